import { z } from 'zod';
import { CoreGeometrySchema, CoreShapeSchema } from '../../solvers/index.js';

const geometry = CoreGeometrySchema.describe(
  'Computed from the nominal dimensions: IEC 60205 effective parameters, window, mean turn length, cooling surface.',
);
const [eShape, efdShape, roundLegShape, pqShape, ringShape] = CoreShapeSchema.options;

/** One catalog core shape: its family, designation and nominal dimensions, plus its geometry. */
export const CoreShapeEntrySchema = z.discriminatedUnion('family', [
  eShape.extend({ geometry }),
  efdShape.extend({ geometry }),
  roundLegShape.extend({ geometry }),
  pqShape.extend({ geometry }),
  ringShape.extend({ geometry }),
]);

/** The response of GET /v1/catalog/core-shapes. */
export const CoreShapeListSchema = z
  .strictObject({
    note: z.string().describe('Where the dimensions come from, and what to confirm.'),
    items: z.array(CoreShapeEntrySchema),
  })
  .describe('The core shapes the engine knows, with their computed effective parameters.');

export type CoreShapeList = z.infer<typeof CoreShapeListSchema>;
