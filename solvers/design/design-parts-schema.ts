import { z } from 'zod';
import { TransformerDesignSchema } from '../transformer/transformer-design-schema.js';
import { OutputInductorDesignSchema } from '../inductor/output-inductor-design-schema.js';
import { HoldUpDesignSchema } from './hold-up-design-schema.js';

/**
 * The parts every topology's design shares: waveforms, device and winding stresses, losses, the
 * corner's outputs, choice origins and the summary.
 */

export const WaveformSchema = z
  .object({
    periodS: z.number().describe('Period, s.'),
    timesS: z
      .array(z.number())
      .describe('Breakpoint times within the period, s; a repeated time is a jump.'),
    values: z
      .array(z.number())
      .describe('Values at the breakpoints, in the unit the field name ends in (A or V).'),
  })
  .describe('One period of a piecewise-linear periodic waveform.');

export const DeviceStressSchema = z.object({
  name: z.string().describe('Which device, for example primary-switch or rectifier-1.'),
  currentPeakA: z.number().describe('Peak current, A.'),
  currentRmsA: z.number().describe('RMS current, A.'),
  currentAverageA: z.number().describe('Average current, A.'),
  voltagePeakV: z.number().describe('Peak blocking voltage, V.'),
  voltageRatingV: z.number().optional().describe('Voltage rating from the spec, V.'),
  voltageUtilization: z
    .number()
    .optional()
    .describe('Peak voltage over rating (dimensionless); compared against the derating limit.'),
});

export const WindingStressSchema = z.object({
  name: z.string().describe('Which winding: primary or secondary-N.'),
  currentRmsA: z.number().describe('RMS current, A.'),
  currentAverageA: z.number().describe('Average current, A.'),
  currentPeakA: z.number().describe('Peak current, A.'),
  resistanceOhm: z.number().describe('DC resistance at the winding temperature, Ω.'),
  copperLossW: z
    .number()
    .describe(
      "Copper loss, W: I²R at DC resistance, or with a designed transformer the DC loss plus each harmonic's loss by Dowell's factor, at the transformer's temperature at this corner.",
    ),
});

export const LOSS_MECHANISMS = [
  'conduction',
  'turn-on',
  'turn-off',
  'output-capacitance',
  'gate-drive',
  'reverse-recovery',
  'dead-time',
  'copper',
  'esr',
  'clamp',
  'core',
] as const;

export const LossSchema = z.object({
  component: z
    .string()
    .describe(
      'Where the loss is: primary-switch, rectifier-N, primary, secondary-N, output-capacitor-N, clamp.',
    ),
  mechanism: z.enum(LOSS_MECHANISMS).describe('The physical mechanism.'),
  powerW: z.number().describe('Average power, W.'),
});

export const CornerOutputSchema = z.object({
  voltageV: z
    .number()
    .describe(
      'Output voltage at this corner, V (cross-regulation estimate for outputs after the first).',
    ),
  currentA: z.number().describe('Load current, A.'),
  capacitorRippleCurrentRmsA: z.number().describe('RMS ripple current in the output capacitor, A.'),
  rippleVoltagePeakToPeakV: z
    .number()
    .describe('Peak-to-peak output ripple from capacitance and ESR, V.'),
});

/** One output at one corner: voltage, load, capacitor ripple current and output ripple. */
export type CornerOutput = z.infer<typeof CornerOutputSchema>;

/** The power balance every corner ends with, whatever the topology: losses, powers, capacitors. */
export const CORNER_BALANCE_FIELDS = {
  losses: z.array(LossSchema),
  lossTotalW: z.number().describe('Sum of all losses, W.'),
  outputPowerW: z.number().describe('Power delivered to the loads, W.'),
  inputPowerW: z.number().describe('Power drawn from the input, W.'),
  inputCurrentAverageA: z.number().describe('Average input current, A.'),
  inputCapacitorRippleCurrentRmsA: z
    .number()
    .describe('RMS ripple current the input capacitor must carry, A.'),
  efficiency: z.number().describe('Output power over input power.'),
  outputs: z.array(CornerOutputSchema),
  modelFallback: z
    .string()
    .optional()
    .describe(
      "Present where the engine's usual model for this corner failed (its solve did not converge, or with several outputs its assumptions did not hold there) and a simpler one was kept: which, and how far off it can be. Such corners are listed in summary.modelFallbacks.",
    ),
};

/**
 * Design-level blocks every topology's design carries beside its choices, corners and summary,
 * each present only when the spec asks for it; a topology's design schema spreads this object.
 */
export const DESIGN_LEVEL_FIELDS = {
  holdUp: HoldUpDesignSchema.optional().describe(
    'Present when the spec has holdUp: the bulk capacitor for the stated hold-up time.',
  ),
  transformer: TransformerDesignSchema.optional().describe(
    "Present when magnetics.mode is 'design' and the magnetics design reaches the topology: the transformer to wind, and how it fares at every corner.",
  ),
  outputInductors: z
    .array(OutputInductorDesignSchema)
    .optional()
    .describe(
      "Present when magnetics.mode is 'design' for a buck-derived topology (every forward, push-pull, half and full bridge; not the flyback): one designed output inductor per output, in output order.",
    ),
};

export const ConductionModeSchema = z
  .enum(['ccm', 'bcm', 'dcm'])
  .describe('Continuous, boundary or discontinuous conduction of the magnetizing current.');

export const ChoiceOriginSchema = z
  .enum(['spec', 'target', 'default', 'magnetics'])
  .describe(
    'Whether a value came from the request, from a design target, from a default rule, or from the designed transformer (whole turns, its leakage and resistances).',
  );

export const DesignSummarySchema = z.object({
  dutyCycleMax: z.number().describe('Largest duty cycle over all corners.'),
  efficiencyMin: z.number().describe('Lowest efficiency over all corners.'),
  efficiencyNominal: z.number().describe('Efficiency at nominal input and the largest load point.'),
  switchVoltagePeakV: z.number().describe('Largest switch voltage over all corners, V.'),
  switchCurrentPeakA: z.number().describe('Largest switch current over all corners, A.'),
  rectifierVoltagePeaksV: z
    .array(z.number())
    .describe('Largest reverse voltage on each output rectifier, V.'),
  lossTotalMaxW: z.number().describe('Largest total loss over all corners, W.'),
  conductionModes: z
    .array(ConductionModeSchema)
    .describe(
      "Conduction mode at each corner, in corner order: the magnetizing current's for the flyback, the first output inductor's for the forward family.",
    ),
  regulationMisses: z
    .array(
      z.object({
        corner: z.string().describe('The corner, as its label.'),
        outputVoltageV: z.number().describe('The regulated output the steady state reached, V.'),
        targetVoltageV: z.number().describe("The regulated output's target, V."),
      }),
    )
    .describe(
      'Corners whose regulated output (the first) the steady state leaves more than 0.1 % from its target: the duty-cycle solve did not hold it there (at light load the push-pull and bridge models’ output can rise very steeply with the duty cycle and jump within a narrow range, and the solve can end off the target even after solving the corner again from fresh starts; and where a flyback, a forward, or a push-pull or bridge with one output, at a few percent load delivers more than the load even at its shortest pulse, the switch capacitance’s energy alone exceeding the load’s, the corner is solved at that pulse for the output it reaches, above the target). The corner is reported at the duty cycle the solve ended on. Empty when every corner regulates.',
    ),
  modelFallbacks: z
    .array(
      z.object({
        corner: z.string().describe('The corner, as its label.'),
        reason: z.string().describe("The corner's modelFallback."),
      }),
    )
    .describe(
      'Corners solved on a simpler model than usual because the usual one did not converge or did not hold there (each corner’s modelFallback says which and how far off it can be); their numbers deserve a circuit simulation. Empty when every corner took its usual model.',
    ),
});
