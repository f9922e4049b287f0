import type { Job, JobState as BullmqJobState } from 'bullmq';
import { CANCELLED_FAILURE_REASON } from './bullmq-cancellation.js';
import type { JobKind, JobProgress, JobRecord, JobState } from './job-runner.js';

function isoTime(timestampMs: number | undefined): string | undefined {
  return timestampMs === undefined || !Number.isFinite(timestampMs)
    ? undefined
    : new Date(timestampMs).toISOString();
}

function progressOf(progress: unknown): JobProgress {
  if (typeof progress === 'object' && progress !== null) {
    const { done, total } = progress as Record<string, unknown>;
    if (typeof done === 'number' && typeof total === 'number') return { done, total };
  }
  return { done: 0, total: 0 };
}

/** Our state of a BullMQ job: a job waiting for a retry is still 'queued'. */
function stateOf(job: Job, state: BullmqJobState | 'unknown'): JobState {
  switch (state) {
    case 'active':
      return 'running';
    case 'completed':
      return 'completed';
    case 'failed':
      return job.failedReason === CANCELLED_FAILURE_REASON ? 'cancelled' : 'failed';
    default:
      return 'queued';
  }
}

/** The JobRecord of a BullMQ job read in state `state` (read the state first, then the job). */
export function bullmqJobRecord(job: Job, state: BullmqJobState | 'unknown'): JobRecord {
  const ourState = stateOf(job, state);
  const record: JobRecord = {
    id: String(job.id),
    kind: job.name as JobKind,
    state: ourState,
    progress: progressOf(job.progress),
    createdAt: isoTime(job.timestamp) ?? new Date(0).toISOString(),
  };
  const startedAt = isoTime(job.processedOn);
  if (startedAt !== undefined) record.startedAt = startedAt;
  const isFinished = ourState === 'completed' || ourState === 'failed' || ourState === 'cancelled';
  const finishedAt = isoTime(job.finishedOn);
  if (isFinished && finishedAt !== undefined) record.finishedAt = finishedAt;
  if (ourState === 'completed') record.result = job.returnvalue;
  if (ourState === 'failed') record.failureReason = job.failedReason;
  return record;
}
