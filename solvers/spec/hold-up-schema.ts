import { z } from 'zod';

/**
 * What a spec asks of the bulk capacitor ahead of the converter: carry full load for `timeS`
 * after the input source drops out, while the bus falls from the start to the end voltage. The
 * voltages have no schema default (their defaults are other fields of the spec); the engine
 * applies them and reports the values it used in the design's `holdUp` block.
 */
export const HoldUpSchema = z
  .strictObject({
    timeS: z
      .number()
      .positive()
      .max(10)
      .describe('Time the converter must keep running at full load after the source drops, s.'),
    startVoltageV: z
      .number()
      .positive()
      .optional()
      .describe(
        'Bulk capacitor voltage when the source drops, V; inputVoltageNominalV when omitted. At most inputVoltageMaxV.',
      ),
    endVoltageV: z
      .number()
      .positive()
      .optional()
      .describe(
        'Lowest bulk capacitor voltage the converter must still run at, V; inputVoltageMinV when omitted. At least inputVoltageMinV and below the start voltage.',
      ),
  })
  .describe(
    'Hold-up: the bulk capacitor is sized so the converter carries full load for timeS while the bus falls from startVoltageV to endVoltageV.',
  );

export type HoldUp = z.infer<typeof HoldUpSchema>;
