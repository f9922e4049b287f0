import type { PathsObject } from 'openapi3-ts/oas31';
import { EXAMPLE_IDS } from './example-ids.js';
import { example } from './example.js';
import { jsonResponse, problemResponses } from './responses.js';

/** /v1/admin/keys: an admin key manages its own tenant's keys. */
export function keyPaths(): PathsObject {
  return {
    '/v1/admin/keys': {
      post: {
        operationId: 'createApiKey',
        tags: ['admin'],
        summary: "Create an API key for the caller's tenant (admin)",
        description:
          'The answer carries the key itself, once: the service keeps only its SHA-256. Send it as `Authorization: Bearer <key>`.',
        requestBody: {
          required: true,
          content: {
            'application/json': {
              schema: { $ref: '#/components/schemas/ApiKeyRequest' },
              examples: {
                dashboard: example(
                  'invented: a read-only key for a team dashboard',
                  { role: 'read', label: 'invented team dashboard' },
                  201,
                ),
                'bad-role': example(
                  'a role that does not exist',
                  { role: 'owner', label: 'x' },
                  400,
                ),
              },
            },
          },
        },
        responses: {
          '201': jsonResponse('The key, shown this once.', 'CreatedApiKey', { isCreated: true }),
          ...problemResponses(400, 415),
        },
      },
      get: {
        operationId: 'listApiKeys',
        tags: ['admin'],
        summary: "The caller's tenant's keys, without secrets (admin)",
        responses: { '200': jsonResponse('The keys, oldest first.', 'ApiKeyList') },
      },
    },
    '/v1/admin/keys/{id}': {
      delete: {
        operationId: 'revokeApiKey',
        tags: ['admin'],
        summary: "Revoke one of the caller's tenant's keys (admin)",
        parameters: [
          {
            name: 'id',
            in: 'path',
            required: true,
            description: 'The key id (the 16 hex digits inside the key).',
            schema: { type: 'string' },
            examples: {
              created: example(
                `a key of the caller's tenant: the id POST /v1/admin/keys returned (${EXAMPLE_IDS.apiKey} stands for it)`,
                EXAMPLE_IDS.apiKey,
                204,
              ),
              unknown: example('an id no key has', EXAMPLE_IDS.unknownApiKey, 404),
            },
          },
        ],
        responses: {
          '204': { description: 'Revoked: the key authenticates nothing from now on.' },
          ...problemResponses(404),
        },
      },
    },
  };
}
