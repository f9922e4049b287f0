import { z } from 'zod';

/**
 * How one uncertain quantity is spread. 'relative' values are fractions of the nominal value
 * (value = nominal·(1 + x)); 'absolute' ones are in the quantity's own unit.
 */

const ScaleSchema = z
  .enum(['relative', 'absolute'])
  .describe(
    "'relative': lower, upper and sigma are fractions of the nominal value (value = nominal·(1 + x)); 'absolute': values in the quantity's unit (sigma about the nominal).",
  );

export const UniformDistributionSchema = z
  .strictObject({
    kind: z.literal('uniform'),
    scale: ScaleSchema,
    lower: z.number().describe('Lowest value (relative fraction or absolute).'),
    upper: z.number().describe('Highest value (relative fraction or absolute).'),
  })
  .describe('Every value between lower and upper equally likely. Worst case: its two ends.');

export const NormalDistributionSchema = z
  .strictObject({
    kind: z.literal('normal'),
    scale: ScaleSchema,
    sigma: z
      .number()
      .nonnegative()
      .describe('Standard deviation before truncation (relative fraction or absolute).'),
  })
  .describe(
    'Normal about the nominal value, truncated at ±3 sigma (draws beyond are redrawn), so its variance is 0.973·sigma². Worst case: nominal ± 3 sigma.',
  );

export const BandDistributionSchema = z
  .strictObject({
    kind: z.literal('band'),
    scale: ScaleSchema,
    lower: z.number().describe('Lowest value (relative fraction or absolute).'),
    upper: z.number().describe('Highest value (relative fraction or absolute).'),
  })
  .describe(
    'A min/max band with no known shape (a part specified by limits only): Monte Carlo draws it uniformly (the widest-spread choice for a bounded quantity), worst case takes its two ends.',
  );

export const FixedDistributionSchema = z
  .strictObject({
    kind: z.literal('fixed'),
    value: z
      .number()
      .optional()
      .describe("The value, in the quantity's unit; the nominal value when omitted."),
  })
  .describe('No spread: every sample and every worst-case vertex takes this value.');

export const DistributionSchema = z
  .discriminatedUnion('kind', [
    UniformDistributionSchema,
    NormalDistributionSchema,
    BandDistributionSchema,
    FixedDistributionSchema,
  ])
  .describe('The spread of one uncertain quantity.');

/** One quantity's spread, as requested or filled in by default. */
export type Distribution = z.infer<typeof DistributionSchema>;

/** Draws beyond this many standard deviations are redrawn. */
export const NORMAL_TRUNCATION_SIGMAS = 3;

/** The value of a relative or absolute offset `x` from `nominal`. */
function valueAt(nominal: number, scale: 'relative' | 'absolute', x: number): number {
  return scale === 'relative' ? nominal * (1 + x) : x;
}

/**
 * The band the worst-case analysis takes the ends of, in the quantity's unit: uniform and band
 * their ends, normal nominal ± 3 sigma, fixed its value at both ends.
 */
export function distributionEnds(
  distribution: Distribution,
  nominal: number,
): { lower: number; upper: number } {
  switch (distribution.kind) {
    case 'uniform':
    case 'band':
      return {
        lower: valueAt(nominal, distribution.scale, distribution.lower),
        upper: valueAt(nominal, distribution.scale, distribution.upper),
      };
    case 'normal': {
      const spread = NORMAL_TRUNCATION_SIGMAS * distribution.sigma;
      const scaled = distribution.scale === 'relative' ? nominal * spread : spread;
      return { lower: nominal - Math.abs(scaled), upper: nominal + Math.abs(scaled) };
    }
    case 'fixed': {
      const value = distribution.value ?? nominal;
      return { lower: value, upper: value };
    }
  }
}

/** A source of uniform doubles on [0, 1) and standard normal variates. */
export interface VariateSource {
  nextDouble(): number;
  nextNormal(): number;
}

/** Draws one value of the quantity from `distribution`, with `nominal` as its centre. */
export function drawValue(
  distribution: Distribution,
  nominal: number,
  source: VariateSource,
): number {
  switch (distribution.kind) {
    case 'uniform':
    case 'band': {
      const { lower, upper } = distributionEnds(distribution, nominal);
      return lower + (upper - lower) * source.nextDouble();
    }
    case 'normal': {
      let z = source.nextNormal();
      while (Math.abs(z) > NORMAL_TRUNCATION_SIGMAS) z = source.nextNormal();
      const spread =
        distribution.scale === 'relative' ? nominal * distribution.sigma : distribution.sigma;
      return nominal + spread * z;
    }
    case 'fixed':
      return distribution.value ?? nominal;
  }
}
