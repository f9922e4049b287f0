import type { Waveform } from '../../waveform/waveform.js';
import { intervalWaveform } from '../buck-derived/interval-waveform.js';
import type { TwoSwitchForwardCircuit, TwoSwitchForwardState } from './two-switch-forward-state.js';

/** The primary-side waveforms of one corner, A and V. */
export interface TwoSwitchForwardPrimaryWaveforms {
  magnetizingA: Waveform;
  /** Current in each switch (both carry the same), A; over the turn-off swing, into its capacitance. */
  switchA: Waveform;
  /** Current in the clamp diodes (Im in reset) or in the reset diode (Im·Np/Nr), A. */
  clampA: Waveform;
  /** Primary winding current: the switch current, then the magnetizing current in reset, A. */
  windingA: Waveform;
  /** Current drawn from the input terminal: switch current less the returned clamp current, A. */
  inputA: Waveform;
  /**
   * Voltage across each switch, V: Rds·i on; rising linearly over the turn-off swing to Vin/2
   * (two-switch) or Vin (the winding at zero); in reset Vin + Vf (two-switch) or Vin + Vr (reset
   * winding); when idle Vin/2 (two equal switches share it) or Vin (one switch).
   */
  switchV: Waveform;
}

/**
 * Returns the primary waveforms: Im ramps 0 → Im,pk from the commutation to the end of the
 * turn-off swing (slower over the swing, where the winding falls to zero) and back to zero over
 * the reset at Vr; the switches carry Im plus the reflected inductor currents Σ iL,k/nk while on
 * and, as their terminal current held at Im,pk + ΣIpk/n, over the swing into their capacitance.
 */
export function twoSwitchForwardPrimaryWaveforms(
  circuit: TwoSwitchForwardCircuit,
  state: TwoSwitchForwardState,
  onResistanceOhm: number,
): TwoSwitchForwardPrimaryWaveforms {
  const d = state.dutyCycle;
  const start = state.commutationFraction;
  const swingEnd = d + state.turnOffSwingFraction;
  // The stages' equivalent on-interval ends halfway through the swing.
  const stageEnd = d + state.turnOffSwingFraction / 2;
  const resetEnd = d + state.resetDutyCycle;
  const { periodS } = circuit;
  const breaks = [start, d, stageEnd, swingEnd, resetEnd];
  // Lm sees Vp up to the gate's turn-off, then the swing's fall to zero.
  const atGateOffA = (state.magnetizingPeakA * (d - start)) / (stageEnd - start);
  const magnetizing = (f: number, mid: number): number => {
    if (mid < start) return 0;
    if (mid < d) return (atGateOffA * (f - start)) / (d - start);
    if (mid < swingEnd) {
      return atGateOffA + ((state.magnetizingPeakA - atGateOffA) * (f - d)) / (swingEnd - d);
    }
    if (mid < resetEnd)
      return state.magnetizingPeakA * (1 - (f - swingEnd) / (resetEnd - swingEnd));
    return 0;
  };
  // Over the swing the current is held at its turn-off value (the swing's constant-current model).
  let turnOffA = state.magnetizingPeakA;
  state.points.forEach((point, k) => (turnOffA += point.peakA / (circuit.turnsRatios[k] ?? 1)));
  const switchCurrent = (f: number, mid: number): number => {
    if (mid >= swingEnd) return 0;
    if (mid >= d) return turnOffA;
    let reflectedA = 0;
    state.points.forEach((point, k) => {
      // Through the leakage the switch current rises to the reflected valley during the
      // commutation; then the inductor currents ramp as the stages say.
      const iL =
        mid < start
          ? (point.valleyA * f) / start
          : point.valleyA + ((point.peakA - point.valleyA) * (f - start)) / (stageEnd - start);
      reflectedA += iL / (circuit.turnsRatios[k] ?? 1);
    });
    return magnetizing(f, mid) + reflectedA;
  };
  const isTwoSwitch = circuit.reset.kind === 'clamp-diodes';
  // The reset winding carries the magnetizing ampere-turns: Im·Np/Nr.
  const resetShare = circuit.reset.kind === 'clamp-diodes' ? 1 : 1 / circuit.reset.resetTurnsRatio;
  const clamp = (f: number, mid: number) =>
    mid >= swingEnd && mid < resetEnd ? resetShare * magnetizing(f, mid) : 0;
  const wave = (value: (f: number, mid: number) => number) =>
    intervalWaveform(periodS, breaks, value);
  const vin = circuit.inputVoltageV;
  // Where the winding reaches zero over the swing: half the input on each of two switches.
  const swingTopV = isTwoSwitch ? vin / 2 : vin;
  const onEndV = onResistanceOhm * switchCurrent(d, (start + d) / 2);
  return {
    magnetizingA: wave(magnetizing),
    switchA: wave(switchCurrent),
    clampA: wave(clamp),
    windingA: wave((f, mid) => switchCurrent(f, mid) + (isTwoSwitch ? clamp(f, mid) : 0)),
    inputA: wave((f, mid) => switchCurrent(f, mid) - clamp(f, mid)),
    switchV: wave((f, mid) => {
      if (mid < d) return onResistanceOhm * switchCurrent(f, mid);
      if (mid < swingEnd) return onEndV + ((swingTopV - onEndV) * (f - d)) / (swingEnd - d);
      if (mid < resetEnd) return vin + (isTwoSwitch ? circuit.clampDiodeV : state.resetVoltageV);
      return isTwoSwitch ? vin / 2 : vin;
    }),
  };
}
