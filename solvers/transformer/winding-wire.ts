import { litzWire } from '../magnetics/litz-wire.js';
import { roundWireGauge } from '../magnetics/round-wire-gauge.js';

/**
 * The conductor of one winding: solid round magnet wire, several of them in parallel side by
 * side (each turn is `parallelCount` wires), or a litz bundle. AWG sizes by ASTM B258.
 */
export type WindingWire =
  | { kind: 'round'; awg: number; parallelCount: number }
  | { kind: 'litz'; strandAwg: number; strandCount: number };

/** A wire's copper and outside dimensions, SI units. */
export interface WireDimensions {
  /** Copper cross-section of one turn (all parallel wires or strands), m². */
  copperAreaM2: number;
  /** Length one turn takes along the layer, m. */
  pitchM: number;
  /** Height one layer of it takes across the window, m. */
  layerHeightM: number;
  /** Outside cross-section of one turn for the fill factor, m². */
  outsideAreaM2: number;
  /** DC resistance per metre of one turn at 20 °C, Ω/m. */
  resistancePerLengthAt20COhmPerM: number;
  /** Bare diameter of one wire or strand, m (for Dowell). */
  bareDiameterM: number;
}

/** Returns the dimensions of a winding wire: round wire of enamel grade 2, litz of grade 1 strands. */
export function wireDimensions(wire: WindingWire): WireDimensions {
  if (wire.kind === 'round') {
    if (!(Number.isInteger(wire.parallelCount) && wire.parallelCount >= 1)) {
      throw new RangeError(`wireDimensions: parallelCount must be an integer ≥ 1`);
    }
    const one = roundWireGauge(wire.awg);
    return {
      copperAreaM2: wire.parallelCount * one.copperAreaM2,
      pitchM: wire.parallelCount * one.overallDiameterM,
      layerHeightM: one.overallDiameterM,
      outsideAreaM2: wire.parallelCount * one.overallDiameterM ** 2,
      resistancePerLengthAt20COhmPerM: one.resistancePerLengthOhmPerM / wire.parallelCount,
      bareDiameterM: one.bareDiameterM,
    };
  }
  const bundle = litzWire(wire.strandAwg, wire.strandCount);
  return {
    copperAreaM2: bundle.copperAreaM2,
    pitchM: bundle.overallDiameterM,
    layerHeightM: bundle.overallDiameterM,
    outsideAreaM2: bundle.overallDiameterM ** 2,
    resistancePerLengthAt20COhmPerM: bundle.resistancePerLengthOhmPerM,
    bareDiameterM: bundle.strandBareDiameterM,
  };
}
