import { z } from 'zod';
import {
  CORNER_BALANCE_FIELDS,
  ChoiceOriginSchema,
  DesignSummarySchema,
  DESIGN_LEVEL_FIELDS,
  DeviceStressSchema,
  WaveformSchema,
  WindingStressSchema,
} from './design-parts-schema.js';
import { ForwardChoicesSchema, InductorModeSchema } from './forward-design-schema.js';

/** How one output's secondary is wound and rectified in the push-pull and the bridges. */
export const SecondaryArrangementSchema = z
  .enum(['center-tapped', 'full-bridge'])
  .describe(
    'Center-tapped secondary with two rectifiers, or one winding into a four-rectifier bridge.',
  );

/**
 * One operating corner of a push-pull or bridge design: the forward corner's shape without the
 * reset interval, plus each switch's own current (each conducts in one half-period only).
 */
export const DoubleEndedCornerSchema = z.object({
  label: z.string().describe('Which corner, for example min-input/100pct-load.'),
  inputVoltageV: z.number().describe('Input voltage at this corner, V.'),
  loadFraction: z.number().describe('Load as a fraction of full load.'),
  dutyCycle: z
    .number()
    .describe(
      "Each switch's on-time over the switching period (0..0.5); the output inductor sees 2·dutyCycle at twice the switching frequency.",
    ),
  outputInductorModes: z.array(InductorModeSchema).describe('Mode of each output inductor.'),
  magnetizingCurrentPeakA: z
    .number()
    .describe('Peak magnetizing current (it swings symmetrically between ±peak), A.'),
  outputInductorCurrentRipplesA: z
    .array(z.number())
    .describe('Peak-to-peak current of each output inductor, A.'),
  waveforms: z.object({
    magnetizingCurrentA: WaveformSchema,
    primaryCurrentA: WaveformSchema.describe(
      'Primary winding current (push-pull: the two halves together, as ampere-turns of one half), A.',
    ),
    switchCurrentsA: z.array(WaveformSchema).describe('Current in each primary switch, A.'),
    windingCurrentsA: z
      .array(WaveformSchema)
      .describe(
        "Current in each transformer winding, in the order of the corner's windings (the output inductors left out): the primary (push-pull: each half), then each output's secondary (center-tapped: each half), A.",
      ),
    switchVoltagesV: z.array(WaveformSchema).describe('Voltage across each primary switch, V.'),
    outputInductorCurrentsA: z.array(WaveformSchema),
    rectifierVoltagesV: z
      .array(WaveformSchema)
      .describe(
        'Reverse voltage of each rectifier, per output in order (two for a center-tapped secondary, four for a bridge), V.',
      ),
  }),
  switches: z.array(DeviceStressSchema),
  rectifiers: z.array(DeviceStressSchema),
  windings: z.array(WindingStressSchema),
  ...CORNER_BALANCE_FIELDS,
});

/** What a push-pull or bridge design chose: the forward's choices plus each secondary's arrangement. */
export const DoubleEndedChoicesSchema = ForwardChoicesSchema.extend({
  secondaryArrangements: z
    .array(SecondaryArrangementSchema)
    .describe('Secondary arrangement of each output.'),
  clampVoltageV: z
    .number()
    .optional()
    .describe(
      'Push-pull with leakage only: the voltage of the RCD clamp capacitor above the input rail, V (each drain is clamped at the input plus this voltage).',
    ),
  origins: ForwardChoicesSchema.shape.origins.extend({
    secondaryArrangements: z.array(ChoiceOriginSchema),
    clampVoltageV: ChoiceOriginSchema.optional(),
  }),
});

function doubleEndedDesignSchema<T extends 'push-pull' | 'half-bridge' | 'full-bridge'>(id: T) {
  return z.object({
    topology: z.literal(id),
    choices: DoubleEndedChoicesSchema,
    corners: z.array(DoubleEndedCornerSchema),
    summary: DesignSummarySchema,
    ...DESIGN_LEVEL_FIELDS,
    modelNotes: z
      .array(z.string())
      .describe('What this version of the model includes and leaves out.'),
  });
}

/** A push-pull design (center-tapped primary, two switches). */
export const PushPullDesignSchema = doubleEndedDesignSchema('push-pull');
/** A half-bridge design (capacitor divider, two switches). */
export const HalfBridgeDesignSchema = doubleEndedDesignSchema('half-bridge');
/** A full-bridge design (four hard-switched switches). */
export const FullBridgeDesignSchema = doubleEndedDesignSchema('full-bridge');
