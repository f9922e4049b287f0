import { randomUUID } from 'node:crypto';
import { setImmediate as yieldToEventLoop, setTimeout as sleep } from 'node:timers/promises';
import { jobResult, type AnyChunkedComputation, type ChunkPlan } from '../../solvers/index.js';
import { decodeJobRequest } from '../chunks/decode-job-request.js';
import { driveChunk } from '../chunks/drive-chunk.js';
import { progressWithRate } from '../chunks/progress-rate.js';
import { chunkFailureReason, computing, isRetryable } from '../chunks/chunk-failures.js';
import { BackendUnavailableError } from './backend-unavailable-error.js';
import { JobQuotaError } from './job-quota-error.js';
import type { CancelOutcome, JobKind, JobRecord, JobRunner, JobState } from './job-runner.js';
import { JOB_RETRY_POLICIES, type JobRetryPolicy } from './job-retry-policy.js';

/** Options of the embedded runner. */
export interface InProcessRunnerOptions {
  /** The computation of every job kind (normally JOB_COMPUTATIONS). */
  computations: Record<JobKind, AnyChunkedComputation>;
  /** Jobs computed at once; they interleave on this event loop. @defaultValue 1 */
  concurrency?: number;
  /** Finished jobs remembered for `get`; the oldest are forgotten first. @defaultValue 1000 */
  keepFinishedJobs?: number;
  /** Attempts and backoff of each chunk, per job kind. @defaultValue JOB_RETRY_POLICIES */
  retryPolicies?: Record<JobKind, JobRetryPolicy>;
  /** Longest one chunk may run, ms; past it the job fails (never retried). @defaultValue no limit */
  chunkTimeoutMs?: number;
  /** Told of every job that ends (completed, failed or cancelled), with its record. @defaultValue none */
  onFinished?: (record: JobRecord) => void;
}

const DEFAULTS = {
  concurrency: 1,
  keepFinishedJobs: 1000,
  retryPolicies: JOB_RETRY_POLICIES,
  chunkTimeoutMs: Infinity,
} satisfies Required<Omit<InProcessRunnerOptions, 'computations' | 'onFinished'>>;

interface Entry {
  record: JobRecord;
  payload: unknown;
  /** Items done by the chunks finished so far. */
  doneBefore: number;
  /** Items done by the running chunk. */
  doneInChunk: number;
  startedAtMs?: number;
  lastProgressAtMs?: number;
  controller?: AbortController;
  running?: Promise<void>;
}

/** What crosses a real queue is JSON; copying through JSON keeps both backends alike. */
function jsonCopy(value: unknown): unknown {
  return value === undefined ? undefined : JSON.parse(JSON.stringify(value));
}

/** A chunk's final failure: its reason names the chunk. */
class ChunkFailure extends Error {
  constructor(chunk: ChunkPlan, cause: unknown) {
    super(chunkFailureReason(chunk, cause), { cause });
  }
}

function messageOf(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

/**
 * A JobRunner that computes chunked jobs in this process, with the states and semantics of the
 * BullMQ backend: queued → running → completed | failed | cancelled. A job is planned, its
 * chunks run one after another, each from a turn of the event loop of its own (and retried per
 * its kind's policy, as a BullMQ child is), yielding to the loop every ~10 ms within a chunk, and
 * their outputs are reduced in chunk-index order.
 * Cancellation drops a queued job or aborts the running chunk. Nothing survives the process;
 * it is the default when no Redis is configured.
 */
export function createInProcessRunner(options: InProcessRunnerOptions): JobRunner {
  const { computations, concurrency, keepFinishedJobs, retryPolicies, chunkTimeoutMs, onFinished } =
    {
      ...DEFAULTS,
      ...options,
    };
  if (!Number.isInteger(concurrency) || concurrency < 1) {
    throw new RangeError(`createInProcessRunner: concurrency must be a positive integer`);
  }
  const entries = new Map<string, Entry>();
  const waiting: string[] = [];
  const finished: string[] = [];
  let active = 0;
  let closed = false;
  let pumpScheduled = false;

  function finish(entry: Entry, state: Extract<JobState, 'completed' | 'failed' | 'cancelled'>) {
    entry.record.state = state;
    entry.record.finishedAt = new Date().toISOString();
    onFinished?.(structuredClone(entry.record));
    finished.push(entry.record.id);
    while (finished.length > keepFinishedJobs) {
      const forgotten = finished.shift();
      if (forgotten !== undefined) entries.delete(forgotten);
    }
  }

  function unfinishedOf(owner: string): number {
    let count = 0;
    for (const { record } of entries.values()) {
      if (record.owner === owner && (record.state === 'queued' || record.state === 'running')) {
        count += 1;
      }
    }
    return count;
  }

  function schedulePump() {
    if (pumpScheduled) return;
    pumpScheduled = true;
    // Start jobs on a later turn, so submit() answers 'queued' as a real queue would.
    setImmediate(() => {
      pumpScheduled = false;
      while (!closed && active < concurrency) {
        const id = waiting.shift();
        if (id === undefined) break;
        const entry = entries.get(id);
        if (entry) start(entry);
      }
    });
  }

  /**
   * Runs one chunk to its output, retrying a transient error per the kind's policy (a
   * computation's own error, a timeout or a bad payload fails at once; chunk-failures.ts).
   */
  async function runChunk(
    entry: Entry,
    computation: AnyChunkedComputation,
    request: unknown,
    chunk: ChunkPlan,
    signal: AbortSignal,
  ): Promise<unknown> {
    const policy = retryPolicies[entry.record.kind];
    for (let attempt = 1; ; attempt += 1) {
      entry.doneInChunk = 0;
      try {
        const output = await driveChunk(computation.runChunk(request, chunk), {
          signal,
          timeoutMs: chunkTimeoutMs,
          onProgress: (doneInChunk) => {
            entry.doneInChunk = doneInChunk;
            entry.lastProgressAtMs = Date.now();
          },
        });
        entry.doneInChunk = 0;
        entry.doneBefore += chunk.count;
        entry.lastProgressAtMs = Date.now();
        return jsonCopy(output);
      } catch (error) {
        if (signal.aborted || !isRetryable(error) || attempt >= policy.attempts) {
          throw new ChunkFailure(chunk, error);
        }
        await sleep(policy.backoffMs * 2 ** (attempt - 1), undefined, { signal });
      }
    }
  }

  async function runJob(entry: Entry, signal: AbortSignal): Promise<unknown> {
    const { kind } = entry.record;
    const computation = computations[kind];
    const request = decodeJobRequest(kind, computation, jsonCopy(entry.payload));
    const plan = computing(() => computation.plan(request));
    entry.record.progress = { done: 0, total: plan.total };
    entry.startedAtMs = Date.now();
    const outputs: unknown[] = [];
    for (const chunk of plan.chunks) {
      // Each chunk starts on a turn of its own, as a queued chunk would: driveChunk yields only
      // within a chunk, so a job of chunks shorter than its slice would otherwise hold the loop
      // (and hide its progress from get()) from its first chunk to its last.
      if (chunk.index > 0) await yieldToEventLoop();
      outputs.push(await runChunk(entry, computation, request, chunk, signal));
    }
    signal.throwIfAborted();
    return jobResult(
      request,
      computing(() => computation.reduce(request, outputs)),
    );
  }

  function start(entry: Entry) {
    const { record } = entry;
    const controller = new AbortController();
    active += 1;
    entry.controller = controller;
    record.state = 'running';
    record.startedAt = new Date().toISOString();
    entry.running = (async () => {
      try {
        const result = await runJob(entry, controller.signal);
        if (controller.signal.aborted) return finish(entry, 'cancelled');
        record.result = jsonCopy(result);
        record.progress = { done: record.progress.total, total: record.progress.total };
        finish(entry, 'completed');
      } catch (error) {
        if (controller.signal.aborted) return finish(entry, 'cancelled');
        record.failureReason = messageOf(error);
        finish(entry, 'failed');
      } finally {
        active -= 1;
        delete entry.controller;
        delete entry.running;
        schedulePump();
      }
    })();
  }

  /** The record as `get` shows it: progress summed over the chunks, with rate and ETA. */
  function view(entry: Entry): JobRecord {
    const record = structuredClone(entry.record);
    if (record.state === 'completed') return record;
    const done = Math.min(record.progress.total, entry.doneBefore + entry.doneInChunk);
    record.progress = progressWithRate(
      done,
      record.progress.total,
      entry,
      record.state === 'running',
    );
    return record;
  }

  return {
    async submit(kind, payload, options = {}) {
      if (closed) throw new BackendUnavailableError('the in-process job runner is closed');
      if (computations[kind] === undefined) {
        throw new TypeError(`createInProcessRunner: no computation for job kind '${String(kind)}'`);
      }
      // A payload that fails its schema is refused, naming the bad fields, as on BullMQ.
      decodeJobRequest(kind, computations[kind], payload);
      // From here to entries.set nothing awaits, so the count and the admission are one step:
      // no other submission can run in between.
      const { owner, ownerUnfinishedMax } = options;
      if (owner !== undefined && ownerUnfinishedMax !== undefined) {
        const unfinished = unfinishedOf(owner);
        if (unfinished >= ownerUnfinishedMax) {
          throw new JobQuotaError(owner, unfinished, ownerUnfinishedMax);
        }
      }
      const copied = jsonCopy(payload);
      const record: JobRecord = {
        id: randomUUID(),
        kind,
        state: 'queued',
        progress: { done: 0, total: 0 },
        createdAt: new Date().toISOString(),
        ...(options.owner === undefined ? {} : { owner: options.owner }),
      };
      entries.set(record.id, { record, payload: copied, doneBefore: 0, doneInChunk: 0 });
      waiting.push(record.id);
      schedulePump();
      return structuredClone(record);
    },

    async get(id) {
      const entry = entries.get(id);
      return entry ? view(entry) : undefined;
    },

    async cancel(id): Promise<CancelOutcome> {
      const entry = entries.get(id);
      if (!entry) return 'not-found';
      switch (entry.record.state) {
        case 'queued': {
          const index = waiting.indexOf(id);
          if (index >= 0) waiting.splice(index, 1);
          finish(entry, 'cancelled');
          return 'cancelled';
        }
        case 'running':
          // The record turns 'cancelled' once the running chunk has stopped.
          entry.controller?.abort();
          return 'cancelled';
        default:
          return 'already-finished';
      }
    },

    async isReady() {
      return !closed;
    },

    async unfinishedCount(owner) {
      return unfinishedOf(owner);
    },

    async counts() {
      let waiting = 0;
      let running = 0;
      for (const { record } of entries.values()) {
        if (record.state === 'queued') waiting += 1;
        else if (record.state === 'running') running += 1;
      }
      return { waiting, running };
    },

    async close() {
      if (closed) return;
      closed = true;
      for (const entry of entries.values()) {
        if (entry.record.state === 'queued') finish(entry, 'cancelled');
        entry.controller?.abort();
      }
      waiting.length = 0;
      const running = [...entries.values()].flatMap((entry) => entry.running ?? []);
      await Promise.allSettled(running);
    },
  };
}
