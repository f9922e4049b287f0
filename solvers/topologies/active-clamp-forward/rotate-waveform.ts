import { piecewiseLinear } from '../../waveform/piecewise-linear.js';
import { valueAt } from '../../waveform/value-at.js';
import type { Waveform } from '../../waveform/waveform.js';

/**
 * Returns `w` advanced by `shiftS` (s, 0 ≤ shiftS < period): the waveform whose value at t is
 * w(t + shiftS), so that the old time shiftS becomes the new origin. Jumps keep their sides.
 */
export function rotateWaveform(w: Waveform, shiftS: number): Waveform {
  const { periodS } = w;
  if (!(shiftS > 0)) return w;
  const head: Array<[number, number]> = [];
  const tail: Array<[number, number]> = [];
  w.timesS.forEach((t, i) => {
    const v = w.values[i] as number;
    if (t > shiftS) head.push([t - shiftS, v]);
    else if (t < shiftS) tail.push([t - shiftS + periodS, v]);
  });
  // The new origin takes the value just after shiftS, the new end the value just before it.
  const startV = valueAt(w, shiftS);
  let endV = startV;
  for (let i = 0; i < w.timesS.length; i++) {
    if ((w.timesS[i] as number) === shiftS) {
      endV = w.values[i] as number;
      break;
    }
  }
  return piecewiseLinear(periodS, [[0, startV], ...head, ...tail, [periodS, endV]]);
}
