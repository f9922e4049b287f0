import { drawnWaveform } from '../../waveform/piecewise-linear.js';
import { valueAt } from '../../waveform/value-at.js';
import type { Waveform } from '../../waveform/waveform.js';

/**
 * Returns `w` advanced by `shiftS` (s, 0 ≤ shiftS < period): the waveform whose value at t is
 * w(t + shiftS), so that the old time shiftS becomes the new origin. Jumps keep their sides.
 */
export function rotateWaveform(w: Waveform, shiftS: number): Waveform {
  const { periodS, timesS, values } = w;
  if (!(shiftS > 0)) return w;
  // The new origin takes the value just after shiftS, the new end the value just before it.
  const startV = valueAt(w, shiftS);
  let endV = startV;
  for (let i = 0; i < timesS.length; i++) {
    if ((timesS[i] as number) === shiftS) {
      endV = values[i] as number;
      break;
    }
  }
  // Drawn as two columns (the points after shiftS, then those before it a period on), not as a
  // [time, value] pair per point: every waveform of an active-clamp corner passes through here.
  const rotatedS: number[] = [0];
  const rotatedValues: number[] = [startV];
  for (let i = 0; i < timesS.length; i++) {
    const t = timesS[i] as number;
    if (t > shiftS) {
      rotatedS.push(t - shiftS);
      rotatedValues.push(values[i] as number);
    }
  }
  for (let i = 0; i < timesS.length; i++) {
    const t = timesS[i] as number;
    if (t < shiftS) {
      rotatedS.push(t - shiftS + periodS);
      rotatedValues.push(values[i] as number);
    }
  }
  rotatedS.push(periodS);
  rotatedValues.push(endV);
  return drawnWaveform(periodS, { timesS: rotatedS, values: rotatedValues });
}
