import type { Job, JobState as BullmqJobState } from 'bullmq';
import { progressWithRate } from '../chunks/progress-rate.js';
import { CANCELLED_FAILURE_REASON } from './bullmq-cancellation.js';
import type { ParentJobData, StoredChunkProgress } from './bullmq-chunked-jobs.js';
import type { JobKind, JobRecord, JobState } from './job-runner.js';

function isoTime(timestampMs: number | undefined): string | undefined {
  return timestampMs === undefined || !Number.isFinite(timestampMs)
    ? undefined
    : new Date(timestampMs).toISOString();
}

/**
 * Our state of a flow's parent job. While its chunks run it waits for its children: running
 * once a chunk has started, else queued; a job waiting for a retry is still queued.
 */
function stateOf(
  state: BullmqJobState | 'unknown',
  failureReason: string | undefined,
  progress: StoredChunkProgress,
): JobState {
  switch (state) {
    case 'active':
      return 'running';
    case 'waiting-children':
      return progress.startedAtMs === undefined ? 'queued' : 'running';
    case 'completed':
      return 'completed';
    case 'failed':
      return failureReason === CANCELLED_FAILURE_REASON ? 'cancelled' : 'failed';
    default:
      return 'queued';
  }
}

/** What the producer read besides the parent job: its chunks' progress and why it failed. */
export interface FlowReading {
  progress: StoredChunkProgress;
  /** The failure reason to show (a failed chunk's own reason rather than BullMQ's pointer). */
  failureReason?: string | undefined;
}

/**
 * The JobRecord of a chunked job's parent read in state `state` (read the state first, then the
 * job and its progress hash).
 */
export function bullmqJobRecord(
  job: Job,
  state: BullmqJobState | 'unknown',
  reading: FlowReading,
): JobRecord {
  const failureReason = reading.failureReason ?? job.failedReason;
  const ourState = stateOf(state, failureReason, reading.progress);
  const data = job.data as Partial<ParentJobData> | null;
  const total = typeof data?.total === 'number' ? data.total : 0;
  const done = ourState === 'completed' ? total : Math.min(total, reading.progress.done);
  const record: JobRecord = {
    id: String(job.id),
    kind: job.name as JobKind,
    state: ourState,
    progress: progressWithRate(done, total, reading.progress, ourState === 'running'),
    createdAt: isoTime(job.timestamp) ?? new Date(0).toISOString(),
    ...(typeof data?.owner === 'string' ? { owner: data.owner } : {}),
  };
  // Work starts with the first chunk (a job without chunks: when the parent was processed).
  const startedAt = isoTime(reading.progress.startedAtMs ?? job.processedOn);
  if (startedAt !== undefined && ourState !== 'queued') record.startedAt = startedAt;
  const isFinished = ourState === 'completed' || ourState === 'failed' || ourState === 'cancelled';
  const finishedAt = isoTime(job.finishedOn);
  if (isFinished && finishedAt !== undefined) record.finishedAt = finishedAt;
  if (ourState === 'completed') record.result = job.returnvalue;
  if (ourState === 'failed' && failureReason !== undefined) record.failureReason = failureReason;
  return record;
}
