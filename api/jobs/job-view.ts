import type { JobRecord } from '../../workers/runners/job-runner.js';
import { CAUTION } from '../caution.js';
import type { JobView } from '../schemas/job-view-schema.js';

/**
 * The API view of a job: its record with progress as a fraction 0..1 and, while it runs, an
 * estimated time to completion in seconds from the rate so far (elapsed / done × remaining).
 */
export function jobView(record: JobRecord, now: Date = new Date()): JobView {
  const { done, total } = record.progress;
  const isCompleted = record.state === 'completed';
  const fraction = total > 0 ? Math.min(1, done / total) : isCompleted ? 1 : 0;
  const elapsedS = record.startedAt ? (now.getTime() - Date.parse(record.startedAt)) / 1000 : NaN;
  const etaS =
    record.state === 'running' && done > 0 && Number.isFinite(elapsedS)
      ? Math.max(0, (elapsedS / done) * (total - done))
      : undefined;
  return {
    id: record.id,
    kind: record.kind,
    state: record.state,
    progress: { done, total, fraction, ...(etaS === undefined ? {} : { etaS }) },
    createdAt: record.createdAt,
    ...(record.startedAt === undefined ? {} : { startedAt: record.startedAt }),
    ...(record.finishedAt === undefined ? {} : { finishedAt: record.finishedAt }),
    ...(isCompleted && record.result !== undefined
      ? { result: record.result as NonNullable<JobView['result']> }
      : {}),
    ...(record.failureReason === undefined ? {} : { failureReason: record.failureReason }),
    caution: CAUTION,
    links: { self: `/v1/jobs/${encodeURIComponent(record.id)}` },
  };
}
