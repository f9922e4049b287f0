import { randomUUID } from 'node:crypto';
import { Queue } from 'bullmq';
import { describe, expect, it } from 'vitest';
import { JOB_COMPUTATIONS, canonicalJson } from '../../solvers/index.js';
import type { CoreSearchResult } from '../../solvers/core-search/core-search-candidate.js';
import type { JobResult } from '../../solvers/jobs/job-result.js';
import { createBullmqRunner } from '../../workers/runners/bullmq.js';
import { createInProcessRunner } from '../../workers/runners/in-process.js';
import type { JobRunner } from '../../workers/runners/job-runner.js';
import { useTestRedis } from '../helpers/use-test-redis.js';
import { waitForJob } from '../helpers/wait-for-job.js';
import { startWorkerProcess, type TestWorkerProcess } from '../helpers/worker-process.js';
import { smallFlybackSearch } from '../solvers/core-search/core-search-fixtures.js';

const redis = useTestRedis();

// Room on a busy 2-core machine (a guard against a hung test, not a speed check).
const GUARD_MS = 300_000;

/** Submits `request` as a core search and waits for its result. */
async function runSearchJob(runner: JobRunner, request: unknown) {
  const { id } = await runner.submit('core-search', request);
  const record = await waitForJob(
    runner,
    id,
    (job) => ['completed', 'failed', 'cancelled'].includes(job.state),
    { timeoutMs: GUARD_MS, pollMs: 50 },
  );
  expect(record.state, record.failureReason).toBe('completed');
  return { id, result: record.result as JobResult<CoreSearchResult> };
}

describe('core search on BullMQ workers', () => {
  it(
    '1 worker, 2 workers and the embedded backend give byte-identical result JSON, counts included',
    async () => {
      // A small invented flyback search (the tests' telecom-style scenario, not any product)
      // over four switching frequencies, 2 shapes each: 6 chunks, the first two frequencies
      // whole (two blocks each) and the last two one block a chunk (`coreSearchPlan`).
      const request = smallFlybackSearch({ topN: 3 });
      const multi = {
        ...request,
        space: { ...request.space, switchingFrequenciesHz: [80e3, 90e3, 100e3, 110e3] },
      };
      const embedded = createInProcessRunner({ computations: JOB_COMPUTATIONS });
      let reference: string;
      try {
        reference = canonicalJson((await runSearchJob(embedded, multi)).result);
      } finally {
        await embedded.close();
      }
      const queueName = `test-${randomUUID()}`;
      const env = { REDIS_URL: redis.url, QUEUE_NAME: queueName, WORKER_SHUTDOWN_GRACE_MS: '0' };
      const runner = createBullmqRunner({ redisUrl: redis.url, queueName, timeoutMs: 10_000 });
      const workers: TestWorkerProcess[] = [];
      try {
        workers.push(await startWorkerProcess(env));
        const alone = await runSearchJob(runner, multi);
        workers.push(await startWorkerProcess(env));
        const shared = await runSearchJob(runner, multi);
        expect(canonicalJson(alone.result)).toBe(reference);
        expect(canonicalJson(shared.result)).toBe(reference);
        expect(shared.result.output.counts.boundedOut).toBeGreaterThan(0);
        // Both processes ran chunks of the shared job, the plan's 6 between them.
        let chunkCount = 0;
        for (const worker of workers) {
          const chunksDone = worker.events.filter(
            (event) =>
              event.event === 'completed' && String(event.jobId).startsWith(`${shared.id}-chunk-`),
          );
          expect(chunksDone.length).toBeGreaterThan(0);
          chunkCount += chunksDone.length;
        }
        expect(chunkCount).toBe(6);
      } finally {
        await runner.close();
        await Promise.all(workers.map((worker) => worker.stop()));
        const queue = new Queue(queueName, { connection: redis.admin });
        await queue.obliterate({ force: true });
        await queue.close();
      }
    },
    GUARD_MS,
  );
});
