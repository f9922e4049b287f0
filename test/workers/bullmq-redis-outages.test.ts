import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import {
  JOB_COMPUTATIONS,
  canonicalJson,
  type AnyChunkedComputation,
  type ChunkPlan,
} from '../../solvers/index.js';
import { startBullmqWorker, type WorkerEvent } from '../../workers/bullmq-worker.js';
import { createBullmqRunner } from '../../workers/runners/bullmq.js';
import { BULLMQ_SETTINGS } from '../../workers/runners/bullmq-settings.js';
import { referenceSweep } from '../contracts/runner-contract.js';
import { largeSweepRequest } from '../helpers/sweep-requests.js';
import { useTestRedis } from '../helpers/use-test-redis.js';
import { waitForFinish } from '../helpers/wait-for-job.js';

// Issue 6, faults: Redis going down and up again several times while one chunk runs. Each
// outage outlasts the worker's lock, so each time the stall check takes the chunk from its
// (living) worker and queues it again. Those re-runs are not the chunk's fault: the job must
// complete with the undisturbed result, however many outages there are, while a chunk whose
// workers die (bullmq-runner.test.ts, SIGKILL) still counts against BULLMQ_SETTINGS.maxStalledCount.
// Redis runs with append-only persistence, as in docker-compose.yml.

const redis = useTestRedis({ appendOnly: true });

// More outages than maxStalledCount allows stalls.
const OUTAGES = BULLMQ_SETTINGS.maxStalledCount + 1;
// Each outage outlasts the lock, so the chunk is surely taken as stalled.
const OUTAGE_MS = BULLMQ_SETTINGS.lockDurationMs + 1_000;
// Chunk 0 takes this long every time it runs, so it is running when Redis goes down.
const SLOW_CHUNK_MS = 3_000;
// The append-only file is written every second: Redis goes down this long after the chunk
// started, so the chunk's start is on disk.
const BEFORE_KILL_MS = 1_200;
// 4 × 2 × 3 = 24 points in 6 chunks of 4 (the invented flyback of the test helpers).
const REQUEST = largeSweepRequest({ frequencyCount: 4, inputCount: 2, chunkPointCount: 4 });

const sleepBlocking = (ms: number) =>
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);

/** The real sweep, except that chunk 0 waits SLOW_CHUNK_MS (in 5 ms steps) before computing. */
function sweepWithSlowChunkZero(): AnyChunkedComputation {
  const sweep = JOB_COMPUTATIONS.sweep as AnyChunkedComputation;
  return {
    ...sweep,
    *runChunk(request: unknown, chunk: ChunkPlan) {
      if (chunk.index === 0) {
        const endMs = Date.now() + SLOW_CHUNK_MS;
        while (Date.now() < endMs) {
          sleepBlocking(5);
          yield 0;
        }
      }
      return yield* sweep.runChunk(request, chunk);
    },
  };
}

const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('Redis going down and up several times while a chunk runs', () => {
  it('the job completes with the undisturbed result: outage stalls do not count against maxStalledCount', async () => {
    const queueName = `test-${randomUUID()}`;
    const events: WorkerEvent[] = [];
    const worker = startBullmqWorker({
      redisUrl: redis.url,
      queueName,
      computations: { ...JOB_COMPUTATIONS, sweep: sweepWithSlowChunkZero() },
      shutdownGraceMs: 0,
      onEvent: (event) => events.push(event),
    });
    const runner = createBullmqRunner({ redisUrl: redis.url, queueName, timeoutMs: 10_000 });
    try {
      await worker.ready;
      const { id } = await runner.submit('sweep', REQUEST);
      const chunkZero = `${id}-chunk-0`;
      const startsOfChunkZero = () =>
        events.filter((event) => event.event === 'started' && event.jobId === chunkZero).length;
      for (let outage = 1; outage <= OUTAGES; outage += 1) {
        // Chunk 0 is running (for the outage-th time) when Redis goes down.
        const deadline = Date.now() + 30_000;
        while (startsOfChunkZero() < outage) {
          if (Date.now() > deadline) throw new Error(`chunk 0 did not start run ${outage}`);
          await pause(20);
        }
        await pause(BEFORE_KILL_MS);
        await redis.server.kill('SIGKILL');
        await pause(OUTAGE_MS);
        await redis.server.restart();
      }
      const record = await waitForFinish(runner, id);
      expect(record.failureReason).toBeUndefined();
      expect(record.state).toBe('completed');
      expect(canonicalJson(record.result)).toBe(canonicalJson(await referenceSweep(REQUEST)));
      // Each outage did take chunk 0 from its worker as stalled (so the test is not vacuous).
      const stalls = events.filter(
        (event) => event.event === 'stalled' && event.jobId === chunkZero,
      );
      expect(stalls).toHaveLength(OUTAGES);
    } finally {
      await runner.close();
      await worker.close();
    }
  }, 120_000);
});
