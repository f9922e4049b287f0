import { z } from 'zod';
import { LossPointSchema } from '../../solvers/index.js';

/** Largest number of loss points one request may carry. */
const LOSS_POINT_LIMIT = 1000;

/** The body of POST /v1/catalog/materials: a named material from its measured loss points. */
export const MaterialRequestSchema = z
  .strictObject({
    name: z
      .string()
      .trim()
      .min(1)
      .max(80)
      .describe(
        'Name of the material, unique ignoring case (also among the built-in class ids); 1 to 80 characters.',
      ),
    lossPoints: z
      .array(LossPointSchema)
      .max(LOSS_POINT_LIMIT)
      .describe(
        `Measured core loss under sinusoidal excitation at one temperature: at least 3 points spanning more than one frequency and more than one flux density (fewer gets 422), at most ${LOSS_POINT_LIMIT}.`,
      ),
    saturationFluxDensityT: z
      .number()
      .positive()
      .max(5)
      .optional()
      .describe('Saturation flux density at the intended operating temperature, T.'),
    initialPermeability: z
      .number()
      .positive()
      .max(1e6)
      .optional()
      .describe('Initial relative permeability μi (dimensionless).'),
    initialPermeabilityTolerance: z
      .number()
      .min(0)
      .max(1)
      .optional()
      .describe('Relative tolerance of μi, a fraction 0..1.'),
  })
  .describe('A user material: the service fits Pv = k·f^α·B^β to the loss points.');

export type MaterialRequest = z.infer<typeof MaterialRequestSchema>;
