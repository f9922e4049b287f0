import { z } from 'zod';
import { AWG_MAX, AWG_MIN, roundWireGauge, type InsulationGrade } from './round-wire-gauge.js';

/** Options of {@link roundWireCatalog}. */
export interface RoundWireCatalogOptions {
  /** Thickest gauge listed (smallest AWG number; −3 is 0000). @defaultValue −3 */
  awgMin?: number;
  /** Thinnest gauge listed (largest AWG number). @defaultValue 56 */
  awgMax?: number;
}

const DEFAULTS = { awgMin: AWG_MIN, awgMax: AWG_MAX } satisfies Required<RoundWireCatalogOptions>;

const GRADES: readonly InsulationGrade[] = [1, 2, 3];

/** One AWG size of round enamelled copper magnet wire, every enamel grade, resistance at 20 °C. */
export const RoundWireCatalogRowSchema = z.strictObject({
  awg: z
    .int()
    .describe('AWG number (dimensionless); 0 is gauge 0, −1 is 00, −2 is 000, −3 is 0000.'),
  bareDiameterM: z.number().describe('Nominal bare copper diameter by ASTM B258, m.'),
  copperAreaM2: z.number().describe('Copper cross-section π·d²/4, m².'),
  resistancePerLengthOhmPerM: z
    .number()
    .describe(
      'DC resistance per metre at 20 °C, annealed copper (IEC 60028), Ω/m (in Ω per length in m).',
    ),
  temperatureC: z.number().describe('Temperature the resistance is stated at, °C.'),
  insulations: z
    .array(
      z.strictObject({
        insulationGrade: z
          .union([z.literal(1), z.literal(2), z.literal(3)])
          .describe('IEC 60317 enamel grade: 1 thin, 2 medium, 3 thick build.'),
        overallDiameterM: z
          .number()
          .describe(
            'Approximate maximum enamelled diameter (a model; confirm with the supplier), m.',
          ),
      }),
    )
    .describe('Overall diameter for each enamel grade.'),
});

/** One row of {@link roundWireCatalog}. */
export type RoundWireCatalogRow = z.infer<typeof RoundWireCatalogRowSchema>;

/**
 * Returns the AWG sizes awgMin…awgMax (integers within −3…56), thickest first, each with its
 * ASTM B258 diameter, copper area, resistance per metre at 20 °C and overall diameter per grade.
 * @throws RangeError for bounds outside −3…56, not integers, or awgMin > awgMax.
 */
export function roundWireCatalog(options: RoundWireCatalogOptions = {}): RoundWireCatalogRow[] {
  const { awgMin, awgMax } = { ...DEFAULTS, ...options };
  if (!(Number.isInteger(awgMin) && Number.isInteger(awgMax) && awgMin <= awgMax)) {
    throw new RangeError(
      `roundWireCatalog: need integers awgMin ≤ awgMax, got ${awgMin}…${awgMax}`,
    );
  }
  const rows: RoundWireCatalogRow[] = [];
  for (let awg = awgMin; awg <= awgMax; awg++) {
    const wires = GRADES.map((insulationGrade) =>
      roundWireGauge(awg, { insulationGrade, temperatureC: 20 }),
    );
    const [first] = wires;
    if (!first) continue;
    rows.push({
      awg,
      bareDiameterM: first.bareDiameterM,
      copperAreaM2: first.copperAreaM2,
      resistancePerLengthOhmPerM: first.resistancePerLengthOhmPerM,
      temperatureC: first.temperatureC,
      insulations: wires.map(({ insulationGrade, overallDiameterM }) => ({
        insulationGrade,
        overallDiameterM,
      })),
    });
  }
  return rows;
}
