import { z } from 'zod';
import { IssueSchema } from '../../solvers/index.js';

/**
 * The RFC 9457 problem body every error response carries, with this service's extensions; open
 * to further members, as RFC 9457 §3.2 lets problem types add their own.
 */
export const ProblemSchema = z
  .looseObject({
    type: z
      .string()
      .describe('URI of the problem type (about:blank or a tag URI of this service).'),
    title: z.string().describe('Short summary of the problem type.'),
    status: z.int().describe('The HTTP status code.'),
    detail: z.string().optional().describe('What went wrong in this occurrence.'),
    instance: z.string().describe('The request path this occurrence belongs to.'),
    errors: z
      .array(
        z.strictObject({
          path: z
            .array(z.union([z.string(), z.number()]))
            .describe('Path of the bad field from the root of the body (or the parameter name).'),
          message: z.string().describe('What is wrong with it.'),
        }),
      )
      .optional()
      .describe('400: every bad field.'),
    issues: z
      .array(IssueSchema)
      .optional()
      .describe('422: the engine issues, as data; paths are relative to the engine input.'),
    validCorners: z
      .array(z.string())
      .optional()
      .describe('400 for an unknown corner: the corner labels the design has.'),
    checks: z
      .record(z.string(), z.enum(['up', 'down']))
      .optional()
      .describe('503 from /readyz: which part is down.'),
  })
  .describe('An RFC 9457 problem: application/problem+json.');
