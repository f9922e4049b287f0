import { z } from 'zod';
import {
  LossPointSchema,
  MaterialClassSchema,
  SteinmetzCoefficientsSchema,
} from '../../solvers/index.js';

const links = z.strictObject({ self: z.string().describe('This material.') });

/** A built-in generic material class as the catalog lists it. */
export const BuiltInMaterialViewSchema = MaterialClassSchema.extend({
  name: z.string().describe('The class id, as its name.'),
  origin: z.literal('built-in').describe('A generic class the service ships.'),
  note: z.string().describe('Every number of a built-in class is invented; read before use.'),
  links,
}).describe('A generic material class with representative, invented numbers.');

/** A user material: the posted loss points, their Steinmetz fit and the optional extras. */
export const UserMaterialViewSchema = z
  .strictObject({
    id: z.string().describe('The material id (a random UUID).'),
    name: z.string().describe('The name it was posted with.'),
    origin: z.literal('user').describe('Added by a caller of this service.'),
    steinmetz: SteinmetzCoefficientsSchema.describe('Fitted to the loss points.'),
    fit: z
      .strictObject({
        rmsLog10Error: z
          .number()
          .describe('RMS over the points of log10(fitted/measured) (dimensionless; 0 is exact).'),
        worstRelativeError: z
          .number()
          .describe('Largest |fitted/measured − 1| over the points, a fraction.'),
        pointCount: z.int().describe('Number of loss points fitted.'),
      })
      .describe('How well the fitted coefficients reproduce the points.'),
    frequencyMinHz: z.number().describe('Lowest frequency among the points, Hz.'),
    frequencyMaxHz: z.number().describe('Highest frequency among the points, Hz.'),
    peakFluxDensityMinT: z.number().describe('Lowest peak flux density among the points, T.'),
    peakFluxDensityMaxT: z.number().describe('Highest peak flux density among the points, T.'),
    lossPoints: z.array(LossPointSchema).describe('The points as posted.'),
    saturationFluxDensityT: z.number().optional().describe('As posted, T.'),
    initialPermeability: z.number().optional().describe('As posted (dimensionless).'),
    initialPermeabilityTolerance: z.number().optional().describe('As posted, a fraction 0..1.'),
    createdAt: z.iso.datetime().describe('When it was added (ISO 8601, UTC).'),
    links,
  })
  .describe('A material added from measured loss points; shared by every caller for now.');

/** Either kind of catalog material, told apart by `origin`. */
export const MaterialViewSchema = z.discriminatedUnion('origin', [
  BuiltInMaterialViewSchema,
  UserMaterialViewSchema,
]);

export type BuiltInMaterialView = z.infer<typeof BuiltInMaterialViewSchema>;
export type UserMaterialView = z.infer<typeof UserMaterialViewSchema>;
export type MaterialView = z.infer<typeof MaterialViewSchema>;
