import { hostname } from 'node:os';
import { UnrecoverableError, WaitingError, Worker, type Job } from 'bullmq';
import { Redis } from 'ioredis';
import { InvalidPayloadError } from './handlers/invalid-payload-error.js';
import { CANCELLED_FAILURE_REASON, bullmqCancellationKeys } from './runners/bullmq-cancellation.js';
import { BULLMQ_SETTINGS, DEFAULT_QUEUE_NAME } from './runners/bullmq-settings.js';
import type { JobHandler, JobKind } from './runners/job-runner.js';

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
  /** The handler of every job kind (normally JOB_HANDLERS). */
  handlers: Record<JobKind, JobHandler>;
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
} satisfies Required<Omit<BullmqWorkerOptions, 'redisUrl' | 'handlers'>>;

/** Why a running job's signal was aborted. */
interface RunningJob {
  controller: AbortController;
  stop?: 'cancel' | 'hand-back';
}

function messageOf(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

/**
 * Starts consuming `queueName` with the shared handlers. Cancel requests from any producer
 * arrive by pub/sub (and by a mark read at start, on every progress report and before
 * completion); close() waits up to shutdownGraceMs, then hands running jobs back to the queue.
 */
export function startBullmqWorker(options: BullmqWorkerOptions): BullmqWorkerHandle {
  const { redisUrl, queueName, concurrency, handlers, shutdownGraceMs, onEvent } = {
    ...DEFAULTS,
    ...options,
  };
  const workerName = `${hostname()}:${process.pid}`;
  const report = (event: Omit<WorkerEvent, 'worker'>) => onEvent({ ...event, worker: workerName });
  const keys = bullmqCancellationKeys(queueName);
  // A worker blocks on Redis; BullMQ requires commands to wait for reconnection indefinitely.
  const connection = new Redis(redisUrl, { maxRetriesPerRequest: null });
  const subscriber = connection.duplicate();
  connection.on('error', () => {});
  subscriber.on('error', () => {});
  const running = new Map<string, RunningJob>();

  const stop = (id: string, why: 'cancel' | 'hand-back') => {
    const job = running.get(id);
    if (!job) return;
    // A cancel outranks a hand-back: a cancelled job must not be run again.
    if (why === 'cancel' || job.stop === undefined) job.stop = why;
    job.controller.abort();
  };
  const stopIfMarked = async (id: string) => {
    if ((await connection.exists(keys.markKey(id))) === 1) stop(id, 'cancel');
  };

  const processor = async (job: Job, token?: string): Promise<unknown> => {
    const id = String(job.id);
    const handler = handlers[job.name as JobKind];
    if (typeof handler !== 'function') {
      throw new UnrecoverableError(`unknown job kind '${job.name}'`);
    }
    const self: RunningJob = { controller: new AbortController() };
    running.set(id, self);
    try {
      await stopIfMarked(id);
      self.controller.signal.throwIfAborted();
      const result = await handler(job.data, {
        signal: self.controller.signal,
        reportProgress: async (progress) => {
          await job.updateProgress({ done: progress.done, total: progress.total });
          await stopIfMarked(id);
        },
      });
      await stopIfMarked(id);
      if (self.stop === 'cancel') throw new Error('cancelled');
      return result;
    } catch (error) {
      if (self.stop === 'cancel') throw new UnrecoverableError(CANCELLED_FAILURE_REASON);
      if (self.stop === 'hand-back' && token !== undefined) {
        await job.moveToWait(token);
        report({ event: 'handed-back', jobId: id, kind: job.name, attempt: job.attemptsStarted });
        throw new WaitingError();
      }
      if (error instanceof InvalidPayloadError) throw new UnrecoverableError(error.message);
      throw error;
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
  });
  worker.on('stalled', (jobId) => report({ event: 'stalled', jobId }));
  worker.on('error', (error) => report({ event: 'error', reason: messageOf(error) }));

  subscriber.on('message', (_channel: string, id: string) => stop(id, 'cancel'));
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
