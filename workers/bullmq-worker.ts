import { hostname } from 'node:os';
import { Job, UnrecoverableError, WaitingError, Worker } from 'bullmq';
import { Redis } from 'ioredis';
import { jobResult, type AnyChunkedComputation } from '../solvers/index.js';
import { decodeJobRequest } from './chunks/decode-job-request.js';
import { driveChunk } from './chunks/drive-chunk.js';
import {
  CANCELLATION_TTL_MS,
  CANCELLED_FAILURE_REASON,
  bullmqCancellationKeys,
} from './runners/bullmq-cancellation.js';
import { chunkFailureReason, computing, isRetryable } from './chunks/chunk-failures.js';
import {
  parseJobName,
  progressKey,
  reportChunkProgress,
  type ChunkJobData,
  type ChunkJobOutput,
  type ParentJobData,
} from './runners/bullmq-chunked-jobs.js';
import { BULLMQ_SETTINGS, DEFAULT_QUEUE_NAME } from './runners/bullmq-settings.js';
import { creditOutageStall } from './runners/bullmq-outage-stalls.js';
import type { JobKind } from './runners/job-runner.js';
import { reconnectDelayMs } from './runners/redis-reconnect.js';

/** One thing that happened to a job (or to the worker), as the worker reports it. */
export interface WorkerEvent {
  event:
    | 'ready'
    | 'started'
    | 'completed'
    | 'failed'
    | 'cancelled'
    | 'handed-back'
    | 'stalled'
    | 'lock-lost'
    | 'error';
  worker: string;
  jobId?: string;
  kind?: string;
  /** Which attempt of the job this was (1 for the first). */
  attempt?: number;
  /** Wall time of the attempt, ms. */
  durationMs?: number;
  /** Why it failed; no stack trace. */
  reason?: string;
  /** Whether BullMQ will attempt a failed job again. */
  willRetry?: boolean;
}

/** Options of one worker process's consumer. */
export interface BullmqWorkerOptions {
  /** Redis URL, for example redis://localhost:6379/0. */
  redisUrl: string;
  /** Queue to consume. @defaultValue 'converter-jobs' */
  queueName?: string;
  /** Jobs computed at once by this worker. @defaultValue 1 */
  concurrency?: number;
  /** The computation of every job kind (normally JOB_COMPUTATIONS). */
  computations: Record<JobKind, AnyChunkedComputation>;
  /** How long close() lets running jobs finish before handing them back to the queue, ms. @defaultValue 10000 */
  shutdownGraceMs?: number;
  /** Receives every WorkerEvent. @defaultValue ignore them */
  onEvent?: (event: WorkerEvent) => void;
}

/** A running consumer: `ready` resolves once it takes jobs; `close` stops it gracefully. */
export interface BullmqWorkerHandle {
  ready: Promise<void>;
  close(): Promise<void>;
}

const DEFAULTS = {
  queueName: DEFAULT_QUEUE_NAME,
  concurrency: 1,
  shutdownGraceMs: 10_000,
  onEvent: () => {},
} satisfies Required<Omit<BullmqWorkerOptions, 'redisUrl' | 'computations'>>;

/** The parsed request of a job, read from its parent, and its chunk time limit. */
interface ParentRequest {
  parentId: string;
  request: unknown;
  chunkTimeoutMs?: number;
}

/** A job this worker is running, and why its signal was aborted. */
interface RunningJob {
  id: string;
  controller: AbortController;
  /** The id a cancel names: the job's own for a parent, its parent's for a chunk. */
  cancelId: string;
  /** The lock token of this run. */
  token?: string;
  /** Set once its lock was found lost in a Redis outage (its stall given back). */
  lockLost?: boolean;
  stop?: 'cancel' | 'hand-back' | 'lock-lost';
}

function messageOf(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

/**
 * Starts consuming `queueName`: chunks of chunked jobs (run through their computation, progress
 * written to the job's hash) and their parents (reduced once every chunk is done; see
 * runners/bullmq-chunked-jobs.ts). Cancel requests from any producer arrive by pub/sub (and by
 * a mark read at start, on every progress report and before completion); close() waits up to
 * shutdownGraceMs, then hands running jobs back to the queue.
 */
export function startBullmqWorker(options: BullmqWorkerOptions): BullmqWorkerHandle {
  const { redisUrl, queueName, concurrency, computations, shutdownGraceMs, onEvent } = {
    ...DEFAULTS,
    ...options,
  };
  const workerName = `${hostname()}:${process.pid}`;
  const report = (event: Omit<WorkerEvent, 'worker'>) => onEvent({ ...event, worker: workerName });
  const keys = bullmqCancellationKeys(queueName);
  // A worker blocks on Redis; BullMQ requires commands to wait for reconnection indefinitely.
  // Through a Redis outage the worker keeps its process and reconnects on its own.
  const connection = new Redis(redisUrl, {
    maxRetriesPerRequest: null,
    retryStrategy: reconnectDelayMs,
  });
  const subscriber = connection.duplicate();
  connection.on('error', () => {});
  subscriber.on('error', () => {});
  const running = new Map<string, RunningJob>();

  const stop = (id: string, why: NonNullable<RunningJob['stop']>) => {
    const job = running.get(id);
    if (!job) return;
    // A cancel outranks a hand-back: a cancelled job must not be run again.
    if (why === 'cancel' || job.stop === undefined) job.stop = why;
    job.controller.abort();
  };
  /** Stops every running job a cancel of `cancelId` concerns (a parent and its chunks). */
  const cancel = (cancelId: string) => {
    for (const [id, job] of running) if (job.cancelId === cancelId) stop(id, 'cancel');
  };
  /** Stops the chunks of a failed job: running ones abort, waiting ones are removed. */
  const stopSiblings = async (parentId: string) => {
    await connection.set(keys.markKey(parentId), '1', 'PX', CANCELLATION_TTL_MS);
    await connection.publish(keys.channel, parentId);
    const parent = await Job.fromId(worker, parentId);
    await parent?.removeUnprocessedChildren();
  };
  const stopIfMarked = async (cancelId: string) => {
    if ((await connection.exists(keys.markKey(cancelId))) === 1) cancel(cancelId);
  };

  // The parsed request of the job whose chunks this worker ran last: the chunks of one job
  // mostly come in a row, so each job's request is read and parsed about once per worker.
  let lastRequest: ParentRequest | undefined;
  const parentRequest = async (
    computation: AnyChunkedComputation,
    kind: JobKind,
    job: Job,
    parentId: string,
  ): Promise<ParentRequest> => {
    if (lastRequest?.parentId === parentId) return lastRequest;
    const parent = await Job.fromId(worker, parentId);
    if (parent === undefined) {
      throw new UnrecoverableError(`the job ${parentId} of chunk ${job.id} is gone`);
    }
    const data = parent.data as ParentJobData;
    const request = decodeJobRequest(kind, computation, data.request);
    lastRequest = {
      parentId,
      request,
      ...(typeof data.chunkTimeoutMs === 'number' ? { chunkTimeoutMs: data.chunkTimeoutMs } : {}),
    };
    return lastRequest;
  };

  /** Runs one chunk, its progress idempotent in the job's hash; resolves to its output. */
  const runChunk = async (
    computation: AnyChunkedComputation,
    kind: JobKind,
    job: Job,
    parentId: string,
    self: RunningJob,
  ): Promise<ChunkJobOutput> => {
    const { chunk } = job.data as ChunkJobData;
    const { request, chunkTimeoutMs } = await parentRequest(computation, kind, job, parentId);
    const progressKeys = {
      progressKey: progressKey(queueName, parentId),
      markKey: keys.markKey(parentId),
    };
    const writeProgress = async (done: number) => {
      if (await reportChunkProgress(connection, progressKeys, chunk.index, done)) cancel(parentId);
    };
    await writeProgress(0);
    self.controller.signal.throwIfAborted();
    const output = await driveChunk(computation.runChunk(request, chunk), {
      signal: self.controller.signal,
      onProgress: writeProgress,
      ...(chunkTimeoutMs === undefined ? {} : { timeoutMs: chunkTimeoutMs }),
    });
    await writeProgress(chunk.count);
    self.controller.signal.throwIfAborted();
    return { index: chunk.index, output };
  };

  /** Reduces a job whose chunks are all done: outputs in chunk-index order, then provenance. */
  const reduceJob = async (
    computation: AnyChunkedComputation,
    kind: JobKind,
    job: Job,
    self: RunningJob,
  ): Promise<unknown> => {
    const request = decodeJobRequest(kind, computation, (job.data as ParentJobData).request);
    const plan = computing(() => computation.plan(request));
    const values = Object.values(await job.getChildrenValues<ChunkJobOutput>());
    const outputs: unknown[] = Array.from({ length: plan.chunks.length });
    for (const { index, output } of values) outputs[index] = output;
    if (values.length !== plan.chunks.length || outputs.includes(undefined)) {
      throw new Error(
        `job ${job.id}: ${values.length} chunk outputs for ${plan.chunks.length} chunks`,
      );
    }
    await stopIfMarked(self.cancelId);
    self.controller.signal.throwIfAborted();
    return jobResult(
      request,
      computing(() => computation.reduce(request, outputs)),
    );
  };

  const processor = async (job: Job, token?: string): Promise<unknown> => {
    const id = String(job.id);
    const { role, kind } = parseJobName(job.name);
    const computation = Object.hasOwn(computations, kind)
      ? computations[kind as JobKind]
      : undefined;
    if (computation === undefined) throw new UnrecoverableError(`unknown job kind '${kind}'`);
    const parentId = role === 'chunk' ? job.parent?.id : id;
    if (parentId === undefined) throw new UnrecoverableError(`chunk ${id} has no parent job`);
    const self: RunningJob = {
      id,
      controller: new AbortController(),
      cancelId: parentId,
      ...(token === undefined ? {} : { token }),
    };
    running.set(id, self);
    try {
      await stopIfMarked(parentId);
      self.controller.signal.throwIfAborted();
      return role === 'chunk'
        ? await runChunk(computation, kind as JobKind, job, parentId, self)
        : await reduceJob(computation, kind as JobKind, job, self);
    } catch (error) {
      if (self.stop === 'cancel') throw new UnrecoverableError(CANCELLED_FAILURE_REASON);
      // The run's lock is gone (another run has the job, or will): nothing to report; BullMQ
      // cannot move a job whose lock it lost, so this error only ends the run.
      if (self.stop === 'lock-lost')
        throw new Error(`job ${id} lost its lock in a Redis outage`, { cause: error });
      if (self.stop === 'hand-back' && token !== undefined) {
        await job.moveToWait(token);
        report({ event: 'handed-back', jobId: id, kind: job.name, attempt: job.attemptsStarted });
        throw new WaitingError();
      }
      // A chunk's reason names the chunk; one that would fail again is not retried.
      const reason =
        role === 'chunk'
          ? chunkFailureReason((job.data as ChunkJobData).chunk, error)
          : messageOf(error);
      if (error instanceof UnrecoverableError || !isRetryable(error)) {
        throw new UnrecoverableError(reason);
      }
      throw new Error(reason, { cause: error });
    } finally {
      running.delete(id);
    }
  };

  const worker = new Worker(queueName, processor, {
    connection,
    concurrency,
    name: workerName,
    lockDuration: BULLMQ_SETTINGS.lockDurationMs,
    stalledInterval: BULLMQ_SETTINGS.stalledIntervalMs,
    maxStalledCount: BULLMQ_SETTINGS.maxStalledCount,
    removeOnComplete: BULLMQ_SETTINGS.keepCompleted,
    removeOnFail: BULLMQ_SETTINGS.keepFailed,
  });
  worker.on('active', (job) => {
    report({
      event: 'started',
      jobId: String(job.id),
      kind: job.name,
      attempt: job.attemptsStarted,
    });
  });
  worker.on('completed', (job) => {
    const durationMs = (job.finishedOn ?? Date.now()) - (job.processedOn ?? Date.now());
    report({ event: 'completed', jobId: String(job.id), kind: job.name, durationMs });
  });
  worker.on('failed', (job, error) => {
    const base = { jobId: String(job?.id), kind: job?.name ?? 'unknown' };
    if (error.message === CANCELLED_FAILURE_REASON) return report({ ...base, event: 'cancelled' });
    const attempts = job?.opts.attempts ?? 1;
    const isUnrecoverable = error instanceof UnrecoverableError;
    const willRetry = !isUnrecoverable && (job?.attemptsMade ?? attempts) < attempts;
    const attempt = job?.attemptsMade ?? 0;
    report({ ...base, event: 'failed', reason: error.message, attempt, willRetry });
    // A chunk that fails for good has failed its job (failParentOnFailure): its other chunks
    // are stopped as for a cancel, so no worker spends time on them.
    const parentId = job?.parent?.id;
    if (!willRetry && parentId !== undefined) {
      stopSiblings(parentId).catch((cause: unknown) =>
        report({
          ...base,
          event: 'error',
          reason: `could not stop the chunks of job ${parentId}: ${messageOf(cause)}`,
        }),
      );
    }
  });
  worker.on('stalled', (jobId) => report({ event: 'stalled', jobId }));
  worker.on('error', (error) => report({ event: 'error', reason: messageOf(error) }));

  // Redis outages. A run whose lock expires while Redis is down is taken as stalled once Redis
  // is back, and BullMQ counts every stall against maxStalledCount, meant for workers that
  // die. So the runs held when the connection closed are checked once it is ready again: a
  // run that lost its lock has its stall given back (creditOutageStall, once per run) and is
  // stopped, since its result could no longer be saved; the job runs again from the queue.
  const heldThroughOutage = new Set<RunningJob>();
  connection.on('close', () => {
    for (const job of running.values()) if (!job.lockLost) heldThroughOutage.add(job);
  });
  connection.on('ready', () => {
    for (const job of heldThroughOutage) {
      if (job.token === undefined) {
        heldThroughOutage.delete(job);
        continue;
      }
      creditOutageStall(connection, queueName, job.id, job.token).then(
        (lost) => {
          heldThroughOutage.delete(job);
          if (!lost || job.lockLost) return;
          job.lockLost = true;
          report({ event: 'lock-lost', jobId: job.id });
          stop(job.id, 'lock-lost');
        },
        // The connection went again: checked when it is next ready.
        () => {},
      );
    }
  });

  subscriber.on('message', (_channel: string, id: string) => cancel(id));
  const ready = (async () => {
    await subscriber.subscribe(keys.channel);
    await worker.waitUntilReady();
    report({ event: 'ready' });
  })();
  ready.catch(() => {});

  let closing: Promise<void> | undefined;
  return {
    ready,
    close() {
      closing ??= (async () => {
        const graceTimer = setTimeout(() => {
          for (const id of running.keys()) stop(id, 'hand-back');
        }, shutdownGraceMs);
        // Stops fetching at once, then waits for the running jobs (finished or handed back).
        await worker.close();
        clearTimeout(graceTimer);
        await subscriber.quit().catch(() => subscriber.disconnect());
        await connection.quit().catch(() => connection.disconnect());
      })();
      return closing;
    },
  };
}
