import { z } from 'zod';
import {
  DESIGN_LEVEL_FIELDS,
  ChoiceOriginSchema,
  DesignSummarySchema,
  DeviceStressSchema,
  WaveformSchema,
} from './design-parts-schema.js';
import { ForwardChoicesSchema, ForwardCornerSchema } from './forward-design-schema.js';

/**
 * One corner of an active-clamp forward: the forward corner shape, with the auxiliary switch and
 * clamp capacitor waveforms and an `activeClamp` block. Its magnetizing current swings negative
 * and never rests at zero; `resetDutyCycle` is the interval the clamp voltage resets the core.
 */
export const ActiveClampForwardCornerSchema = ForwardCornerSchema.extend({
  resetDutyCycle: z
    .number()
    .describe(
      'Interval over the period in which the clamp capacitor voltage is across the magnetizing inductance (the off-time less the turn-off commutation and the dead time before turn-on).',
    ),
  waveforms: ForwardCornerSchema.shape.waveforms.extend({
    auxiliarySwitchCurrentA: WaveformSchema.describe(
      'Current in the auxiliary switch, which is the clamp capacitor current (positive charging it), A.',
    ),
    auxiliarySwitchVoltageV: WaveformSchema.describe('Voltage across the auxiliary switch, V.'),
    clampCapacitorVoltageV: WaveformSchema.describe('Voltage across the clamp capacitor, V.'),
  }),
  activeClamp: z.object({
    capacitorVoltageV: z
      .number()
      .describe(
        'Mean clamp capacitor voltage over the reset interval, V: the Vc of volt-second balance on the magnetizing inductance (Vin·D/(1 − D) lossless).',
      ),
    capacitorVoltagePeakV: z.number().describe('Peak voltage across the clamp capacitor, V.'),
    capacitorRippleVoltagePeakToPeakV: z
      .number()
      .describe('Peak-to-peak voltage ripple of the clamp capacitor, V.'),
    capacitorCurrentRmsA: z.number().describe('RMS current of the clamp capacitor, A.'),
    magnetizingCurrentValleyA: z
      .number()
      .describe('Lowest magnetizing current (negative when the flux resets past zero), A.'),
    auxiliarySwitch: DeviceStressSchema,
  }),
});

/** What an active-clamp forward design chose: the forward's choices plus the clamp capacitor. */
export const ActiveClampForwardChoicesSchema = ForwardChoicesSchema.extend({
  clampCapacitanceF: z.number().describe('Clamp capacitance, F.'),
  clampCapacitorEsrOhm: z.number().describe('Clamp capacitor equivalent series resistance, Ω.'),
  origins: ForwardChoicesSchema.shape.origins.extend({ clampCapacitanceF: ChoiceOriginSchema }),
});

/** An active-clamp forward design. */
export const ActiveClampForwardDesignSchema = z.object({
  topology: z.literal('active-clamp-forward'),
  choices: ActiveClampForwardChoicesSchema,
  corners: z.array(ActiveClampForwardCornerSchema),
  summary: DesignSummarySchema,
  ...DESIGN_LEVEL_FIELDS,
  modelNotes: z
    .array(z.string())
    .describe('What this version of the model includes and leaves out.'),
});
