import { randomUUID } from 'node:crypto';
import { spawn } from 'node:child_process';
import { Queue } from 'bullmq';
import { Redis } from 'ioredis';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SweepJobResult } from '../../workers/handlers/sweep.js';
import { BackendUnavailableError } from '../../workers/runners/backend-unavailable-error.js';
import { createBullmqRunner } from '../../workers/runners/bullmq.js';
import { runnerContract } from '../contracts/runner-contract.js';
import { freePort, startRedisServer, type TestRedisServer } from '../helpers/redis-server.js';
import { largeSweepRequest, smallSweepRequest } from '../helpers/sweep-requests.js';
import { waitForFinish, waitForJob } from '../helpers/wait-for-job.js';
import { startWorkerProcess, type TestWorkerProcess } from '../helpers/worker-process.js';

let redis: TestRedisServer;
let admin: Redis;
beforeAll(async () => {
  redis = await startRedisServer();
  admin = new Redis(redis.url, { maxRetriesPerRequest: null });
});
afterAll(async () => {
  await admin?.quit();
  await redis?.stop();
});

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
  const queue = new Queue(queueName, { connection: admin });
  await queue.obliterate({ force: true });
  await queue.close();
  const leftovers = await admin.keys(`bull:${queueName}:*`);
  if (leftovers.length > 0) await admin.del(...leftovers);
}

async function attemptsMade(queueName: string, id: string): Promise<number> {
  const queue = new Queue(queueName, { connection: admin });
  const job = await queue.getJob(id);
  await queue.close();
  return job?.attemptsMade ?? 0;
}

runnerContract('bullmq', async () => {
  const { queueName, worker } = await takeQueueWithWorker({ warmNext: true });
  const runner = createBullmqRunner({ redisUrl: redis.url, queueName });
  return {
    runner,
    attemptsOf: (id) => attemptsMade(queueName, id),
    async close() {
      await runner.close();
      await worker.stop();
      await obliterate(queueName);
    },
  };
});

describe('createBullmqRunner', () => {
  it('two worker processes share one queue and every sweep completes with the same rows', async () => {
    const taken = takeQueueWithWorker({ warmNext: true });
    const { queueName } = await taken;
    const workers: TestWorkerProcess[] = [
      (await taken).worker,
      await startWorkerProcess({ REDIS_URL: redis.url, QUEUE_NAME: queueName }),
    ];
    await Promise.all(workers.map((worker) => worker.waitForEvent(isReadyEvent)));
    const runner = createBullmqRunner({ redisUrl: redis.url, queueName });
    try {
      const request = largeSweepRequest({ frequencyCount: 200, inputCount: 1 });
      const ids = [];
      for (let i = 0; i < 4; i += 1) ids.push((await runner.submit('sweep', request)).id);
      const records = await Promise.all(ids.map((id) => waitForFinish(runner, id)));
      const results = records.map((record) => record.result as SweepJobResult);
      expect(records.map((record) => record.state)).toEqual(Array(4).fill('completed'));
      for (const result of results.slice(1)) expect(result.sweep).toEqual(results[0]?.sweep);
      // Both processes took part: each logged at least one completed job.
      for (const worker of workers) {
        expect(worker.events.some((event) => event.event === 'completed')).toBe(true);
      }
    } finally {
      await runner.close();
      await Promise.all(workers.map((worker) => worker.stop()));
      await obliterate(queueName);
    }
  });

  it('SIGTERM hands a running job back to the queue and another worker completes it', async () => {
    const { queueName, worker: first } = await takeQueueWithWorker({ warmNext: false });
    const env = { REDIS_URL: redis.url, QUEUE_NAME: queueName };
    const runner = createBullmqRunner({ redisUrl: redis.url, queueName });
    let second: TestWorkerProcess | undefined;
    try {
      const { id } = await runner.submit(
        'sweep',
        largeSweepRequest({ frequencyCount: 200, inputCount: 2 }),
      );
      await waitForJob(runner, id, (record) => record.state === 'running');
      expect(await first.stop('SIGTERM')).toBe(0);
      expect(first.events.some((e) => e.event === 'handed-back' && e.jobId === id)).toBe(true);
      expect((await runner.get(id))?.state).toBe('queued');
      second = await startWorkerProcess(env);
      const record = await waitForFinish(runner, id);
      expect(record.state).toBe('completed');
      expect((record.result as SweepJobResult).sweep.rows).toHaveLength(200 * 2 * 3);
    } finally {
      await runner.close();
      await first.stop();
      await second?.stop();
      await obliterate(queueName);
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
