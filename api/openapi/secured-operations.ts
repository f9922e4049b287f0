import type { PathsObject, SecuritySchemeObject } from 'openapi3-ts/oas31';
import { problemResponses } from './responses.js';

/** Paths anyone may call; every other operation requires an API key. */
const OPEN_PATHS = new Set(['/healthz', '/readyz', '/openapi.json']);

/** The API key scheme: a bearer token (RFC 6750). */
export const API_KEY_SCHEME: SecuritySchemeObject = {
  type: 'http',
  scheme: 'bearer',
  description:
    "An API key, bound to a tenant and a role: 'read' (GET), 'design' (also POST and DELETE of designs, comparisons, jobs, materials) or 'admin' (also /v1/admin/keys). The embedded backend prints one admin key of tenant 'local' at start-up (or takes LOCAL_API_KEY); with Redis, `npm run keys -- create` makes them. Every key may send RATE_LIMIT_PER_MINUTE requests per clock minute (600 by default).",
};

const OPERATIONS = ['get', 'put', 'post', 'delete', 'patch'] as const;

/**
 * `paths` with each operation's security stated: none on the open paths, and on the others the
 * 401, 403, 429 and 503 answers every secured operation may give (with Redis the key is looked
 * up there, so any of them answers 503 while Redis is down).
 */
export function withSecuredOperations(paths: PathsObject): PathsObject {
  return Object.fromEntries(
    Object.entries(paths).map(([path, item]) => {
      const secured = { ...item };
      for (const method of OPERATIONS) {
        const operation = item[method];
        if (operation === undefined) continue;
        secured[method] = OPEN_PATHS.has(path)
          ? { ...operation, security: [] }
          : {
              ...operation,
              responses: { ...problemResponses(401, 403, 429, 503), ...operation.responses },
            };
      }
      return [path, secured];
    }),
  );
}
