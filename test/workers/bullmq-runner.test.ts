import { randomUUID } from 'node:crypto';
import { spawn } from 'node:child_process';
import { FlowProducer, Queue } from 'bullmq';
import { afterAll, describe, expect, it } from 'vitest';
import {
  canonicalJson,
  type JobResult,
  type SweepRequestInput,
  type SweepResult,
} from '../../solvers/index.js';
import { BackendUnavailableError } from '../../workers/runners/backend-unavailable-error.js';
import { createBullmqRunner } from '../../workers/runners/bullmq.js';
import { ownerJobsKey } from '../../workers/runners/bullmq-owner-jobs.js';
import { bullmqCancellationKeys } from '../../workers/runners/bullmq-cancellation.js';
import {
  progressKey,
  reportChunkProgress,
  storedChunkProgress,
} from '../../workers/runners/bullmq-chunked-jobs.js';
import { referenceSweep, runnerContract } from '../contracts/runner-contract.js';
import { freePort, startRedisServer } from '../helpers/redis-server.js';
import { largeSweepRequest, smallSweepRequest } from '../helpers/sweep-requests.js';
import { useTestRedis } from '../helpers/use-test-redis.js';
import { waitForFinish, waitForJob } from '../helpers/wait-for-job.js';
import { startWorkerProcess, type TestWorkerProcess } from '../helpers/worker-process.js';

const redis = useTestRedis();

type SweepJobResult = JobResult<SweepResult>;

function uniqueQueueName(): string {
  return `test-${randomUUID()}`;
}

/** A worker process with a queue of its own (a unique name per test). */
interface QueueWithWorker {
  queueName: string;
  worker: TestWorkerProcess;
}

// Starting a worker process (tsx, bullmq) takes seconds, so the next test's worker is started
// while the current test runs, and tests do not wait for it: jobs wait in the queue until it
// takes them, as in production. Grace 0: on SIGTERM a running job is handed back at once.
let spare: Promise<QueueWithWorker> | undefined;
function startQueueWithWorker(): Promise<QueueWithWorker> {
  const queueName = uniqueQueueName();
  const env = { REDIS_URL: redis.url, QUEUE_NAME: queueName, WORKER_SHUTDOWN_GRACE_MS: '0' };
  const started = startWorkerProcess(env, { waitUntilReady: false }).then((worker) => ({
    queueName,
    worker,
  }));
  started.catch(() => {});
  return started;
}
const isReadyEvent = (event: Record<string, unknown>) => event.event === 'ready';
function takeQueueWithWorker(options: { warmNext: boolean }): Promise<QueueWithWorker> {
  const next = spare ?? startQueueWithWorker();
  spare = options.warmNext ? startQueueWithWorker() : undefined;
  return next;
}
afterAll(async () => {
  const left = await spare?.catch(() => undefined);
  await left?.worker.stop();
});

/** Removes every trace of the queue: BullMQ's keys (obliterate) and the cancellation keys. */
async function obliterate(queueName: string): Promise<void> {
  const queue = new Queue(queueName, { connection: redis.admin });
  await queue.obliterate({ force: true });
  await queue.close();
  const leftovers = await redis.admin.keys(`bull:${queueName}:*`);
  if (leftovers.length > 0) await redis.admin.del(...leftovers);
}

async function attemptsMade(queueName: string, id: string): Promise<number> {
  const queue = new Queue(queueName, { connection: redis.admin });
  const job = await queue.getJob(id);
  await queue.close();
  return job?.attemptsMade ?? 0;
}

// The shared test machine can be very busy: give Redis exchanges room (a guard, not a check).
const TIMEOUT_MS = 10_000;
// Tests with two worker processes and an embedded reference: room on a busy 2-core machine
// (a guard against a hung test, not a speed check).
const MULTI_PROCESS_GUARD_MS = 180_000;

runnerContract('bullmq', async () => {
  const { queueName, worker } = await takeQueueWithWorker({ warmNext: true });
  const runner = createBullmqRunner({ redisUrl: redis.url, queueName, timeoutMs: TIMEOUT_MS });
  return {
    runner,
    async close() {
      await runner.close();
      await worker.stop();
      await obliterate(queueName);
    },
  };
});

describe('createBullmqRunner', () => {
  it(
    '1 worker, 2 workers and the embedded backend give byte-identical result JSON',
    async () => {
      const taken = takeQueueWithWorker({ warmNext: true });
      const { queueName, worker: first } = await taken;
      const workers: TestWorkerProcess[] = [first];
      const runner = createBullmqRunner({ redisUrl: redis.url, queueName, timeoutMs: TIMEOUT_MS });
      try {
        // 300 points in 15 chunks of 20.
        const request = largeSweepRequest({
          frequencyCount: 20,
          inputCount: 5,
          chunkPointCount: 20,
        });
        const runOnce = async () => {
          const { id } = await runner.submit('sweep', request);
          const record = await waitForFinish(runner, id);
          expect(record.state).toBe('completed');
          return { id, json: canonicalJson(record.result) };
        };
        await first.waitForEvent(isReadyEvent);
        const alone = await runOnce();
        workers.push(await startWorkerProcess({ REDIS_URL: redis.url, QUEUE_NAME: queueName }));
        const shared = await runOnce();
        const embedded = canonicalJson(await referenceSweep(request));
        expect(alone.json).toBe(embedded);
        expect(shared.json).toBe(embedded);
        // Both processes ran chunks of the shared job.
        const chunkPrefix = `${shared.id}-chunk-`;
        for (const worker of workers) {
          const chunksDone = worker.events.filter(
            (event) => event.event === 'completed' && String(event.jobId).startsWith(chunkPrefix),
          );
          expect(chunksDone.length).toBeGreaterThan(0);
        }
      } finally {
        await runner.close();
        await Promise.all(workers.map((worker) => worker.stop()));
        await obliterate(queueName);
      }
    },
    MULTI_PROCESS_GUARD_MS,
  );

  it(
    'a worker killed mid-chunk (SIGKILL) loses nothing: the job completes with the embedded result',
    async () => {
      const taken = takeQueueWithWorker({ warmNext: true });
      const { queueName, worker: doomed } = await taken;
      const survivor = await startWorkerProcess({ REDIS_URL: redis.url, QUEUE_NAME: queueName });
      await doomed.waitForEvent(isReadyEvent);
      const runner = createBullmqRunner({ redisUrl: redis.url, queueName, timeoutMs: TIMEOUT_MS });
      // 600 points in 12 chunks of 50 (each a good fraction of a second, so a kill lands mid-chunk).
      const request: SweepRequestInput = largeSweepRequest({
        frequencyCount: 40,
        inputCount: 5,
        chunkPointCount: 50,
      });
      try {
        const { id } = await runner.submit('sweep', request);
        // The doomed worker has started a chunk and not finished it.
        const started = await doomed.waitForEvent(
          (event) => event.event === 'started' && String(event.jobId).startsWith(`${id}-chunk-`),
        );
        const heldChunk = String(started.jobId);
        expect(await doomed.stop('SIGKILL')).toBeNull();
        expect(doomed.events.some((e) => e.event === 'completed' && e.jobId === heldChunk)).toBe(
          false,
        );
        const record = await waitForFinish(runner, id);
        expect(record.state).toBe('completed');
        // The survivor found the dead worker's chunk by its expired lock and ran it again.
        expect(survivor.events.some((e) => e.event === 'stalled' && e.jobId === heldChunk)).toBe(
          true,
        );
        expect(survivor.events.some((e) => e.event === 'completed' && e.jobId === heldChunk)).toBe(
          true,
        );
        expect(record.progress).toMatchObject({ done: record.progress.total });
        expect(canonicalJson(record.result)).toBe(canonicalJson(await referenceSweep(request)));
      } finally {
        await runner.close();
        await survivor.stop();
        await doomed.stop();
        await obliterate(queueName);
      }
    },
    MULTI_PROCESS_GUARD_MS,
  );

  it("a parent whose input the worker's schema refuses (another producer's) fails once, naming the field", async () => {
    const { queueName, worker } = await takeQueueWithWorker({ warmNext: true });
    // createBullmqRunner refuses such an input; a producer of another version might not.
    const flows = new FlowProducer({ connection: redis.admin });
    const runner = createBullmqRunner({ redisUrl: redis.url, queueName, timeoutMs: TIMEOUT_MS });
    try {
      const id = randomUUID();
      await flows.add({
        name: 'sweep',
        queueName,
        data: { request: { spec: { topology: 'flyback' } }, total: 0 },
        opts: { jobId: id, attempts: 3 },
      });
      const record = await waitForFinish(runner, id);
      expect(record.state).toBe('failed');
      expect(record.failureReason).toMatch(/^invalid sweep payload: .*spec\.inputVoltageMinV/);
      expect(await attemptsMade(queueName, id)).toBe(1);
    } finally {
      await flows.close();
      await runner.close();
      await worker.stop();
      await obliterate(queueName);
    }
  });

  it('SIGTERM hands a running chunk back to the queue and another worker completes the job', async () => {
    const { queueName, worker: first } = await takeQueueWithWorker({ warmNext: false });
    const env = { REDIS_URL: redis.url, QUEUE_NAME: queueName };
    const runner = createBullmqRunner({ redisUrl: redis.url, queueName, timeoutMs: TIMEOUT_MS });
    let second: TestWorkerProcess | undefined;
    try {
      const { id } = await runner.submit(
        'sweep',
        largeSweepRequest({ frequencyCount: 100, inputCount: 2, chunkPointCount: 100 }),
      );
      await waitForJob(runner, id, (record) => record.state === 'running');
      expect(await first.stop('SIGTERM')).toBe(0);
      const handedBack = first.events.filter(
        (e) => e.event === 'handed-back' && String(e.jobId).startsWith(`${id}-chunk-`),
      );
      expect(handedBack).toHaveLength(1);
      // A chunk has started, so the job counts as running while it waits for a worker.
      expect((await runner.get(id))?.state).toBe('running');
      second = await startWorkerProcess(env);
      const record = await waitForFinish(runner, id);
      expect(record.state).toBe('completed');
      expect((record.result as SweepJobResult).output.rows).toHaveLength(100 * 2 * 3);
    } finally {
      await runner.close();
      await first.stop();
      await second?.stop();
      await obliterate(queueName);
    }
  });

  it("unfinishedCount(owner) reads only that owner's set of job ids and forgets finished ones", async () => {
    // No worker: the jobs stay queued.
    const queueName = uniqueQueueName();
    const runner = createBullmqRunner({ redisUrl: redis.url, queueName, timeoutMs: TIMEOUT_MS });
    try {
      const first = await runner.submit('sweep', smallSweepRequest(), { owner: 'tenant-a' });
      const second = await runner.submit('sweep', smallSweepRequest(), { owner: 'tenant-a' });
      for (let i = 0; i < 5; i += 1) {
        await runner.submit('sweep', smallSweepRequest(), { owner: 'tenant-b' });
      }
      expect(await runner.unfinishedCount('tenant-a')).toBe(2);
      expect(await runner.unfinishedCount('tenant-b')).toBe(5);
      // The count reads tenant-a's own set, whatever else waits in the queue.
      const key = ownerJobsKey(queueName, 'tenant-a');
      expect((await redis.admin.smembers(key)).sort()).toEqual([first.id, second.id].sort());
      expect(await runner.cancel(first.id)).toBe('cancelled');
      expect(await runner.unfinishedCount('tenant-a')).toBe(1);
      // The cancelled job's id left the set as it was counted.
      expect(await redis.admin.smembers(key)).toEqual([second.id]);
    } finally {
      await runner.close();
      await obliterate(queueName);
    }
  });

  it("reportChunkProgress only raises a chunk's count, so a chunk run again is never counted twice", async () => {
    const queueName = uniqueQueueName();
    const keys = {
      progressKey: progressKey(queueName, 'job-a'),
      markKey: bullmqCancellationKeys(queueName).markKey('job-a'),
    };
    try {
      expect(await reportChunkProgress(redis.admin, keys, 0, 0)).toBe(false);
      await reportChunkProgress(redis.admin, keys, 0, 30);
      await reportChunkProgress(redis.admin, keys, 1, 50);
      // Chunk 0's worker died; another runs it again from its start.
      await reportChunkProgress(redis.admin, keys, 0, 0);
      await reportChunkProgress(redis.admin, keys, 0, 10);
      const stored = storedChunkProgress(await redis.admin.hgetall(keys.progressKey));
      expect(stored.done).toBe(80);
      expect(stored.startedAtMs).toBeTypeOf('number');
      expect(stored.lastProgressAtMs).toBeGreaterThanOrEqual(stored.startedAtMs ?? Infinity);
      await reportChunkProgress(redis.admin, keys, 0, 40);
      expect(storedChunkProgress(await redis.admin.hgetall(keys.progressKey)).done).toBe(90);
      // A report answers whether the job carries a cancel mark.
      await redis.admin.set(keys.markKey, '1');
      expect(await reportChunkProgress(redis.admin, keys, 1, 60)).toBe(true);
    } finally {
      await redis.admin.del(keys.progressKey, keys.markKey);
    }
  });

  it('submit() rejects with BackendUnavailableError when Redis is unreachable', async () => {
    const runner = createBullmqRunner({ redisUrl: `redis://127.0.0.1:${await freePort()}` });
    await expect(runner.submit('sweep', smallSweepRequest())).rejects.toBeInstanceOf(
      BackendUnavailableError,
    );
    await expect(runner.get('any')).rejects.toBeInstanceOf(BackendUnavailableError);
    expect(await runner.isReady()).toBe(false);
    await runner.close();
  });

  it('submit() and get() reject with BackendUnavailableError once Redis goes away', async () => {
    const ownRedis = await startRedisServer();
    const runner = createBullmqRunner({ redisUrl: ownRedis.url, queueName: uniqueQueueName() });
    try {
      const { id } = await runner.submit('sweep', smallSweepRequest());
      expect((await runner.get(id))?.state).toBe('queued');
      expect(await runner.isReady()).toBe(true);
      await ownRedis.stop();
      await expect(runner.submit('sweep', smallSweepRequest())).rejects.toBeInstanceOf(
        BackendUnavailableError,
      );
      await expect(runner.get(id)).rejects.toBeInstanceOf(BackendUnavailableError);
      expect(await runner.isReady()).toBe(false);
    } finally {
      await runner.close();
      await ownRedis.stop();
    }
  });

  it('workers/worker.ts exits with code 2 and names REDIS_URL when it is missing', async () => {
    const env = { ...process.env };
    delete env.REDIS_URL;
    const child = spawn(process.execPath, ['--import', 'tsx', 'workers/worker.ts'], {
      cwd: new URL('../../', import.meta.url),
      env,
      stdio: ['ignore', 'ignore', 'pipe'],
    });
    let stderr = '';
    child.stderr.setEncoding('utf8');
    child.stderr.on('data', (chunk: string) => (stderr += chunk));
    const code = await new Promise((resolve) => child.once('exit', resolve));
    expect(code).toBe(2);
    expect(stderr).toMatch(/REDIS_URL/);
  });
});
