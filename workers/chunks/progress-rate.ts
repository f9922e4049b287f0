import type { JobProgress } from '../runners/job-runner.js';

/** When a job's work started and when it last reported progress (ms since the epoch). */
export interface ProgressTimes {
  startedAtMs?: number;
  lastProgressAtMs?: number;
}

/**
 * `{ done, total }` completed with the rate so far, items/s (done over the time from the first
 * chunk's start to the latest report), once there is one, and, for a running job, the time to
 * completion at that rate, s. Both are omitted while unknown (nothing done yet).
 */
export function progressWithRate(
  done: number,
  total: number,
  times: ProgressTimes,
  isRunning: boolean,
): JobProgress {
  const progress: JobProgress = { done, total };
  const { startedAtMs, lastProgressAtMs } = times;
  if (startedAtMs === undefined || lastProgressAtMs === undefined || done <= 0) return progress;
  const elapsedS = (lastProgressAtMs - startedAtMs) / 1000;
  if (!(elapsedS > 0)) return progress;
  progress.ratePerS = done / elapsedS;
  if (isRunning) progress.etaS = Math.max(0, total - done) / progress.ratePerS;
  return progress;
}
