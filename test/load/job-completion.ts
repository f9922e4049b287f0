// How `npm run load -- --target jobs` learns whether every accepted job completed: it reads each
// job's state (GET /v1/jobs/{id}) until none is queued or running, or until the deadline.

/** The states of the accepted jobs once none is unfinished or the deadline passed. */
export interface JobCompletion {
  /** Jobs per final (or, at the deadline, current) state. */
  states: Record<string, number>;
  /** Seconds from the call until the last job finished (or the deadline). */
  drainS: number;
  /** Ids of jobs still queued or running at the deadline. */
  unfinished: string[];
}

const UNFINISHED = new Set(['queued', 'running']);

/**
 * Polls the state of every job in `ids` (8 requests at a time, re-reading only the unfinished
 * ones, once a second) until each has completed, failed or been cancelled, or `deadlineS` passed.
 */
export async function waitForJobs(
  baseUrl: string,
  token: string,
  ids: readonly string[],
  deadlineS: number,
): Promise<JobCompletion> {
  const started = Date.now();
  const stateOf = new Map<string, string>();
  let pending = [...ids];
  for (;;) {
    const queue = [...pending];
    const readOne = async () => {
      for (let id = queue.pop(); id !== undefined; id = queue.pop()) {
        const response = await fetch(`${baseUrl}/v1/jobs/${encodeURIComponent(id)}`, {
          headers: { authorization: `Bearer ${token}` },
        });
        const body = (await response.json()) as { state?: string };
        stateOf.set(id, response.ok ? String(body.state) : `HTTP ${response.status}`);
      }
    };
    await Promise.all(Array.from({ length: 8 }, readOne));
    pending = pending.filter((id) => UNFINISHED.has(stateOf.get(id) ?? 'queued'));
    const elapsedS = (Date.now() - started) / 1000;
    if (pending.length === 0 || elapsedS >= deadlineS) {
      const states: Record<string, number> = {};
      for (const state of stateOf.values()) states[state] = (states[state] ?? 0) + 1;
      return { states, drainS: elapsedS, unfinished: pending };
    }
    await new Promise((resolve) => setTimeout(resolve, 1000));
  }
}
