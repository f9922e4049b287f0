import { z } from 'zod';
import { SpecSchema } from '../spec/spec-schema.js';
import { DistributionSchema, NORMAL_TRUNCATION_SIGMAS } from './tolerance-distribution.js';
import { toleranceParameterIds } from './tolerance-parameters.js';

/** Defaults of a tolerance request. */
export const TOLERANCE_DEFAULTS = {
  /** Monte Carlo samples when the request names none. */
  sampleCount: 2000,
  /**
   * Seed when the request names none: a fixed, arbitrary value (the digits of 2026-12-02), so a
   * request without a seed is reproducible too; every result echoes the seed it used.
   */
  seed: 20261202,
  /**
   * Output excursion allowed, as a fraction of each output's target: ±5 % (common practice for a
   * regulated supply's total band: set point, load and line regulation, ripple; recalled).
   */
  outputVoltageBand: 0.05,
  /** Varied parameters up to which the worst case evaluates every vertex (2^8 = 256). */
  everyVertexParameterMax: 8,
} as const;

/**
 * Largest sampleCount the schema accepts. The service's configurable job-size limit (what
 * `plan(request).total`, the sample count, is held to) applies below it.
 */
export const TOLERANCE_SAMPLE_COUNT_MAX = 1_000_000;

/**
 * A tolerance run: one spec, designed once; `sampleCount` units built from that design with every
 * uncertain quantity drawn from its distribution, each at an operating point also drawn; yield
 * against each limit, the worst-case vertices and which tolerance drives each limit.
 */
export const ToleranceRequestSchema = z
  .strictObject({
    spec: SpecSchema,
    sampleCount: z
      .int()
      .min(1)
      .max(TOLERANCE_SAMPLE_COUNT_MAX)
      .default(TOLERANCE_DEFAULTS.sampleCount)
      .describe(
        `Monte Carlo samples (units × operating points), ${TOLERANCE_DEFAULTS.sampleCount} when omitted; the service's job-size limit applies.`,
      ),
    seed: z
      .int()
      .min(0)
      .max(Number.MAX_SAFE_INTEGER)
      .default(TOLERANCE_DEFAULTS.seed)
      .describe(
        `Seed of the random streams (${TOLERANCE_DEFAULTS.seed} when omitted); the result echoes it, and the same request with the same seed gives the same result to the byte.`,
      ),
    tolerances: z
      .record(z.string(), DistributionSchema)
      .default({})
      .describe(
        'Spread of each uncertain quantity by parameter id (inputVoltageV, loadFraction, regulationSetpoint, switchingFrequencyHz, ambientTemperatureC, transformer.magnetizingInductanceH, transformer.leakageInductanceH, primarySwitch.onResistanceOhm, and per output k outputs.k.rectifier.forwardVoltageV or outputs.k.rectifier.onResistanceOhm, outputs.k.capacitanceF, outputs.k.capacitorEsrOhm); every id omitted gets its documented default, which the result states.',
      ),
    limits: z
      .strictObject({
        outputVoltageBand: z
          .number()
          .gt(0)
          .max(1)
          .default(TOLERANCE_DEFAULTS.outputVoltageBand)
          .describe(
            'Largest output excursion (|Vo − target| + ripple/2) as a fraction of the target, every output; 0.05 when omitted (common practice).',
          ),
        efficiencyMin: z
          .number()
          .gt(0)
          .lt(1)
          .optional()
          .describe('Lowest acceptable efficiency; not checked when omitted.'),
      })
      .default({ outputVoltageBand: TOLERANCE_DEFAULTS.outputVoltageBand })
      .describe("Limits of the run besides the spec's own (ratings, flux, temperature rise)."),
    worstCase: z
      .strictObject({
        everyVertexParameterMax: z
          .int()
          .min(0)
          .max(10)
          .default(TOLERANCE_DEFAULTS.everyVertexParameterMax)
          .describe(
            'Up to this many varied parameters (at most 10: 1024 vertices) every vertex of the tolerance box (2^k) is evaluated; above it the sensitivity-signed extreme vertex of each limit.',
          ),
      })
      .default({ everyVertexParameterMax: TOLERANCE_DEFAULTS.everyVertexParameterMax })
      .describe('How the worst-case analysis picks its vertices.'),
  })
  .superRefine((request, ctx) => {
    const ids = toleranceParameterIds(request.spec);
    for (const [id, distribution] of Object.entries(request.tolerances)) {
      const path = ['tolerances', id];
      if (!ids.includes(id)) {
        ctx.addIssue({
          code: 'custom',
          path,
          message: `is not a parameter of this spec; the parameters are ${ids.join(', ')}`,
        });
        continue;
      }
      if (distribution.kind === 'uniform' || distribution.kind === 'band') {
        if (!(distribution.lower <= distribution.upper)) {
          ctx.addIssue({
            code: 'custom',
            path: [...path, 'upper'],
            message: 'must be at least lower',
          });
        }
        if (distribution.scale === 'relative' && !(distribution.lower > -1)) {
          ctx.addIssue({
            code: 'custom',
            path: [...path, 'lower'],
            message: 'a relative lower end must be above −1 (the value must stay positive)',
          });
        }
      }
      const isPositive = id !== 'ambientTemperatureC';
      const absoluteLowest =
        distribution.kind === 'fixed'
          ? distribution.value
          : distribution.kind !== 'normal' && distribution.scale === 'absolute'
            ? distribution.lower
            : undefined;
      if (isPositive && absoluteLowest !== undefined && !(absoluteLowest > 0)) {
        ctx.addIssue({
          code: 'custom',
          path: [...path, distribution.kind === 'fixed' ? 'value' : 'lower'],
          message: 'must be above 0 (the quantity is positive)',
        });
      }
      if (
        distribution.kind === 'normal' &&
        distribution.scale === 'relative' &&
        !(NORMAL_TRUNCATION_SIGMAS * distribution.sigma < 1)
      ) {
        ctx.addIssue({
          code: 'custom',
          path: [...path, 'sigma'],
          message: `a relative sigma must be below 1/${NORMAL_TRUNCATION_SIGMAS} (the value must stay positive at the truncation)`,
        });
      }
    }
  })
  .describe('A tolerance (Monte Carlo and worst-case) job.');

/** A parsed tolerance request, defaults filled in. */
export type ToleranceRequest = z.infer<typeof ToleranceRequestSchema>;
/** A tolerance request as a client may send it. */
export type ToleranceRequestInput = z.input<typeof ToleranceRequestSchema>;
