import { SCHEMA_VERSION, SOLVER_VERSION, inputHash } from '../versioning/result-meta.js';

/**
 * The provenance a chunked job's result carries: no clock time, so the same request gives the
 * same bytes on any backend and any number of workers (the job's times are on its record).
 */
export interface JobResultMeta {
  solverVersion: string;
  schemaVersion: string;
  /** SHA-256 of the canonical JSON of the parsed request (defaults applied), hex. */
  inputHash: string;
}

/** What a completed chunked job returns: its provenance and the computation's reduced output. */
export interface JobResult<Output = unknown> {
  meta: JobResultMeta;
  output: Output;
}

/** Wraps a reduced output with the provenance of the parsed `request`. */
export async function jobResult<Output>(
  request: unknown,
  output: Output,
): Promise<JobResult<Output>> {
  return {
    meta: {
      solverVersion: SOLVER_VERSION,
      schemaVersion: SCHEMA_VERSION,
      inputHash: await inputHash(request),
    },
    output,
  };
}
