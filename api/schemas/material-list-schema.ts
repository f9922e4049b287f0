import { z } from 'zod';
import { MaterialViewSchema } from './material-view-schema.js';

/** The response of GET /v1/catalog/materials. */
export const MaterialListSchema = z
  .strictObject({
    note: z.string().describe('Where the numbers come from.'),
    items: z
      .array(MaterialViewSchema)
      .describe('Built-in classes first, then user materials in the order they were added.'),
  })
  .describe('Every core material the service knows.');

export type MaterialList = z.infer<typeof MaterialListSchema>;
