import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createKey } from '../../api/auth/create-key.js';
import { createRedisKeyStore } from '../../api/auth/redis-key-store.js';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { JOB_COMPUTATIONS, canonicalJson } from '../../solvers/index.js';
import { createInProcessRunner } from '../../workers/runners/in-process.js';
import { startApiServerProcess, type TestApiServerProcess } from '../helpers/api-server-process.js';
import { forwardTelecomSpec } from '../helpers/forward-specs.js';
import { useTestRedis } from '../helpers/use-test-redis.js';
import { waitForFinish } from '../helpers/wait-for-job.js';
import { startWorkerProcess, type TestWorkerProcess } from '../helpers/worker-process.js';

// Issue 6, faults: Redis killed mid-job and started again on the same port and directory, with
// append-only persistence as docker-compose.yml runs it. The API process and a worker process
// stay up throughout. While Redis is down, every route that needs it answers 503 problem+json
// with Retry-After and /readyz is not ready; once Redis is back both recover on their own and
// every job accepted before the outage completes with the result of an undisturbed run (and
// is counted in the API's job metrics).
// The spec is an invented scenario (test/helpers/forward-specs.ts), not any product.

const RETRY_AFTER_S = 2;
// Room for a busy shared 2-core machine: guards against a hung test, not speed checks.
const GUARD_MS = 240_000;
const RECOVERY_GUARD_MS = 60_000;

const redis = useTestRedis({ appendOnly: true });
let api: TestApiServerProcess | undefined;
let worker: TestWorkerProcess | undefined;
let token: string;
const queueName = `test-${randomUUID()}`;

beforeAll(async () => {
  const keys = createRedisKeyStore({ redisUrl: redis.url });
  ({ token } = await createKey(keys, { tenant: 'restart', role: 'admin', label: 'restart test' }));
  await keys.close();
  const env = { REDIS_URL: redis.url, QUEUE_NAME: queueName };
  // Each handle is kept as soon as it exists, so afterAll stops whatever did start.
  await Promise.all([
    startApiServerProcess({ ...env, RETRY_AFTER_S: String(RETRY_AFTER_S) }).then(
      (started) => (api = started),
    ),
    startWorkerProcess(env).then((started) => (worker = started)),
  ]);
}, GUARD_MS);

// Runs before useTestRedis stops Redis and removes its directory (vitest runs afterAll hooks
// in reverse order).
afterAll(async () => {
  await api?.stop('SIGKILL');
  await worker?.stop('SIGKILL');
});

function call(path: string, init: RequestInit = {}): Promise<Response> {
  return fetch(`${api?.url}${path}`, {
    ...init,
    headers: {
      authorization: `Bearer ${token}`,
      'content-type': 'application/json',
      ...init.headers,
    },
  });
}

async function json(response: Response): Promise<Record<string, unknown>> {
  return (await response.json()) as Record<string, unknown>;
}

/** Polls `path` until `accept` holds for its response; fails after `timeoutMs`. */
async function pollUntil(
  path: string,
  accept: (status: number, body: Record<string, unknown>) => boolean,
  timeoutMs: number,
): Promise<Record<string, unknown>> {
  const deadline = Date.now() + timeoutMs;
  let last = '';
  for (;;) {
    const response = await call(path).catch(() => undefined);
    if (response !== undefined) {
      const body = await json(response).catch(() => ({}));
      if (accept(response.status, body)) return body;
      last = `${response.status} ${JSON.stringify(body).slice(0, 300)}`;
    }
    if (Date.now() > deadline) throw new Error(`${path}: gave up waiting; last answer ${last}`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

/** A 503 problem+json with a Retry-After of at least RETRY_AFTER_S. */
async function expectUnavailable(response: Response): Promise<void> {
  expect(response.status).toBe(503);
  expect(response.headers.get('content-type')).toMatch(/^application\/problem\+json/);
  expect(Number(response.headers.get('retry-after'))).toBeGreaterThanOrEqual(RETRY_AFTER_S);
  const problem = await json(response);
  expect(problem).toMatchObject({ status: 503 });
}

/** The result an undisturbed run gives: the embedded backend, in this process. */
async function undisturbedResult(input: unknown): Promise<unknown> {
  const reference = createInProcessRunner({ computations: JOB_COMPUTATIONS });
  try {
    const { id } = await reference.submit('tolerance', input);
    const record = await waitForFinish(reference, id);
    expect(record.state).toBe('completed');
    return record.result;
  } finally {
    await reference.close();
  }
}

describe('Redis killed and restarted mid-job (append-only persistence)', () => {
  it(
    'the API answers 503 with Retry-After and is not ready while Redis is down, recovers by itself, and every accepted job completes with the undisturbed result',
    async () => {
      // 120 chunks of 250 samples each, and a second job behind it. Large enough that the first
      // job is still running when Redis is killed even on a quiet machine (Monte Carlo runs at
      // most about 9,000 samples/s per core here, so 30,000 take over 3 s; 4,000 were done
      // before the kill once the machine was idle).
      const inputs = [
        { spec: forwardTelecomSpec(), sampleCount: 30_000, seed: 11 },
        { spec: forwardTelecomSpec(), sampleCount: 1500, seed: 12 },
      ];
      const ids: string[] = [];
      for (const input of inputs) {
        const response = await call('/v1/jobs', {
          method: 'POST',
          body: JSON.stringify({ kind: 'tolerance', input }),
        });
        expect(response.status).toBe(202);
        ids.push(String((await json(response))['id']));
      }
      const [firstId, secondId] = ids as [string, string];
      // The first job is under way: some of its samples are done, not all.
      await pollUntil(
        `/v1/jobs/${firstId}`,
        (status, body) => {
          const progress = body['progress'] as { done?: number } | undefined;
          return status === 200 && (progress?.done ?? 0) > 0;
        },
        RECOVERY_GUARD_MS,
      );
      // The first second of writes has surely reached the append-only file (fsync every second).
      await new Promise((resolve) => setTimeout(resolve, 1_100));
      const before = await json(await call(`/v1/jobs/${firstId}`));
      expect(before['state']).toBe('running');
      expect((before['progress'] as { fraction: number }).fraction).toBeLessThan(1);

      await redis.server.kill('SIGKILL');

      const down = await call('/readyz');
      await expectUnavailable(down);
      const readiness = (await json(await call('/readyz'))) as { checks?: unknown };
      expect(readiness.checks).toEqual({ designStore: 'down', jobBackend: 'down' });
      expect((await call('/healthz')).status).toBe(200);
      await expectUnavailable(await call(`/v1/jobs/${firstId}`));
      await expectUnavailable(
        await call('/v1/jobs', {
          method: 'POST',
          body: JSON.stringify({ kind: 'tolerance', input: inputs[1] }),
        }),
      );
      await expectUnavailable(
        await call('/v1/designs', {
          method: 'POST',
          body: JSON.stringify({ spec: EXAMPLE_SPECS.packagingAux }),
        }),
      );
      // Down for longer than a worker's lock lives (4 s), so its chunk is taken as stalled.
      await new Promise((resolve) => setTimeout(resolve, 5_000));

      await redis.server.restart();

      await pollUntil('/readyz', (status) => status === 200, RECOVERY_GUARD_MS);
      const records = await Promise.all(
        ids.map((id) =>
          pollUntil(
            `/v1/jobs/${id}`,
            (status, body) =>
              status === 200 &&
              ['completed', 'failed', 'cancelled'].includes(String(body['state'])),
            GUARD_MS / 2,
          ),
        ),
      );
      for (const record of records) {
        expect(record).toMatchObject({ state: 'completed', progress: { fraction: 1 } });
      }
      // The API process followed the queue's events through the outage: /metrics counts both.
      const counted = 'designservice_jobs_finished_total{kind="tolerance",state="completed"} 2';
      const metricsDeadline = Date.now() + RECOVERY_GUARD_MS;
      let metricsText = '';
      while (!metricsText.includes(counted) && Date.now() < metricsDeadline) {
        metricsText = await (await call('/metrics')).text();
        if (!metricsText.includes(counted)) await new Promise((r) => setTimeout(r, 200));
      }
      expect(metricsText).toContain(counted);
      expect(metricsText).toContain('designservice_job_duration_seconds_count{kind="tolerance"} 2');
      // A new design is accepted again once Redis is back.
      const after = await call('/v1/designs', {
        method: 'POST',
        body: JSON.stringify({ spec: EXAMPLE_SPECS.packagingAux }),
      });
      expect(after.status).toBe(201);
      const references = await Promise.all(inputs.map((input) => undisturbedResult(input)));
      expect(ids).toEqual([firstId, secondId]);
      // The same worker process saw the outage and carried on: no restart was needed.
      expect(worker?.events.some((event) => event.event === 'error')).toBe(true);
      const exitedYet = await Promise.race([
        worker?.exited.then(() => true),
        new Promise((resolve) => setTimeout(() => resolve(false), 10)),
      ]);
      expect(exitedYet).toBe(false);
      records.forEach((record, index) => {
        expect(canonicalJson(record['result'])).toBe(canonicalJson(references[index]));
      });
    },
    GUARD_MS,
  );
});
