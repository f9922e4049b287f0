import type { ActiveClampState } from './active-clamp-forward-state.js';

/**
 * Returns the charge (C) the clamp capacitor takes while its current is positive, which is its
 * peak-to-peak voltage ripple times its capacitance: the leakage hand-over (ΣIpk/n falling to
 * zero over the turn-off commutation, on top of Im,pk) plus the positive part of the magnetizing
 * ramp Im,pk²/(2·slope), slope = ΔIm/(Dr·T).
 */
export function clampCharge(state: ActiveClampState, periodS: number): number {
  const handOverC =
    (state.magnetizingPeakA + state.reflectedPeakA / 2) * state.offCommutationFraction * periodS;
  const swingA = state.magnetizingPeakA - state.magnetizingValleyA;
  const peakA = state.magnetizingPeakA;
  const rampC =
    peakA > 0 && swingA > 0 ? (peakA * peakA * state.resetDutyCycle * periodS) / (2 * swingA) : 0;
  return Math.max(0, handOverC) + rampC;
}
