import type { JobRecord } from '../../workers/runners/job-runner.js';
import { CAUTION } from '../caution.js';
import type { JobView } from '../schemas/job-view-schema.js';

/**
 * The API view of a job: its record with progress as a fraction 0..1, plus the runner's rate
 * (items/s) and, while it runs, estimated time to completion (s), each once known.
 */
export function jobView(record: JobRecord): JobView {
  const { done, total, ratePerS, etaS } = record.progress;
  const isCompleted = record.state === 'completed';
  const fraction = total > 0 ? Math.min(1, done / total) : isCompleted ? 1 : 0;
  const self = `/v1/jobs/${encodeURIComponent(record.id)}`;
  return {
    id: record.id,
    kind: record.kind,
    state: record.state,
    progress: {
      done,
      total,
      fraction,
      ...(ratePerS === undefined ? {} : { ratePerS }),
      ...(etaS === undefined ? {} : { etaS }),
    },
    createdAt: record.createdAt,
    ...(record.startedAt === undefined ? {} : { startedAt: record.startedAt }),
    ...(record.finishedAt === undefined ? {} : { finishedAt: record.finishedAt }),
    ...(isCompleted && record.result !== undefined
      ? { result: record.result as NonNullable<JobView['result']> }
      : {}),
    ...(record.failureReason === undefined ? {} : { failureReason: record.failureReason }),
    caution: CAUTION,
    links: { self, ...(isCompleted ? { result: `${self}/result` } : {}) },
  };
}
