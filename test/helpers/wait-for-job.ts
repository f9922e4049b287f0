import type { JobRecord, JobRunner } from '../../workers/runners/job-runner.js';

/**
 * Polls `runner.get(id)` every few milliseconds until `predicate` holds and returns that
 * record; fails after `timeoutMs` (a guard against a hung test, not a speed check).
 */
export async function waitForJob(
  runner: JobRunner,
  id: string,
  predicate: (record: JobRecord) => boolean,
  options: { timeoutMs?: number; pollMs?: number } = {},
): Promise<JobRecord> {
  const { timeoutMs = 50_000, pollMs = 10 } = options;
  const deadline = Date.now() + timeoutMs;
  let last: JobRecord | undefined;
  for (;;) {
    last = await runner.get(id);
    if (last && predicate(last)) return last;
    if (Date.now() > deadline) {
      throw new Error(`job ${id} did not reach the awaited state; last: ${JSON.stringify(last)}`);
    }
    await new Promise((resolve) => setTimeout(resolve, pollMs));
  }
}

/** Waits until the job is completed, failed or cancelled. */
export function waitForFinish(runner: JobRunner, id: string): Promise<JobRecord> {
  return waitForJob(runner, id, (record) =>
    ['completed', 'failed', 'cancelled'].includes(record.state),
  );
}
