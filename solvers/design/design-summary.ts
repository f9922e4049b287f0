import { cornerConductionMode } from './corner-conduction-mode.js';
import type { AnyCorner, Design } from './design-schema.js';

type Corner = AnyCorner;

/**
 * Returns the design's summary over its corners: largest duty cycle, switch voltage and current,
 * each rectifier's largest reverse voltage, largest total loss, lowest efficiency, the efficiency
 * at nominal input and the largest load fraction, and each corner's conduction mode (the first
 * output inductor's for the forward family).
 * @throws RangeError when there are no corners.
 */
export function designSummary(
  corners: readonly Corner[],
  nominalInputV: number,
): Design['summary'] {
  const first = corners[0];
  if (first === undefined) throw new RangeError('designSummary: no corners');
  let nominal: Corner | undefined;
  for (const corner of corners) {
    if (corner.inputVoltageV !== nominalInputV) continue;
    if (nominal === undefined || corner.loadFraction > nominal.loadFraction) nominal = corner;
  }
  const largest = (pick: (corner: Corner) => number) =>
    corners.reduce((value, corner) => Math.max(value, pick(corner)), -Infinity);
  const deviceLargest = (
    devices: Corner['switches'],
    pick: (d: Corner['switches'][number]) => number,
  ) => devices.reduce((value, device) => Math.max(value, pick(device)), 0);
  return {
    dutyCycleMax: largest((corner) => corner.dutyCycle),
    efficiencyMin: -largest((corner) => -corner.efficiency),
    efficiencyNominal: (nominal ?? first).efficiency,
    switchVoltagePeakV: largest((corner) => deviceLargest(corner.switches, (d) => d.voltagePeakV)),
    switchCurrentPeakA: largest((corner) => deviceLargest(corner.switches, (d) => d.currentPeakA)),
    rectifierVoltagePeaksV: first.rectifiers.map((_, k) =>
      largest((corner) => corner.rectifiers[k]?.voltagePeakV ?? 0),
    ),
    lossTotalMaxW: largest((corner) => corner.lossTotalW),
    conductionModes: corners.map((corner) => cornerConductionMode(corner)),
  };
}
