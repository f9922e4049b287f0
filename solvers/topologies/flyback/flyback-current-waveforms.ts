import { piecewiseLinear } from '../../waveform/piecewise-linear.js';
import type { Waveform } from '../../waveform/waveform.js';
import type { FlybackCircuit } from './flyback-circuit.js';
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
 * ramps between t = 0, t1, DT, DT + ts, the end of secondary conduction and T. Zero-length
 * intervals (no leakage) become jumps.
 */
export function flybackCurrentWaveforms(
  circuit: FlybackCircuit,
  state: FlybackSteadyState,
): FlybackCurrentWaveforms {
  const periodS = circuit.periodS;
  const onS = state.dutyCycle * periodS;
  const t1 = state.turnOnCommutationS;
  const commutatedS = onS + state.turnOffCommutationS;
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
        [commutatedS, 0],
        [periodS, 0],
      ]),
      referredSecondaryA: piecewiseLinear(periodS, [
        [0, valley],
        [t1, 0],
        [onS, 0],
        [commutatedS, after],
        [periodS, valley],
      ]),
    };
  }
  return {
    magnetizingA: piecewiseLinear(periodS, [
      [0, 0],
      [onS, peakA],
      [commutatedS, after],
      [endS, 0],
      [periodS, 0],
    ]),
    switchA: piecewiseLinear(periodS, [
      [0, 0],
      [onS, peakA],
      [onS, 0],
      [periodS, 0],
    ]),
    primaryWindingA: piecewiseLinear(periodS, [
      [0, 0],
      [onS, peakA],
      [commutatedS, 0],
      [periodS, 0],
    ]),
    referredSecondaryA: piecewiseLinear(periodS, [
      [0, 0],
      [onS, 0],
      [commutatedS, after],
      [endS, 0],
      [periodS, 0],
    ]),
  };
}
