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
  const count = points.length;
  const builder = startWaveform(periodS, count, points[0]?.[0], points[count - 1]?.[0]);
  // An indexed loop reading the pair's elements: the entries() iterator, or destructuring the
  // pair (which falls back to the iterator protocol where this call site is not optimized), cost
  // several times more and made garbage, and this runs for every waveform of every corner.
  for (let index = 0; index < count; index++) {
    const point = points[index] as readonly [number, number];
    appendPoint(builder, index, point[0], point[1]);
  }
  return { periodS, timesS: builder.timesS, values: builder.values };
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
  const count = rawTimesS.length;
  if (Number.isFinite(periodS) && periodS > 0 && rawValues.length !== count) {
    throw new RangeError(
      `piecewiseLinear: ${count} times but ${rawValues.length} values (columns of one length)`,
    );
  }
  const builder = startWaveform(periodS, count, rawTimesS[0], rawTimesS[count - 1]);
  for (let index = 0; index < count; index++) {
    appendPoint(builder, index, rawTimesS[index] as number, rawValues[index] as number);
  }
  return { periodS, timesS: builder.timesS, values: builder.values };
}

/** The columns being built, with the last time kept. */
interface WaveformBuilder {
  periodS: number;
  toleranceS: number;
  timesS: number[];
  values: number[];
  previousS: number;
}

/** Checks the period, the point count and the end times, and starts the columns. */
function startWaveform(
  periodS: number,
  count: number,
  firstS: number | undefined,
  lastS: number | undefined,
): WaveformBuilder {
  if (!Number.isFinite(periodS) || periodS <= 0) {
    throw new RangeError(`piecewiseLinear: periodS must be finite and > 0, got ${periodS}`);
  }
  if (firstS === undefined || lastS === undefined || count < 2) {
    throw new RangeError(`piecewiseLinear: need at least 2 points, got ${count}`);
  }
  const toleranceS = TIME_ROUND_OFF * periodS;
  if (!(Math.abs(firstS) <= toleranceS)) {
    throw new RangeError(`piecewiseLinear: the first time must be 0, got ${firstS}`);
  }
  if (!(Math.abs(lastS - periodS) <= toleranceS)) {
    throw new RangeError(`piecewiseLinear: the last time must be periodS ${periodS}, got ${lastS}`);
  }
  return { periodS, toleranceS, timesS: [], values: [], previousS: 0 };
}

/** Checks one point and appends it, clamping round-off and keeping no zero-width spike. */
function appendPoint(
  builder: WaveformBuilder,
  index: number,
  rawTimeS: number,
  value: number,
): void {
  const { periodS, toleranceS, timesS, values, previousS } = builder;
  if (!Number.isFinite(rawTimeS) || !Number.isFinite(value)) {
    throw new RangeError(`piecewiseLinear: point ${index} is not finite: [${rawTimeS}, ${value}]`);
  }
  if (rawTimeS < previousS - toleranceS || rawTimeS > periodS + toleranceS) {
    throw new RangeError(
      `piecewiseLinear: time ${rawTimeS} at point ${index} is outside [${previousS}, ${periodS}]`,
    );
  }
  // Round-off is clamped onto the neighbouring time, never kept as a sliver of a segment.
  let timeS = rawTimeS - previousS <= toleranceS ? previousS : rawTimeS;
  if (periodS - timeS <= toleranceS) timeS = periodS;
  const kept = timesS.length;
  // A third point at one time would be a zero-width spike: keep the run's first and last.
  if (kept >= 2 && timesS[kept - 1] === timeS && timesS[kept - 2] === timeS) {
    values[kept - 1] = value;
  } else {
    timesS.push(timeS);
    values.push(value);
  }
  builder.previousS = timeS;
}
