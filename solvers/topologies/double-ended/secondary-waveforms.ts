import type { RectifierModel } from '../../devices/rectifier-model.js';
import type { Waveform } from '../../waveform/waveform.js';
import type { OutputStage } from '../buck-derived/output-stage.js';
import {
  gridHalfWaveformOfEnds,
  gridWaveform,
  gridWaveformOfEnds,
  gridWaveformPairOfEnds,
  swingShare,
  type HalfPeriodGrid,
} from './half-period-grid.js';
import type { DoubleEndedStagePoint } from './light-load-point.js';
import { isFreewheel } from './node-ring.js';
import type { SecondaryArrangement } from './secondary-stage.js';

/** The waveforms of one double-ended output over a switching period, A and V. */
export interface SecondaryWaveforms {
  inductorA: Waveform;
  /** The inductor current over one half-period, its own period (it repeats at 2·fs), A. */
  inductorHalfA: Waveform;
  /**
   * Current of each rectifier: center-tapped [half a, half b]; bridge [a upper, a lower, b upper,
   * b lower], where the a rectifiers conduct while the winding is driven positive.
   */
  rectifiersA: Waveform[];
  /** Reverse voltage of each rectifier, in the same order, V. */
  rectifiersV: Waveform[];
  /** Current of each secondary winding: both halves (center-tapped) or the one winding, A. */
  windingsA: Waveform[];
}

/**
 * Returns output `k`'s waveforms. While one half drives the winding, its rectifiers carry the
 * inductor current and the others block the winding (2·Vs for a center-tapped secondary, Vs for
 * a bridge) less the conducting path's drops; while freewheeling, every rectifier carries half
 * the inductor current; during the turn-on commutation the driven side takes it over linearly;
 * with the inductor current at zero (DCM) the rectifiers share Vo in blocking. The magnetizing
 * current's share of the rectifier currents while freewheeling is left out, except with a shared
 * fall (light load): then the side just driven carries (IL − n·Im)/2 and the other (IL + n·Im)/2
 * (with several outputs, n·Im is this output's part of it: its current as the fall starts)
 * until they meet, after which the other side alone carries IL while the winding, at Vw, is
 * blocked by the side just driven.
 */
export function secondaryWaveforms(
  arrangement: SecondaryArrangement,
  stage: OutputStage,
  point: DoubleEndedStagePoint,
  grid: HalfPeriodGrid,
  k: number,
  secondaryVoltageV: number,
  periodS: number,
  rectifier: RectifierModel,
): SecondaryWaveforms {
  const isBridge = arrangement === 'full-bridge';
  const context: SecondaryContext = {
    grid,
    inductor: grid.inductorA[k] ?? [],
    idle: grid.idle[k] ?? [],
    point,
    // With the node ring, its stretches: a rectifier conducting on the side about to be driven
    // (+1) or just driven (−1), both freewheeling, or none (idle). With several outputs the ring
    // is their equivalent's, referred to output 0 (`SharedFall.followsRing`).
    ring: k === 0 || point.sharedFall?.followsRing !== undefined ? grid.ring : undefined,
    ringWindingFactor: point.sharedFall?.followsRing?.windingFactor ?? 1,
    isFollower: point.sharedFall?.followsRing?.segmentStartsA !== undefined,
    isBridge,
    blockingV: (isBridge ? 1 : 2) * secondaryVoltageV,
    pathOhm: rectifier.resistanceOhm + stage.windingResistanceOhm,
    rectifier,
  };
  // Each pair's side 1 is side 0 with the halves swapped (the values read `half === side`).
  // Side 0's values in each half, per end, written here in a loop of this function's own and
  // read off as columns (`gridWaveformPairOfEnds`): called from the grid's shared loop, the value
  // functions were a call and a boxed number a point.
  const current = sideCurrent(context, 0);
  const voltage = sideVoltage(context, 0);
  const currents0 = CURRENTS_0;
  const currents1 = CURRENTS_1;
  const voltages0 = VOLTAGES_0;
  const voltages1 = VOLTAGES_1;
  const joined = grid.joined;
  for (let j = 0; j < grid.kinds.length; j++) {
    for (let e = 0; e < 2; e++) {
      const end: 0 | 1 = e === 0 ? 0 : 1;
      const at = 2 * j + end;
      // A joined interval's start is not read (the previous interval's end stands for it): a
      // zero there keeps the columns' elements packed doubles (a hole would make them holey).
      if (e === 0 && joined?.[j] === true) {
        currents0[at] = 0;
        currents1[at] = 0;
        voltages0[at] = 0;
        voltages1[at] = 0;
        continue;
      }
      currents0[at] = current(j, end, 0);
      currents1[at] = current(j, end, 1);
      voltages0[at] = voltage(j, end, 0);
      voltages1[at] = voltage(j, end, 1);
    }
  }
  const [a, b] = gridWaveformPairOfEnds(grid, periodS, currents0, currents1);
  const [va, vb] = gridWaveformPairOfEnds(grid, periodS, voltages0, voltages1);
  const aA = sideCurrent(context, 0);
  const bA = sideCurrent(context, 1);
  return {
    // The inductor current's value at an end is `inductorCurrent`'s, read off its column.
    inductorA: gridWaveformOfEnds(grid, periodS, context.inductor),
    inductorHalfA: gridHalfWaveformOfEnds(grid, periodS, context.inductor),
    rectifiersA: isBridge ? [a, a, b, b] : [a, b],
    rectifiersV: isBridge ? [va, va, vb, vb] : [va, vb],
    windingsA: isBridge
      ? [gridWaveform(grid, periodS, (j, end, half) => aA(j, end, half) - bA(j, end, half))]
      : [a, b],
  };
}

/** Per end: side 0's rectifier current and reverse voltage in half 0 and in half 1. */
const CURRENTS_0: number[] = [];
const CURRENTS_1: number[] = [];
const VOLTAGES_0: number[] = [];
const VOLTAGES_1: number[] = [];

/*
 * The value functions below are made by module factories, not as named arrows in
 * `secondaryWaveforms`: under tsx (the service's and the bench's runtime) esbuild's keepNames
 * wraps every named arrow in an Object.defineProperty call, paid at every corner.
 */

/** What one output's rectifier waveforms are read from. */
interface SecondaryContext {
  grid: HalfPeriodGrid;
  /** The output's inductor current at each interval end (`HalfPeriodGrid.inductorA`), A. */
  inductor: readonly number[];
  idle: readonly boolean[];
  point: DoubleEndedStagePoint;
  ring: HalfPeriodGrid['ring'];
  /** This output's winding voltage over the ring's (n0/n; 1 for output 0). */
  ringWindingFactor: number;
  /** Whether the output follows the event model's equivalent ring (`followsRing.segmentStartsA`). */
  isFollower: boolean;
  isBridge: boolean;
  /** What the blocking rectifiers see while the other side drives: 2·Vs or Vs (bridge), V. */
  blockingV: number;
  /** The conducting path's resistance: a rectifier's and the winding's, Ω. */
  pathOhm: number;
  rectifier: RectifierModel;
}

/** The inductor current at the start (end 0) or end (end 1) of interval j, A. */
function inductorCurrent(inductor: readonly number[]): (j: number, end: 0 | 1) => number {
  return (j, end) => inductor[2 * j + end] ?? 0;
}

/** The current of the rectifiers that conduct while half `side` drives the winding, A. */
function sideCurrent(
  x: SecondaryContext,
  side: 0 | 1,
): (j: number, end: 0 | 1, half: 0 | 1) => number {
  const { grid, ring } = x;
  const fall = x.point.sharedFall;
  const iL = inductorCurrent(x.inductor);
  return (j, end, half) => {
    const kind = grid.kinds[j];
    const ringMode = ring?.modes[j];
    if (ring !== undefined && ringMode !== undefined) {
      const il = iL(j, end);
      if (ringMode === 'idle') return 0;
      if (isFreewheel(ringMode)) {
        // The rectifiers' difference carries iM less the leakage current (iM without leakage).
        let im = (ring.magnetizingA[2 * j + end] ?? 0) - (ring.leakageA?.[2 * j + end] ?? 0);
        // Several outputs in the event model: this output's part, in proportion to its share
        // of the equivalent's current (referred to its own secondary: IL/I of n0·Im).
        const equivalentA = ring.equivalentA?.[2 * j + end];
        if (x.isFollower && equivalentA !== undefined && equivalentA > 0) {
          im = (im * il) / equivalentA;
        }
        return Math.max(0, (il + (half === side ? -im : im)) / 2);
      }
      const isJustDriven = half === side;
      return (ring.sides[j] ?? 1) > 0 === isJustDriven ? 0 : il;
    }
    if (fall !== undefined && kind === 'shared') return half === side ? 0 : iL(j, end);
    if (fall !== undefined && kind === 'off') {
      const imA = fall.freewheelMagnetizingA ?? fall.magnetizingEndOfOnA;
      return Math.max(0, (iL(j, end) + (half === side ? -imA : imA)) / 2);
    }
    if (kind === 'commutation') {
      const share = (grid.edges[j + end] as number) / (2 * grid.start);
      return iL(j, end) * (half === side ? 0.5 + share : 0.5 - share);
    }
    if (kind === 'on') return half === side ? iL(j, end) : 0;
    return iL(j, end) / 2;
  };
}

/** The reverse voltage of the rectifiers that conduct while half `side` drives the winding, V. */
function sideVoltage(
  x: SecondaryContext,
  side: 0 | 1,
): (j: number, end: 0 | 1, half: 0 | 1) => number {
  const { grid, ring, idle, point, isBridge, rectifier, pathOhm } = x;
  const fall = point.sharedFall;
  const iL = inductorCurrent(x.inductor);
  return (j, end, half) => {
    if (ring !== undefined && ring.modes[j] !== undefined) {
      // The winding at v (towards the next half's drive) reverse-biases the side just driven;
      // idle, each side holds Vo against the winding's own swing.
      const v = (half === side ? 1 : -1) * x.ringWindingFactor * (ring.windingV[2 * j + end] ?? 0);
      // Idle: the ring's idle stretch, or (each output's own events) this output's stretch
      // without current while the others conduct.
      const reverseV =
        ring.modes[j] === 'idle' || idle[j] === true
          ? isBridge
            ? (point.voltageV + v) / 2
            : point.voltageV + v
          : (isBridge ? 1 : 2) * v - rectifier.forwardVoltageV - pathOhm * iL(j, end);
      return Math.max(0, reverseV);
    }
    if (idle[j] === true) return isBridge ? point.voltageV / 2 : point.voltageV;
    if (fall !== undefined && grid.kinds[j] === 'shared') {
      if (half !== side) return 0;
      const blockV = (isBridge ? 1 : 2) * fall.windingVoltageV;
      return Math.max(0, blockV - rectifier.forwardVoltageV - pathOhm * iL(j, end));
    }
    if (half === side) return 0;
    // The turn-off swing: the blocking voltage falls with the winding's.
    const share = swingShare(grid, j, end);
    if (share >= 0) {
      return Math.max(0, share * x.blockingV - rectifier.forwardVoltageV - pathOhm * iL(j, end));
    }
    if (grid.kinds[j] !== 'on') return 0;
    return x.blockingV - rectifier.forwardVoltageV - pathOhm * iL(j, end);
  };
}
