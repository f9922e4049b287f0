import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { FUZZ_TIMEOUT_MS, fuzzApp, fuzzRuns } from '../helpers/fuzz-app.js';
import { mutatedRequest } from '../helpers/json-mutation.js';

// Issue 6: random and mutated requests against the design operations; every answer must keep
// the promises checked in fuzzResponseProblem (no 5xx, problem+json 4xx with field paths, no
// negative loss in a 2xx). The bases are the documented examples (invented scenarios).

const api = await fuzzApp();
afterAll(async () => {
  expect(api.requestCount()).toBeGreaterThanOrEqual(2500);
  // The mutations must reach the engine, not only the schema: designs made and specs refused.
  const counts = api.statusCounts();
  expect(counts[201] ?? 0).toBeGreaterThan(100);
  expect(counts[422] ?? 0).toBeGreaterThan(5);
  expect(counts[400] ?? 0).toBeGreaterThan(100);
  await api.close();
});

const BASES = Object.values(EXAMPLE_SPECS).map((spec) => ({ spec }));
const mutatedDesignRequest = fc.constantFrom(...BASES).chain((base) => mutatedRequest(base));

describe('fuzz: designs', () => {
  it(
    'POST /v1/designs with 1,200 mutated specs never answers 5xx',
    async () => {
      await fc.assert(
        fc.asyncProperty(mutatedDesignRequest, async (body) => {
          await api.send('POST', '/v1/designs', { body: JSON.stringify(body) });
        }),
        fuzzRuns(1200),
      );
    },
    FUZZ_TIMEOUT_MS,
  );

  it(
    'POST /v1/designs/{id}/revisions with 300 mutated specs, on a real and a random id',
    async () => {
      const created = await api.send('POST', '/v1/designs', { body: JSON.stringify(BASES[0]) });
      const id = (created.json as { id: string }).id;
      await fc.assert(
        fc.asyncProperty(
          mutatedDesignRequest,
          fc.oneof(fc.constant(id), fc.uuid(), fc.string({ maxLength: 20 })),
          async (body, target) => {
            await api.send('POST', `/v1/designs/${encodeURIComponent(target)}/revisions`, {
              body: JSON.stringify(body),
            });
          },
        ),
        fuzzRuns(300),
      );
    },
    FUZZ_TIMEOUT_MS,
  );

  it(
    'GET of designs, revisions and netlists with 1,000 random ids, revisions and corners',
    async () => {
      const created = await api.send('POST', '/v1/designs', { body: JSON.stringify(BASES[1]) });
      const id = (created.json as { id: string }).id;
      const anyText = fc.oneof(fc.string({ maxLength: 30 }), fc.integer().map(String));
      await fc.assert(
        fc.asyncProperty(
          fc.oneof(fc.constant(id), fc.uuid(), anyText),
          anyText,
          fc.constantFrom(
            '',
            '/revisions',
            '/revisions/',
            '/netlist',
            '/netlist?corner=',
            '/netlist?revision=',
          ),
          async (target, parameter, tail) => {
            const suffix =
              tail.endsWith('/') || tail.endsWith('=')
                ? tail + encodeURIComponent(parameter)
                : tail;
            await api.send('GET', `/v1/designs/${encodeURIComponent(target)}${suffix}`);
          },
        ),
        fuzzRuns(1000),
      );
    },
    FUZZ_TIMEOUT_MS,
  );
});
