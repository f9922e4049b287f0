import { ToleranceJobResultSchema } from './tolerance-result-schema.js';
import { evenChunks, type ChunkedComputation } from '../jobs/chunked-computation.js';
import {
  mergeChunkOutputs,
  runToleranceChunk,
  type ToleranceChunkOutput,
} from './tolerance-chunk.js';
import { toleranceCsvTable } from './tolerance-csv.js';
import { ToleranceRequestSchema, type ToleranceRequest } from './tolerance-request-schema.js';
import { TOLERANCE_CAUTION, toleranceResult } from './tolerance-result.js';
import type { InfeasibleToleranceResult, ToleranceResult } from './tolerance-result-schema.js';
import { toleranceRun } from './tolerance-run.js';
import { worstCaseAnalysis } from './worst-case.js';

/**
 * Samples per chunk: about 0.1–0.5 s of work on one core (a sample solves one operating point
 * and, with a designed transformer, re-evaluates it), enough to make the design each chunk
 * repeats (a few ms) negligible.
 */
export const TOLERANCE_CHUNK_SIZE = 250;

/** A chunk's output: the samples' sums, or nothing when the nominal design is infeasible. */
export type ToleranceChunk = ToleranceChunkOutput | { infeasible: true };

/**
 * The tolerance job (kind 'tolerance'): Monte Carlo over `sampleCount` units of the request's
 * design, cut into chunks of consecutive samples. Every chunk and the reducer re-make the nominal
 * design from the request (deterministic, a few ms), so a chunk needs nothing but the request and
 * its range. The reducer merges the chunks' exact sums and runs the worst-case analysis (2k
 * one-at-a-time evaluations plus up to 2^everyVertexParameterMax vertices, k the varied
 * parameters).
 */
export const TOLERANCE_COMPUTATION: ChunkedComputation<
  ToleranceRequest,
  ToleranceChunk,
  ToleranceResult | InfeasibleToleranceResult
> = {
  kind: 'tolerance',
  requestSchema: ToleranceRequestSchema,
  outputSchema: ToleranceJobResultSchema,
  plan: (request) => evenChunks(request.sampleCount, TOLERANCE_CHUNK_SIZE),
  *runChunk(request, chunk) {
    const run = toleranceRun(request);
    if (!run.ok) return { infeasible: true };
    // The design above is the chunk's longest single step: a pause for the runner after it.
    yield 0;
    return yield* runToleranceChunk(run.value, chunk);
  },
  reduce(request, outputs) {
    const run = toleranceRun(request);
    if (!run.ok) {
      return {
        feasible: false,
        seed: request.seed,
        sampleCount: request.sampleCount,
        issues: run.issues,
        caution: TOLERANCE_CAUTION,
      };
    }
    const samples = outputs.map((output) => {
      if ('infeasible' in output) {
        throw new Error(
          'tolerance reduce: a chunk found the design infeasible, the reducer did not',
        );
      }
      return output;
    });
    const merged = mergeChunkOutputs(run.value, samples);
    if (merged.sampleCount !== request.sampleCount) {
      throw new Error(
        `tolerance reduce: the chunks hold ${merged.sampleCount} samples, the request ${request.sampleCount}`,
      );
    }
    return toleranceResult(run.value, merged, worstCaseAnalysis(run.value));
  },
  csvTable: toleranceCsvTable,
};
