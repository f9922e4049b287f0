import { z } from 'zod';
import { IssueSchema } from '../result-schema.js';
import { ConductionModeSchema } from '../design/design-schema.js';
import { SpecSchema } from '../spec/spec-schema.js';

/**
 * Most values one axis of a sweep's grid may list. The grid's size (the product of the axes) is
 * what the service's configurable job-size limit (JOB_SIZE_LIMIT_SWEEP) holds; this bound only
 * keeps a single list within what that limit's default (100,000 points) could ever use.
 */
export const SWEEP_AXIS_VALUES_MAX = 100_000;

/**
 * A parametric sweep: one base spec evaluated over a grid of input voltage x load fraction x
 * switching frequency. At each frequency the engine re-makes every choice the spec leaves open.
 */
export const SweepRequestSchema = z
  .strictObject({
    spec: SpecSchema,
    grid: z
      .strictObject({
        inputVoltagesV: z
          .array(z.number().positive())
          .min(1)
          .max(SWEEP_AXIS_VALUES_MAX)
          .optional()
          .describe(
            'Input voltages to evaluate, V; the spec minimum, nominal and maximum when omitted.',
          ),
        loadFractions: z
          .array(z.number().gt(0).max(1.5))
          .min(1)
          .max(SWEEP_AXIS_VALUES_MAX)
          .optional()
          .describe('Load fractions to evaluate; the spec loadFractions when omitted.'),
        switchingFrequenciesHz: z
          .array(z.number().min(1e3).max(10e6))
          .min(1)
          .max(SWEEP_AXIS_VALUES_MAX)
          .optional()
          .describe(
            'Switching frequencies to evaluate, Hz; the spec switchingFrequencyHz when omitted.',
          ),
      })
      .default({})
      .describe('The grid; each axis defaults to the spec value(s).'),
    chunkPointCount: z
      .int()
      .min(1)
      .max(100_000)
      .optional()
      .describe(
        'Grid points per chunk, the unit of work one worker takes at a time; 100 when omitted, and raised where the grid would need more than 1000 chunks (a job is cut into at most 1000). The rows do not depend on it.',
      ),
  })
  .describe('A parametric sweep request.');

export const SweepRowSchema = z.object({
  inputVoltageV: z.number().describe('Input voltage, V.'),
  loadFraction: z.number().describe('Load as a fraction of full load.'),
  switchingFrequencyHz: z.number().describe('Switching frequency, Hz.'),
  feasible: z.boolean().describe('Whether the design meets every limit at this point.'),
  conductionMode: ConductionModeSchema.optional(),
  dutyCycle: z.number().optional().describe('Duty cycle.'),
  efficiency: z.number().optional().describe('Output power over input power.'),
  lossTotalW: z.number().optional().describe('Total loss, W.'),
  switchVoltagePeakV: z.number().optional().describe('Peak switch voltage, V.'),
  switchCurrentPeakA: z.number().optional().describe('Peak switch current, A.'),
  issues: z.array(IssueSchema).optional().describe('Why the point is infeasible.'),
});

export const SweepResultSchema = z.object({
  pointCount: z.number().describe('Number of grid points evaluated.'),
  rows: z
    .array(SweepRowSchema)
    .describe('One row per grid point: frequency, then input voltage, then load.'),
});

export type SweepRequest = z.infer<typeof SweepRequestSchema>;
export type SweepRequestInput = z.input<typeof SweepRequestSchema>;
export type SweepRow = z.infer<typeof SweepRowSchema>;
export type SweepResult = z.infer<typeof SweepResultSchema>;
