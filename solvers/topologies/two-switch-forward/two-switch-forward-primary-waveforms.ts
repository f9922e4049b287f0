import type { Waveform } from '../../waveform/waveform.js';
import { intervalBreaks, intervalWaveform } from '../buck-derived/interval-waveform.js';
import type { TwoSwitchForwardCircuit, TwoSwitchForwardState } from './two-switch-forward-state.js';

/** The primary-side waveforms of one corner, A and V. */
export interface TwoSwitchForwardPrimaryWaveforms {
  magnetizingA: Waveform;
  /** Current in each switch (both carry the same), A. */
  switchA: Waveform;
  /** Current in the clamp diodes (Im in reset) or in the reset diode (Im·Np/Nr), A. */
  clampA: Waveform;
  /** Primary winding current: the switch current, then the magnetizing current in reset, A. */
  windingA: Waveform;
  /** Current drawn from the input terminal: switch current less the returned clamp current, A. */
  inputA: Waveform;
  /**
   * Voltage across each switch, V: Rds·i on; in reset Vin + Vf (two-switch) or Vin + Vr (reset
   * winding); when idle Vin/2 (two equal switches share it) or Vin (one switch).
   */
  switchV: Waveform;
}

/**
 * Returns the primary waveforms: Im ramps 0 → Im,pk over D·T and back to zero over Dr·T; the
 * switches carry Im plus the reflected inductor currents Σ iL,k/nk while on.
 */
export function twoSwitchForwardPrimaryWaveforms(
  circuit: TwoSwitchForwardCircuit,
  state: TwoSwitchForwardState,
  onResistanceOhm: number,
): TwoSwitchForwardPrimaryWaveforms {
  const d = state.dutyCycle;
  const start = state.commutationFraction;
  const resetEnd = d + state.resetDutyCycle;
  const { periodS } = circuit;
  // Put in order once for the six waveforms.
  const breaks = intervalBreaks([start, d, resetEnd]);
  const magnetizing = (f: number, mid: number): number => {
    if (mid < start) return 0;
    if (mid < d) return (state.magnetizingPeakA * (f - start)) / (d - start);
    if (mid < resetEnd) return state.magnetizingPeakA * (1 - (f - d) / state.resetDutyCycle);
    return 0;
  };
  const switchCurrent = (f: number, mid: number): number => {
    if (mid >= d) return 0;
    let reflectedA = 0;
    // A plain loop, not a forEach callback: this runs for every point of four waveforms.
    const { points } = state;
    for (let k = 0; k < points.length; k++) {
      const point = points[k] as (typeof points)[number];
      // Through the leakage the switch current rises to the reflected valley during the
      // commutation; then the inductor currents ramp as the stages say.
      const iL =
        mid < start
          ? (point.valleyA * f) / start
          : point.valleyA + ((point.peakA - point.valleyA) * (f - start)) / (d - start);
      reflectedA += iL / (circuit.turnsRatios[k] ?? 1);
    }
    return magnetizing(f, mid) + reflectedA;
  };
  const isTwoSwitch = circuit.reset.kind === 'clamp-diodes';
  // The reset winding carries the magnetizing ampere-turns: Im·Np/Nr.
  const resetShare = circuit.reset.kind === 'clamp-diodes' ? 1 : 1 / circuit.reset.resetTurnsRatio;
  const clamp = (f: number, mid: number) =>
    mid >= d && mid < resetEnd ? resetShare * magnetizing(f, mid) : 0;
  const wave = (value: (f: number, mid: number) => number) =>
    intervalWaveform(periodS, breaks, value);
  const vin = circuit.inputVoltageV;
  return {
    magnetizingA: wave(magnetizing),
    switchA: wave(switchCurrent),
    clampA: wave(clamp),
    windingA: wave((f, mid) => switchCurrent(f, mid) + (isTwoSwitch ? clamp(f, mid) : 0)),
    inputA: wave((f, mid) => switchCurrent(f, mid) - clamp(f, mid)),
    switchV: wave((f, mid) => {
      if (mid < d) return onResistanceOhm * switchCurrent(f, mid);
      if (mid < resetEnd) return vin + (isTwoSwitch ? circuit.clampDiodeV : state.resetVoltageV);
      return isTwoSwitch ? vin / 2 : vin;
    }),
  };
}
