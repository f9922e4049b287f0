import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { canonicalJson } from '../../solvers/index.js';
import { createBullmqRunner } from '../../workers/runners/bullmq.js';
import { BULLMQ_SETTINGS } from '../../workers/runners/bullmq-settings.js';
import { referenceSweep } from '../contracts/runner-contract.js';
import { largeSweepRequest } from '../helpers/sweep-requests.js';
import { useTestRedis } from '../helpers/use-test-redis.js';
import { waitForFinish } from '../helpers/wait-for-job.js';
import { startWorkerProcess } from '../helpers/worker-process.js';

// Issue 6, faults: Redis going down and up again several times while one chunk runs. Each
// outage outlasts the worker's lock, so each time the stall check takes the chunk from its
// living worker and queues it again. Those re-runs are not the chunk's fault: the job must
// complete with the undisturbed result however many outages there are, while a chunk whose
// worker dies (bullmq-runner.test.ts, SIGKILL) still counts against maxStalledCount. Redis
// runs with append-only persistence, as in docker-compose.yml; the worker is a process of its
// own, as in production.

const redis = useTestRedis({ appendOnly: true });

// More outages than maxStalledCount allows stalls.
const OUTAGES = BULLMQ_SETTINGS.maxStalledCount + 1;
// Each outage outlasts the lock, so the chunk is surely taken as stalled.
const OUTAGE_MS = BULLMQ_SETTINGS.lockDurationMs + 1_000;
// The append-only file is written every second: Redis goes down this long after the chunk
// started, so the chunk's start is on disk.
const BEFORE_KILL_MS = 1_200;
// One chunk of 2400 frequencies × 3 inputs × 3 loads = 21,600 points of the invented flyback of
// the test helpers: each frequency a real choice, its transformer designed, so a few seconds of
// work, and the chunk is still running when Redis goes down. The engine keeps getting faster:
// 4 frequencies × 120 inputs, once several seconds, took 0.4 s with solver 0.5.0, and 800
// frequencies finished in 1.17 s with solver 0.10.0, before the kill (2026-12-03).
const REQUEST = largeSweepRequest({ frequencyCount: 2400, inputCount: 3, chunkPointCount: 21600 });
// Room for a busy shared 2-core machine: a guard against a hung test, not a speed check.
const GUARD_MS = 180_000;

const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('Redis going down and up several times while a chunk runs', () => {
  it(
    'the job completes with the undisturbed result: outage stalls do not count against maxStalledCount',
    async () => {
      const queueName = `test-${randomUUID()}`;
      const worker = await startWorkerProcess({
        REDIS_URL: redis.url,
        QUEUE_NAME: queueName,
        WORKER_SHUTDOWN_GRACE_MS: '0',
      });
      const runner = createBullmqRunner({ redisUrl: redis.url, queueName, timeoutMs: 10_000 });
      try {
        const { id } = await runner.submit('sweep', REQUEST);
        const chunk = `${id}-chunk-0`;
        const eventsOfChunk = (event: string) =>
          worker.events.filter((seen) => seen.event === event && seen.jobId === chunk);
        for (let outage = 1; outage <= OUTAGES; outage += 1) {
          // The chunk is running (for the outage-th time) when Redis goes down.
          await worker.waitForEvent(() => eventsOfChunk('started').length >= outage);
          await pause(BEFORE_KILL_MS);
          expect(eventsOfChunk('completed')).toEqual([]);
          await redis.server.kill('SIGKILL');
          await pause(OUTAGE_MS);
          await redis.server.restart();
        }
        // The producer reconnects on its own, within about a second of Redis answering.
        while (!(await runner.isReady())) await pause(100);
        const record = await waitForFinish(runner, id);
        expect(record.failureReason).toBeUndefined();
        expect(record.state).toBe('completed');
        expect(canonicalJson(record.result)).toBe(canonicalJson(await referenceSweep(REQUEST)));
        // Each outage did take the chunk from its worker as stalled (the test is not vacuous),
        // and the worker gave each of those stalls back.
        expect(eventsOfChunk('stalled')).toHaveLength(OUTAGES);
        expect(eventsOfChunk('lock-lost')).toHaveLength(OUTAGES);
      } finally {
        await runner.close();
        await worker.stop();
      }
    },
    GUARD_MS,
  );
});
