import fc from 'fast-check';
import { expect } from 'vitest';
import { createApp } from '../../api/app.js';
import { createKey } from '../../api/auth/create-key.js';
import { createMemoryKeyStore } from '../../api/auth/memory-key-store.js';
import { loadConfig } from '../../api/config.js';
import { createMemoryDesignStore } from '../../api/stores/memory-design-store.js';
import { createMemoryMaterialStore } from '../../api/stores/memory-material-store.js';
import { JOB_COMPUTATIONS } from '../../solvers/index.js';
import { createInProcessRunner } from '../../workers/runners/in-process.js';
import { fuzzResponseProblem } from './fuzz-response-check.js';

/**
 * The seed of every fuzz run: fixed, so CI runs the same requests each time and a failure
 * reproduces; set FUZZ_SEED to explore others (fast-check prints the seed and path of a failure).
 */
export const FUZZ_SEED = Number(process.env['FUZZ_SEED'] ?? 20_261_202);

/** The real app on the embedded backends, called in-process (no sockets: thousands of calls). */
export async function fuzzApp() {
  // No rate limit worth the name: thousands of requests from one key are the point here.
  const config = { ...loadConfig({}), rateLimitPerMinute: 100_000_000, jobsPerTenantMax: 100_000 };
  const keys = createMemoryKeyStore();
  const { token } = await createKey(keys, { tenant: 'fuzz', role: 'admin', label: 'fuzz' });
  const designs = createMemoryDesignStore();
  const materials = createMemoryMaterialStore();
  const jobs = createInProcessRunner({ computations: JOB_COMPUTATIONS });
  const app = createApp({ designs, materials, jobs, config, keys });
  let requestCount = 0;
  const statuses = new Map<number, number>();
  return {
    /** Sends one request and checks the promises of fuzzResponseProblem; returns the response. */
    async send(
      method: string,
      path: string,
      init: { body?: string; contentType?: string | null } = {},
    ): Promise<{ status: number; json: unknown }> {
      requestCount += 1;
      const headers: Record<string, string> = { authorization: `Bearer ${token}` };
      const contentType = init.contentType === undefined ? 'application/json' : init.contentType;
      if (contentType !== null && init.body !== undefined) headers['content-type'] = contentType;
      const response = await app.fetch(
        new Request(`http://fuzz.local${path}`, {
          method,
          headers,
          ...(init.body === undefined ? {} : { body: init.body }),
        }),
      );
      statuses.set(response.status, (statuses.get(response.status) ?? 0) + 1);
      const copy = response.clone();
      const wrong = await fuzzResponseProblem(response);
      expect(wrong, `${method} ${path} ${init.body?.slice(0, 500) ?? ''}`).toBeUndefined();
      const text = await copy.text();
      let json: unknown;
      try {
        json = JSON.parse(text);
      } catch {
        json = text;
      }
      return { status: copy.status, json };
    },
    requestCount: () => requestCount,
    /** How many answers had each status: to check the fuzz reached the engine, not only the schema. */
    statusCounts: () => Object.fromEntries(statuses) as Record<number, number>,
    async close() {
      await jobs.close();
      await designs.close();
      await materials.close();
    },
  };
}

/** Time one fuzz property may take: thousands of requests on a shared 2-core machine. */
export const FUZZ_TIMEOUT_MS = 300_000;

/** fast-check settings of a fuzz property: `numRuns` requests from the fixed seed. */
export function fuzzRuns(numRuns: number): fc.Parameters<unknown> {
  return { numRuns, seed: FUZZ_SEED, endOnFailure: true };
}
