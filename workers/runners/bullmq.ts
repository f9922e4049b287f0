import { randomUUID } from 'node:crypto';
import { Queue } from 'bullmq';
import { Redis } from 'ioredis';
import { BackendUnavailableError } from './backend-unavailable-error.js';
import { CANCELLATION_TTL_MS, bullmqCancellationKeys } from './bullmq-cancellation.js';
import { bullmqJobRecord } from './bullmq-job-record.js';
import { BULLMQ_SETTINGS, DEFAULT_QUEUE_NAME } from './bullmq-settings.js';
import type { CancelOutcome, JobKind, JobRecord, JobRunner } from './job-runner.js';
import { JOB_RETRY_POLICIES, type JobRetryPolicy } from './job-retry-policy.js';

/** Options of the BullMQ producer. */
export interface BullmqRunnerOptions {
  /** Redis URL, for example redis://localhost:6379/0. */
  redisUrl: string;
  /** Queue the workers consume. @defaultValue 'converter-jobs' */
  queueName?: string;
  /** Longest wait for Redis before a call fails with BackendUnavailableError, ms. @defaultValue 1000 */
  timeoutMs?: number;
  /** Attempts and backoff per job kind. @defaultValue JOB_RETRY_POLICIES */
  retryPolicies?: Record<JobKind, JobRetryPolicy>;
}

const DEFAULTS = {
  queueName: DEFAULT_QUEUE_NAME,
  timeoutMs: 1000,
  retryPolicies: JOB_RETRY_POLICIES,
} satisfies Required<Omit<BullmqRunnerOptions, 'redisUrl'>>;

class RedisTimeoutError extends Error {}

function withTimeout<T>(work: Promise<T>, timeoutMs: number): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<never>((_, reject) => {
    timer = setTimeout(
      () => reject(new RedisTimeoutError(`no answer in ${timeoutMs} ms`)),
      timeoutMs,
    );
  });
  return Promise.race([work, timeout]).finally(() => clearTimeout(timer));
}

/**
 * A JobRunner on BullMQ for the API side: it enqueues, reads state and cancels; worker processes
 * (workers/worker.ts) compute. Calls fail fast with BackendUnavailableError when Redis cannot
 * be reached. See bullmq-cancellation.ts for how cancel reaches another process.
 */
export function createBullmqRunner(options: BullmqRunnerOptions): JobRunner {
  const { redisUrl, queueName, timeoutMs, retryPolicies } = { ...DEFAULTS, ...options };
  // A producer never blocks, so it may fail fast: no offline queue, one retry per command.
  const client = new Redis(redisUrl, {
    enableOfflineQueue: false,
    maxRetriesPerRequest: 1,
    connectTimeout: timeoutMs,
    retryStrategy: (times) => Math.min(times * 200, 2000),
  });
  client.on('error', () => {
    // Connection errors surface as BackendUnavailableError on the next call.
  });
  const queue = new Queue(queueName, { connection: client });
  queue.on('error', () => {});
  const keys = bullmqCancellationKeys(queueName);
  let closed = false;

  /** Resolves once the connection is ready; rejects at once when it is down, not connecting. */
  async function connected(): Promise<void> {
    if (closed) throw new BackendUnavailableError('the BullMQ job runner is closed');
    if (client.status === 'ready') return;
    if (client.status !== 'connecting' && client.status !== 'connect') {
      throw new BackendUnavailableError(`Redis is unreachable (connection ${client.status})`);
    }
    let onReady = (): void => {};
    let onClose = (): void => {};
    await withTimeout(
      new Promise<void>((resolve, reject) => {
        onReady = resolve;
        onClose = () => reject(new Error('connection closed'));
        client.once('ready', onReady);
        client.once('close', onClose);
      }),
      timeoutMs,
    )
      .catch((cause: unknown) => {
        throw new BackendUnavailableError('Redis is unreachable', { cause });
      })
      .finally(() => {
        client.off('ready', onReady);
        client.off('close', onClose);
      });
  }

  /** Runs one exchange with Redis; a dead or silent connection becomes BackendUnavailableError. */
  async function guarded<T>(work: () => Promise<T>): Promise<T> {
    await connected();
    try {
      return await withTimeout(work(), timeoutMs);
    } catch (cause) {
      if (cause instanceof RedisTimeoutError || client.status !== 'ready') {
        throw new BackendUnavailableError('Redis did not answer', { cause });
      }
      throw cause;
    }
  }

  async function read(id: string): Promise<JobRecord | undefined> {
    // State first: a job read after its state is never older than the state.
    const state = await queue.getJobState(id);
    const job = state === 'unknown' ? undefined : await queue.getJob(id);
    if (job) return bullmqJobRecord(job, state);
    const kept = await client.get(keys.recordKey(id));
    return kept === null ? undefined : (JSON.parse(kept) as JobRecord);
  }

  async function cancelActive(id: string): Promise<CancelOutcome> {
    await client.set(keys.markKey(id), '1', 'PX', CANCELLATION_TTL_MS);
    await client.publish(keys.channel, id);
    // It may have finished before the mark landed; then the cancel did nothing.
    const after = await read(id);
    if (after?.state === 'completed' || after?.state === 'failed') return 'already-finished';
    return 'cancelled';
  }

  return {
    submit(kind, payload) {
      const policy = retryPolicies[kind];
      return guarded(async () => {
        const job = await queue.add(kind, payload ?? null, {
          jobId: randomUUID(),
          attempts: policy.attempts,
          backoff: { type: 'exponential', delay: policy.backoffMs },
          removeOnComplete: BULLMQ_SETTINGS.keepCompleted,
          removeOnFail: BULLMQ_SETTINGS.keepFailed,
        });
        return bullmqJobRecord(job, 'waiting');
      });
    },

    get(id) {
      return guarded(() => read(id));
    },

    cancel(id) {
      return guarded(async (): Promise<CancelOutcome> => {
        const state = await queue.getJobState(id);
        if (state === 'unknown') {
          return (await client.exists(keys.recordKey(id))) ? 'already-finished' : 'not-found';
        }
        if (state === 'completed' || state === 'failed') return 'already-finished';
        if (state === 'active') return cancelActive(id);
        const job = await queue.getJob(id);
        if (!job) return 'already-finished';
        // Keep the record before removing, so a reader never finds neither job nor record.
        const record: JobRecord = {
          ...bullmqJobRecord(job, state),
          state: 'cancelled',
          finishedAt: new Date().toISOString(),
        };
        delete record.failureReason;
        await client.set(keys.recordKey(id), JSON.stringify(record), 'PX', CANCELLATION_TTL_MS);
        if ((await queue.remove(id)) === 1) return 'cancelled';
        // A worker took it in the meantime (remove answers 0 for a locked job).
        await client.del(keys.recordKey(id));
        return cancelActive(id);
      });
    },

    async isReady() {
      try {
        await connected();
        return (await withTimeout(client.ping(), Math.min(timeoutMs, 500))) === 'PONG';
      } catch {
        return false;
      }
    },

    async close() {
      if (closed) return;
      closed = true;
      await withTimeout(queue.close(), timeoutMs).catch(() => {});
      await withTimeout(client.quit(), timeoutMs).catch(() => client.disconnect());
    },
  };
}
