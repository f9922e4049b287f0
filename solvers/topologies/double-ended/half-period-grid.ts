import { keptTimeSources, piecewiseLinearColumns } from '../../waveform/piecewise-linear.js';
import type { Waveform } from '../../waveform/waveform.js';
import type { DoubleEndedStagePoint, SharedFall } from './light-load-point.js';
import {
  isFreewheel,
  RING_SAMPLE_RADIANS,
  ringAdvance,
  ringingOmega,
  simulateRing,
  wholeStepsS,
  type RingMode,
  type RingSegment,
} from './node-ring.js';

/**
 * What happens in one interval of a half-period; `shared`: one rectifier of each output has
 * stopped and the magnetizing current carries the inductor currents (light load).
 */
export type HalfInterval = 'commutation' | 'on' | 'off' | 'shared';

/**
 * The intervals both halves of a double-ended period share, as fractions of one half-period, and
 * each stage's inductor current at every interval's ends: the waveforms are read off it.
 */
export interface HalfPeriodGrid {
  /** End of the turn-on commutation: 2·tc. */
  start: number;
  /** End of the on-interval: 2·D. */
  onEnd: number;
  /**
   * The turn-off swing, where there is one: from the switches' opening (gate-off, onEnd − w) to
   * the winding's reaching zero (onEnd + w), w = t_s/T; the on-interval's end is its middle
   * (the swing's volt-seconds as drive). The voltages ramp over it (`swingShare`).
   */
  swing?: { from: number; to: number };
  /** Interval edges within the half, 0..1, ascending. */
  edges: number[];
  kinds: HalfInterval[];
  /** Per stage, per interval: whether its inductor current is zero (DCM idle). */
  idle: boolean[][];
  /** Per stage, the inductor current at interval j's start (index 2j) and end (2j + 1), A. */
  inductorA: number[][];
  /**
   * With the switch-node ring (one output): per interval from the shared fall's start on, its
   * mode and side (`node-ring.ts`), and at each end (2j, 2j + 1) the referred magnetizing
   * current and the winding voltage (positive towards the next half's drive); before it, NaN.
   */
  ring?: {
    modes: (RingMode | undefined)[];
    sides: (1 | -1)[];
    magnetizingA: number[];
    windingV: number[];
    /**
     * With several outputs in the event model (`SharedFall.followsRing.segmentStartsA`): the
     * ring's own (equivalent) inductor current, referred to output 0's secondary, A; each
     * output's part of the freewheeling magnetizing current is taken in proportion to its share
     * of it.
     */
    equivalentA?: number[];
    /**
     * With the leakage in the ring (the event model's half and full bridge): at each end the
     * node's voltage (the switches see it, not the winding's) and the leakage current (the
     * primary's, referred to output 0's secondary), V and A.
     */
    nodeV?: number[];
    leakageA?: number[];
  };
  /**
   * Per interval, where true: every waveform read off the grid is continuous at the interval's
   * start (its start values are the previous interval's end values: the samples inside one
   * stretch of the ring), so the waveforms draw one point there, not a pair of equal ones. A
   * pair at one time with equal values is a segment of zero width, which no integral, peak or
   * spectrum reads; without it a sampled ring draws half the points.
   */
  joined?: boolean[];
  /**
   * The columns `gridWaveform` and `gridWaveformPair` (index 1) and `gridHalfWaveform` (index
   * 0) build the waveforms from, kept for the grid's next waveform: the times, the same for
   * every waveform read off the grid, what of them a waveform keeps, and a column of values each
   * waveform overwrites. Set on the first read.
   */
  columns?: (GridColumns | undefined)[];
}

/**
 * The time column of a grid's waveforms over `halves` halves of `halfS`, and a value column
 * (empty where every time is kept: `isIdentity`).
 */
interface GridColumns {
  halfS: number;
  timesS: number[];
  values: number[];
  /**
   * What `piecewiseLinearColumns` keeps of these times over `periodS` (its round-off clamps and
   * runs of equal times depend on the times alone): the kept times, and for each the index of
   * the value it keeps (a run's last). Undefined where the times fail its checks. The kept times
   * are every such waveform's own `timesS`: the waveforms read off one grid share that one
   * array (nothing writes into a waveform's columns once it is made), where each took a copy.
   */
  periodS: number;
  keptTimesS: number[] | undefined;
  sources: number[] | undefined;
  /**
   * Whether every time is kept, each with its own value (`sources[k]` is k): then a waveform's
   * values are written straight into its own column, with no column of raw values between.
   * So for almost every grid (no run of three equal times).
   */
  isIdentity: boolean;
}

/**
 * Returns the grid of a double-ended period at duty cycle D (each switch's on-time over the
 * period), with a turn-on commutation of tc (over the period) and each stage's point. Inductor
 * current: valley → peak over the on-interval, down to the valley (CCM, through the next half's
 * commutation) or to zero at the end of its freewheeling interval (DCM).
 */
export function halfPeriodGrid(
  dutyCycle: number,
  commutationFraction: number,
  points: readonly DoubleEndedStagePoint[],
  turnOffSwingFraction = 0,
): HalfPeriodGrid {
  const start = 2 * commutationFraction;
  const onEnd = 2 * dutyCycle;
  const zeroAts = points.map((p) =>
    p.sharedFall !== undefined
      ? p.sharedFall.endFraction
      : p.mode === 'dcm'
        ? Math.min(1, onEnd + p.freewheelDutyCycle)
        : 1 + start,
  );
  // With several outputs they share one fall (`severalOutputsFall`): the same fractions.
  const fall = points[0]?.sharedFall;
  const candidates = [start, onEnd, ...zeroAts, 1];
  if (fall !== undefined) candidates.push(Math.max(onEnd, fall.startFraction));
  const swing =
    fall === undefined && turnOffSwingFraction > 0
      ? { from: onEnd - turnOffSwingFraction, to: Math.min(1, onEnd + turnOffSwingFraction) }
      : undefined;
  if (swing !== undefined) candidates.push(swing.from, swing.to);
  sortAscending(candidates);
  const edges = [0];
  for (const h of candidates) {
    if (h > (edges[edges.length - 1] as number) && h <= 1) edges.push(h);
  }
  const kinds: HalfInterval[] = [];
  for (let j = 0; j + 1 < edges.length; j++) {
    const mid = ((edges[j] as number) + (edges[j + 1] as number)) / 2;
    const isShared =
      fall !== undefined && mid >= fall.startFraction && mid < fall.endFraction && mid >= onEnd;
    kinds.push(mid < start ? 'commutation' : mid < onEnd ? 'on' : isShared ? 'shared' : 'off');
  }
  const idle: boolean[][] = [];
  const inductorA: number[][] = [];
  points.forEach((point, k) => {
    const zeroAt = zeroAts[k] as number;
    const isDcm = point.mode === 'dcm';
    const offEndA = isDcm ? 0 : point.valleyA;
    const stageIdle: boolean[] = [];
    const values: number[] = [];
    const f = point.sharedFall;
    kinds.forEach((kind, j) => {
      const mid = ((edges[j] as number) + (edges[j + 1] as number)) / 2;
      stageIdle.push(kind === 'off' && mid >= zeroAt);
      for (const h of [edges[j] as number, edges[j + 1] as number]) {
        if (f?.ring?.isContinued === true && kind === 'commutation') {
          // The event model's commutation: IL freewheels from the half's start to the valley.
          values.push(f.endA + ((point.valleyA - f.endA) * h) / start);
        } else if (f !== undefined && kind !== 'on') {
          values.push(sharedFallValue(f, point.peakA, onEnd, kind, h, mid));
        } else if (kind === 'commutation')
          values.push(isDcm ? 0 : offRamp(point.peakA, offEndA, onEnd, zeroAt, h + 1));
        else if (kind === 'on') {
          values.push(
            point.valleyA + ((point.peakA - point.valleyA) * (h - start)) / (onEnd - start),
          );
        } else values.push(mid < zeroAt ? offRamp(point.peakA, offEndA, onEnd, zeroAt, h) : 0);
      }
    });
    idle.push(stageIdle);
    inductorA.push(values);
  });
  const grid: HalfPeriodGrid = { start, onEnd, edges, kinds, idle, inductorA };
  if (swing !== undefined) grid.swing = swing;
  if (fall?.ring !== undefined && points[0] !== undefined) {
    appendRing(grid, fall, points, halfS(fall));
  }
  return grid;
}

/**
 * Within the turn-off swing, the share of the drive left on the winding at the end `end` of
 * interval j, (to − h)/(to − from) from 1 at the switches' opening to 0 where the winding
 * reaches zero: first order, the node capacitance charged at a constant current ramps it
 * linearly. NaN outside the swing.
 */
export function swingShare(grid: HalfPeriodGrid, j: number, end: 0 | 1): number {
  const swing = grid.swing;
  if (swing === undefined) return NaN;
  const a = grid.edges[j] as number;
  const b = grid.edges[j + 1] as number;
  const mid = (a + b) / 2;
  if (!(mid > swing.from && mid < swing.to)) return NaN;
  const h = end === 0 ? a : b;
  return (swing.to - h) / (swing.to - swing.from);
}

/**
 * The inductor current on its fall from `peakA` at the on-interval's end `onEnd` to `endA` at
 * `zeroAt` (fractions of the half-period), at h, A. A module function, not a named arrow in
 * `halfPeriodGrid`: under tsx esbuild's keepNames wraps each named arrow in a defineProperty call.
 */
function offRamp(peakA: number, endA: number, onEnd: number, zeroAt: number, h: number): number {
  return peakA + ((endA - peakA) * (h - onEnd)) / (zeroAt - onEnd);
}

/** The half-period in seconds, from the ring's stretch (its start to the half's end). */
function halfS(fall: SharedFall): number {
  return fall.ring?.halfS ?? 0;
}

/**
 * Replaces the grid's shared-fall intervals by samples of the simulated ring: every event, and
 * every π/6 of a ringing stretch's phase. The last sample is set to the periodic end (the valley
 * and the magnetizing start), which the solve meets to 1e-11 of the currents' scale. With several
 * outputs the ring is their equivalent's, and each output's current follows it
 * (`SharedFall.followsRing`).
 */
function appendRing(
  grid: HalfPeriodGrid,
  fall: SharedFall,
  points: readonly DoubleEndedStagePoint[],
  halfSeconds: number,
) {
  const ring = fall.ring;
  if (ring === undefined) return;
  const first = grid.kinds.findIndex(
    (_, j) => ((grid.edges[j] as number) + (grid.edges[j + 1] as number)) / 2 >= fall.startFraction,
  );
  const keep = first < 0 ? grid.kinds.length : first;
  grid.edges.length = keep + 1;
  grid.kinds.length = keep;
  for (let k = 0; k < points.length; k++) {
    (grid.inductorA[k] as number[]).length = 2 * keep;
    (grid.idle[k] as boolean[]).length = keep;
  }
  const modes: (RingMode | undefined)[] = new Array<RingMode | undefined>(keep).fill(undefined);
  const sides: (1 | -1)[] = new Array<1 | -1>(keep).fill(1);
  const magnetizingA: number[] = new Array<number>(2 * keep).fill(NaN);
  const windingV: number[] = new Array<number>(2 * keep).fill(NaN);
  const joined: boolean[] = new Array<boolean>(keep).fill(false);
  const hasFollowers = points.some((p) => p.sharedFall?.followsRing?.segmentStartsA !== undefined);
  const equivalentA: number[] | undefined = hasFollowers
    ? new Array<number>(2 * keep).fill(NaN)
    : undefined;
  const stretches = ring.stretches;
  const isLeaky = ((stretches?.[0]?.constants ?? ring.constants).c.leakageH ?? 0) > 0;
  const nodeV: number[] | undefined = isLeaky ? new Array<number>(2 * keep).fill(NaN) : undefined;
  const leakageA: number[] | undefined = isLeaky
    ? new Array<number>(2 * keep).fill(NaN)
    : undefined;
  const startS = fall.startFraction * halfSeconds;
  const isContinued = ring.isContinued === true;
  // Each output's own events give their stretches, each with its own constants (the outputs
  // carrying current through it); else the ring of one circuit, simulated from its start.
  const segments =
    stretches?.map((s) => s.segment) ??
    simulateRing(
      ring.constants,
      ring.start,
      halfSeconds - startS,
      true,
      isContinued,
      isContinued ? -1 : 1,
    ).segments ??
    [];
  for (let s = 0; s < segments.length; s++) {
    const segment = segments[s] as RingSegment;
    const k = stretches?.[s]?.constants ?? ring.constants;
    const omega = ringingOmega(k, segment.mode);
    const isRinging = omega > 0;
    // Every π/6 of phase from the stretch's start, the last step shorter (as the charges take it).
    const stepS = isRinging ? RING_SAMPLE_RADIANS / omega : segment.durationS;
    const wholeS = isRinging ? wholeStepsS(omega, segment.durationS) : segment.durationS;
    const steps = Math.round(wholeS / stepS) + (segment.durationS > wholeS ? 1 : 0);
    let before = segment.start;
    let t0 = 0;
    // Whether the last interval drawn is this stretch's, ending where the next one starts.
    let isJoinable = false;
    for (let p = 1; p <= steps; p++) {
      const t = p * stepS >= wholeS + 1e-12 * stepS ? segment.durationS : p * stepS;
      const after = ringAdvance(k, segment.mode, segment.side, segment.start, t, false).state;
      const h0 = (startS + segment.startS + t0) / halfSeconds;
      const h1 = (startS + segment.startS + t) / halfSeconds;
      const beforeS = segment.startS + t0;
      const t0Before = t0;
      t0 = t;
      if (!(h1 > h0)) {
        isJoinable = false;
        continue;
      }
      grid.edges.push(Math.min(1, h1));
      grid.kinds.push('shared');
      joined.push(isJoinable);
      isJoinable = true;
      modes.push(segment.mode);
      sides.push(segment.side);
      for (let j = 0; j < points.length; j++) {
        const follows = points[j]?.sharedFall?.followsRing;
        // With each output's own events an output that carries no current through a stretch
        // idles there while the others ring on.
        const shares = follows?.segmentSharesA;
        (grid.idle[j] as boolean[]).push(
          segment.mode === 'idle' || (shares !== undefined && !((shares[s] ?? 0) > 0)),
        );
        (grid.inductorA[j] as number[]).push(
          Math.max(
            0,
            followedA(points[j], follows, before.inductorA, beforeS, segment, s, t0Before),
          ),
          Math.max(
            0,
            followedA(points[j], follows, after.inductorA, segment.startS + t, segment, s, t),
          ),
        );
      }
      magnetizingA.push(before.magnetizingA, after.magnetizingA);
      windingV.push(before.windingV, after.windingV);
      equivalentA?.push(before.inductorA, after.inductorA);
      nodeV?.push(before.nodeV ?? NaN, after.nodeV ?? NaN);
      leakageA?.push(before.leakageA ?? NaN, after.leakageA ?? NaN);
      before = after;
    }
  }
  if (grid.kinds.length > keep) {
    grid.edges[grid.edges.length - 1] = 1;
    for (let j = 0; j < points.length; j++) {
      const il = grid.inductorA[j] as number[];
      // The periodic end: the next half's start (the event model's starts its commutation there).
      il[il.length - 1] = isContinued
        ? (points[j]?.sharedFall?.endA ?? 0)
        : (points[j]?.valleyA ?? 0);
    }
    magnetizingA[magnetizingA.length - 1] = fall.magnetizingStartA;
  } else {
    grid.edges.push(1);
    grid.kinds.push('off');
    joined.push(false);
    modes.push('off');
    sides.push(1);
    for (let j = 0; j < points.length; j++) {
      (grid.idle[j] as boolean[]).push(false);
      (grid.inductorA[j] as number[]).push(
        points[j]?.sharedFall?.startA ?? 0,
        points[j]?.valleyA ?? 0,
      );
    }
    magnetizingA.push(fall.magnetizingEndOfOnA, fall.magnetizingStartA);
    windingV.push(0, 0);
    equivalentA?.push(NaN, NaN);
    nodeV?.push(0, 0);
    leakageA?.push(0, 0);
  }
  grid.ring = { modes, sides, magnetizingA, windingV };
  if (equivalentA !== undefined) grid.ring.equivalentA = equivalentA;
  if (nodeV !== undefined) grid.ring.nodeV = nodeV;
  if (leakageA !== undefined) grid.ring.leakageA = leakageA;
  grid.joined = joined;
}

/**
 * Output j's inductor current where the ring's is `ringA`, `t` seconds into the ring's stretch:
 * the ring's own with one output, else as the output follows it (`SharedFall.followsRing`), A.
 */
function followedA(
  point: DoubleEndedStagePoint | undefined,
  follows: SharedFall['followsRing'],
  ringA: number,
  t: number,
  segment: RingSegment,
  segmentIndex: number,
  segmentT: number,
): number {
  if (follows === undefined || point?.sharedFall?.ring === undefined) return ringA;
  const startsA = follows.segmentStartsA;
  if (startsA !== undefined) {
    // The event model's followers: stretch by stretch (`several-outputs-events.ts`).
    if (segment.mode === 'idle') return 0;
    const shares = follows.segmentSharesA;
    if (shares !== undefined) {
      // Each output's own events: its share and slope in this stretch.
      return (
        (startsA[segmentIndex] ?? 0) +
        (shares[segmentIndex] ?? 0) * (ringA - segment.start.inductorA) +
        (follows.segmentRatesAPerS?.[segmentIndex] ?? 0) * segmentT
      );
    }
    const rate = isFreewheel(segment.mode) ? (follows.offPerS ?? follows.perS) : follows.perS;
    return (
      (startsA[segmentIndex] ?? 0) +
      follows.perRingA * (ringA - segment.start.inductorA) +
      rate * segmentT
    );
  }
  const ring = point.sharedFall.ring;
  return (
    point.sharedFall.startA + follows.perRingA * (ringA - ring.start.inductorA) + follows.perS * t
  );
}

/** The inductor current of a stage with a shared fall outside its on-interval, A. */
function sharedFallValue(
  f: SharedFall,
  peakA: number,
  onEnd: number,
  kind: HalfInterval,
  h: number,
  mid: number,
): number {
  if (kind === 'commutation') return f.endA;
  if (kind === 'shared') {
    const span = f.endFraction - f.startFraction;
    return span > 0 ? f.startA + ((f.endA - f.startA) * (h - f.startFraction)) / span : f.startA;
  }
  if (mid >= f.endFraction) return 0;
  const span = f.startFraction - onEnd;
  return span > 0 ? peakA + ((f.startA - peakA) * (h - onEnd)) / span : f.startA;
}

/**
 * Returns a waveform over the whole period from `value(j, end, half)`: its value at the start
 * (end 0) or end (end 1) of interval j in half 0 (winding driven positive) or half 1; a value
 * that differs across an edge is a jump.
 */
export function gridWaveform(
  grid: HalfPeriodGrid,
  periodS: number,
  value: (j: number, end: 0 | 1, half: 0 | 1) => number,
): Waveform {
  return gridPoints(grid, periodS, periodS / 2, 2, value);
}

/**
 * Returns the waveforms of both sides of a pair over the whole period, as {@link gridWaveform}
 * would for `value` (side 0) and for side 1's value, which must be side 0's with the halves
 * swapped: side 1 at (j, end, half) is side 0 at (j, end, 1 − half). Every per-side waveform of
 * the grid is so (its value reads `half === side` and nothing else of the two), so side 1's
 * column is side 0's with its halves swapped: `value` runs over the period once for both.
 */
export function gridWaveformPair(
  grid: HalfPeriodGrid,
  periodS: number,
  value: GridValue,
): [Waveform, Waveform] {
  const columns = gridColumns(grid, periodS, periodS / 2, 2);
  if (columns.isIdentity && columns.keptTimesS !== undefined) {
    const keptS = columns.keptTimesS;
    // Side 0's values written into its own column (a copy of the times, an array of doubles of
    // the right length), side 1's its halves swapped.
    const first = keptS.slice();
    if (!fillValues(grid, first, 2, value)) {
      const swapped = [...first.slice(first.length / 2), ...first.slice(0, first.length / 2)];
      return [
        piecewiseLinearColumns(periodS, columns.timesS, first),
        piecewiseLinearColumns(periodS, columns.timesS, swapped),
      ];
    }
    const second = keptS.slice();
    const half = first.length / 2;
    for (let k = 0; k < half; k++) {
      second[k] = first[k + half] as number;
      second[k + half] = first[k] as number;
    }
    return [
      { periodS, timesS: keptS, values: first },
      { periodS, timesS: keptS, values: second },
    ];
  }
  const isFinite = fillValues(grid, columns.values, 2, value);
  const { timesS, values, keptTimesS, sources } = columns;
  const halfCount = values.length / 2;
  if (!isFinite || keptTimesS === undefined || sources === undefined) {
    // As `gridWaveform` for each side, which throws its own error.
    const first = piecewiseLinearColumns(periodS, timesS, values);
    const swapped = [...values.slice(halfCount), ...values.slice(0, halfCount)];
    return [first, piecewiseLinearColumns(periodS, timesS, swapped)];
  }
  // Written over copies of the kept times, not pushed onto empty arrays (see gridPoints).
  const first = valueColumn(keptTimesS, sources.length);
  const second = valueColumn(keptTimesS, sources.length);
  for (let k = 0; k < sources.length; k++) {
    const source = sources[k] as number;
    first[k] = values[source] as number;
    second[k] = values[source < halfCount ? source + halfCount : source - halfCount] as number;
  }
  return [
    { periodS, timesS: keptTimesS, values: first },
    { periodS, timesS: keptTimesS, values: second },
  ];
}

/** Returns half 0 of {@link gridWaveform} as a waveform of its own, period T/2. */
export function gridHalfWaveform(
  grid: HalfPeriodGrid,
  periodS: number,
  value: (j: number, end: 0 | 1, half: 0 | 1) => number,
): Waveform {
  return gridPoints(grid, periodS / 2, periodS / 2, 1, value);
}

/**
 * A waveform's values at the interval ends as columns: in half 0 `half0[2j + end]` (interval
 * j's start or end; a missing entry 0), in half 1 `half1`'s where given, else half 0's, negated
 * where `isMirrored`.
 */
interface GridEnds {
  half0: readonly number[];
  half1: readonly number[] | undefined;
  isMirrored: boolean;
}

/**
 * What a grid waveform's value at each interval end is: a function of (j, end, half), or
 * columns of the values ({@link GridEnds}; `gridWaveformOfEnds`, `gridWaveformPairOfEnds`).
 */
type GridValue = ((j: number, end: 0 | 1, half: 0 | 1) => number) | GridEnds;

/**
 * {@link gridWaveform} of the value `ends[2j + end] ?? 0` in half 0 and, in half 1, the same
 * (or its negative where `isMirrored`): the same waveform, to the bit (1·x is x, −1·x is −x),
 * read off the column in a loop instead of a call per point. The grid's value functions are many
 * and all called from `fillColumn`, so none of them is inlined there: each call and each number
 * it returns (boxed) cost more than reading a column the caller filled in a loop of its own.
 */
export function gridWaveformOfEnds(
  grid: HalfPeriodGrid,
  periodS: number,
  ends: readonly number[],
  isMirrored = false,
): Waveform {
  return gridPoints(grid, periodS, periodS / 2, 2, {
    half0: ends,
    half1: undefined,
    isMirrored,
  });
}

/** {@link gridHalfWaveform} of the value `ends[2j + end] ?? 0` (see {@link gridWaveformOfEnds}). */
export function gridHalfWaveformOfEnds(
  grid: HalfPeriodGrid,
  periodS: number,
  ends: readonly number[],
): Waveform {
  return gridPoints(grid, periodS / 2, periodS / 2, 1, {
    half0: ends,
    half1: undefined,
    isMirrored: false,
  });
}

/**
 * {@link gridWaveformPair} of the value `half0[2j + end] ?? 0` in half 0 and
 * `half1[2j + end] ?? 0` in half 1 (side 0's; see {@link gridWaveformOfEnds}). A start of an
 * interval that is `joined` is not read.
 */
export function gridWaveformPairOfEnds(
  grid: HalfPeriodGrid,
  periodS: number,
  half0: readonly number[],
  half1: readonly number[],
): [Waveform, Waveform] {
  return gridWaveformPair(grid, periodS, { half0, half1, isMirrored: false });
}

/**
 * The waveform of the first `halves` halves, built as two columns (no pair per point). The
 * columns are the grid's (`gridColumns`): the some 15 waveforms of a corner share one time
 * column and overwrite one value column instead of building two new ones each (with the ring
 * sampled every π/6, a tenth of a design's garbage), and each copies only the points
 * `piecewiseLinearColumns` would keep, found once per grid (`keptColumns`).
 */
function gridPoints(
  grid: HalfPeriodGrid,
  periodS: number,
  halfS: number,
  halves: 1 | 2,
  value: GridValue,
): Waveform {
  const columns = gridColumns(grid, periodS, halfS, halves);
  const { timesS, values, keptTimesS, sources } = columns;
  if (columns.isIdentity && keptTimesS !== undefined) {
    // The values written straight into the waveform's column (see `GridColumns.isIdentity`).
    const own = keptTimesS.slice();
    if (!fillValues(grid, own, halves, value)) {
      return piecewiseLinearColumns(periodS, timesS, own);
    }
    return { periodS, timesS: keptTimesS, values: own };
  }
  const isFinite = fillValues(grid, values, halves, value);
  // A value that is not a number, or times that fail the checks: `piecewiseLinearColumns`
  // throws its own error, as it did for every waveform.
  if (!isFinite || keptTimesS === undefined || sources === undefined) {
    return piecewiseLinearColumns(periodS, timesS, values);
  }
  // The same columns as `piecewiseLinearColumns(periodS, timesS, values)` gives, without its
  // checks and clamps per point, which the grid's times pass the same way for every waveform.
  // Written over a copy of the kept times (an array of doubles of the right length), not pushed
  // onto an empty one, which grew it several times per waveform.
  const kept = valueColumn(keptTimesS, sources.length);
  for (let k = 0; k < sources.length; k++) kept[k] = values[sources[k] as number] as number;
  return { periodS, timesS: keptTimesS, values: kept };
}

/**
 * Writes `value` at both ends of every interval of the first `halves` halves into `values` (at
 * the start only where the interval is not `joined`, as `gridColumns` lays out the times);
 * returns whether every value is finite.
 */
function fillColumn(
  grid: HalfPeriodGrid,
  values: number[],
  halves: 1 | 2,
  value: (j: number, end: 0 | 1, half: 0 | 1) => number,
): boolean {
  const intervals = grid.kinds.length;
  const joined = grid.joined;
  let i = 0;
  let isFinite = true;
  for (let h = 0; h < halves; h++) {
    const half: 0 | 1 = h === 0 ? 0 : 1;
    for (let j = 0; j < intervals; j++) {
      if (joined?.[j] !== true) {
        const a = value(j, 0, half);
        values[i++] = a;
        isFinite = isFinite && Number.isFinite(a);
      }
      const b = value(j, 1, half);
      values[i++] = b;
      isFinite = isFinite && Number.isFinite(b);
    }
  }
  return isFinite;
}

/** {@link fillColumn} of either kind of {@link GridValue}. */
function fillValues(grid: HalfPeriodGrid, values: number[], halves: 1 | 2, value: GridValue) {
  return typeof value === 'function'
    ? fillColumn(grid, values, halves, value)
    : fillEndsColumn(grid, values, halves, value);
}

/** {@link fillColumn} of the values a {@link GridEnds} gives, in the same order. */
function fillEndsColumn(
  grid: HalfPeriodGrid,
  values: number[],
  halves: 1 | 2,
  value: GridEnds,
): boolean {
  const intervals = grid.kinds.length;
  const joined = grid.joined;
  let i = 0;
  let isFinite = true;
  for (let h = 0; h < halves; h++) {
    const ends = h === 1 && value.half1 !== undefined ? value.half1 : value.half0;
    const isNegated = h === 1 && value.half1 === undefined && value.isMirrored;
    for (let j = 0; j < intervals; j++) {
      if (joined?.[j] !== true) {
        const a = ends[2 * j] ?? 0;
        const signedA = isNegated ? -a : a;
        values[i++] = signedA;
        isFinite = isFinite && Number.isFinite(signedA);
      }
      const b = ends[2 * j + 1] ?? 0;
      const signedB = isNegated ? -b : b;
      values[i++] = signedB;
      isFinite = isFinite && Number.isFinite(signedB);
    }
  }
  return isFinite;
}

/** The grid's columns for `halves` halves of `halfS` in a period `periodS`, made on the first call. */
function gridColumns(
  grid: HalfPeriodGrid,
  periodS: number,
  halfS: number,
  halves: 1 | 2,
): GridColumns {
  const intervals = grid.kinds.length;
  const joined = grid.joined;
  let joinedCount = 0;
  for (let j = 0; j < intervals; j++) if (joined?.[j] === true) joinedCount++;
  const count = (2 * intervals - joinedCount) * halves;
  const kept = grid.columns?.[halves - 1];
  if (
    kept !== undefined &&
    kept.halfS === halfS &&
    kept.periodS === periodS &&
    kept.timesS.length === count
  ) {
    return kept;
  }
  // Pushed, not written into `new Array(count)`: that array's elements are holey, and
  // `fillColumn`, which writes into the value column made from it and into the waveforms' own
  // columns alike, then turned the waveforms' columns holey too, whose every number the
  // finiteness walk and the stats then read boxed.
  const timesS: number[] = [];
  for (let h = 0; h < halves; h++) {
    for (let j = 0; j < intervals; j++) {
      if (joined?.[j] !== true) timesS.push((h + (grid.edges[j] as number)) * halfS);
      timesS.push((h + (grid.edges[j + 1] as number)) * halfS);
    }
  }
  const columns: GridColumns = {
    halfS,
    timesS,
    values: [],
    periodS,
    keptTimesS: undefined,
    sources: undefined,
    isIdentity: false,
  };
  keptColumns(columns);
  // The raw value column, for the grids that drop a time (or fail the checks) alone.
  if (!columns.isIdentity) columns.values = timesS.slice();
  grid.columns ??= [];
  grid.columns[halves - 1] = columns;
  return columns;
}

/**
 * Sets `columns.keptTimesS` and `sources`: the columns `piecewiseLinearColumns` builds from the
 * times, each kept value named by the point it came from (`keptTimeSources`). Left undefined
 * where the times fail its checks (the waveform's own call then throws).
 */
function keptColumns(columns: GridColumns): void {
  const kept = keptTimeSources(columns.periodS, columns.timesS);
  columns.keptTimesS = kept?.timesS;
  columns.sources = kept?.sources;
  const sources = kept?.sources;
  let isIdentity = sources !== undefined && sources.length === columns.timesS.length;
  for (let k = 0; isIdentity && k < (sources?.length ?? 0); k++) {
    if (sources?.[k] !== k) isIdentity = false;
  }
  columns.isIdentity = isIdentity;
}

/**
 * Sorts a few numbers in place, ascending: by insertion, as `sort((a, b) => a - b)` orders them
 * (which took a quarter of this module's grid time in a profile); with a NaN among them, by that
 * very sort, so that even their order is as before.
 */
function sortAscending(values: number[]): void {
  if (values.some((v) => Number.isNaN(v))) {
    values.sort((a, b) => a - b);
    return;
  }
  for (let k = 1; k < values.length; k++) {
    const v = values[k] as number;
    let i = k;
    while (i > 0 && (values[i - 1] as number) > v) {
      values[i] = values[i - 1] as number;
      i--;
    }
    values[i] = v;
  }
}

/**
 * A column for `length` values to be written in order from index 0: a copy of `keptTimesS` (an
 * array of doubles already of that length, so nothing grows) when the lengths agree, else empty.
 */
function valueColumn(keptTimesS: readonly number[], length: number): number[] {
  return keptTimesS.length === length ? keptTimesS.slice() : [];
}
