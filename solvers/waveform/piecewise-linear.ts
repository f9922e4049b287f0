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
  return columnsWaveform(periodS, rawTimesS, rawValues, [], []);
}

/**
 * The waveform of the columns `rawTimesS` and `rawValues` by piecewiseLinear's rules, its points
 * written into `timesS` and `values`: fresh arrays, or the raw columns themselves (a kept point
 * never lies past the point being read, so it overwrites only points already read), which are
 * then cut to the points kept.
 */
function columnsWaveform(
  periodS: number,
  rawTimesS: readonly number[],
  rawValues: readonly number[],
  timesS: number[],
  values: number[],
): Waveform {
  const count = rawTimesS.length;
  if (Number.isFinite(periodS) && periodS > 0 && rawValues.length !== count) {
    throw new RangeError(
      `piecewiseLinear: ${count} times but ${rawValues.length} values (columns of one length)`,
    );
  }
  const builder = startWaveform(periodS, count, rawTimesS[0], rawTimesS[count - 1], timesS, values);
  for (let index = 0; index < count; index++) {
    appendPoint(builder, index, rawTimesS[index] as number, rawValues[index] as number);
  }
  timesS.length = builder.kept;
  values.length = builder.kept;
  return { periodS, timesS, values };
}

/** The columns being built, with the last time kept. */
interface WaveformBuilder {
  periodS: number;
  toleranceS: number;
  timesS: number[];
  values: number[];
  /** Points kept so far: the columns' first `kept` entries. */
  kept: number;
  previousS: number;
}

/**
 * Checks the period, the point count and the end times, and starts the columns: `timesS` and
 * `values`, fresh ones by default.
 */
function startWaveform(
  periodS: number,
  count: number,
  firstS: number | undefined,
  lastS: number | undefined,
  timesS: number[] = [],
  values: number[] = [],
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
  return { periodS, toleranceS, timesS, values, kept: 0, previousS: 0 };
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
  const kept = builder.kept;
  // A third point at one time would be a zero-width spike: keep the run's first and last.
  if (kept >= 2 && timesS[kept - 1] === timeS && timesS[kept - 2] === timeS) {
    values[kept - 1] = value;
  } else {
    // At the end of fresh columns (a push), or over a point already read (drawnWaveform).
    timesS[kept] = timeS;
    values[kept] = value;
    builder.kept = kept + 1;
  }
  builder.previousS = timeS;
}

/**
 * Points of a waveform being drawn, as two columns for {@link piecewiseLinearColumns}: a caller
 * that draws many points appends them with {@link drawPoint} and {@link drawTrace} instead of
 * building one `[time, value]` pair each.
 */
export interface WaveformDrawing {
  timesS: number[];
  values: number[];
}

/** A drawing that starts at the point (timeS, value). */
export function startDrawing(timeS: number, value: number): WaveformDrawing {
  return { timesS: [timeS], values: [value] };
}

/** Appends the point (timeS, value) to `drawing`. */
export function drawPoint(drawing: WaveformDrawing, timeS: number, value: number): void {
  drawing.timesS.push(timeS);
  drawing.values.push(value);
}

/** Appends every point of a trace (its times and, index by index, `values`) to `drawing`. */
export function drawTrace(
  drawing: WaveformDrawing,
  timesS: readonly number[],
  values: readonly number[],
): void {
  for (let k = 0; k < timesS.length; k++) {
    drawing.timesS.push(timesS[k] as number);
    drawing.values.push(values[k] as number);
  }
}

/**
 * The waveform of a finished drawing over [0, periodS], by piecewiseLinearColumns' rules and
 * with its errors. The drawing's own columns become the waveform's, compacted in place
 * (`columnsWaveform`); the drawing must not be used again.
 */
export function drawnWaveform(periodS: number, drawing: WaveformDrawing): Waveform {
  const { timesS, values } = drawing;
  return columnsWaveform(periodS, timesS, values, timesS, values);
}
