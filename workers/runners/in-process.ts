import { randomUUID } from 'node:crypto';
import { InvalidPayloadError } from '../handlers/invalid-payload-error.js';
import { BackendUnavailableError } from './backend-unavailable-error.js';
import type {
  CancelOutcome,
  JobHandler,
  JobKind,
  JobRecord,
  JobRunner,
  JobState,
} from './job-runner.js';
import { JOB_RETRY_POLICIES, type JobRetryPolicy } from './job-retry-policy.js';

/** Options of the embedded runner. */
export interface InProcessRunnerOptions {
  /** The handler of every job kind (normally JOB_HANDLERS). */
  handlers: Record<JobKind, JobHandler>;
  /** Jobs computed at once; they interleave on this event loop. @defaultValue 1 */
  concurrency?: number;
  /** Finished jobs remembered for `get`; the oldest are forgotten first. @defaultValue 1000 */
  keepFinishedJobs?: number;
  /** Attempts and backoff per job kind. @defaultValue JOB_RETRY_POLICIES */
  retryPolicies?: Record<JobKind, JobRetryPolicy>;
}

const DEFAULTS = {
  concurrency: 1,
  keepFinishedJobs: 1000,
  retryPolicies: JOB_RETRY_POLICIES,
} satisfies Required<Omit<InProcessRunnerOptions, 'handlers'>>;

interface Entry {
  record: JobRecord;
  payload: unknown;
  attemptsStarted: number;
  controller?: AbortController;
  retryTimer?: NodeJS.Timeout;
  running?: Promise<void>;
}

/** What crosses a real queue is JSON; copying through JSON keeps both backends alike. */
function jsonCopy(value: unknown): unknown {
  return value === undefined ? undefined : JSON.parse(JSON.stringify(value));
}

function messageOf(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

/**
 * A JobRunner that computes jobs in this process, with the states and semantics of the BullMQ
 * backend: queued → running → completed | failed | cancelled, progress, cancellation (a queued
 * job leaves the queue, a running one has its AbortSignal aborted), retries per job kind.
 * Nothing survives the process; it is the default when no Redis is configured.
 */
export function createInProcessRunner(options: InProcessRunnerOptions): JobRunner {
  const { handlers, concurrency, keepFinishedJobs, retryPolicies } = { ...DEFAULTS, ...options };
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
    finished.push(entry.record.id);
    while (finished.length > keepFinishedJobs) {
      const forgotten = finished.shift();
      if (forgotten !== undefined) entries.delete(forgotten);
    }
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

  function start(entry: Entry) {
    const { record } = entry;
    const handler = handlers[record.kind];
    const controller = new AbortController();
    active += 1;
    entry.attemptsStarted += 1;
    entry.controller = controller;
    record.state = 'running';
    record.startedAt = new Date().toISOString();
    const reportProgress = ({ done, total }: { done: number; total: number }) => {
      if (entry.controller === controller) record.progress = { done, total };
    };
    entry.running = (async () => {
      try {
        const result = await handler(jsonCopy(entry.payload), {
          signal: controller.signal,
          reportProgress,
        });
        if (controller.signal.aborted) return finish(entry, 'cancelled');
        record.result = jsonCopy(result);
        finish(entry, 'completed');
      } catch (error) {
        if (controller.signal.aborted) return finish(entry, 'cancelled');
        const policy = retryPolicies[record.kind];
        if (error instanceof InvalidPayloadError || entry.attemptsStarted >= policy.attempts) {
          record.failureReason = messageOf(error);
          return finish(entry, 'failed');
        }
        record.state = 'queued';
        const delayMs = policy.backoffMs * 2 ** (entry.attemptsStarted - 1);
        entry.retryTimer = setTimeout(() => {
          delete entry.retryTimer;
          waiting.push(record.id);
          schedulePump();
        }, delayMs);
      } finally {
        active -= 1;
        delete entry.controller;
        delete entry.running;
        schedulePump();
      }
    })();
  }

  return {
    async submit(kind, payload) {
      if (closed) throw new BackendUnavailableError('the in-process job runner is closed');
      if (typeof handlers[kind] !== 'function') {
        throw new TypeError(`createInProcessRunner: no handler for job kind '${String(kind)}'`);
      }
      const record: JobRecord = {
        id: randomUUID(),
        kind,
        state: 'queued',
        progress: { done: 0, total: 0 },
        createdAt: new Date().toISOString(),
      };
      entries.set(record.id, { record, payload: jsonCopy(payload), attemptsStarted: 0 });
      waiting.push(record.id);
      schedulePump();
      return structuredClone(record);
    },

    async get(id) {
      const entry = entries.get(id);
      return entry ? structuredClone(entry.record) : undefined;
    },

    async cancel(id): Promise<CancelOutcome> {
      const entry = entries.get(id);
      if (!entry) return 'not-found';
      switch (entry.record.state) {
        case 'queued': {
          const index = waiting.indexOf(id);
          if (index >= 0) waiting.splice(index, 1);
          clearTimeout(entry.retryTimer);
          delete entry.retryTimer;
          finish(entry, 'cancelled');
          return 'cancelled';
        }
        case 'running':
          // The record turns 'cancelled' once the handler has stopped.
          entry.controller?.abort();
          return 'cancelled';
        default:
          return 'already-finished';
      }
    },

    async isReady() {
      return !closed;
    },

    async close() {
      if (closed) return;
      closed = true;
      for (const entry of entries.values()) {
        if (entry.record.state === 'queued') {
          clearTimeout(entry.retryTimer);
          finish(entry, 'cancelled');
        }
        entry.controller?.abort();
      }
      waiting.length = 0;
      const running = [...entries.values()].flatMap((entry) => entry.running ?? []);
      await Promise.allSettled(running);
    },
  };
}
