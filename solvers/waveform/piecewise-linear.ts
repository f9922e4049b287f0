import { TIME_ROUND_OFF } from './time-round-off.js';
import type { Waveform } from './waveform.js';

/**
 * Builds a one-period piecewise-linear waveform from `[timeS, value]` points (s, and the unit of
 * the value). Two points at one time form a jump; a longer run of equal times keeps its first and
 * last point only. Times within 1e-12·periodS of the previous time, of 0 or of periodS are
 * clamped onto it, absorbing round-off such as D·T + (1 − D)·T > T.
 * @throws RangeError for a period ≤ 0, fewer than 2 points, a non-finite number, times out of
 *   order, a first time not 0 or a last time not periodS (beyond that round-off).
 */
export function piecewiseLinear(
  periodS: number,
  points: ReadonlyArray<readonly [timeS: number, value: number]>,
): Waveform {
  if (!Number.isFinite(periodS) || periodS <= 0) {
    throw new RangeError(`piecewiseLinear: periodS must be finite and > 0, got ${periodS}`);
  }
  const first = points[0];
  const last = points[points.length - 1];
  if (first === undefined || last === undefined || points.length < 2) {
    throw new RangeError(`piecewiseLinear: need at least 2 points, got ${points.length}`);
  }
  const toleranceS = TIME_ROUND_OFF * periodS;
  if (!(Math.abs(first[0]) <= toleranceS)) {
    throw new RangeError(`piecewiseLinear: the first time must be 0, got ${first[0]}`);
  }
  if (!(Math.abs(last[0] - periodS) <= toleranceS)) {
    throw new RangeError(
      `piecewiseLinear: the last time must be periodS ${periodS}, got ${last[0]}`,
    );
  }
  const timesS: number[] = [];
  const values: number[] = [];
  let previousS = 0;
  // An indexed loop: the entries() iterator with destructuring cost several times more, and this
  // runs for every waveform of every corner.
  for (let index = 0; index < points.length; index++) {
    const [rawTimeS, value] = points[index] as readonly [number, number];
    if (!Number.isFinite(rawTimeS) || !Number.isFinite(value)) {
      throw new RangeError(
        `piecewiseLinear: point ${index} is not finite: [${rawTimeS}, ${value}]`,
      );
    }
    if (rawTimeS < previousS - toleranceS || rawTimeS > periodS + toleranceS) {
      throw new RangeError(
        `piecewiseLinear: time ${rawTimeS} at point ${index} is outside [${previousS}, ${periodS}]`,
      );
    }
    // Round-off is clamped onto the neighbouring time, never kept as a sliver of a segment.
    let timeS = rawTimeS - previousS <= toleranceS ? previousS : rawTimeS;
    if (periodS - timeS <= toleranceS) timeS = periodS;
    const count = timesS.length;
    // A third point at one time would be a zero-width spike: keep the run's first and last.
    if (count >= 2 && timesS[count - 1] === timeS && timesS[count - 2] === timeS) {
      values[count - 1] = value;
    } else {
      timesS.push(timeS);
      values.push(value);
    }
    previousS = timeS;
  }
  return { periodS, timesS, values };
}

/**
 * {@link piecewiseLinear} from the times and values as two columns of equal length, with the
 * same rules and errors: for callers that build many points (the double-ended waveforms, whose
 * ring is sampled every π/6), where one `[time, value]` pair per point was most of the
 * garbage collector's work.
 * @throws RangeError as {@link piecewiseLinear}, or for columns of unequal length.
 */
export function piecewiseLinearColumns(
  periodS: number,
  rawTimesS: readonly number[],
  rawValues: readonly number[],
): Waveform {
  if (!Number.isFinite(periodS) || periodS <= 0) {
    throw new RangeError(`piecewiseLinear: periodS must be finite and > 0, got ${periodS}`);
  }
  const count = rawTimesS.length;
  if (rawValues.length !== count) {
    throw new RangeError(
      `piecewiseLinear: ${count} times but ${rawValues.length} values (columns of one length)`,
    );
  }
  if (count < 2) throw new RangeError(`piecewiseLinear: need at least 2 points, got ${count}`);
  const toleranceS = TIME_ROUND_OFF * periodS;
  const firstS = rawTimesS[0] as number;
  const lastS = rawTimesS[count - 1] as number;
  if (!(Math.abs(firstS) <= toleranceS)) {
    throw new RangeError(`piecewiseLinear: the first time must be 0, got ${firstS}`);
  }
  if (!(Math.abs(lastS - periodS) <= toleranceS)) {
    throw new RangeError(`piecewiseLinear: the last time must be periodS ${periodS}, got ${lastS}`);
  }
  const timesS: number[] = [];
  const values: number[] = [];
  let previousS = 0;
  // The loop of piecewiseLinear, over the columns.
  for (let index = 0; index < count; index++) {
    const rawTimeS = rawTimesS[index] as number;
    const value = rawValues[index] as number;
    if (!Number.isFinite(rawTimeS) || !Number.isFinite(value)) {
      throw new RangeError(
        `piecewiseLinear: point ${index} is not finite: [${rawTimeS}, ${value}]`,
      );
    }
    if (rawTimeS < previousS - toleranceS || rawTimeS > periodS + toleranceS) {
      throw new RangeError(
        `piecewiseLinear: time ${rawTimeS} at point ${index} is outside [${previousS}, ${periodS}]`,
      );
    }
    let timeS = rawTimeS - previousS <= toleranceS ? previousS : rawTimeS;
    if (periodS - timeS <= toleranceS) timeS = periodS;
    const kept = timesS.length;
    if (kept >= 2 && timesS[kept - 1] === timeS && timesS[kept - 2] === timeS) {
      values[kept - 1] = value;
    } else {
      timesS.push(timeS);
      values.push(value);
    }
    previousS = timeS;
  }
  return { periodS, timesS, values };
}
