import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { EXAMPLE_COMPARISONS } from '../../api/openapi/example-comparisons.js';
import { EXAMPLE_MATERIALS } from '../../api/openapi/example-materials.js';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { FUZZ_TIMEOUT_MS, fuzzApp, fuzzRuns } from '../helpers/fuzz-app.js';
import { mutatedRequest } from '../helpers/json-mutation.js';

// Issue 6: random and mutated requests against jobs, comparisons and the catalog; every answer
// must keep the promises checked in fuzzResponseProblem. Bases are documented, invented examples.

const api = await fuzzApp();
afterAll(async () => {
  expect(api.requestCount()).toBeGreaterThanOrEqual(2700);
  const counts = api.statusCounts();
  expect(counts[202] ?? 0).toBeGreaterThan(20);
  expect(counts[201] ?? 0).toBeGreaterThan(20);
  expect(counts[400] ?? 0).toBeGreaterThan(100);
  await api.close();
});

const SWEEP = {
  kind: 'sweep',
  input: { spec: EXAMPLE_SPECS.packagingAux, grid: { loadFractions: [0.5, 1] } },
};

describe('fuzz: jobs, comparisons, catalog', () => {
  it(
    'POST /v1/jobs with 500 mutated sweep requests; each accepted job is cancelled at once',
    async () => {
      await fc.assert(
        fc.asyncProperty(mutatedRequest(SWEEP), async (body) => {
          const answer = await api.send('POST', '/v1/jobs', { body: JSON.stringify(body) });
          if (answer.status === 202) {
            const id = (answer.json as { id: string }).id;
            await api.send('DELETE', `/v1/jobs/${id}`);
            await api.send('GET', `/v1/jobs/${id}`);
          }
        }),
        fuzzRuns(500),
      );
    },
    FUZZ_TIMEOUT_MS,
  );

  it(
    'GET and DELETE /v1/jobs/{id} with 600 random ids',
    async () => {
      const anyId = fc.oneof(fc.uuid(), fc.string({ maxLength: 40 }), fc.integer().map(String));
      await fc.assert(
        fc.asyncProperty(anyId, fc.constantFrom('GET', 'DELETE'), async (id, method) => {
          await api.send(method, `/v1/jobs/${encodeURIComponent(id)}`);
        }),
        fuzzRuns(600),
      );
    },
    FUZZ_TIMEOUT_MS,
  );

  it(
    'POST /v1/comparisons with 120 mutated requests',
    async () => {
      const bases = Object.values(EXAMPLE_COMPARISONS);
      await fc.assert(
        fc.asyncProperty(
          fc.constantFrom(...bases).chain((base) => mutatedRequest(base)),
          async (body) => {
            await api.send('POST', '/v1/comparisons', { body: JSON.stringify(body) });
          },
        ),
        fuzzRuns(120),
      );
    },
    FUZZ_TIMEOUT_MS,
  );

  it(
    'POST /v1/catalog/materials with 500 mutated loss-point sets, and GET by random id',
    async () => {
      await fc.assert(
        fc.asyncProperty(
          mutatedRequest(EXAMPLE_MATERIALS.labFerrite),
          fc.string({ maxLength: 8 }),
          async (body, suffix) => {
            // A unique name most of the time, so the fit runs rather than the name check.
            const named =
              body !== null && typeof body === 'object' && !Array.isArray(body) && 'name' in body
                ? { ...body, name: `${JSON.stringify((body as { name: unknown }).name)}-${suffix}` }
                : body;
            const answer = await api.send('POST', '/v1/catalog/materials', {
              body: JSON.stringify(named),
            });
            const id = (answer.json as { id?: unknown }).id;
            await api.send(
              'GET',
              `/v1/catalog/materials/${encodeURIComponent(typeof id === 'string' ? id : suffix)}`,
            );
          },
        ),
        fuzzRuns(500),
      );
    },
    FUZZ_TIMEOUT_MS,
  );

  it(
    '800 raw requests: any method, path, content type and body',
    async () => {
      const paths = fc.constantFrom(
        '/v1/designs',
        '/v1/jobs',
        '/v1/comparisons',
        '/v1/catalog/materials',
        '/v1/catalog/core-shapes',
        '/v1/catalog/wires',
        '/healthz',
        '/openapi.json',
        '/v1/designs/x/revisions',
      );
      await fc.assert(
        fc.asyncProperty(
          fc.constantFrom('GET', 'POST', 'PUT', 'PATCH', 'DELETE'),
          paths,
          fc.constantFrom('application/json', 'text/plain', 'application/merge-patch+json', null),
          fc.oneof(fc.string({ maxLength: 200 }), fc.json(), fc.constant('{"spec":')),
          async (method, path, contentType, body) => {
            const hasBody = method !== 'GET';
            await api.send(method, path, hasBody ? { body, contentType } : {});
          },
        ),
        fuzzRuns(800),
      );
    },
    FUZZ_TIMEOUT_MS,
  );
});
