import { z } from 'zod';

/**
 * The engine's answer for one spec: the choices it made, and the complete operating point at
 * every corner (input voltage × load fraction). Plain JSON; every number in SI units.
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
  copperLossW: z.number().describe('I²R loss at DC resistance, W.'),
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

export const ConductionModeSchema = z
  .enum(['ccm', 'bcm', 'dcm'])
  .describe('Continuous, boundary or discontinuous conduction of the magnetizing current.');

export const CornerSchema = z.object({
  label: z.string().describe('Which corner, for example min-input/100pct-load.'),
  inputVoltageV: z.number().describe('Input voltage at this corner, V.'),
  loadFraction: z.number().describe('Load as a fraction of full load.'),
  conductionMode: ConductionModeSchema,
  dutyCycle: z.number().describe('Switch on-time over period.'),
  demagnetizingDutyCycle: z.number().describe('Secondary conduction time over period.'),
  magnetizingCurrentAverageA: z
    .number()
    .describe('Average magnetizing current referred to the primary, A.'),
  magnetizingCurrentPeakA: z.number().describe('Peak magnetizing current, A.'),
  magnetizingCurrentRippleA: z.number().describe('Peak-to-peak magnetizing ripple, A.'),
  waveforms: z.object({
    magnetizingCurrentA: WaveformSchema,
    primaryCurrentA: WaveformSchema,
    switchVoltageV: WaveformSchema,
    secondaryCurrentsA: z.array(WaveformSchema),
    rectifierVoltagesV: z.array(WaveformSchema),
  }),
  switches: z.array(DeviceStressSchema),
  rectifiers: z.array(DeviceStressSchema),
  windings: z.array(WindingStressSchema),
  clamp: z.object({
    voltageV: z.number().describe('Voltage across the clamp capacitor, V.'),
    powerW: z.number().describe('Power dissipated in the clamp resistor, W.'),
    leakageEnergyJ: z.number().describe('Energy in the leakage inductance at turn-off, J.'),
    commutationTimeS: z
      .number()
      .describe('Time for the leakage current to fall to zero after turn-off, s.'),
  }),
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
});

export const ChoiceOriginSchema = z
  .enum(['spec', 'target', 'default'])
  .describe('Whether a value came from the request, from a design target, or from a default rule.');

export const DesignSchema = z.object({
  topology: z.literal('flyback'),
  choices: z.object({
    turnsRatio: z.number().describe('Np/Ns of the first output.'),
    outputTurnsRatios: z.array(z.number()).describe('Np/Ns of each output.'),
    magnetizingInductanceH: z
      .number()
      .describe('Magnetizing inductance referred to the primary, H.'),
    leakageInductanceH: z.number().describe('Primary-referred leakage inductance, H.'),
    reflectedVoltageV: z
      .number()
      .describe(
        'First output voltage plus rectifier drop, reflected to the primary at full load, V.',
      ),
    clampVoltageV: z.number().describe('Voltage across the clamp capacitor, V.'),
    primaryResistanceOhm: z
      .number()
      .describe('Primary DC resistance at the ambient temperature, Ω.'),
    outputWindingResistancesOhm: z
      .array(z.number())
      .describe('Output winding DC resistances at the ambient temperature, Ω.'),
    origins: z.object({
      turnsRatio: ChoiceOriginSchema,
      magnetizingInductanceH: ChoiceOriginSchema,
      leakageInductanceH: ChoiceOriginSchema,
      clampVoltageV: ChoiceOriginSchema,
    }),
  }),
  corners: z.array(CornerSchema),
  summary: z.object({
    dutyCycleMax: z.number().describe('Largest duty cycle over all corners.'),
    efficiencyMin: z.number().describe('Lowest efficiency over all corners.'),
    efficiencyNominal: z
      .number()
      .describe('Efficiency at nominal input and the largest load point.'),
    switchVoltagePeakV: z.number().describe('Largest switch voltage over all corners, V.'),
    switchCurrentPeakA: z.number().describe('Largest switch current over all corners, A.'),
    rectifierVoltagePeaksV: z
      .array(z.number())
      .describe('Largest reverse voltage on each output rectifier, V.'),
    lossTotalMaxW: z.number().describe('Largest total loss over all corners, W.'),
    conductionModes: z
      .array(ConductionModeSchema)
      .describe('Conduction mode at each corner, in corner order.'),
  }),
  modelNotes: z
    .array(z.string())
    .describe('What this version of the model includes and leaves out.'),
});

export type Design = z.infer<typeof DesignSchema>;
export type Corner = z.infer<typeof CornerSchema>;
export type DeviceStress = z.infer<typeof DeviceStressSchema>;
export type Loss = z.infer<typeof LossSchema>;
export type ConductionMode = z.infer<typeof ConductionModeSchema>;
