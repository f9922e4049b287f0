import { z } from 'zod';
import { JOB_COMPUTATIONS, JOB_KINDS } from '../../solvers/index.js';
import { ResultMetaSchema } from './result-meta-schema.js';

/** A chunked job's provenance: the result meta without a clock time (times are on the job). */
export const JobResultMetaSchema = ResultMetaSchema.omit({ createdAt: true }).describe(
  'Provenance of a job result: no clock time, so the same request gives the same bytes on any backend and any number of workers (the times are on the job).',
);

/** The outputs of every kind that documents its own (a kind without one: any object). */
const outputSchemas = JOB_KINDS.map(
  (kind) => JOB_COMPUTATIONS[kind].outputSchema ?? z.record(z.string(), z.unknown()),
);

/** What a completed job returns (solvers' JobResult): provenance and the kind's output. */
export const JobResultSchema = z
  .strictObject({
    meta: JobResultMetaSchema,
    output: (outputSchemas.length === 1
      ? outputSchemas[0]
      : z.union(outputSchemas as [z.ZodType, z.ZodType, ...z.ZodType[]])
    )?.describe(
      "The job kind's result: for a sweep, one row per grid point (infeasible points carry their issues); for a core search, the counts per constraint, the top N and the Pareto front; for a tolerance run, yield, worst case and sensitivity per limit.",
    ) as z.ZodType,
  })
  .describe('The result of a completed job.');

/** GET /v1/jobs/{id}/result as JSON: the result and the caution. */
export const JobResultViewSchema = JobResultSchema.extend({
  caution: z.string().describe('Read before use.'),
}).describe('The result of a completed job, with the caution.');
