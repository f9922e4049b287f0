import { z } from 'zod';
import { SweepResultSchema } from '../../solvers/index.js';
import { JOB_KINDS, JOB_STATES } from '../../workers/runners/job-runner.js';
import { ResultMetaSchema } from './result-meta-schema.js';

/** What a completed sweep job returns (workers' SweepJobResult): provenance and the rows. */
export const SweepJobResultSchema = z
  .strictObject({ meta: ResultMetaSchema, sweep: SweepResultSchema })
  .describe('The result of a sweep job.');

/** A job as the API returns it. */
export const JobViewSchema = z
  .strictObject({
    id: z.string().describe('The job id.'),
    kind: z.enum(JOB_KINDS).describe('What the job computes.'),
    state: z.enum(JOB_STATES).describe('queued → running → completed | failed | cancelled.'),
    progress: z.strictObject({
      done: z.int().min(0).describe('Work units done (grid points, for a sweep).'),
      total: z.int().min(0).describe('Work units in the job.'),
      fraction: z.number().min(0).max(1).describe('done / total, a fraction 0..1.'),
      etaS: z
        .number()
        .min(0)
        .optional()
        .describe('Estimated time to completion, s, from the rate so far (running jobs only).'),
    }),
    createdAt: z.iso.datetime().describe('When the job was accepted (ISO 8601, UTC).'),
    startedAt: z.iso.datetime().optional().describe('When a worker started it (ISO 8601, UTC).'),
    finishedAt: z.iso
      .datetime()
      .optional()
      .describe('When it reached a final state (ISO 8601, UTC).'),
    result: SweepJobResultSchema.optional().describe(
      'The result, once completed; infeasible grid points are rows with their issues.',
    ),
    failureReason: z.string().optional().describe('Why it failed, once failed.'),
    caution: z.string().describe('Read before use.'),
    links: z.strictObject({ self: z.string().describe('This job.') }),
  })
  .describe('A background job: state, progress and, once completed, its result.');

export type JobView = z.infer<typeof JobViewSchema>;
