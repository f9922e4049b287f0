import { z } from 'zod';

/** The response of GET /v1/designs/{id}/revisions. */
export const RevisionListSchema = z
  .strictObject({
    items: z.array(
      z.strictObject({
        revision: z.int().min(1).describe('Revision number.'),
        createdAt: z.iso.datetime().describe('When this revision was computed (ISO 8601, UTC).'),
        inputHash: z
          .string()
          .regex(/^[0-9a-f]{64}$/)
          .describe('SHA-256 (hex) of the canonical parsed spec of this revision.'),
      }),
    ),
  })
  .describe('Every revision of a design, oldest first.');

export type RevisionList = z.infer<typeof RevisionListSchema>;
