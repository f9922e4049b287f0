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
  const kept = keptColumns(periodS, rawTimesS, rawValues, rawTimesS.length, timesS, values);
  timesS.length = kept;
  values.length = kept;
  return { periodS, timesS, values };
}

/**
 * Writes the waveform of the first `count` raw points into `timesS` and `values` (as
 * {@link columnsWaveform}) and returns how many points it kept; the columns are not cut.
 */
function keptColumns(
  periodS: number,
  rawTimesS: readonly number[],
  rawValues: readonly number[],
  count: number,
  timesS: number[],
  values: number[],
): number {
  if (Number.isFinite(periodS) && periodS > 0 && rawValues.length !== rawTimesS.length) {
    throw new RangeError(
      `piecewiseLinear: ${rawTimesS.length} times but ${rawValues.length} values (columns of one length)`,
    );
  }
  const builder = startWaveform(periodS, count, rawTimesS[0], rawTimesS[count - 1], timesS, values);
  for (let index = 0; index < count; index++) {
    appendPoint(builder, index, rawTimesS[index] as number, rawValues[index] as number);
  }
  return builder.kept;
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
  const { timesS, values } = builder;
  const timeS = clampedTime(builder, index, rawTimeS, value);
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
 * Checks one point against the builder's last time and returns its time with round-off clamped
 * onto the neighbouring time (never kept as a sliver of a segment); the builder's last time is
 * not moved.
 */
function clampedTime(
  builder: WaveformBuilder,
  index: number,
  rawTimeS: number,
  value: number,
): number {
  const { periodS, toleranceS, previousS } = builder;
  if (!Number.isFinite(rawTimeS) || !Number.isFinite(value)) {
    throw new RangeError(`piecewiseLinear: point ${index} is not finite: [${rawTimeS}, ${value}]`);
  }
  if (rawTimeS < previousS - toleranceS || rawTimeS > periodS + toleranceS) {
    throw new RangeError(
      `piecewiseLinear: time ${rawTimeS} at point ${index} is outside [${previousS}, ${periodS}]`,
    );
  }
  const timeS = rawTimeS - previousS <= toleranceS ? previousS : rawTimeS;
  return periodS - timeS <= toleranceS ? periodS : timeS;
}

/**
 * What {@link piecewiseLinearColumns} keeps of the times `rawTimesS` over `periodS` (its clamps
 * and runs of equal times depend on the times alone): the kept times, and for each the index of
 * the raw point whose value it keeps (a run's last, as it overwrites). Undefined where the times
 * fail its checks (a call with the values then throws its own error). For callers that read many
 * waveforms off one time column (the double-ended grid): it once, each waveform then a copy of
 * the kept values. Its own loop, not `keptColumns` with each point's index as its value: that
 * fed `keptColumns` arrays of small integers beside the waveforms' doubles, and its loads and
 * stores, shared by every waveform, took both kinds from then on.
 */
export function keptTimeSources(
  periodS: number,
  rawTimesS: readonly number[],
): { timesS: number[]; sources: number[] } | undefined {
  const count = rawTimesS.length;
  const timesS: number[] = [];
  const sources: number[] = [];
  try {
    const builder = startWaveform(periodS, count, rawTimesS[0], rawTimesS[count - 1], timesS, []);
    for (let index = 0; index < count; index++) {
      const timeS = clampedTime(builder, index, rawTimesS[index] as number, 0);
      const kept = builder.kept;
      // A third point at one time would be a zero-width spike: keep the run's first and last.
      if (kept >= 2 && timesS[kept - 1] === timeS && timesS[kept - 2] === timeS) {
        sources[kept - 1] = index;
      } else {
        timesS.push(timeS);
        sources.push(index);
        builder.kept = kept + 1;
      }
      builder.previousS = timeS;
    }
  } catch {
    return undefined;
  }
  return { timesS, sources };
}

/**
 * Points of a waveform being drawn, as two columns for {@link piecewiseLinearColumns}: a caller
 * that draws many points appends them with {@link drawPoint} and {@link drawTrace} instead of
 * building one `[time, value]` pair each. A drawing made by {@link reusableDrawing} is drawn
 * again and again (its columns keep their length; `count` says how many points are drawn).
 */
export interface WaveformDrawing {
  timesS: number[];
  values: number[];
  /** Points drawn: the columns' first `count` entries. */
  count: number;
  /** True for a reusable drawing: its waveform takes copies of the points kept. */
  isReused: boolean;
}

/**
 * An empty drawing to start again for every waveform of its kind: a caller keeps one per
 * waveform it draws at a time (a module constant), and each waveform then costs one array of
 * the kept points per column. Fresh columns grown point by point reallocated their store three
 * or four times on the way to a flyback corner's 80–90 points, about twice the waveforms'
 * own bytes in garbage, for each waveform of each corner of each solve.
 */
export function reusableDrawing(): WaveformDrawing {
  return { timesS: [], values: [], count: 0, isReused: true };
}

/**
 * A drawing that starts at the point (timeS, value): `reuse` started again (its earlier points
 * dropped), or a fresh one.
 */
export function startDrawing(
  timeS: number,
  value: number,
  reuse?: WaveformDrawing,
): WaveformDrawing {
  if (reuse === undefined) return { timesS: [timeS], values: [value], count: 1, isReused: false };
  reuse.timesS[0] = timeS;
  reuse.values[0] = value;
  reuse.count = 1;
  return reuse;
}

/** Appends the point (timeS, value) to `drawing`. */
export function drawPoint(drawing: WaveformDrawing, timeS: number, value: number): void {
  const count = drawing.count;
  drawing.timesS[count] = timeS;
  drawing.values[count] = value;
  drawing.count = count + 1;
}

/** Appends every point of a trace (its times and, index by index, `values`) to `drawing`. */
export function drawTrace(
  drawing: WaveformDrawing,
  timesS: readonly number[],
  values: readonly number[],
): void {
  const drawnS = drawing.timesS;
  const drawnValues = drawing.values;
  let count = drawing.count;
  for (let k = 0; k < timesS.length; k++) {
    drawnS[count] = timesS[k] as number;
    drawnValues[count] = values[k] as number;
    count++;
  }
  drawing.count = count;
}

/**
 * The waveform of a finished drawing over [0, periodS], by piecewiseLinearColumns' rules and
 * with its errors. The drawing's columns are compacted in place (`columnsWaveform`); a fresh
 * drawing's columns (or plain columns of the caller's own) then become the waveform's (it must
 * not be used again), a reusable one's kept points are copied out (it may be started again).
 */
export function drawnWaveform(
  periodS: number,
  drawing: WaveformDrawing | { timesS: number[]; values: number[] },
): Waveform {
  const { timesS, values } = drawing;
  if (!('isReused' in drawing) || !drawing.isReused) {
    return columnsWaveform(periodS, timesS, values, timesS, values);
  }
  const kept = keptColumns(periodS, timesS, values, drawing.count, timesS, values);
  return { periodS, timesS: timesS.slice(0, kept), values: values.slice(0, kept) };
}

/**
 * {@link drawnWaveform} of a reusable drawing that redraws one stretch of a waveform `source`
 * made by this module's rules (piecewiseLinear, its columns, a drawing, a grid's kept times):
 * the drawing's first `headCount` points are source's first points as they are, and its points
 * from `tailAt` on are source's last points as they are (to its end). The same waveform as
 * `drawnWaveform(periodS, drawing)`, with the same errors, for less: source's points already
 * passed these rules, which keep such points as they are (a point is kept, its time moved
 * onto the last only where it lies within the round-off of it, and a run of equal times has
 * two points at most; a waveform that passed them meets all that), so the head is not checked
 * again, and the tail only until two of its points in a row are kept as they are: from there
 * each point meets what it met in source (the last kept time and the two before it are
 * source's), so the rest is kept as it is too.
 */
export function redrawnWaveform(
  periodS: number,
  drawing: WaveformDrawing,
  headCount: number,
  tailAt: number,
): Waveform {
  const { timesS, values, count } = drawing;
  if (!drawing.isReused || !(headCount >= 1 && headCount <= tailAt && tailAt <= count)) {
    return drawnWaveform(periodS, drawing);
  }
  const builder = startWaveform(periodS, count, timesS[0], timesS[count - 1], timesS, values);
  builder.kept = headCount;
  builder.previousS = timesS[headCount - 1] as number;
  // Tail points kept in a row with their own times.
  let asTheyAre = 0;
  let index = headCount;
  while (index < count) {
    const rawTimeS = timesS[index] as number;
    const keptBefore = builder.kept;
    appendPoint(builder, index, rawTimeS, values[index] as number);
    index++;
    if (index <= tailAt) continue;
    asTheyAre = builder.kept > keptBefore && builder.previousS === rawTimeS ? asTheyAre + 1 : 0;
    if (asTheyAre === 2) break;
  }
  // The rest of the tail as it is, moved down over the points dropped before it (if any).
  let kept = builder.kept;
  if (kept === index) {
    kept = count;
  } else {
    for (; index < count; index++) {
      timesS[kept] = timesS[index] as number;
      values[kept] = values[index] as number;
      kept++;
    }
  }
  return { periodS, timesS: timesS.slice(0, kept), values: values.slice(0, kept) };
}
