import { z } from 'zod';

const HoldUpVoltageOriginSchema = z
  .enum(['spec', 'default'])
  .describe('Whether the voltage came from the request or from its default field of the spec.');

/** The design's answer to the spec's hold-up requirement: the bulk capacitance and its inputs. */
export const HoldUpDesignSchema = z
  .object({
    timeS: z.number().describe('Hold-up time asked for, s.'),
    startVoltageV: z.number().describe('Bulk capacitor voltage when the source drops, V.'),
    endVoltageV: z.number().describe('Lowest bulk capacitor voltage at the end of the time, V.'),
    inputPowerW: z
      .number()
      .describe(
        'Largest full-load input power of the converter between the end and start voltages, W: the power the capacitor must supply.',
      ),
    inputPowerAtVoltageV: z
      .number()
      .describe('Input voltage at which that largest full-load input power was found, V.'),
    energyJ: z.number().describe('Energy drawn from the bulk capacitor over the time, J.'),
    bulkCapacitanceF: z
      .number()
      .describe(
        'Smallest bulk capacitance that holds up the converter, F; nominal value, before any margin for tolerance, ageing or ripple.',
      ),
    origins: z.object({
      startVoltageV: HoldUpVoltageOriginSchema,
      endVoltageV: HoldUpVoltageOriginSchema,
    }),
  })
  .describe(
    'Hold-up: C = 2·P·t / (Vstart² − Vend²), from the energy ½·C·V² a capacitor stores, with P the largest full-load input power between the two voltages.',
  );

export type HoldUpDesign = z.infer<typeof HoldUpDesignSchema>;
