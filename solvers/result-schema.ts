import { z } from 'zod';
import { ISSUE_CODES } from './result.js';

/** The zod form of an engine Issue, for documents and payloads that carry issues. */
export const IssueSchema = z.object({
  code: z.enum(ISSUE_CODES).describe('Stable issue code.'),
  path: z.array(z.union([z.string(), z.number()])).describe('Path of the spec field concerned.'),
  constraint: z.string().describe('The violated constraint, in symbols.'),
  quantity: z.string().describe('The quantity, named with its unit suffix.'),
  required: z.number().describe('The value the spec would need, in the unit of quantity.'),
  limit: z.number().describe('The limit, in the unit of quantity.'),
  corner: z.string().optional().describe('The operating corner, when the issue belongs to one.'),
});
