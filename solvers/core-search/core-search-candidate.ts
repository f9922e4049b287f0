import type { Spec } from '../spec/spec-schema.js';
import type { WindingArrangement } from '../transformer/transformer-build.js';
import type { WindingWire } from '../transformer/winding-wire.js';

/**
 * One fully evaluated candidate that meets every constraint: the build, its figures (converter
 * solved with this transformer fixed in, at every corner), and the spec that reproduces it
 * through `POST /v1/designs` (the request's spec with the magnetics block and transformer fields
 * that fix this build). SI units.
 */
export interface CoreSearchCandidate {
  /** The candidate's number in the enumeration (see the core-search README). */
  index: number;
  frequencyHz: number;
  coreShape: string;
  materialId: string;
  /** Turns of every winding, primary first. */
  turns: number[];
  /** Names of the windings, in the order of `turns` and `wires`. */
  windingNames: string[];
  wires: WindingWire[];
  arrangement: WindingArrangement;
  /** Total gap length, m (0: ungapped). */
  gapLengthM: number;
  /** Magnetizing inductance the wound core gives, referred to the primary, H. */
  magnetizingInductanceH: number;
  /** Leakage inductance from the winding geometry, referred to the primary, H. */
  leakageInductanceH: number;
  /** Largest total converter loss over the corners, transformer included, W (the ranking). */
  lossWorstCornerW: number;
  /** Total converter loss at the nominal input and largest load fraction, W. */
  lossNominalW: number;
  /** Largest transformer loss (core and copper) over the corners, W. */
  transformerLossWorstCornerW: number;
  /** Efficiency at the nominal input and largest load fraction (dimensionless). */
  efficiencyNominal: number;
  /** Largest temperature rise of the wound core over the corners, K. */
  temperatureRiseK: number;
  /** Largest peak flux density over the saturation flux density at the corner's temperature. */
  fluxDensityUtilization: number;
  /** Outside area of every turn over the window area (dimensionless). */
  windowFill: number;
  /** Effective core volume Ve (IEC 60205), m³. */
  coreVolumeM3: number;
  /** The spec to POST to /v1/designs to get this build back (magnetics and transformer fixed). */
  spec: Spec;
}

/**
 * Candidates counted by what became of them; every enumerated candidate lands in exactly one,
 * the first test that rejects it in the search's order: the (material, turns, gap) node's
 * checks (converter, saturation, inductance), the build's window and saturation checks, the
 * loss and temperature bounds, all before the design; then the design on the first converter
 * solve, bounds on that design and on the second solve, and the full evaluation.
 */
export interface CoreSearchCounts {
  /** Candidates enumerated (the sum of all the others). */
  enumerated: number;
  /** Peak flux density over the limit at every temperature the core may have (cheap bound). */
  saturation: number;
  /** Gapped core: the turns cannot give the magnetizing inductance with any gap up to half the window. */
  inductanceUnreachable: number;
  /** A winding that does not fit the breadth, or window fill or stack height over the limit. */
  windowFill: number;
  /** Temperature rise over the limit (by the bound, or when evaluated). */
  temperatureRise: number;
  /** Flux density over the limit when evaluated (after the second converter solve). */
  saturationEvaluated: number;
  /** The converter cannot meet the spec with this transformer (or with this Lm at all). */
  converterInfeasible: number;
  /**
   * Skipped: a loss and temperature lower bound shows it can enter neither the top N nor the
   * Pareto front. Bounds come before the design: a candidate a bound puts out counts here even
   * where its design would have failed for another reason.
   */
  boundedOut: number;
  /** Evaluated in full and inside every constraint. */
  accepted: number;
  /**
   * Of all the above, the candidates evaluated in full (accepted, or rejected after the
   * evaluation); not part of the sum that makes `enumerated`.
   */
  fullyEvaluated: number;
}

/** What one chunk hands to the reducer: its counts, its best few and its Pareto front. */
export interface CoreSearchChunkOutput {
  counts: CoreSearchCounts;
  /** The chunk's best `topN` by worst-corner loss (ties by index). */
  top: CoreSearchCandidate[];
  /** The chunk's non-dominated candidates over (worst-corner loss, core volume, temperature rise). */
  paretoFront: CoreSearchCandidate[];
}

/** The job's result. */
export interface CoreSearchResult {
  counts: CoreSearchCounts;
  /** The best `topN` by worst-corner loss, ties by index. */
  top: CoreSearchCandidate[];
  /** Non-dominated over (worst-corner loss, core volume, temperature rise), by loss, volume, rise, index. */
  paretoFront: CoreSearchCandidate[];
  /** Each switching frequency searched: its candidates, and why none when it cannot be solved. */
  frequencies: Array<{ frequencyHz: number; candidateCount: number; issues?: unknown[] }>;
  lossBoundMargin: number;
}

/** Counts with every field zero. */
export function zeroCounts(): CoreSearchCounts {
  return {
    enumerated: 0,
    saturation: 0,
    inductanceUnreachable: 0,
    windowFill: 0,
    temperatureRise: 0,
    saturationEvaluated: 0,
    converterInfeasible: 0,
    boundedOut: 0,
    accepted: 0,
    fullyEvaluated: 0,
  };
}

/** Adds `more` into `sum`, field by field. */
export function addCountsTo(sum: CoreSearchCounts, more: CoreSearchCounts): void {
  for (const key of Object.keys(sum) as Array<keyof CoreSearchCounts>) sum[key] += more[key];
}
