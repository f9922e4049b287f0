import { copperResistancePerLength } from './copper-resistance-per-length.js';
import { roundWireGauge, type InsulationGrade } from './round-wire-gauge.js';

/** A litz bundle of `strandCount` enamelled strands of one AWG size. */
export interface LitzWire {
  strandAwg: number;
  strandCount: number;
  /** Bare strand diameter (ASTM B258), m. */
  strandBareDiameterM: number;
  /** Enamelled strand diameter, m. */
  strandOverallDiameterM: number;
  /** Copper cross-section of all strands, m². */
  copperAreaM2: number;
  /** Overall bundle diameter from the packing factor, m (no serving or wrap). */
  overallDiameterM: number;
  packingFactor: number;
  takeUpFactor: number;
  /** DC resistance per metre of bundle at `temperatureC`, Ω/m. */
  resistancePerLengthOhmPerM: number;
  temperatureC: number;
}

/** Options for {@link litzWire}. */
export interface LitzWireOptions {
  /** Strand enamel grade. @defaultValue 1 (litz strands are usually single build, common practice) */
  strandInsulationGrade?: InsulationGrade;
  /**
   * Bundle packing factor: strands' overall cross-section over the area of the bundle's
   * circumscribing circle, 0..0.9069 (hexagonal close packing). @defaultValue 0.75
   */
  packingFactor?: number;
  /**
   * Take-up (lay) factor: strand length per bundle length from twisting, ≥ 1. @defaultValue 1.02
   * (a single bunching operation lengthens strands by about 1–3 %, common practice, from memory)
   */
  takeUpFactor?: number;
  /** Temperature for the resistance, °C. @defaultValue 20 */
  temperatureC?: number;
}

const DEFAULTS = {
  strandInsulationGrade: 1,
  packingFactor: 0.75,
  takeUpFactor: 1.02,
  temperatureC: 20,
} satisfies Required<LitzWireOptions>;

/** Densest packing of equal circles in the plane, π/(2√3). */
const HEXAGONAL_PACKING = Math.PI / (2 * Math.sqrt(3));

/**
 * Returns a litz bundle of `strandCount` (integer ≥ 1) strands of AWG `strandAwg`: copper area
 * k·π·ds²/4, overall diameter do·sqrt(k/packing) and DC resistance per metre ρ·takeUp/(k·As).
 * @throws RangeError for a strand count below 1 or not an integer, or a packing factor outside (0, 0.9069].
 */
export function litzWire(
  strandAwg: number,
  strandCount: number,
  options: LitzWireOptions = {},
): LitzWire {
  const { strandInsulationGrade, packingFactor, takeUpFactor, temperatureC } = {
    ...DEFAULTS,
    ...options,
  };
  if (!Number.isInteger(strandCount) || strandCount < 1) {
    throw new RangeError(`litzWire: strandCount must be an integer ≥ 1, got ${strandCount}`);
  }
  if (!(packingFactor > 0 && packingFactor <= HEXAGONAL_PACKING)) {
    throw new RangeError(`litzWire: packingFactor must be in (0, 0.9069], got ${packingFactor}`);
  }
  const strand = roundWireGauge(strandAwg, { insulationGrade: strandInsulationGrade });
  const copperAreaM2 = strandCount * strand.copperAreaM2;
  // k circles of diameter do fill `packing` of a circle of diameter D: k·do² = packing·D².
  // Packing 0.75 gives D ≈ 1.155·do·√k, a rule of thumb for bunched litz (from memory).
  const overallDiameterM = strand.overallDiameterM * Math.sqrt(strandCount / packingFactor);
  return {
    strandAwg,
    strandCount,
    strandBareDiameterM: strand.bareDiameterM,
    strandOverallDiameterM: strand.overallDiameterM,
    copperAreaM2,
    overallDiameterM,
    packingFactor,
    takeUpFactor,
    resistancePerLengthOhmPerM: copperResistancePerLength(copperAreaM2, {
      temperatureC,
      takeUpFactor,
    }),
    temperatureC,
  };
}
