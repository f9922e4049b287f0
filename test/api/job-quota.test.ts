import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { createBullmqRunner } from '../../workers/runners/bullmq.js';
import { admissionKey } from '../../workers/runners/bullmq-owner-jobs.js';
import { startApiTestApp, type ApiTestApp } from '../helpers/api-test-app.js';
import { useTestRedis } from '../helpers/use-test-redis.js';

// Issue 6, quotas: JOBS_PER_TENANT_MAX holds under concurrent submissions, on the embedded
// backend and on BullMQ with two API processes (two apps, each with its own Redis connection,
// on one queue, as API_PROCESSES=2 runs them). Counting the tenant's unfinished jobs and
// admitting the new one are one step, so exactly the quota is accepted, never more.

const redis = useTestRedis();

const QUOTA = 3;
const SUBMISSIONS = 24;
// A sweep long enough to stay unfinished while the submissions arrive (4000 input voltages ×
// the spec's loads: several seconds of work). 400 voltages once were, until the engine got
// faster: then the embedded backend finished a job while submissions were still arriving and
// admitted a fourth (2026-12-03).
const LONG_SWEEP = {
  kind: 'sweep',
  input: {
    spec: EXAMPLE_SPECS.packagingAux,
    grid: { inputVoltagesV: Array.from({ length: 4000 }, (_, i) => 36 + i * 0.009) },
  },
};

/** Fires SUBMISSIONS job submissions at once, spread over `apps`; answers their statuses. */
async function submitAtOnce(apps: ApiTestApp[]): Promise<number[]> {
  const responses = await Promise.all(
    Array.from({ length: SUBMISSIONS }, (_, i) =>
      (apps[i % apps.length] as ApiTestApp).http.post('/v1/jobs').send(LONG_SWEEP),
    ),
  );
  for (const response of responses.filter((r) => r.status === 429)) {
    expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(response.body.type).toMatch(/too-many-jobs$/);
    expect(Number(response.headers['retry-after'])).toBeGreaterThanOrEqual(1);
  }
  return responses.map((response) => response.status);
}

const countOf = (statuses: number[], status: number) => statuses.filter((s) => s === status).length;

describe('JOBS_PER_TENANT_MAX under concurrent submissions', () => {
  it('the embedded backend accepts exactly the quota of many submissions sent at once', async () => {
    const api = await startApiTestApp({ config: { jobsPerTenantMax: QUOTA } });
    try {
      const statuses = await submitAtOnce([api]);
      expect(countOf(statuses, 202)).toBe(QUOTA);
      expect(countOf(statuses, 429)).toBe(SUBMISSIONS - QUOTA);
      expect(await api.jobs.unfinishedCount('test-tenant')).toBe(QUOTA);
    } finally {
      await api.close();
    }
  });

  it('two API processes on one BullMQ queue accept exactly the quota between them', async () => {
    // No worker: every accepted job stays queued, so the count can only grow.
    const queueName = `test-${randomUUID()}`;
    const runner = () => createBullmqRunner({ redisUrl: redis.url, queueName, timeoutMs: 10_000 });
    const first = await startApiTestApp({ config: { jobsPerTenantMax: QUOTA }, jobs: runner() });
    const second = await startApiTestApp({
      config: { jobsPerTenantMax: QUOTA },
      jobs: runner(),
      keys: first.keys,
    });
    try {
      const statuses = await submitAtOnce([first, second]);
      expect(countOf(statuses, 202)).toBe(QUOTA);
      expect(countOf(statuses, 429)).toBe(SUBMISSIONS - QUOTA);
      expect(await first.jobs.unfinishedCount('test-tenant')).toBe(QUOTA);
      // Every admitted flow was written, so no admission is left holding a place.
      expect(await redis.admin.keys(admissionKey(queueName, '*'))).toEqual([]);
    } finally {
      await first.close();
      await second.close();
    }
  });
});
