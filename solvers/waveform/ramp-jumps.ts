import { piecewiseLinear } from './piecewise-linear.js';
import type { Waveform } from './waveform.js';

/**
 * Returns the waveform with every jump replaced by a ramp at `slopePerS` (the waveform's unit per
 * second, > 0) from the value before the jump until it meets the waveform after it; the
 * breakpoints the ramp passes over are dropped. A waveform without jumps is returned as it is.
 * Where the ramp would not meet the waveform before the period ends, it carries on from the
 * period's start until it meets the waveform there (the waveform is periodic, and the flux it
 * stands for must return to its start: cut at the period's end it did not, and `igseCoreLoss`
 * refused it, a light-load full bridge's output inductor stepping 8 ns before the end). A step of at
 * most 1e-9 of the waveform's swing is a round-off step where a waveform was stitched (the
 * halves of a period meeting in their last bits), not a jump: it is kept as it is, as
 * `igseCoreLoss` reads it, and not ramped (at the steepest slope, parallel to the waveform
 * after it, such a ramp could run on for half a period).
 * @throws RangeError for a slope that is not finite and positive.
 */
export function rampJumps(w: Waveform, slopePerS: number): Waveform {
  if (!(slopePerS > 0 && Number.isFinite(slopePerS))) {
    throw new RangeError(`rampJumps: slope must be finite and > 0, got ${slopePerS}`);
  }
  const { timesS, values, periodS } = w;
  const count = timesS.length;
  let highest = -Infinity;
  let lowest = Infinity;
  for (let i = 0; i < count; i++) {
    const v = values[i] as number;
    if (v > highest) highest = v;
    if (v < lowest) lowest = v;
  }
  const stepMax = ROUND_OFF_STEP * (highest - lowest);
  let hasJump = false;
  for (let i = 0; i + 1 < count; i++) if (isJumpAt(timesS, values, i, stepMax)) hasJump = true;
  if (!hasJump) return w;
  const points: Array<[number, number]> = [];
  // The slope of a ramp cut at the period's end (0: none was).
  let cutSlope = 0;
  let i = 0;
  while (i < count) {
    const t0 = timesS[i] as number;
    const v0 = values[i] as number;
    if (i + 1 >= count || !isJumpAt(timesS, values, i, stepMax)) {
      points.push([t0, v0]);
      i += 1;
      continue;
    }
    const direction = Math.sign((values[i + 1] as number) - v0);
    // The ramp from the jump: v0 + direction·slope·(t − t0).
    const rampSlope = direction * slopePerS;
    // The first segment after the jump where the waveform falls back to the ramp holds the end.
    let endS = periodS;
    let k = i + 1;
    for (; k + 1 < count; k++) {
      const ta = timesS[k] as number;
      const tb = timesS[k + 1] as number;
      const fa = ((values[k] as number) - (v0 + rampSlope * (ta - t0))) * direction;
      const fb = ((values[k + 1] as number) - (v0 + rampSlope * (tb - t0))) * direction;
      if (tb > ta && fb <= 0) {
        endS = ta + (fa / (fa - fb)) * (tb - ta);
        break;
      }
    }
    points.push([t0, v0], [endS, v0 + rampSlope * (endS - t0)]);
    // Resume at the first breakpoint past the ramp's end.
    i = k + 1;
    if (endS >= periodS) {
      cutSlope = rampSlope;
      break;
    }
  }
  const last = points[points.length - 1];
  if (last !== undefined && last[0] < periodS) {
    points.push([periodS, values[count - 1] as number]);
  }
  return piecewiseLinear(periodS, cutSlope === 0 ? points : wrapped(points, cutSlope, periodS));
}

/**
 * `points` (ramped, from t = 0 to the period's end) with the ramp cut at the period's end carried
 * on from t = 0 at `slope` until it meets the waveform; the breakpoints it passes over dropped.
 * Where it does not meet it within the period the points are returned as they are.
 */
function wrapped(
  points: Array<[number, number]>,
  slope: number,
  periodS: number,
): Array<[number, number]> {
  const startV = (points[points.length - 1] as [number, number])[1];
  const direction = Math.sign(slope);
  for (let k = 0; k + 1 < points.length; k++) {
    const [ta, va] = points[k] as [number, number];
    const [tb, vb] = points[k + 1] as [number, number];
    if (!(tb > ta) || tb > periodS) continue;
    const fa = (va - (startV + slope * ta)) * direction;
    const fb = (vb - (startV + slope * tb)) * direction;
    if (fb <= 0) {
      if (fa <= 0) return points;
      const endS = ta + (fa / (fa - fb)) * (tb - ta);
      return [[0, startV], [endS, startV + slope * endS], ...points.slice(k + 1)];
    }
  }
  return points;
}

/** A step of at most this times the waveform's swing is round-off, not a jump (`igseCoreLoss`'s). */
const ROUND_OFF_STEP = 1e-9;

/** Whether breakpoints i and i + 1 are a jump: one time, two values more than `stepMax` apart. */
function isJumpAt(
  timesS: readonly number[],
  values: readonly number[],
  i: number,
  stepMax: number,
): boolean {
  return (
    timesS[i + 1] === timesS[i] &&
    Math.abs((values[i + 1] as number) - (values[i] as number)) > stepMax
  );
}
