import { ObjectMemo } from '../object-memo.js';
import { foilConductor } from '../magnetics/foil-conductor.js';
import { litzWire } from '../magnetics/litz-wire.js';
import { roundWireGauge } from '../magnetics/round-wire-gauge.js';

/**
 * The conductor of one winding: solid round magnet wire, several of them in parallel side by
 * side (each turn is `parallelCount` wires), a litz bundle, or copper foil wound one turn per
 * layer with insulating film between the turns. AWG sizes by ASTM B258.
 */
export type WindingWire =
  | { kind: 'round'; awg: number; parallelCount: number }
  | { kind: 'litz'; strandAwg: number; strandCount: number }
  | {
      kind: 'foil';
      /** Copper thickness across the window, m. */
      thicknessM: number;
      /** Copper width along the leg, m; the usable breadth (window less end margins) if omitted. */
      widthM?: number | undefined;
      /** Insulating film between successive turns (layers), m. */
      insulationThicknessM: number;
    };

/** A wire's copper and outside dimensions, SI units. */
export interface WireDimensions {
  /** Copper cross-section of one turn (all parallel wires or strands), m². */
  copperAreaM2: number;
  /** Length one turn takes along the layer, m (a foil's width). */
  pitchM: number;
  /** Height one layer of it takes across the window, m. */
  layerHeightM: number;
  /** Outside cross-section of one turn for the fill factor, m². */
  outsideAreaM2: number;
  /** DC resistance per metre of one turn at 20 °C, Ω/m. */
  resistancePerLengthAt20COhmPerM: number;
  /** Bare diameter of one wire or strand, m (for Dowell); a foil's thickness. */
  bareDiameterM: number;
}

/**
 * Returns the dimensions of a winding wire: round wire of enamel grade 2, litz of grade 1
 * strands, foil of its thickness plus the film between turns (one turn per layer).
 * `breadthM` (m) is the usable breadth a foil without a width of its own spans.
 * @throws RangeError for a bad parallel count, a foil of non-positive dimensions, or a foil
 *   without a width when no breadth is given.
 */
export function wireDimensions(wire: WindingWire, breadthM?: number): WireDimensions {
  if (wire.kind === 'foil') return foilDimensions(wire, breadthM);
  const known = ROUND_AND_LITZ.get(wire);
  if (known !== undefined) return known;
  const dimensions = roundOrLitzDimensions(wire);
  ROUND_AND_LITZ.set(wire, dimensions);
  return dimensions;
}

/**
 * Dimensions of round and litz wires already computed, by wire object: a search lays the same
 * wires for every turn set and material it tries (four layouts a two-winding stack), and each
 * took a gauge's power law and resistance again. They do not depend on the breadth; wires and
 * dimensions are plain data that nothing mutates, so the memo cannot go stale.
 */
const ROUND_AND_LITZ = new ObjectMemo<WindingWire, WireDimensions>();

function roundOrLitzDimensions(wire: Exclude<WindingWire, { kind: 'foil' }>): WireDimensions {
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

function foilDimensions(
  wire: Extract<WindingWire, { kind: 'foil' }>,
  breadthM: number | undefined,
): WireDimensions {
  const widthM = wire.widthM ?? breadthM;
  if (widthM === undefined) {
    throw new RangeError('wireDimensions: a foil without widthM needs the breadth it spans');
  }
  if (!(Number.isFinite(wire.insulationThicknessM) && wire.insulationThicknessM >= 0)) {
    throw new RangeError(`wireDimensions: foil insulation must be ≥ 0`);
  }
  // ρ20/(t·w) of annealed copper (IEC 60028); the film adds to every layer's height.
  const foil = foilConductor(wire.thicknessM, widthM);
  const layerHeightM = wire.thicknessM + wire.insulationThicknessM;
  return {
    copperAreaM2: foil.copperAreaM2,
    pitchM: widthM,
    layerHeightM,
    outsideAreaM2: widthM * layerHeightM,
    resistancePerLengthAt20COhmPerM: foil.resistancePerLengthOhmPerM,
    bareDiameterM: wire.thicknessM,
  };
}
