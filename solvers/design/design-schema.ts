import { z } from 'zod';
import {
  CORNER_BALANCE_FIELDS,
  DESIGN_LEVEL_FIELDS,
  ChoiceOriginSchema,
  ConductionModeSchema,
  DesignSummarySchema,
  DeviceStressSchema,
  LossSchema,
  WaveformSchema,
  WindingStressSchema,
} from './design-parts-schema.js';
import { ActiveClampForwardDesignSchema } from './active-clamp-forward-design-schema.js';
import {
  FullBridgeDesignSchema,
  HalfBridgeDesignSchema,
  PushPullDesignSchema,
} from './double-ended-design-schema.js';
import { ForwardDesignSchema, ResetWindingForwardDesignSchema } from './forward-design-schema.js';

export {
  ChoiceOriginSchema,
  ConductionModeSchema,
  CornerOutputSchema,
  DesignSummarySchema,
  DeviceStressSchema,
  LOSS_MECHANISMS,
  LossSchema,
  WaveformSchema,
  WindingStressSchema,
} from './design-parts-schema.js';

/**
 * The engine's answer for one spec: the choices it made, and the complete operating point at
 * every corner (input voltage × load fraction). Plain JSON; every number in SI units.
 */

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
    primaryWindingCurrentA: WaveformSchema.describe(
      'Primary winding current: the switch current, then the leakage current into the clamp, A.',
    ),
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
  ...CORNER_BALANCE_FIELDS,
});

export const FlybackDesignSchema = z.object({
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
  summary: DesignSummarySchema,
  ...DESIGN_LEVEL_FIELDS,
  modelNotes: z
    .array(z.string())
    .describe('What this version of the model includes and leaves out.'),
});

export const DesignSchema = z
  .discriminatedUnion('topology', [
    FlybackDesignSchema,
    ForwardDesignSchema,
    ResetWindingForwardDesignSchema,
    ActiveClampForwardDesignSchema,
    PushPullDesignSchema,
    HalfBridgeDesignSchema,
    FullBridgeDesignSchema,
  ])
  .describe('A designed converter; its shape depends on the topology.');

/** Any design: the union over topologies, discriminated by `topology`. */
export type Design = z.infer<typeof DesignSchema>;
/** A flyback design. */
export type FlybackDesign = z.infer<typeof FlybackDesignSchema>;
/** A two-switch forward design. */
export type ForwardDesign = z.infer<typeof ForwardDesignSchema>;
/** A design of the forward with a reset winding. */
export type ResetWindingForwardDesign = z.infer<typeof ResetWindingForwardDesignSchema>;
/** An active-clamp forward design. */
export type ActiveClampForwardDesign = z.infer<typeof ActiveClampForwardDesignSchema>;
/** A corner of an active-clamp forward design. */
export type ActiveClampForwardCorner = ActiveClampForwardDesign['corners'][number];
/** A corner of a forward-family design. */
export type ForwardCorner = ForwardDesign['corners'][number];
/** A push-pull, half-bridge or full-bridge design. */
export type DoubleEndedDesign =
  | z.infer<typeof PushPullDesignSchema>
  | z.infer<typeof HalfBridgeDesignSchema>
  | z.infer<typeof FullBridgeDesignSchema>;
/** A corner of a push-pull or bridge design. */
export type DoubleEndedCorner = DoubleEndedDesign['corners'][number];
/** A corner of any design. */
export type AnyCorner = Design['corners'][number];
export type Corner = z.infer<typeof CornerSchema>;
export type DeviceStress = z.infer<typeof DeviceStressSchema>;
export type Loss = z.infer<typeof LossSchema>;
export type ConductionMode = z.infer<typeof ConductionModeSchema>;
