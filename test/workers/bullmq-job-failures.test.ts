import { randomUUID } from 'node:crypto';
import { Queue } from 'bullmq';
import { afterEach, describe, expect, it } from 'vitest';
import {
  JOB_COMPUTATIONS,
  canonicalJson,
  type AnyChunkedComputation,
  type ChunkPlan,
} from '../../solvers/index.js';
import { startBullmqWorker, type WorkerEvent } from '../../workers/bullmq-worker.js';
import { TransientError } from '../../workers/chunks/chunk-failures.js';
import { createBullmqRunner, type BullmqRunnerOptions } from '../../workers/runners/bullmq.js';
import { createServiceMetrics, recordFinishedJob } from '../../api/observability/metrics.js';
import { JOB_RETRY_POLICIES } from '../../workers/runners/job-retry-policy.js';
import type { JobRecord, JobRunner } from '../../workers/runners/job-runner.js';
import { referenceSweep } from '../contracts/runner-contract.js';
import { largeSweepRequest } from '../helpers/sweep-requests.js';
import { useTestRedis } from '../helpers/use-test-redis.js';
import { waitForFinish } from '../helpers/wait-for-job.js';

// Issue 6, faults: on the BullMQ backend a chunk that fails for good (its computation threw, it
// ran past its time limit) fails its job at once with a reason naming the chunk, is never
// retried, and stops the job's other chunks; a transient failure is retried with backoff and
// the job completes with the undisturbed result. The worker runs in this process so a test can
// give it a sweep computation that misbehaves on one chunk (the producer plans the real sweep,
// so chunks and results are the real ones).

const redis = useTestRedis();

// 4 × 2 × 3 = 24 points in 6 chunks of 4; chunk 1 holds items 4-7.
const REQUEST = largeSweepRequest({ frequencyCount: 4, inputCount: 2, chunkPointCount: 4 });
const BACKOFF_MS = 400;

/** A timed worker event (the time as this process saw it, ms). */
type SeenEvent = WorkerEvent & { atMs: number };

interface Setup {
  queueName: string;
  runner: JobRunner;
  events: SeenEvent[];
  close(): Promise<void>;
}
let current: Setup | undefined;
afterEach(async () => {
  await current?.close();
  current = undefined;
});

/** The real sweep, but chunk 1 runs `chunkOne` first (its `call` counts chunk 1's runs from 1). */
function sweepWithChunkOne(
  chunkOne: (call: number) => Generator<number, void, void>,
): AnyChunkedComputation {
  const sweep = JOB_COMPUTATIONS.sweep as AnyChunkedComputation;
  let calls = 0;
  return {
    ...sweep,
    *runChunk(request: unknown, chunk: ChunkPlan) {
      if (chunk.index === 1) {
        calls += 1;
        yield* chunkOne(calls);
      }
      return yield* sweep.runChunk(request, chunk);
    },
  };
}

async function setUp(
  sweep: AnyChunkedComputation,
  options: Pick<BullmqRunnerOptions, 'chunkTimeoutMs' | 'onFinished'> = {},
): Promise<Setup> {
  const queueName = `test-${randomUUID()}`;
  const events: SeenEvent[] = [];
  const worker = startBullmqWorker({
    redisUrl: redis.url,
    queueName,
    computations: { ...JOB_COMPUTATIONS, sweep },
    shutdownGraceMs: 0,
    onEvent: (event) => events.push({ ...event, atMs: Date.now() }),
  });
  await worker.ready;
  const runner = createBullmqRunner({
    redisUrl: redis.url,
    queueName,
    timeoutMs: 10_000,
    retryPolicies: { ...JOB_RETRY_POLICIES, sweep: { attempts: 3, backoffMs: BACKOFF_MS } },
    ...options,
  });
  current = {
    queueName,
    runner,
    events,
    async close() {
      await runner.close();
      await worker.close();
      const queue = new Queue(queueName, { connection: redis.admin });
      await queue.obliterate({ force: true });
      await queue.close();
    },
  };
  return current;
}

/** How often the chunk was attempted (BullMQ's count of its failed attempts, kept on failure). */
async function chunkAttempts(queueName: string, chunkId: string): Promise<number> {
  const queue = new Queue(queueName, { connection: redis.admin });
  const job = await queue.getJob(chunkId);
  await queue.close();
  return job?.attemptsMade ?? 0;
}

/** Waits until no entry of the queue waits or runs (a guard against a hang, not a speed check). */
async function queueDrained(queueName: string): Promise<void> {
  const queue = new Queue(queueName, { connection: redis.admin });
  try {
    const deadline = Date.now() + 30_000;
    for (;;) {
      const counts = await queue.getJobCounts(
        'waiting',
        'prioritized',
        'delayed',
        'waiting-children',
        'active',
      );
      if (Object.values(counts).every((count) => count === 0)) return;
      if (Date.now() > deadline) throw new Error(`queue not drained: ${JSON.stringify(counts)}`);
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
  } finally {
    await queue.close();
  }
}

/** The events of the job's chunk `index`. */
const ofChunk = (events: SeenEvent[], id: string, index: number) =>
  events.filter((event) => event.jobId === `${id}-chunk-${index}`);

/** Chunks (other than `failed`) that completed after chunk `failed` failed for good. */
function completedAfterFailure(events: SeenEvent[], id: string, failed: number): string[] {
  const failure = events.findIndex(
    (event) => event.jobId === `${id}-chunk-${failed}` && event.event === 'failed',
  );
  return events
    .slice(failure + 1)
    .filter((event) => event.event === 'completed' && String(event.jobId).startsWith(`${id}-`))
    .map((event) => String(event.jobId));
}

describe('chunk failures on the BullMQ backend', () => {
  it("a computation's own error fails the job at once, naming the chunk, and stops its other chunks", async () => {
    // eslint-disable-next-line require-yield
    const sweep = sweepWithChunkOne(function* (call) {
      throw new RangeError(`simulated engine fault (run ${call})`);
    });
    const { queueName, runner, events } = await setUp(sweep);
    const { id } = await runner.submit('sweep', REQUEST);
    const record = await waitForFinish(runner, id);
    expect(record.state).toBe('failed');
    expect(record.failureReason).toBe('chunk 1 (items 4-7) failed: simulated engine fault (run 1)');
    // Never retried: one attempt, and the worker was told it would not be retried.
    expect(await chunkAttempts(queueName, `${id}-chunk-1`)).toBe(1);
    expect(ofChunk(events, id, 1).filter((event) => event.event === 'failed')).toEqual([
      expect.objectContaining({ willRetry: false }),
    ]);
    // The remaining chunks are gone from the queue, and none completed after the failure.
    await queueDrained(queueName);
    expect(completedAfterFailure(events, id, 1)).toEqual([]);
    expect((await runner.get(id))?.state).toBe('failed');
  });

  it('a chunk past the time limit stamped by the producer fails the job, never retried', async () => {
    const sweep = sweepWithChunkOne(function* () {
      for (;;) yield 0;
    });
    const { queueName, runner } = await setUp(sweep, { chunkTimeoutMs: 300 });
    const { id } = await runner.submit('sweep', REQUEST);
    const record = await waitForFinish(runner, id);
    expect(record.state).toBe('failed');
    expect(record.failureReason).toBe(
      'chunk 1 (items 4-7) failed: ran longer than the chunk time limit of 0.3 s (JOB_CHUNK_TIMEOUT_S)',
    );
    expect(await chunkAttempts(queueName, `${id}-chunk-1`)).toBe(1);
    await queueDrained(queueName);
  });

  it('a transient failure is retried after the backoff and the job completes with the undisturbed result', async () => {
    // eslint-disable-next-line require-yield
    const sweep = sweepWithChunkOne(function* (call) {
      if (call === 1) throw new TransientError('simulated lost Redis connection');
    });
    const { runner, events } = await setUp(sweep);
    const { id } = await runner.submit('sweep', REQUEST);
    const record = await waitForFinish(runner, id);
    expect(record.state).toBe('completed');
    expect(canonicalJson(record.result)).toBe(canonicalJson(await referenceSweep(REQUEST)));
    const chunkOne = ofChunk(events, id, 1);
    const failed = chunkOne.find((event) => event.event === 'failed');
    expect(failed).toMatchObject({
      reason: 'chunk 1 (items 4-7) failed: simulated lost Redis connection',
      willRetry: true,
    });
    const retried = chunkOne.find((event) => event.event === 'started' && event.attempt === 2);
    expect(chunkOne.at(-1)?.event).toBe('completed');
    // BullMQ's exponential backoff: the second attempt starts no sooner than BACKOFF_MS later
    // (an ordering check of the schedule, with 50 ms for the clocks of two callbacks).
    expect((retried?.atMs ?? 0) - (failed?.atMs ?? Infinity)).toBeGreaterThanOrEqual(
      BACKOFF_MS - 50,
    );
  });
});

describe('finished jobs on the BullMQ backend (onFinished, the job metrics)', () => {
  it('tells onFinished of each completed, failed and cancelled job once, and the metrics count them', async () => {
    // eslint-disable-next-line require-yield
    const sweep = sweepWithChunkOne(function* (call) {
      if (call === 1) throw new RangeError('simulated engine fault');
    });
    const metrics = createServiceMetrics({ processMetrics: false });
    const finished: JobRecord[] = [];
    const { runner } = await setUp(sweep, {
      onFinished: (record) => {
        finished.push(record);
        recordFinishedJob(metrics, record);
      },
    });
    const failed = await runner.submit('sweep', REQUEST);
    expect((await waitForFinish(runner, failed.id)).state).toBe('failed');
    const completed = await runner.submit('sweep', REQUEST);
    // Queued behind the other (one worker, one chunk at a time): removed at once when cancelled.
    const cancelled = await runner.submit('sweep', REQUEST);
    expect(await runner.cancel(cancelled.id)).toBe('cancelled');
    expect((await waitForFinish(runner, completed.id)).state).toBe('completed');
    const deadline = Date.now() + 30_000;
    while (finished.length < 3 && Date.now() < deadline) {
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    // Nothing more arrives (no chunk, no second report of a job).
    await new Promise((resolve) => setTimeout(resolve, 500));
    const stateOf = Object.fromEntries(finished.map((record) => [record.id, record.state]));
    expect(finished).toHaveLength(3);
    expect(stateOf).toEqual({
      [failed.id]: 'failed',
      [completed.id]: 'completed',
      [cancelled.id]: 'cancelled',
    });
    const text = await metrics.registry.metrics();
    for (const state of ['completed', 'failed', 'cancelled']) {
      expect(text).toContain(`designservice_jobs_finished_total{kind="sweep",state="${state}"} 1`);
    }
    expect(text).toContain('designservice_job_duration_seconds_count{kind="sweep"} 3');
  });
});
