import { piecewiseLinear } from '../../waveform/piecewise-linear.js';
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
  const risePoints = rise.timesS.map((timeS, k): [number, number] => [
    timeS,
    rise.currentsA[k] ?? 0,
  ]);
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
  const leakagePoints: Array<[number, number]> = [];
  const ringSecondaryPoints: Array<[number, number]> = [];
  const { leakageRise, leakageReturn } = traces;
  for (let k = 0; k < leakageRise.timesS.length; k++) {
    const timeS = leakageRise.timesS[k] as number;
    const leakageA = leakageRise.currentsA[k] as number;
    leakagePoints.push([timeS, leakageA]);
    ringSecondaryPoints.push([timeS, fromA + fallSlope * (timeS - risenS) - leakageA]);
  }
  const returnPoints: Array<[number, number]> = [];
  const returnSecondaryPoints: Array<[number, number]> = [];
  for (let k = 0; k < leakageReturn.timesS.length; k++) {
    const timeS = leakageReturn.timesS[k] as number;
    const leakageA = leakageReturn.currentsA[k] as number;
    const magnetizingA = after + demagnetizingSlope * (timeS - commutatedS);
    returnPoints.push([timeS, leakageA]);
    returnSecondaryPoints.push([timeS, magnetizingA - leakageA]);
  }
  // The ring is taken as damped at the end of its return: the leakage current drops to zero.
  const returnEndS = leakageReturn.timesS[leakageReturn.timesS.length - 1];
  if (returnEndS !== undefined) {
    returnPoints.push([returnEndS, 0]);
    returnSecondaryPoints.push([
      returnEndS,
      after + demagnetizingSlope * (returnEndS - commutatedS),
    ]);
  }
  if (isContinuous) {
    return {
      magnetizingA: piecewiseLinear(periodS, [
        [0, valley],
        [t1, onset],
        [onS, peakA],
        ...risePoints,
        [commutatedS, after],
        [periodS, valley],
      ]),
      switchA: piecewiseLinear(periodS, [
        [0, 0],
        [t1, onset],
        [onS, peakA],
        [onS, 0],
        [periodS, 0],
      ]),
      primaryWindingA: piecewiseLinear(periodS, [
        [0, 0],
        [t1, onset],
        [onS, peakA],
        ...risePoints,
        ...leakagePoints,
        [commutatedS, 0],
        ...returnPoints,
        [periodS, 0],
      ]),
      referredSecondaryA: piecewiseLinear(periodS, [
        [0, valley],
        [t1, 0],
        [risenS, 0],
        ...ringSecondaryPoints,
        [commutatedS, after],
        ...returnSecondaryPoints,
        [periodS, valley],
      ]),
    };
  }
  // DCM: the idle ring from the end of secondary conduction to T, which ends at I0 = valley.
  const ring = traces.idle;
  if (ring === undefined)
    throw new RangeError('flybackCurrentWaveforms: a DCM corner needs its idle ring');
  const magnetizing: Array<[number, number]> = [
    [0, valley],
    [onS, peakA],
    ...risePoints,
    [commutatedS, after],
  ];
  const primary: Array<[number, number]> = [
    [0, valley],
    [onS, peakA],
    ...risePoints,
    ...leakagePoints,
    [commutatedS, 0],
    ...returnPoints,
  ];
  // The switch carries the ring current only while its body diode clamps the drain.
  const switching: Array<[number, number]> = [
    [0, valley],
    [onS, peakA],
    [onS, 0],
  ];
  const count = ring.timesS.length;
  for (let k = 0; k < count; k++) {
    const timeS = ring.timesS[k] as number;
    const currentA = ring.currentsA[k] as number;
    magnetizing.push([timeS, currentA]);
    primary.push([timeS, currentA]);
    if (k === ring.clampFrom) switching.push([timeS, 0]);
    const isClamped = k >= ring.clampFrom && k <= ring.clampTo && ring.clampFrom >= 0;
    switching.push([timeS, isClamped ? currentA : 0]);
    if (k === ring.clampTo && ring.clampFrom >= 0 && k < count - 1) switching.push([timeS, 0]);
  }
  return {
    magnetizingA: piecewiseLinear(periodS, magnetizing),
    switchA: piecewiseLinear(periodS, switching),
    primaryWindingA: piecewiseLinear(periodS, primary),
    referredSecondaryA: piecewiseLinear(periodS, [
      [0, 0],
      [risenS, 0],
      ...ringSecondaryPoints,
      [commutatedS, after],
      ...returnSecondaryPoints,
      [endS, 0],
      [periodS, 0],
    ]),
  };
}
