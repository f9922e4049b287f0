import { setImmediate as yieldToEventLoop } from 'node:timers/promises';
import {
  SweepRequestSchema,
  evaluateSweepPoint,
  resultMeta,
  sweepPoints,
  type ResultMeta,
  type SweepChoiceCache,
  type SweepResult,
  type SweepRow,
} from '../../solvers/index.js';
import type { JobHandler } from '../runners/job-runner.js';
import { InvalidPayloadError } from './invalid-payload-error.js';

/** What a completed sweep job returns: provenance of the parsed request, and the rows. */
export interface SweepJobResult {
  meta: ResultMeta;
  sweep: SweepResult;
}

const DEFAULTS = {
  /** Longest stretch of computation between two yields to the event loop, ms. */
  computeSliceMs: 10,
  /** Shortest time between two progress reports, ms (the first and the last always go out). */
  progressIntervalMs: 100,
} as const;

/**
 * The `sweep` job: decodes a SweepRequest, evaluates every grid point through the engine and
 * resolves to a SweepJobResult. It yields to the event loop every few milliseconds (so an API
 * sharing the process stays responsive), honours the signal between points and reports
 * `{ done, total }` at most every 100 ms.
 */
export const sweepJob: JobHandler = async (payload, { signal, reportProgress }) => {
  const parsed = SweepRequestSchema.safeParse(payload);
  if (!parsed.success) {
    throw new InvalidPayloadError(
      'sweep',
      parsed.error.issues.map((issue) => ({
        path: issue.path.map((key) => (typeof key === 'symbol' ? String(key) : key)),
        message: issue.message,
      })),
    );
  }
  const request = parsed.data;
  const points = sweepPoints(request);
  const total = points.length;
  const cache: SweepChoiceCache = new Map();
  const rows: SweepRow[] = [];
  await reportProgress({ done: 0, total });
  let sliceStartMs = performance.now();
  let reportedAtMs = sliceStartMs;
  for (const point of points) {
    signal.throwIfAborted();
    rows.push(evaluateSweepPoint(request, point, cache));
    const nowMs = performance.now();
    if (nowMs - sliceStartMs >= DEFAULTS.computeSliceMs) {
      await yieldToEventLoop();
      sliceStartMs = performance.now();
    }
    if (nowMs - reportedAtMs >= DEFAULTS.progressIntervalMs && rows.length < total) {
      await reportProgress({ done: rows.length, total });
      reportedAtMs = nowMs;
    }
  }
  signal.throwIfAborted();
  await reportProgress({ done: total, total });
  const result: SweepJobResult = {
    meta: await resultMeta(request),
    sweep: { pointCount: total, rows },
  };
  return result;
};
