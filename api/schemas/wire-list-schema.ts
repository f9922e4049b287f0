import { z } from 'zod';
import { RoundWireCatalogRowSchema } from '../../solvers/index.js';

/** The response of GET /v1/catalog/wires. */
export const WireListSchema = z
  .strictObject({
    note: z.string().describe('Where the numbers come from, and what to confirm.'),
    items: z.array(RoundWireCatalogRowSchema).describe('Thickest gauge first.'),
  })
  .describe('Round enamelled copper magnet wire by AWG.');

export type WireList = z.infer<typeof WireListSchema>;
