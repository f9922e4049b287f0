// How `npm run load -- --target jobs` learns whether every accepted job completed. Not by reading
// each job: both backends forget all but the newest 1000 finished jobs, so a long run's early
// jobs answer 404 by the end. The service's own count of finished jobs by state
// (designservice_jobs_finished_total in /metrics, every API process merged) holds them all.

/** The finished jobs once all accepted ones have finished or the deadline passed. */
export interface JobCompletion {
  /** Finished jobs per state (completed, failed, cancelled), as /metrics counts them. */
  states: Record<string, number>;
  /** Seconds from the call until the last job finished (or the deadline). */
  drainS: number;
  /** Accepted jobs not finished at the deadline (lost ones would stay here). */
  unfinished: number;
}

/** Jobs of `kind` finished so far, by state, from the service's /metrics. */
export async function finishedJobs(
  baseUrl: string,
  token: string,
  kind: string,
): Promise<Record<string, number>> {
  const response = await fetch(`${baseUrl}/metrics`, {
    headers: { authorization: `Bearer ${token}` },
  });
  if (!response.ok) throw new Error(`GET /metrics answered ${response.status}`);
  const states: Record<string, number> = {};
  const line = /^designservice_jobs_finished_total\{kind="([^"]+)",state="([^"]+)"\} (\S+)$/gm;
  for (const [, lineKind, state, count] of (await response.text()).matchAll(line)) {
    if (lineKind === kind && state !== undefined) states[state] = Number(count);
  }
  return states;
}

/**
 * Reads the finished jobs of `kind` once a second until `accepted` of them have finished
 * (completed, failed or cancelled) or `deadlineS` passed.
 */
export async function waitForJobs(
  baseUrl: string,
  token: string,
  kind: string,
  accepted: number,
  deadlineS: number,
): Promise<JobCompletion> {
  const started = Date.now();
  for (;;) {
    const states = await finishedJobs(baseUrl, token, kind);
    const finished = Object.values(states).reduce((sum, count) => sum + count, 0);
    const drainS = (Date.now() - started) / 1000;
    if (finished >= accepted || drainS >= deadlineS) {
      return { states, drainS, unfinished: Math.max(0, accepted - finished) };
    }
    await new Promise((resolve) => setTimeout(resolve, 1000));
  }
}
