import { z } from 'zod';
import { JOB_KINDS, JOB_STATES } from '../../workers/runners/job-runner.js';
import { JobResultSchema } from './job-result-schema.js';

/** A job as the API returns it. */
export const JobViewSchema = z
  .strictObject({
    id: z.string().describe('The job id.'),
    kind: z.enum(JOB_KINDS).describe('What the job computes.'),
    state: z.enum(JOB_STATES).describe('queued → running → completed | failed | cancelled.'),
    progress: z.strictObject({
      done: z.int().min(0).describe('Items done (grid points, for a sweep).'),
      total: z.int().min(0).describe('Items in the job (its size, as the size limit counts).'),
      fraction: z.number().min(0).max(1).describe('done / total, a fraction 0..1.'),
      ratePerS: z
        .number()
        .positive()
        .optional()
        .describe(
          "Items done per second so far, 1/s (from the first chunk's start to the latest report); absent until known.",
        ),
      etaS: z
        .number()
        .min(0)
        .optional()
        .describe('Estimated time to completion at that rate, s (running jobs only, once known).'),
    }),
    createdAt: z.iso.datetime().describe('When the job was accepted (ISO 8601, UTC).'),
    startedAt: z.iso.datetime().optional().describe('When a worker started it (ISO 8601, UTC).'),
    finishedAt: z.iso
      .datetime()
      .optional()
      .describe('When it reached a final state (ISO 8601, UTC).'),
    result: JobResultSchema.optional().describe(
      'The result, once completed (also at GET /v1/jobs/{id}/result, as JSON or CSV).',
    ),
    failureReason: z.string().optional().describe('Why it failed, once failed.'),
    caution: z.string().describe('Read before use.'),
    links: z.strictObject({
      self: z.string().describe('This job.'),
      result: z
        .string()
        .optional()
        .describe('Its result alone, as JSON or CSV (completed jobs only).'),
    }),
  })
  .describe('A background job: state, progress and, once completed, its result.');

export type JobView = z.infer<typeof JobViewSchema>;
