import { randomUUID } from 'node:crypto';
import { Queue } from 'bullmq';
import { beforeAll, describe, expect, it } from 'vitest';
import {
  JOB_COMPUTATIONS,
  sweepComputation,
  type AnyChunkedComputation,
} from '../../solvers/index.js';
import { startBullmqWorker } from '../../workers/bullmq-worker.js';
import { createBullmqRunner } from '../../workers/runners/bullmq.js';
import { JOB_RETRY_POLICIES } from '../../workers/runners/job-retry-policy.js';
import { largeSweepRequest } from '../helpers/sweep-requests.js';
import { useTestRedis } from '../helpers/use-test-redis.js';
import { waitForFinish } from '../helpers/wait-for-job.js';

const redis = useTestRedis();

/** What became of a sweep whose first chunk to run throws (one attempt), on one worker. */
interface FailedJobOutcome {
  state: string;
  failureReason: string | undefined;
  /** The index of the chunk that threw. */
  brokenChunk: number | undefined;
  /** Chunks started by the time the job read failed, and 1.5 s later. */
  runsAtFailure: number;
  runsLater: number;
  /** Chunks of the job still waiting in the queue 1.5 s after it failed. */
  waitingLater: number;
}

async function runJobWithFailingChunk(): Promise<FailedJobOutcome> {
  const queueName = `test-${randomUUID()}`;
  const runs: number[] = [];
  // The sweep, except that the first chunk any worker starts throws.
  const flaky = {
    ...sweepComputation,
    *runChunk(request, chunk) {
      runs.push(chunk.index);
      if (runs.length === 1) throw new Error(`chunk ${chunk.index} broke`);
      return yield* sweepComputation.runChunk(request as never, chunk);
    },
  } as AnyChunkedComputation;
  const runner = createBullmqRunner({
    redisUrl: redis.url,
    queueName,
    timeoutMs: 10_000,
    retryPolicies: { ...JOB_RETRY_POLICIES, sweep: { attempts: 1, backoffMs: 10 } },
  });
  const worker = startBullmqWorker({
    redisUrl: redis.url,
    queueName,
    computations: { ...JOB_COMPUTATIONS, sweep: flaky },
    shutdownGraceMs: 0,
  });
  const queue = new Queue(queueName, { connection: redis.admin });
  try {
    await worker.ready;
    // 40 chunks of 10 points (the invented flyback of the test helpers).
    const { id } = await runner.submit(
      'sweep',
      largeSweepRequest({ frequencyCount: 20, inputCount: 10, chunkPointCount: 10 }),
    );
    const record = await waitForFinish(runner, id);
    const runsAtFailure = runs.length;
    // Time for a worker that goes on to take more chunks (a guard, not a timing check).
    await new Promise((resolve) => setTimeout(resolve, 1500));
    return {
      state: record.state,
      failureReason: record.failureReason,
      brokenChunk: runs[0],
      runsAtFailure,
      runsLater: runs.length,
      waitingLater: await queue.getWaitingCount(),
    };
  } finally {
    await queue.close();
    await worker.close();
    await runner.close();
  }
}

describe('a failed chunk on the BullMQ backend', () => {
  let outcome: FailedJobOutcome;
  beforeAll(async () => {
    outcome = await runJobWithFailingChunk();
  });

  it("fails the job with the failed chunk's reason", () => {
    expect(outcome.state).toBe('failed');
    // The reason names the chunk, then gives the computation's own message.
    expect(outcome.failureReason).toMatch(/^chunk \d+ \(items \d+-\d+\) failed: /);
    expect(outcome.failureReason).toContain(`chunk ${outcome.brokenChunk} broke`);
  });

  // Issue 5: a failed chunk stops the job's other chunks (the embedded runner too,
  // test/workers/in-process-runner.test.ts): the failing worker sets the job's cancel mark and
  // removes the chunks no worker has taken yet.
  it('runs none of its other chunks once it has failed, and leaves none waiting', () => {
    expect(outcome.runsLater).toBe(outcome.runsAtFailure);
    expect(outcome.waitingLater).toBe(0);
  });
});
