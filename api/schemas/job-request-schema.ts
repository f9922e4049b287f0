import { z } from 'zod';
import {
  JOB_COMPUTATIONS,
  JOB_KINDS,
  type JobKind,
  type JobRequestOf,
} from '../../solvers/index.js';

/** A job of one kind: its kind and its input, validated by that kind's request schema. */
export type JobRequestMember<Kind extends JobKind> = { kind: Kind; input: JobRequestOf<Kind> };

/** The body of POST /v1/jobs, one member per kind of the registry. */
export type JobRequest = { [Kind in JobKind]: JobRequestMember<Kind> }[JobKind];

/** The schema of one kind's member: `{ kind, input }` with the kind's own request schema. */
function memberSchema(kind: JobKind) {
  return z.strictObject({
    kind: z.literal(kind),
    input: JOB_COMPUTATIONS[kind].requestSchema,
  });
}

/**
 * Body of POST /v1/jobs: a union discriminated on `kind`, one member per job kind of the
 * registry (solvers/jobs/job-computations.ts), each with its computation's request schema, so a
 * kind added there is accepted here with no edit.
 */
export const JobRequestSchema = z
  .discriminatedUnion(
    'kind',
    JOB_KINDS.map(memberSchema) as [
      ReturnType<typeof memberSchema>,
      ...ReturnType<typeof memberSchema>[],
    ],
  )
  .describe('A heavy job to run in the background.') as unknown as z.ZodType<JobRequest>;
