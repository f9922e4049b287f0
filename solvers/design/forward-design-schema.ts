import { z } from 'zod';
import {
  CORNER_BALANCE_FIELDS,
  DESIGN_LEVEL_FIELDS,
  ChoiceOriginSchema,
  DesignSummarySchema,
  DeviceStressSchema,
  WaveformSchema,
  WindingStressSchema,
} from './design-parts-schema.js';

/** Continuous or discontinuous conduction of an output inductor. */
export const InductorModeSchema = z
  .enum(['ccm', 'dcm'])
  .describe('Continuous or discontinuous conduction of an output inductor.');

/** One operating corner of a forward-family design: steady state, waveforms, stresses, losses. */
export const ForwardCornerSchema = z.object({
  label: z.string().describe('Which corner, for example min-input/100pct-load.'),
  inputVoltageV: z.number().describe('Input voltage at this corner, V.'),
  loadFraction: z.number().describe('Load as a fraction of full load.'),
  dutyCycle: z.number().describe('Switch on-time over period.'),
  resetDutyCycle: z
    .number()
    .describe(
      'Time for the magnetizing current to return to zero after turn-off, over the period.',
    ),
  outputInductorModes: z.array(InductorModeSchema).describe('Mode of each output inductor.'),
  magnetizingCurrentPeakA: z.number().describe('Peak magnetizing current, A.'),
  outputInductorCurrentRipplesA: z
    .array(z.number())
    .describe('Peak-to-peak current of each output inductor, A.'),
  waveforms: z.object({
    magnetizingCurrentA: WaveformSchema,
    primaryCurrentA: WaveformSchema,
    primaryWindingCurrentA: WaveformSchema.describe(
      'Primary winding current: the switch current, plus the reset current where it flows in the primary, A.',
    ),
    secondaryCurrentsA: z
      .array(WaveformSchema)
      .describe('Current in each secondary winding (its forward rectifier), A.'),
    resetWindingCurrentA: WaveformSchema.optional().describe(
      'Current in the reset winding (forward with a reset winding only), A.',
    ),
    switchVoltagesV: z.array(WaveformSchema).describe('Voltage across each primary switch, V.'),
    outputInductorCurrentsA: z.array(WaveformSchema),
    rectifierVoltagesV: z
      .array(WaveformSchema)
      .describe('Reverse voltage of each rectifier: forward then freewheel, per output, V.'),
  }),
  switches: z.array(DeviceStressSchema),
  rectifiers: z.array(DeviceStressSchema),
  windings: z.array(WindingStressSchema),
  ...CORNER_BALANCE_FIELDS,
});

/** What a two-switch forward design chose, and where each choice came from. */
export const ForwardChoicesSchema = z.object({
  turnsRatio: z.number().describe('Np/Ns of the first output.'),
  outputTurnsRatios: z.array(z.number()).describe('Np/Ns of each output.'),
  magnetizingInductanceH: z.number().describe('Magnetizing inductance referred to the primary, H.'),
  leakageInductanceH: z.number().describe('Primary-referred leakage inductance, H.'),
  outputInductancesH: z.array(z.number()).describe('Output filter inductance of each output, H.'),
  primaryResistanceOhm: z.number().describe('Primary DC resistance at the ambient temperature, Ω.'),
  outputWindingResistancesOhm: z
    .array(z.number())
    .describe('Output winding DC resistances at the ambient temperature, Ω.'),
  outputInductorResistancesOhm: z
    .array(z.number())
    .describe('Output inductor DC resistances at the ambient temperature, Ω.'),
  origins: z.object({
    turnsRatio: ChoiceOriginSchema,
    magnetizingInductanceH: ChoiceOriginSchema,
    leakageInductanceH: ChoiceOriginSchema,
    outputInductancesH: z.array(ChoiceOriginSchema),
  }),
});

/** The reset-winding forward's choices: the two-switch forward's plus its Nr/Np. */
export const ResetWindingChoicesSchema = ForwardChoicesSchema.extend({
  resetTurnsRatio: z.number().describe('Reset-to-primary turns ratio Nr/Np.'),
  origins: ForwardChoicesSchema.shape.origins.extend({ resetTurnsRatio: ChoiceOriginSchema }),
});

/** A design of the forward with a reset winding. */
export const ResetWindingForwardDesignSchema = z.object({
  topology: z.literal('forward-reset-winding'),
  choices: ResetWindingChoicesSchema,
  corners: z.array(ForwardCornerSchema),
  summary: DesignSummarySchema,
  ...DESIGN_LEVEL_FIELDS,
  modelNotes: z
    .array(z.string())
    .describe('What this version of the model includes and leaves out.'),
});

/** A two-switch forward design. */
export const ForwardDesignSchema = z.object({
  topology: z.literal('two-switch-forward'),
  choices: ForwardChoicesSchema,
  corners: z.array(ForwardCornerSchema),
  summary: DesignSummarySchema,
  ...DESIGN_LEVEL_FIELDS,
  modelNotes: z
    .array(z.string())
    .describe('What this version of the model includes and leaves out.'),
});
