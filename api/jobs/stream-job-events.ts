import type { Context } from 'hono';
import { streamSSE } from 'hono/streaming';
import type { JobRecord, JobRunner } from '../../workers/runners/job-runner.js';
import { safeJson } from '../http/safe-json.js';
import { jobView } from './job-view.js';

/** How the progress stream polls and keeps the connection alive. */
export interface JobEventOptions {
  /** Time between looks at the job, ms. @defaultValue 250 */
  pollIntervalMs?: number;
  /** Time between keep-alive comments while nothing changes, ms. @defaultValue 15000 */
  keepAliveMs?: number;
}

const DEFAULTS = { pollIntervalMs: 250, keepAliveMs: 15_000 } satisfies Required<JobEventOptions>;

const TERMINAL_STATES = new Set<JobRecord['state']>(['completed', 'failed', 'cancelled']);

/**
 * Streams a job's progress as server-sent events: a `progress` event (the job view without its
 * result) whenever state or progress changes, then one `end` event with the final state, and the
 * stream closes. The result itself stays at GET /v1/jobs/{id}.
 */
export function streamJobEvents(
  c: Context,
  jobs: JobRunner,
  first: JobRecord,
  options: JobEventOptions = {},
): Response {
  const { pollIntervalMs, keepAliveMs } = { ...DEFAULTS, ...options };
  return streamSSE(c, async (stream) => {
    let record: JobRecord | undefined = first;
    let lastSent = '';
    let quietMs = 0;
    let eventId = 0;
    while (record !== undefined && !stream.aborted) {
      const { result, ...view } = jobView(record);
      const key = `${view.state}:${view.progress.done}:${view.progress.total}`;
      if (key !== lastSent) {
        lastSent = key;
        quietMs = 0;
        eventId += 1;
        await stream.writeSSE({ event: 'progress', id: String(eventId), data: safeJson(view) });
      } else if (quietMs >= keepAliveMs) {
        quietMs = 0;
        await stream.write(': keep-alive\n\n');
      }
      if (TERMINAL_STATES.has(view.state)) {
        eventId += 1;
        await stream.writeSSE({
          event: 'end',
          id: String(eventId),
          data: safeJson({ state: view.state, links: view.links }),
        });
        return;
      }
      await stream.sleep(pollIntervalMs);
      quietMs += pollIntervalMs;
      record = await jobs.get(first.id);
    }
  });
}
