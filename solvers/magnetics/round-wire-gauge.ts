import { copperResistancePerLength } from './copper-resistance-per-length.js';

/** Enamel insulation grade of IEC 60317 (1 thin, 2 medium, 3 thick build). */
export type InsulationGrade = 1 | 2 | 3;

/** A solid round enamelled copper wire of one AWG size. */
export interface RoundWire {
  /** AWG number; 0 is gauge 0, −1 is 00, −2 is 000, −3 is 0000. */
  awg: number;
  /** Nominal bare copper diameter by ASTM B258, m. */
  bareDiameterM: number;
  /** Copper cross-section π·d²/4, m². */
  copperAreaM2: number;
  insulationGrade: InsulationGrade;
  /** Approximate maximum overall (enamelled) diameter, m: a model, see the build constant. */
  overallDiameterM: number;
  /** DC resistance per metre at `temperatureC`, Ω/m. */
  resistancePerLengthOhmPerM: number;
  /** Temperature the resistance is stated at, °C. */
  temperatureC: number;
}

/** Options for {@link roundWireGauge}. */
export interface RoundWireOptions {
  /** Enamel grade. @defaultValue 2 (the usual build for power magnetics, common practice) */
  insulationGrade?: InsulationGrade;
  /** Temperature for the resistance, °C. @defaultValue 20 */
  temperatureC?: number;
}

const DEFAULTS = { insulationGrade: 2, temperatureC: 20 } satisfies Required<RoundWireOptions>;

/** Smallest and largest AWG accepted: 0000 (−3) to 56, the span of the ASTM B258 series. */
export const AWG_MIN = -3;
export const AWG_MAX = 56;

/**
 * Increase of the maximum overall diameter over the bare diameter for one enamel grade, mm at
 * 1 mm bare diameter. A fit by eye to recalled maximum overall diameters of medium (grade 2,
 * "heavy") build wire, AWG 10…40, of IEC 60317-0-1 and NEMA MW 1000 tables (from memory):
 * within ±25 % of the build there (the recalled builds grow faster than √d for thin wire and
 * slower for thick). Grades 1 and 3 are taken as 1/2 and 3/2 of grade 2, the rough 1 : 2 : 3
 * proportion of the IEC grades (from memory). Confirm against the supplier's data.
 */
const BUILD_PER_GRADE_AT_1MM_MM = 0.0305;

/**
 * Returns the nominal AWG wire of gauge `awg` (integer −3…56): ASTM B258 diameter
 * d = 0.127 mm·92^((36 − n)/39), its copper area, an approximate enamelled diameter and its
 * DC resistance per metre (IEC 60028).
 * @throws RangeError for a gauge outside −3…56 or not an integer, or a bad grade.
 */
export function roundWireGauge(awg: number, options: RoundWireOptions = {}): RoundWire {
  const { insulationGrade, temperatureC } = { ...DEFAULTS, ...options };
  if (!Number.isInteger(awg) || awg < AWG_MIN || awg > AWG_MAX) {
    throw new RangeError(`roundWireGauge: awg must be an integer in −3…56, got ${awg}`);
  }
  if (insulationGrade !== 1 && insulationGrade !== 2 && insulationGrade !== 3) {
    throw new RangeError(`roundWireGauge: insulationGrade must be 1, 2 or 3`);
  }
  // ref: ASTM B258, the defining geometric series: gauge 36 is 0.005 in, gauge 0000 is 0.46 in.
  const bareDiameterM = 0.127e-3 * Math.pow(92, (36 - awg) / 39);
  const copperAreaM2 = (Math.PI / 4) * bareDiameterM * bareDiameterM;
  return {
    awg,
    bareDiameterM,
    copperAreaM2,
    insulationGrade,
    overallDiameterM: bareDiameterM + enamelBuildM(bareDiameterM, insulationGrade),
    resistancePerLengthOhmPerM: copperResistancePerLength(copperAreaM2, { temperatureC }),
    temperatureC,
  };
}

/** Returns the approximate maximum diameter increase from enamel, m: grade·0.0305 mm·√(d/1 mm). */
function enamelBuildM(bareDiameterM: number, grade: InsulationGrade): number {
  return grade * BUILD_PER_GRADE_AT_1MM_MM * 1e-3 * Math.sqrt(bareDiameterM / 1e-3);
}
