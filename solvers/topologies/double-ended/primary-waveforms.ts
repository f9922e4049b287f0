import type { Waveform } from '../../waveform/waveform.js';
import type { DoubleEndedCircuit, DoubleEndedState } from './double-ended-state.js';
import {
  gridWaveformOfEnds,
  gridWaveformPairOfEnds,
  swingShare,
  type HalfPeriodGrid,
} from './half-period-grid.js';

/** The primary-side waveforms of one corner, A and V. */
export interface PrimaryWaveforms {
  /** Magnetizing current, swinging between −Im,pk and +Im,pk, A. */
  magnetizingA: Waveform;
  /** Primary winding current (push-pull: as ampere-turns of one half), A. */
  primaryA: Waveform;
  /** Current of each switch, in the bridge's switch order, A. */
  switchesA: Waveform[];
  /** Voltage across each switch, V. */
  switchesV: Waveform[];
  /** Current drawn from the input rail by the switches (half bridge: by the high side), A. */
  railA: Waveform;
}

/**
 * Returns the primary waveforms: Im ramps −Im,pk → +Im,pk while the winding is driven positive,
 * holds while it is at zero, and mirrors in the other half (with a shared fall at light load:
 * ramps from its start to its peak, holds, then falls with the inductor current over n); the driven switches carry Im plus the
 * reflected inductor currents, rising from zero through the leakage during the commutation; no
 * switch conducts while the secondary freewheels. Switch voltages: push-pull Vin + Vp while the
 * other half is driven (the other half's voltage adds to the input), else Vin; bridges Vin less
 * the conducting partner's drop while the other diagonal is on, else Vin/2 (equal capacitances
 * share the input); the leakage's decay after a bridge's turn-off (Vin plus a body diode's drop
 * on the switch just turned off) is drawn over these by the corner (`bridgeDecayPlateau`).
 */
export function primaryWaveforms(
  circuit: DoubleEndedCircuit,
  state: DoubleEndedState,
  grid: HalfPeriodGrid,
  onResistanceOhm: number,
): PrimaryWaveforms {
  const { start, onEnd } = grid;
  const peakA = state.magnetizingPeakA;
  const startA = state.magnetizingStartA;
  const vin = circuit.inputVoltageV;
  let reflectedValleyA = 0;
  for (let k = 0; k < state.points.length; k++) {
    reflectedValleyA +=
      (state.points[k] as DoubleEndedState['points'][number]).valleyA /
      (circuit.turnsRatios[k] ?? 1);
  }
  // The shared fall: the magnetizing current follows the inductor currents over n (their sum
  // Σ IL_k/n_k with several outputs), and the winding sits at −n·Vw (Vw output 0's shared-fall
  // voltage; every output's over its n is the same).
  const fall = state.points[0]?.sharedFall;
  const ring = grid.ring;
  const n0 = circuit.turnsRatios[0] ?? 1;
  const sharedV = fall === undefined ? 0 : n0 * fall.windingVoltageV;
  // Per interval end (index 2j + end): magnetizing current and the driven switches' current,
  // both in the positive half; the negative half mirrors them. These per-end columns (and
  // `decay` and `ringing`) are the module's scratch, written over from index 0 for each corner:
  // every interval end writes each once, and they are read only before this returns.
  const magnetizing = MAGNETIZING;
  const driven = DRIVEN;
  // The bridges' leakage current left at turn-on (`leakageCarryA`): the commutation sweeps the
  // primary current from −I (the last half's, through the switch just turned on) through zero,
  // and the decay before it fills the whole off-stretch after the turn-off swing, from the
  // turn-off current Ip to I, through the opposite switches' body diodes (`decay`: per interval
  // end, in the positive half's sense; zero elsewhere). Where the decay ends within the off-time
  // it is not drawn (the grid has no edge at its end).
  const carryA = ring === undefined && fall === undefined ? (state.leakageCarryA ?? 0) : 0;
  // Where the decay ended within the off-time, the leakage's ring with the node has carried the
  // current some way towards this half by the turn-on (`leakageRingA`): the commutation starts
  // there (the ring itself, within the off-stretch, is not drawn).
  const ringA = ring === undefined && fall === undefined ? (state.leakageRingA ?? 0) : 0;
  const sweepFromA = ringA - carryA;
  const decay = DECAY;
  const decayFrom = grid.swing?.to ?? onEnd;
  let turnOffA = peakA;
  for (let k = 0; k < state.points.length; k++) {
    turnOffA += (state.points[k]?.peakA ?? 0) / (circuit.turnsRatios[k] ?? 1);
  }
  // The primary winding's current while the switches are off and the node rings: the referred
  // magnetizing current less the conducting rectifier's, over n (into the drain capacitance, or
  // through the body diodes while clamped).
  const ringing = RINGING;
  // Plain loops, not forEach and `of [0, 1]` (a closure, and an array for each interval).
  for (let j = 0; j < grid.kinds.length; j++) {
    const kind = grid.kinds[j];
    const ringMode = ring?.modes[j];
    for (let e = 0; e < 2; e++) {
      const end: 0 | 1 = e === 0 ? 0 : 1;
      const at = 2 * j + end;
      const h = grid.edges[j + end] as number;
      if (ring !== undefined && ringMode !== undefined) {
        const im = ring.magnetizingA[2 * j + end] ?? 0;
        // The ring's inductor current: output 0's, or with several the equivalent's (referred to
        // output 0's secondary: Σ (n0/n_k)·IL_k).
        let il = 0;
        for (let k = 0; k < grid.inductorA.length; k++) {
          il += (n0 / (circuit.turnsRatios[k] ?? 1)) * (grid.inductorA[k]?.[2 * j + end] ?? 0);
        }
        const side = ring.sides[j] ?? 1;
        magnetizing[at] = im / n0;
        driven[at] = 0;
        decay[at] = 0;
        const leakageA = ring.leakageA?.[2 * j + end];
        ringing[at] =
          leakageA !== undefined
            ? leakageA / n0
            : ringMode === 'off'
              ? 0
              : ringMode === 'idle'
                ? im / n0
                : (im - side * il) / n0;
        continue;
      }
      ringing[at] = 0;
      decay[at] =
        carryA > 0 && kind === 'off' && (grid.edges[j] as number) >= decayFrom && decayFrom < 1
          ? turnOffA - ((turnOffA - carryA) * (h - decayFrom)) / (1 - decayFrom)
          : 0;
      if (kind === 'commutation') {
        magnetizing[at] = startA;
        driven[at] = sweepFromA + ((reflectedValleyA + startA - sweepFromA) * h) / start;
      } else if (kind === 'on') {
        const im = startA + ((peakA - startA) * (h - start)) / (onEnd - start);
        let reflectedA = 0;
        for (let k = 0; k < grid.inductorA.length; k++) {
          reflectedA +=
            ((grid.inductorA[k] as readonly number[])[2 * j + end] ?? 0) /
            (circuit.turnsRatios[k] ?? 1);
        }
        magnetizing[at] = im;
        driven[at] = im + reflectedA;
      } else if (kind === 'shared') {
        // The referred magnetizing current is the inductor current (the outputs' sum).
        let reflectedA = 0;
        for (let k = 0; k < grid.inductorA.length; k++) {
          reflectedA += (grid.inductorA[k]?.[2 * j + end] ?? 0) / (circuit.turnsRatios[k] ?? 1);
        }
        magnetizing[at] = reflectedA;
        driven[at] = 0;
      } else if (fall !== undefined && (grid.edges[j] as number) >= fall.endFraction) {
        // Both have fallen to zero (discontinuous conduction).
        magnetizing[at] = fall.endA / n0;
        driven[at] = 0;
      } else {
        magnetizing[at] = peakA;
        driven[at] = 0;
      }
    }
  }
  const isPushPull = circuit.bridge.kind === 'push-pull';
  const idleV = isPushPull ? vin : vin / 2;
  const periodS = circuit.periodS;
  // Each pair's side 1 is side 0 with the halves swapped (the values read `half === side`).
  // Through the turn-off swing the primary current charges the node capacitance, not the
  // channel: the switch current ends at the gate's turn-off.
  // The decay after the last half's turn-off flows back through this side's body diodes.
  // Across the switches during the shared fall: the winding voltage adds to the switches of the
  // half just driven and subtracts from the others (push-pull: one winding half; half bridge:
  // the switch node; full bridge: half of it on each floating leg, equal capacitances).
  // Side 0's values in each half, per end, written here in a loop of this function's own and
  // read off as columns (`gridWaveformPairOfEnds`; a function per point, called from the grid's
  // shared loop, was a call and a boxed number each).
  const isFullBridge = circuit.bridge.kind === 'full-bridge';
  const sharedShareV = isFullBridge ? sharedV / 2 : sharedV;
  const currents0 = SIDE_CURRENTS_0;
  const currents1 = SIDE_CURRENTS_1;
  const voltages0 = SIDE_VOLTAGES_0;
  const voltages1 = SIDE_VOLTAGES_1;
  const joined = grid.joined;
  for (let j = 0; j < grid.kinds.length; j++) {
    const kind = grid.kinds[j];
    const isRinging = ring !== undefined && ring.modes[j] !== undefined;
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
      const share = swingShare(grid, j, end);
      const drivenA = endValue(driven, j, end);
      currents0[at] = share >= 0 ? 0 : drivenA;
      currents1[at] = -endValue(decay, j, end);
      if (ring !== undefined && isRinging) {
        // With the leakage in the ring the switches see the node, not the winding.
        const ringV = ring.nodeV?.[at] ?? ring.windingV[at] ?? 0;
        const nodeV = n0 * ringV * (isFullBridge ? 0.5 : 1);
        voltages0[at] = idleV + nodeV;
        voltages1[at] = idleV + -nodeV;
      } else if (kind === 'shared') {
        voltages0[at] = idleV + sharedShareV;
        voltages1[at] = idleV + -sharedShareV;
      } else if (share >= 0) {
        // The turn-off swing: from the on-state's voltages to the idle ones as the winding falls.
        const onV0 = onResistanceOhm * drivenA;
        const onV1 = isPushPull ? vin + state.primaryVoltageV : vin - onResistanceOhm * drivenA;
        voltages0[at] = idleV + share * (onV0 - idleV);
        voltages1[at] = idleV + share * (onV1 - idleV);
      } else {
        voltages0[at] = kind === 'off' ? idleV : onResistanceOhm * drivenA;
        voltages1[at] = isPushPull
          ? kind === 'on'
            ? vin + state.primaryVoltageV
            : vin
          : kind === 'off'
            ? idleV
            : vin - onResistanceOhm * drivenA;
      }
    }
  }
  const sideCurrents = gridWaveformPairOfEnds(grid, periodS, currents0, currents1);
  const sideVoltages = gridWaveformPairOfEnds(grid, periodS, voltages0, voltages1);
  // The waveforms that read the per-end columns alone: from columns (`gridWaveformOfEnds`),
  // each value the one a function of (j, end, half) gave, half 1 negated where it mirrors half 0.
  const rail = RAIL;
  const primary = PRIMARY;
  for (let at = 0; at < 2 * grid.kinds.length; at++) {
    rail[at] = (driven[at] ?? 0) - (decay[at] ?? 0);
    primary[at] = (driven[at] ?? 0) + (ringing[at] ?? 0) + (decay[at] ?? 0);
  }
  const railA =
    circuit.bridge.kind === 'half-bridge'
      ? (sideCurrents[0] as Waveform)
      : gridWaveformOfEnds(grid, periodS, rail);
  return {
    magnetizingA: gridWaveformOfEnds(grid, periodS, magnetizing, true),
    primaryA: gridWaveformOfEnds(grid, periodS, primary, true),
    switchesA: circuit.bridge.switchHalves.map((side) => sideCurrents[side] as Waveform),
    switchesV: circuit.bridge.switchHalves.map((side) => sideVoltages[side] as Waveform),
    railA,
  };
}

/** The per-end scratch columns of {@link primaryWaveforms} (see there). */
const MAGNETIZING: number[] = [];
const DRIVEN: number[] = [];
const DECAY: number[] = [];
const RINGING: number[] = [];
/** Per end: the rail's current (driven less decay) and the primary's (driven, ringing, decay). */
const RAIL: number[] = [];
const PRIMARY: number[] = [];
/** Per end: side 0's switch current and voltage in half 0 and in half 1. */
const SIDE_CURRENTS_0: number[] = [];
const SIDE_CURRENTS_1: number[] = [];
const SIDE_VOLTAGES_0: number[] = [];
const SIDE_VOLTAGES_1: number[] = [];

/*
 * Module functions, not named arrows in `primaryWaveforms`: under tsx (the service's and the
 * bench's runtime) esbuild's keepNames wraps every named arrow in an Object.defineProperty call.
 */

/** The value at the start (end 0) or end (end 1) of interval j, from per-end values. */
function endValue(values: readonly number[], j: number, end: 0 | 1): number {
  return values[2 * j + end] ?? 0;
}
