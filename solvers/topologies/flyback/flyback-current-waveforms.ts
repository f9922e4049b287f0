import {
  drawnWaveform,
  drawPoint,
  drawTrace,
  piecewiseLinear,
  reusableDrawing,
  startDrawing,
} from '../../waveform/piecewise-linear.js';
import type { Waveform } from '../../waveform/waveform.js';
import type { FlybackCircuit } from './flyback-circuit.js';
import type { FlybackRingTraces } from './flyback-ring-traces.js';
import type { FlybackSteadyState } from './flyback-steady-state.js';

/** The primary-side currents of one corner and the secondary current referred to the primary. */
export interface FlybackCurrentWaveforms {
  /** Magnetizing current, A. */
  magnetizingA: Waveform;
  /** Switch (drain) current: zero while the clamp takes the leakage current, A. */
  switchA: Waveform;
  /** Primary winding current: the switch current plus the clamp current during ts, A. */
  primaryWindingA: Waveform;
  /** Sum over the secondaries of ik/nk, A; secondary k carries αk times this. */
  referredSecondaryA: Waveform;
}

/**
 * The drawings of the four currents, started again for every corner (each waveform then
 * allocates its kept points once; flyback-current-waveforms is not re-entered while it draws).
 */
const MAGNETIZING = reusableDrawing();
const PRIMARY = reusableDrawing();
const SECONDARY = reusableDrawing();
const SWITCHING = reusableDrawing();

/**
 * Returns the corner's current waveforms from its breakpoints (flyback-intervals.ts): straight
 * ramps between t = 0, t1, DT, DT + ts, the end of secondary conduction and T, and in DCM the
 * idle ring (flyback-idle-ring.ts) drawn point by point, which ends at the next turn-on's I0 so
 * that the magnetizing current is periodic. Zero-length intervals (no leakage) become jumps.
 * `traces` are the corner's arcs (flyback-ring-traces.ts), shared with the voltage waveforms.
 */
export function flybackCurrentWaveforms(
  circuit: FlybackCircuit,
  state: FlybackSteadyState,
  traces: FlybackRingTraces,
): FlybackCurrentWaveforms {
  const periodS = circuit.periodS;
  const onS = state.dutyCycle * periodS;
  const t1 = state.turnOnCommutationS;
  // The drain's rise at turn-off (the winding's current charges the drain capacitance, no
  // secondary current yet), then the leakage ring and the leakage commutation.
  const risenS = onS + state.turnOffTransitionS;
  const rise = traces.rise;
  const commutatedS = risenS + state.leakageRingS + state.turnOffCommutationS;
  const endS = state.conductionEndS;
  const valley = state.valleyCurrentA;
  const onset = state.onsetCurrentA;
  const peakA = state.peakCurrentA;
  const after = state.afterCommutationCurrentA;
  const isContinuous = state.mode !== 'dcm' && valley > 0;
  // The leakage ring with the drain capacitance (flyback-turn-off.ts): the leakage current on
  // its arcs, and the referred secondary current as the magnetizing current less it. The
  // magnetizing current falls straight from I1 at risenS to Ib at commutatedS, then to the
  // period's end value (Iv in CCM, 0 at the end of conduction in DCM).
  const fromA = state.transitionEndCurrentA;
  const fallSlope = commutatedS > risenS ? (after - fromA) / (commutatedS - risenS) : 0;
  const demagnetizingSlope = isContinuous
    ? (valley - after) / (periodS - commutatedS)
    : endS > commutatedS
      ? -after / (endS - commutatedS)
      : 0;
  const { leakageRise, leakageReturn } = traces;
  // The waveforms are drawn as columns of times and values, point by point in time order (a
  // [time, value] pair per point, spread into each waveform's list, was most of a flyback
  // corner's garbage).
  const magnetizing = startDrawing(0, valley, MAGNETIZING);
  const primary = startDrawing(0, isContinuous ? 0 : valley, PRIMARY);
  const secondary = startDrawing(0, isContinuous ? valley : 0, SECONDARY);
  if (isContinuous) {
    drawPoint(magnetizing, t1, onset);
    drawPoint(primary, t1, onset);
    drawPoint(secondary, t1, 0);
  }
  drawPoint(magnetizing, onS, peakA);
  drawPoint(primary, onS, peakA);
  drawPoint(secondary, risenS, 0);
  drawTrace(magnetizing, rise.timesS, rise.currentsA);
  drawPoint(magnetizing, commutatedS, after);
  drawTrace(primary, rise.timesS, rise.currentsA);
  drawTrace(primary, leakageRise.timesS, leakageRise.currentsA);
  drawPoint(primary, commutatedS, 0);
  drawTrace(primary, leakageReturn.timesS, leakageReturn.currentsA);
  for (let k = 0; k < leakageRise.timesS.length; k++) {
    const timeS = leakageRise.timesS[k] as number;
    const leakageA = leakageRise.currentsA[k] as number;
    drawPoint(secondary, timeS, fromA + fallSlope * (timeS - risenS) - leakageA);
  }
  drawPoint(secondary, commutatedS, after);
  for (let k = 0; k < leakageReturn.timesS.length; k++) {
    const timeS = leakageReturn.timesS[k] as number;
    const leakageA = leakageReturn.currentsA[k] as number;
    drawPoint(secondary, timeS, after + demagnetizingSlope * (timeS - commutatedS) - leakageA);
  }
  // The ring is taken as damped at the end of its return: the leakage current drops to zero.
  const returnEndS = leakageReturn.timesS[leakageReturn.timesS.length - 1];
  if (returnEndS !== undefined) {
    drawPoint(primary, returnEndS, 0);
    drawPoint(secondary, returnEndS, after + demagnetizingSlope * (returnEndS - commutatedS));
  }
  if (isContinuous) {
    drawPoint(magnetizing, periodS, valley);
    drawPoint(primary, periodS, 0);
    drawPoint(secondary, periodS, valley);
    return {
      magnetizingA: drawnWaveform(periodS, magnetizing),
      switchA: piecewiseLinear(periodS, [
        [0, 0],
        [t1, onset],
        [onS, peakA],
        [onS, 0],
        [periodS, 0],
      ]),
      primaryWindingA: drawnWaveform(periodS, primary),
      referredSecondaryA: drawnWaveform(periodS, secondary),
    };
  }
  // DCM: the idle ring from the end of secondary conduction to T, which ends at I0 = valley.
  const ring = traces.idle;
  if (ring === undefined)
    throw new RangeError('flybackCurrentWaveforms: a DCM corner needs its idle ring');
  // The switch carries the ring current only while its body diode clamps the drain.
  const switching = startDrawing(0, valley, SWITCHING);
  drawPoint(switching, onS, peakA);
  drawPoint(switching, onS, 0);
  const count = ring.timesS.length;
  for (let k = 0; k < count; k++) {
    const timeS = ring.timesS[k] as number;
    const currentA = ring.currentsA[k] as number;
    drawPoint(magnetizing, timeS, currentA);
    drawPoint(primary, timeS, currentA);
    if (k === ring.clampFrom) drawPoint(switching, timeS, 0);
    const isClamped = k >= ring.clampFrom && k <= ring.clampTo && ring.clampFrom >= 0;
    drawPoint(switching, timeS, isClamped ? currentA : 0);
    if (k === ring.clampTo && ring.clampFrom >= 0 && k < count - 1) {
      drawPoint(switching, timeS, 0);
    }
  }
  drawPoint(secondary, endS, 0);
  drawPoint(secondary, periodS, 0);
  return {
    magnetizingA: drawnWaveform(periodS, magnetizing),
    switchA: drawnWaveform(periodS, switching),
    primaryWindingA: drawnWaveform(periodS, primary),
    referredSecondaryA: drawnWaveform(periodS, secondary),
  };
}
