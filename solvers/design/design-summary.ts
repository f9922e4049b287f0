import { cornerConductionMode } from './corner-conduction-mode.js';
import type { AnyCorner, Design } from './design-schema.js';

type Corner = AnyCorner;

/**
 * Largest relative miss of the regulated output, |Vo − target|/target, a corner may show and
 * still count as regulated. The solves stop far inside it (duty cycles to 1e-13), so a corner
 * beyond it sits where no duty cycle of the model gives the target: a step of Vo(D).
 */
export const REGULATION_TOLERANCE = 1e-3;

/**
 * Returns the design's summary over its corners: largest duty cycle, switch voltage and current,
 * each rectifier's largest reverse voltage, largest total loss, lowest efficiency, the efficiency
 * at nominal input and the largest load fraction, each corner's conduction mode (the first
 * output inductor's for the forward family), and the corners whose first (regulated) output
 * misses `regulatedTargetV` (V) by more than REGULATION_TOLERANCE.
 * @throws RangeError when there are no corners.
 */
export function designSummary(
  corners: readonly Corner[],
  nominalInputV: number,
  regulatedTargetV: number,
): Design['summary'] {
  const first = corners[0];
  if (first === undefined) throw new RangeError('designSummary: no corners');
  let nominal: Corner | undefined;
  for (const corner of corners) {
    if (corner.inputVoltageV !== nominalInputV) continue;
    if (nominal === undefined || corner.loadFraction > nominal.loadFraction) nominal = corner;
  }
  return {
    dutyCycleMax: largestOf(corners, (corner) => corner.dutyCycle),
    efficiencyMin: -largestOf(corners, (corner) => -corner.efficiency),
    efficiencyNominal: (nominal ?? first).efficiency,
    switchVoltagePeakV: largestOf(corners, (corner) =>
      deviceLargest(corner.switches, (d) => d.voltagePeakV),
    ),
    switchCurrentPeakA: largestOf(corners, (corner) =>
      deviceLargest(corner.switches, (d) => d.currentPeakA),
    ),
    rectifierVoltagePeaksV: first.rectifiers.map((_, k) =>
      largestOf(corners, (corner) => corner.rectifiers[k]?.voltagePeakV ?? 0),
    ),
    lossTotalMaxW: largestOf(corners, (corner) => corner.lossTotalW),
    conductionModes: corners.map((corner) => cornerConductionMode(corner)),
    regulationMisses: regulationMisses(corners, regulatedTargetV),
    modelFallbacks: modelFallbacks(corners),
  };
}

/**
 * The largest `pick` over the corners (−Infinity for none). Module-level helpers, not named
 * closures in designSummary: under tsx esbuild's keepNames gives each of those an
 * Object.defineProperty call.
 */
function largestOf(corners: readonly Corner[], pick: (corner: Corner) => number): number {
  return corners.reduce((value, corner) => Math.max(value, pick(corner)), -Infinity);
}

/** The largest `pick` over the devices, 0 for none. */
function deviceLargest(
  devices: Corner['switches'],
  pick: (d: Corner['switches'][number]) => number,
): number {
  return devices.reduce((value, device) => Math.max(value, pick(device)), 0);
}

/** The corners whose first output misses `targetV` by more than REGULATION_TOLERANCE. */
function regulationMisses(
  corners: readonly Corner[],
  targetV: number,
): Design['summary']['regulationMisses'] {
  const misses: Design['summary']['regulationMisses'] = [];
  for (const corner of corners) {
    const outputVoltageV = corner.outputs[0]?.voltageV;
    if (outputVoltageV === undefined) continue;
    if (Math.abs(outputVoltageV - targetV) > REGULATION_TOLERANCE * Math.abs(targetV)) {
      misses.push({ corner: corner.label, outputVoltageV, targetVoltageV: targetV });
    }
  }
  return misses;
}

/** The corners solved on a simpler model than usual, with the reason each gives. */
function modelFallbacks(corners: readonly Corner[]): Design['summary']['modelFallbacks'] {
  const fallbacks: Design['summary']['modelFallbacks'] = [];
  for (const corner of corners) {
    if (corner.modelFallback !== undefined) {
      fallbacks.push({ corner: corner.label, reason: corner.modelFallback });
    }
  }
  return fallbacks;
}
