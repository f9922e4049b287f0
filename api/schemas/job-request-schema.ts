import { z } from 'zod';
import { SweepRequestSchema } from '../../solvers/index.js';

/** A sweep job: a parametric grid over one base spec. */
export const SweepJobRequestSchema = z.strictObject({
  kind: z.literal('sweep'),
  input: SweepRequestSchema,
});

/**
 * Body of POST /v1/jobs: a union discriminated on `kind`, so each new job kind adds one member
 * with its own input schema.
 */
export const JobRequestSchema = z
  .discriminatedUnion('kind', [SweepJobRequestSchema])
  .describe('A heavy job to run in the background.');

export type JobRequest = z.infer<typeof JobRequestSchema>;
