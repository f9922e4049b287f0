import type { Waveform } from './waveform.js';

/**
 * The time the second half of a waveform's points may be off its first half's plus T/2, over
 * the period: the double-ended grids lay each point of the second half at (1 + h)·T/2 against
 * h·T/2 in the first, equal but for rounding (a few 1e-17 of the period).
 */
const HALF_SHIFT_TOLERANCE = 1e-13;

/**
 * +1 where the second half of the waveform's points repeats the first half's values half a
 * period on (a double-ended converter's output inductor current), −1 where it repeats them
 * negated (its primary current and magnetizing current), 0 otherwise or where the halves do not
 * meet at T/2. The values must agree to the bit; the times to {@link HALF_SHIFT_TOLERANCE}.
 */
export function halfPeriodSign(w: Waveform): -1 | 0 | 1 {
  const { periodS, timesS, values } = w;
  const count = timesS.length;
  if (count < 4 || count % 2 !== 0) return 0;
  const half = count / 2;
  const halfS = periodS / 2;
  const tolerance = HALF_SHIFT_TOLERANCE * periodS;
  if (timesS[0] !== 0 || timesS[count - 1] !== periodS) return 0;
  if (!(Math.abs((timesS[half - 1] as number) - halfS) <= tolerance)) return 0;
  if (!(Math.abs((timesS[half] as number) - halfS) <= tolerance)) return 0;
  const first = values[0] as number;
  const second = values[half] as number;
  const sign = second === first && first !== 0 ? 1 : second === -first && first !== 0 ? -1 : 0;
  if (sign === 0) return 0;
  for (let k = 0; k < half; k++) {
    if (values[k + half] !== sign * (values[k] as number)) return 0;
    const shiftS = (timesS[k + half] as number) - (timesS[k] as number);
    if (!(Math.abs(shiftS - halfS) <= tolerance)) return 0;
  }
  return sign;
}
