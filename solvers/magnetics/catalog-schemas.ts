import { z } from 'zod';
import type { CoreGeometry } from './core-geometry.js';
import type { CoreShape } from './core-shape.js';
import type { MaterialClass } from './material-class.js';
import type { SteinmetzCoefficients } from './steinmetz-coefficients.js';
import type { LossPoint, SteinmetzFit } from './steinmetz-fit.js';

/**
 * The zod forms of the magnetics catalog's plain data, for documents and payloads. The engine's
 * interfaces stay the source of truth: each schema `satisfies` the type it mirrors.
 */

/** Every core-shape family a CoreShape can have (not all have catalog sizes yet). */
export const CORE_SHAPE_FAMILIES = [
  'e',
  'efd',
  'etd',
  'eq',
  'pq',
  'ring',
] as const satisfies readonly CoreShape['family'][];

const length = (what: string) => z.number().positive().describe(`${what}, m.`);

const eDimensions = {
  designation: z.string().describe('Standard size designation, for example "E 25/13/7".'),
  overallWidthM: length('A: overall width of the core set'),
  halfHeightM: length('B: height of one half'),
  depthM: length('C: depth of the core'),
  halfWindowHeightM: length('D: window height of one half'),
  windowSpanM: length('E: span of the window between the outer legs'),
};

/** A core set's nominal dimensions by family, m (IEC 62317 / IEC 63093 letters). */
export const CoreShapeSchema = z.discriminatedUnion('family', [
  z.strictObject({
    family: z.literal('e'),
    ...eDimensions,
    centreLegWidthM: length('F: centre-leg width'),
  }),
  z.strictObject({
    family: z.literal('efd'),
    ...eDimensions,
    centreLegWidthM: length('F: centre-leg width'),
    centreLegDepthM: length('K: centre-leg depth (thinner than the core)'),
  }),
  z.strictObject({
    family: z.enum(['etd', 'eq']),
    ...eDimensions,
    centreLegDiameterM: length('F: diameter of the round centre leg'),
  }),
  z.strictObject({
    family: z.literal('pq'),
    ...eDimensions,
    windowSpanM: length('E: diameter of the winding space'),
    centreLegDiameterM: length('F: diameter of the round centre leg'),
    slotWidthM: length('G: width of the wire exit between the outer legs'),
  }),
  z.strictObject({
    family: z.literal('ring'),
    designation: eDimensions.designation,
    outerDiameterM: length('Outer diameter'),
    innerDiameterM: length('Inner (bore) diameter'),
    heightM: length('Height'),
  }),
]) satisfies z.ZodType<CoreShape>;

/** A core set's IEC 60205 effective parameters, window and cooling surface, SI units. */
export const CoreGeometrySchema = z.strictObject({
  coreConstantC1PerM: z.number().describe('Core constant C1 = Σ l/A, 1/m (per length in m).'),
  coreConstantC2PerM3: z.number().describe('Core constant C2 = Σ l/A², 1/m³ (per volume in m³).'),
  effectiveLengthM: z.number().describe('Effective magnetic path length le = C1²/C2, m.'),
  effectiveAreaM2: z.number().describe('Effective cross-section Ae = C1/C2, m².'),
  effectiveVolumeM3: z.number().describe('Effective volume Ve = le·Ae, m³.'),
  minimumAreaM2: z.number().describe('Smallest cross-section along the path, Amin, m².'),
  windowAreaM2: z.number().describe('Area of one winding window, no bobbin, m².'),
  windowBreadthM: z.number().describe('Window length along the leg a layer can fill, m.'),
  windowWidthM: z.number().describe('Window width across the layers, m.'),
  meanTurnLengthM: z.number().describe('Length of a turn at half the window width, m.'),
  surfaceAreaM2: z.number().describe('Outside surface of the wound core, for cooling, m².'),
}) satisfies z.ZodType<CoreGeometry>;

/** Steinmetz coefficients of Pv = k·f^α·B^β (Pv in W/m³, f in Hz, B peak in T). */
export const SteinmetzCoefficientsSchema = z.strictObject({
  k: z.number().positive().describe('k of Pv = k·f^α·B^β with Pv in W/m³, f in Hz and B in T.'),
  alpha: z.number().positive().describe('Frequency exponent α (dimensionless).'),
  beta: z.number().positive().describe('Flux-density exponent β (dimensionless).'),
}) satisfies z.ZodType<SteinmetzCoefficients>;

/** A generic core-material class with its representative numbers. */
export const MaterialClassSchema = z.strictObject({
  id: z.string().min(1).max(80).describe('Stable id of the material (1 to 80 characters).'),
  steinmetz: SteinmetzCoefficientsSchema.describe(
    'Coefficients at the minimum-loss temperature, where the temperature factor is 1.',
  ),
  lossTemperatureFactor: z
    .strictObject({
      ct2: z.number().describe('ct2 of ct(T) = ct2·T² − ct1·T + ct0, per °C² (T in °C).'),
      ct1: z.number().describe('ct1 of ct(T), per °C (T in °C).'),
      ct0: z.number().describe('ct0 of ct(T) (dimensionless).'),
    })
    .describe(
      'Factor multiplying the Steinmetz loss density at temperature T (°C); minimum 1 (ct2 = ct1 = 0, ct0 = 1 is flat).',
    ),
  saturation: z
    .strictObject({
      lowTemperatureC: z.number().describe('Lower temperature of the two points, °C.'),
      lowFluxDensityT: z
        .number()
        .positive()
        .describe('Saturation flux density at the lower one, T.'),
      highTemperatureC: z.number().describe('Higher temperature, °C (above lowTemperatureC).'),
      highFluxDensityT: z
        .number()
        .positive()
        .describe('Saturation flux density at the higher one, T.'),
    })
    .describe('Saturation flux density at two temperatures, interpolated linearly.'),
  initialPermeability: z
    .number()
    .positive()
    .describe('Initial relative permeability μi (dimensionless).'),
  initialPermeabilityTolerance: z
    .number()
    .min(0)
    .max(1)
    .describe('Relative tolerance of μi, a fraction 0..1.'),
  frequencyMinHz: z.number().positive().describe('Lowest frequency the loss fit is meant for, Hz.'),
  frequencyMaxHz: z
    .number()
    .positive()
    .describe('Highest frequency the loss fit is meant for, Hz (at least frequencyMinHz).'),
}) satisfies z.ZodType<MaterialClass>;

/** One measured core-loss point under sinusoidal excitation; every value > 0 and finite. */
export const LossPointSchema = z.strictObject({
  frequencyHz: z
    .number()
    .min(1)
    .max(100e6)
    .describe('Sinusoidal excitation frequency, Hz, 1 Hz to 100 MHz.'),
  peakFluxDensityT: z
    .number()
    .min(1e-6)
    .max(5)
    .describe('Peak flux density (half the peak-to-peak swing), T, 1 µT to 5 T.'),
  lossDensityWPerM3: z
    .number()
    .min(1e-3)
    .max(1e10)
    .describe(
      'Core loss per unit volume, W/m³ (power in W per volume in m³), 1e-3 to 1e10 W/m³ (far beyond any magnetic material at both ends).',
    ),
}) satisfies z.ZodType<LossPoint>;

/** A Steinmetz fit: coefficients and how well they reproduce the points. */
export const SteinmetzFitSchema = z.strictObject({
  coefficients: SteinmetzCoefficientsSchema,
  rmsLog10Error: z
    .number()
    .describe('RMS over the points of log10(fitted/measured) (dimensionless; 0 is exact).'),
  worstRelativeError: z
    .number()
    .describe('Largest |fitted/measured − 1| over the points, a fraction.'),
}) satisfies z.ZodType<SteinmetzFit>;
