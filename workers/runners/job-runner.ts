/**
 * The job contract both backends keep (BullMQ on Redis and the embedded in-process runner).
 * Everything that crosses it is plain JSON.
 */

export const JOB_KINDS = ['sweep'] as const;
export type JobKind = (typeof JOB_KINDS)[number];

export const JOB_STATES = ['queued', 'running', 'completed', 'failed', 'cancelled'] as const;
export type JobState = (typeof JOB_STATES)[number];

export interface JobProgress {
  done: number;
  total: number;
}

export interface JobRecord {
  id: string;
  kind: JobKind;
  state: JobState;
  progress: JobProgress;
  /** ISO 8601 times. */
  createdAt: string;
  startedAt?: string;
  finishedAt?: string;
  /** The handler's plain result, once completed. */
  result?: unknown;
  /** Why it failed, once failed (never a stack trace). */
  failureReason?: string;
}

export type CancelOutcome = 'cancelled' | 'not-found' | 'already-finished';

export interface JobRunner {
  /** Queues a job whose payload has already passed its schema; resolves once it is accepted. */
  submit(kind: JobKind, payload: unknown): Promise<JobRecord>;
  get(id: string): Promise<JobRecord | undefined>;
  cancel(id: string): Promise<CancelOutcome>;
  /** True when the backend can accept and run jobs (Redis reachable, for BullMQ). */
  isReady(): Promise<boolean>;
  close(): Promise<void>;
}

/** What a handler receives besides its payload. */
export interface JobContext {
  signal: AbortSignal;
  reportProgress(progress: JobProgress): Promise<void> | void;
}

/** One handler per job kind, shared by both backends. */
export type JobHandler = (payload: unknown, context: JobContext) => Promise<unknown>;
