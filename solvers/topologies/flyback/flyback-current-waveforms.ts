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
  // secondary current yet), then the leakage commutation.
  const risenS = onS + state.turnOffTransitionS;
  const rise = traces.rise;
  const risePoints = rise.timesS.map((timeS, k): [number, number] => [
    timeS,
    rise.currentsA[k] ?? 0,
  ]);
  const commutatedS = risenS + state.turnOffCommutationS;
  const endS = state.conductionEndS;
  const valley = state.valleyCurrentA;
  const onset = state.onsetCurrentA;
  const peakA = state.peakCurrentA;
  const after = state.afterCommutationCurrentA;
  const isContinuous = state.mode !== 'dcm' && valley > 0;
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
        [commutatedS, 0],
        [periodS, 0],
      ]),
      referredSecondaryA: piecewiseLinear(periodS, [
        [0, valley],
        [t1, 0],
        [risenS, 0],
        [commutatedS, after],
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
    [commutatedS, 0],
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
      [commutatedS, after],
      [endS, 0],
      [periodS, 0],
    ]),
  };
}
