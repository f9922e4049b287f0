import { randomUUID } from 'node:crypto';
import { FlowProducer, Queue, QueueEvents, type FlowJob, type Job } from 'bullmq';
import { Redis } from 'ioredis';
import { jobComputation, type JobPlan } from '../../solvers/index.js';
import { decodeJobRequest } from '../chunks/decode-job-request.js';
import { BackendUnavailableError } from './backend-unavailable-error.js';
import { CANCELLATION_TTL_MS, bullmqCancellationKeys } from './bullmq-cancellation.js';
import {
  chunkJobId,
  chunkJobName,
  parseJobName,
  progressKey,
  storedChunkProgress,
  type ChunkJobData,
  type ParentJobData,
} from './bullmq-chunked-jobs.js';
import { bullmqJobRecord } from './bullmq-job-record.js';
import { BULLMQ_SETTINGS, DEFAULT_QUEUE_NAME } from './bullmq-settings.js';
import { reconnectDelayMs } from './redis-reconnect.js';
import type { CancelOutcome, JobKind, JobRecord, JobRunner } from './job-runner.js';
import { JOB_RETRY_POLICIES, type JobRetryPolicy } from './job-retry-policy.js';
import { JobQuotaError } from './job-quota-error.js';
import {
  admitOwnerJob,
  confirmOwnerJob,
  countOwnerJobs,
  releaseOwnerJob,
} from './bullmq-owner-jobs.js';

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
  /**
   * Longest one chunk may run, ms, stamped on every job submitted so each worker applies the
   * same limit; past it the job fails (never retried). @defaultValue no limit
   */
  chunkTimeoutMs?: number;
  /**
   * Told of every job of the queue that ends (completed, failed or cancelled), with its record,
   * whichever process submitted it: the runner then follows the queue's event stream
   * (QueueEvents). For metrics; every producer given it is told of every job. @defaultValue none
   */
  onFinished?: (record: JobRecord) => void;
}

const DEFAULTS = {
  queueName: DEFAULT_QUEUE_NAME,
  timeoutMs: 1000,
  retryPolicies: JOB_RETRY_POLICIES,
} satisfies Required<Omit<BullmqRunnerOptions, 'redisUrl' | 'chunkTimeoutMs' | 'onFinished'>>;

class RedisTimeoutError extends Error {}

/** A chunk's job id (`<parent id>-chunk-<index>`, see chunkJobId). */
const CHUNK_ID = /-chunk-\d+$/;

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
 * A JobRunner on BullMQ for the API side: it enqueues each job as a flow (a parent and one child
 * per chunk, see bullmq-chunked-jobs.ts), reads state and progress, and cancels; worker
 * processes (workers/worker.ts) compute. Calls fail fast with BackendUnavailableError when Redis
 * cannot be reached. See bullmq-cancellation.ts for how cancel reaches another process.
 */
export function createBullmqRunner(options: BullmqRunnerOptions): JobRunner {
  const { redisUrl, queueName, timeoutMs, retryPolicies, chunkTimeoutMs, onFinished } = {
    ...DEFAULTS,
    ...options,
  };
  // A producer never blocks, so it may fail fast: no offline queue, one retry per command.
  const client = new Redis(redisUrl, {
    enableOfflineQueue: false,
    maxRetriesPerRequest: 1,
    connectTimeout: timeoutMs,
    retryStrategy: reconnectDelayMs,
  });
  client.on('error', () => {
    // Connection errors surface as BackendUnavailableError on the next call.
  });
  const queue = new Queue(queueName, { connection: client });
  queue.on('error', () => {});
  const flows = new FlowProducer({ connection: client });
  flows.on('error', () => {});
  const keys = bullmqCancellationKeys(queueName);
  let closed = false;
  const events = onFinished === undefined ? undefined : followFinishedJobs(onFinished);

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

  /**
   * Runs one exchange with Redis; a dead or silent connection becomes BackendUnavailableError.
   * `extraMs` lengthens the wait for an exchange whose size grows with the job (a flow's chunks).
   */
  async function guarded<T>(work: () => Promise<T>, extraMs = 0): Promise<T> {
    await connected();
    try {
      return await withTimeout(work(), timeoutMs + extraMs);
    } catch (cause) {
      if (cause instanceof RedisTimeoutError || client.status !== 'ready') {
        throw new BackendUnavailableError('Redis did not answer', { cause });
      }
      throw cause;
    }
  }

  /** The reason a failed parent shows: BullMQ names the failed child; show that child's reason. */
  async function failureReasonOf(job: Job): Promise<string | undefined> {
    const pointer = /^child bull:[^:]+:(.+) failed$/.exec(job.failedReason ?? '');
    if (pointer?.[1] === undefined) return job.failedReason;
    const child = await queue.getJob(pointer[1]);
    return child?.failedReason ?? job.failedReason;
  }

  async function read(id: string): Promise<JobRecord | undefined> {
    // State first: a job read after its state is never older than the state.
    const state = await queue.getJobState(id);
    const job = state === 'unknown' ? undefined : await queue.getJob(id);
    if (job) {
      // A chunk's id is not a job of the API.
      if (parseJobName(job.name).role !== 'parent') return undefined;
      const progress = storedChunkProgress(await client.hgetall(progressKey(queueName, id)));
      const reading =
        state === 'failed' ? { progress, failureReason: await failureReasonOf(job) } : { progress };
      return bullmqJobRecord(job, state, reading);
    }
    const kept = await client.get(keys.recordKey(id));
    return kept === null ? undefined : (JSON.parse(kept) as JobRecord);
  }

  /**
   * Follows the queue's event stream on a connection of its own (it blocks reading), and tells
   * `notify` of every job (a flow's parent, not its chunks) that completes or fails, read as a
   * record: a cancelled active job fails with the cancel reason and reads 'cancelled'. A waiting
   * job removed by cancel() leaves no event; cancel() tells `notify` itself.
   */
  function followFinishedJobs(notify: (record: JobRecord) => void) {
    const connection = new Redis(redisUrl, {
      maxRetriesPerRequest: null,
      retryStrategy: reconnectDelayMs,
    });
    connection.on('error', () => {});
    const ended = ({ jobId }: { jobId: string }) => {
      if (CHUNK_ID.test(jobId)) return;
      guarded(() => read(jobId)).then(
        (record) => {
          const isFinished =
            record?.state === 'completed' ||
            record?.state === 'failed' ||
            record?.state === 'cancelled';
          if (record !== undefined && isFinished) notify(record);
        },
        () => {
          // Redis went away between the event and the read: this job goes uncounted.
        },
      );
    };
    // The stream is read from the moment the runner was made, on Redis's clock, so no job that
    // ends after it is missed while the reader starts.
    const following = (async () => {
      const [seconds, microseconds] = await connection.time();
      const startMs = Number(seconds) * 1000 + Math.floor(Number(microseconds) / 1000);
      const queueEvents = new QueueEvents(queueName, {
        connection,
        autorun: false,
        lastEventId: `${startMs}-0`,
      });
      queueEvents.on('error', () => {});
      queueEvents.on('completed', ended);
      queueEvents.on('failed', ended);
      queueEvents.run().catch(() => {});
      return queueEvents;
    })();
    following.catch(() => {});
    return {
      async close() {
        const queueEvents = await withTimeout(following, timeoutMs).catch(() => undefined);
        await withTimeout(queueEvents?.close() ?? Promise.resolve(), timeoutMs).catch(() => {});
        connection.disconnect();
      },
    };
  }

  async function cancelActive(id: string): Promise<CancelOutcome> {
    await client.set(keys.markKey(id), '1', 'PX', CANCELLATION_TTL_MS);
    await client.publish(keys.channel, id);
    // It may have finished before the mark landed; then the cancel did nothing.
    const after = await read(id);
    if (after?.state === 'completed' || after?.state === 'failed') {
      await client.del(keys.markKey(id));
      return 'already-finished';
    }
    return 'cancelled';
  }

  return {
    submit(kind, payload, options = {}) {
      const policy = retryPolicies[kind];
      const computation = jobComputation(kind);
      if (computation === undefined) {
        throw new TypeError(`createBullmqRunner: no computation for job kind '${String(kind)}'`);
      }
      // A payload that fails its schema is refused here, naming the bad fields, before anything
      // is written: a job that is accepted has a plan and a chunk to start.
      let plan: JobPlan;
      try {
        plan = computation.plan(decodeJobRequest(kind, computation, payload));
      } catch (error) {
        return Promise.reject(error);
      }
      const id = randomUUID();
      const attemptOptions = {
        attempts: policy.attempts,
        backoff: { type: 'exponential', delay: policy.backoffMs },
      };
      const children: FlowJob[] = plan.chunks.map((chunk) => ({
        name: chunkJobName(kind),
        queueName,
        data: { chunk } satisfies ChunkJobData,
        opts: {
          ...attemptOptions,
          jobId: chunkJobId(id, chunk.index),
          failParentOnFailure: true,
          // A child's output is kept in its parent once it completes; finished children would
          // only crowd the parents out of the queue's kept jobs.
          removeOnComplete: true,
          removeOnFail: BULLMQ_SETTINGS.keepFailed,
        },
      }));
      const data: ParentJobData = {
        request: payload ?? null,
        total: plan.total,
        ...(options.owner === undefined ? {} : { owner: options.owner }),
        ...(chunkTimeoutMs === undefined ? {} : { chunkTimeoutMs }),
      };
      // Adding a flow writes one job per chunk: allow 1 ms more per chunk.
      const extraMs = children.length;
      const { owner, ownerUnfinishedMax } = options;
      return guarded(async () => {
        if (owner !== undefined) {
          // The place is taken before the flow is added, in one step with the count; it is held
          // past the longest this call may wait, and given back if the flow cannot be added.
          const admission = await admitOwnerJob(client, queueName, owner, id, {
            limit: ownerUnfinishedMax,
            holdMs: 2 * (timeoutMs + extraMs) + 1000,
            keepMs: BULLMQ_SETTINGS.keepFailed.age * 1000,
          });
          if (!admission.admitted) {
            throw new JobQuotaError(owner, admission.unfinished, ownerUnfinishedMax ?? Infinity);
          }
        }
        let job: Job;
        try {
          ({ job } = await flows.add({
            name: kind,
            queueName,
            data,
            opts: {
              ...attemptOptions,
              jobId: id,
              removeOnComplete: BULLMQ_SETTINGS.keepCompleted,
              removeOnFail: BULLMQ_SETTINGS.keepFailed,
            },
            children,
          }));
        } catch (error) {
          // Best effort: if Redis is gone, the admission key's time to live gives it back.
          if (owner !== undefined) {
            await releaseOwnerJob(client, queueName, owner, id).catch(() => {});
          }
          throw error;
        }
        // Best effort too: until it expires, a leftover admission key only counts a job whose
        // hash is gone (cancelled while waiting) a few seconds longer.
        if (owner !== undefined) await confirmOwnerJob(client, queueName, id).catch(() => {});
        return bullmqJobRecord(job, 'waiting', { progress: { done: 0 } });
      }, extraMs);
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
        const job = await queue.getJob(id);
        if (!job) return 'already-finished';
        if (parseJobName(job.name).role !== 'parent') return 'not-found';
        if (state === 'active') return cancelActive(id);
        // Keep the record before removing, so a reader never finds neither job nor record.
        const before = await read(id);
        if (before === undefined) return 'already-finished';
        const record: JobRecord = {
          ...before,
          state: 'cancelled',
          finishedAt: new Date().toISOString(),
        };
        delete record.failureReason;
        delete record.progress.etaS;
        await client.set(keys.recordKey(id), JSON.stringify(record), 'PX', CANCELLATION_TTL_MS);
        // The parent and every chunk go at once unless a worker holds a chunk (remove answers 0).
        if ((await queue.remove(id, { removeChildren: true })) === 1) {
          onFinished?.(record);
          return 'cancelled';
        }
        await client.del(keys.recordKey(id));
        // A chunk is running: mark the job, so the running chunk stops at its next report and
        // the parent, once processed, fails as cancelled; drop the chunks not yet taken.
        const outcome = await cancelActive(id);
        if (outcome === 'cancelled') await job.removeUnprocessedChildren();
        return outcome;
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

    unfinishedCount(owner) {
      // O(the owner's jobs not yet seen finished): its own set, pruned of finished jobs as it is
      // counted, so it holds about as many ids as the owner has unfinished jobs.
      return guarded(() => countOwnerJobs(client, queueName, owner));
    },

    counts() {
      return guarded(async () => {
        const counts = await queue.getJobCounts(
          'waiting',
          'prioritized',
          'delayed',
          'waiting-children',
          'active',
        );
        const waiting =
          (counts['waiting'] ?? 0) + (counts['prioritized'] ?? 0) + (counts['delayed'] ?? 0);
        return { waiting, running: counts['active'] ?? 0 };
      });
    },

    async close() {
      if (closed) return;
      closed = true;
      await events?.close();
      await withTimeout(flows.close(), timeoutMs).catch(() => {});
      await withTimeout(queue.close(), timeoutMs).catch(() => {});
      await withTimeout(client.quit(), timeoutMs).catch(() => client.disconnect());
    },
  };
}
