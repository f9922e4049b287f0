import { CORE_SEARCH_COMPUTATION } from '../core-search/core-search-computation.js';
import { sweepComputation } from '../sweeps/sweep-computation.js';
import { TOLERANCE_COMPUTATION } from '../tolerance/tolerance-computation.js';
import type { ChunkedComputation } from './chunked-computation.js';

/** A chunked computation of any request, chunk output and result type (what the runners hold). */
export type AnyChunkedComputation = ChunkedComputation<unknown, unknown, unknown>;

/**
 * Every job kind and the computation that runs it; both job backends, the worker process and
 * the API's request schema read this registry. Adding a kind is one line here.
 */
export const JOB_COMPUTATIONS = {
  sweep: sweepComputation,
  'core-search': CORE_SEARCH_COMPUTATION,
  tolerance: TOLERANCE_COMPUTATION,
} as const;

/** A job kind, as in `POST /v1/jobs` `{ kind }`. */
export type JobKind = keyof typeof JOB_COMPUTATIONS;

/** The request (parsed input) of one job kind. */
export type JobRequestOf<Kind extends JobKind> =
  (typeof JOB_COMPUTATIONS)[Kind] extends ChunkedComputation<infer Request, unknown, unknown>
    ? Request
    : never;

/** Every job kind, in registry order. */
export const JOB_KINDS = Object.keys(JOB_COMPUTATIONS) as [JobKind, ...JobKind[]];

/** The computation of `kind`, or undefined for a name that is not a job kind. */
export function jobComputation(kind: string): AnyChunkedComputation | undefined {
  return Object.hasOwn(JOB_COMPUTATIONS, kind)
    ? (JOB_COMPUTATIONS[kind as JobKind] as AnyChunkedComputation)
    : undefined;
}
