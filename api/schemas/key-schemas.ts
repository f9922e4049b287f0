import { z } from 'zod';
import { ROLES } from '../auth/api-key.js';

/** The body of POST /v1/admin/keys. */
export const KeyRequestSchema = z
  .strictObject({
    role: z
      .enum(ROLES)
      .describe(
        "'read': GET only; 'design': also evaluate, store and submit; 'admin': also manage this tenant's keys.",
      ),
    label: z
      .string()
      .trim()
      .min(1)
      .max(120)
      .describe('What the key is for (for example "nightly tolerance runs"); 1 to 120 characters.'),
  })
  .describe("A new API key for the caller's own tenant.");

/** A key as listed: never its token or hash. */
export const KeyViewSchema = z
  .object({
    id: z.string().describe('Public id of the key (the 16 hex digits inside its token).'),
    tenant: z.string().describe('Tenant the key belongs to; it sees only this tenant’s data.'),
    role: z.enum(ROLES).describe('What the key may do.'),
    label: z.string().describe('What the key is for.'),
    createdAt: z.string().describe('ISO 8601 creation time.'),
    revokedAt: z.string().optional().describe('ISO 8601 revocation time; absent while valid.'),
    links: z.object({ self: z.string() }),
  })
  .describe('An API key, without its secret.');

/** The answer to POST /v1/admin/keys: the view and, this once, the token. */
export const CreatedKeyViewSchema = KeyViewSchema.extend({
  key: z
    .string()
    .describe(
      'The key to send as `Authorization: Bearer <key>`. Shown only in this answer: the service keeps only its SHA-256.',
    ),
}).describe('A key just created, with its token (shown once).');

export const KeyListSchema = z
  .object({ items: z.array(KeyViewSchema) })
  .describe("The caller's tenant's keys, revoked ones included, oldest first.");
