import type { Waveform } from '../../waveform/waveform.js';
import { intervalBreaks, intervalWaveform } from '../buck-derived/interval-waveform.js';
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
  // Put in order once for the six waveforms.
  const breaks = intervalBreaks([start, d, stageEnd, swingEnd, resetEnd]);
  const isTwoSwitch = circuit.reset.kind === 'clamp-diodes';
  // Over the swing the current is held at its turn-off value (the swing's constant-current model).
  let turnOffA = state.magnetizingPeakA;
  const { points } = state;
  for (let k = 0; k < points.length; k++) {
    turnOffA += (points[k] as (typeof points)[number]).peakA / (circuit.turnsRatios[k] ?? 1);
  }
  const c: ForwardPrimaryShape = {
    circuit,
    state,
    start,
    stageEnd,
    swingEnd,
    resetEnd,
    // Lm sees Vp up to the gate's turn-off, then the swing's fall to zero.
    atGateOffA: (state.magnetizingPeakA * (d - start)) / (stageEnd - start),
    turnOffA,
    // The reset winding carries the magnetizing ampere-turns: Im·Np/Nr.
    resetShare: circuit.reset.kind === 'clamp-diodes' ? 1 : 1 / circuit.reset.resetTurnsRatio,
  };
  const vin = circuit.inputVoltageV;
  // Where the winding reaches zero over the swing: half the input on each of two switches.
  const swingTopV = isTwoSwitch ? vin / 2 : vin;
  const onEndV = onResistanceOhm * switchCurrentAt(c, d, (start + d) / 2);
  // The value functions live at module level and are handed over as anonymous arrows: under
  // tsx (the service's and the bench's runtime) esbuild's keepNames gave each named closure an
  // Object.defineProperty call, four a corner.
  return {
    magnetizingA: intervalWaveform(periodS, breaks, (f, mid) => magnetizingAt(c, f, mid)),
    switchA: intervalWaveform(periodS, breaks, (f, mid) => switchCurrentAt(c, f, mid)),
    clampA: intervalWaveform(periodS, breaks, (f, mid) => clampAt(c, f, mid)),
    windingA: intervalWaveform(
      periodS,
      breaks,
      (f, mid) => switchCurrentAt(c, f, mid) + (isTwoSwitch ? clampAt(c, f, mid) : 0),
    ),
    inputA: intervalWaveform(
      periodS,
      breaks,
      (f, mid) => switchCurrentAt(c, f, mid) - clampAt(c, f, mid),
    ),
    switchV: intervalWaveform(periodS, breaks, (f, mid) => {
      if (mid < d) return onResistanceOhm * switchCurrentAt(c, f, mid);
      if (mid < swingEnd) return onEndV + ((swingTopV - onEndV) * (f - d)) / (swingEnd - d);
      if (mid < resetEnd) return vin + (isTwoSwitch ? circuit.clampDiodeV : state.resetVoltageV);
      return isTwoSwitch ? vin / 2 : vin;
    }),
  };
}

/** What the primary's value functions read (fractions of the period). */
interface ForwardPrimaryShape {
  circuit: TwoSwitchForwardCircuit;
  state: TwoSwitchForwardState;
  /** End of the turn-on commutation. */
  start: number;
  /** End of the stages' equivalent on-interval, halfway through the turn-off swing. */
  stageEnd: number;
  /** End of the turn-off swing (the winding at zero). */
  swingEnd: number;
  /** End of the reset, D + Dr. */
  resetEnd: number;
  /** Magnetizing current as the gate turns off, A. */
  atGateOffA: number;
  /** Switch current held over the swing, Im,pk + ΣIpk/n, A. */
  turnOffA: number;
  /** The clamp's share of the magnetizing current: 1, or Np/Nr for a reset winding. */
  resetShare: number;
}

function magnetizingAt(c: ForwardPrimaryShape, f: number, mid: number): number {
  const { state, start, swingEnd, resetEnd, atGateOffA } = c;
  const d = state.dutyCycle;
  if (mid < start) return 0;
  if (mid < d) return (atGateOffA * (f - start)) / (d - start);
  if (mid < swingEnd) {
    return atGateOffA + ((state.magnetizingPeakA - atGateOffA) * (f - d)) / (swingEnd - d);
  }
  if (mid < resetEnd) return state.magnetizingPeakA * (1 - (f - swingEnd) / (resetEnd - swingEnd));
  return 0;
}

function switchCurrentAt(c: ForwardPrimaryShape, f: number, mid: number): number {
  const { state, start, stageEnd } = c;
  const d = state.dutyCycle;
  if (mid >= c.swingEnd) return 0;
  if (mid >= d) return c.turnOffA;
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
        : point.valleyA + ((point.peakA - point.valleyA) * (f - start)) / (stageEnd - start);
    reflectedA += iL / (c.circuit.turnsRatios[k] ?? 1);
  }
  return magnetizingAt(c, f, mid) + reflectedA;
}

function clampAt(c: ForwardPrimaryShape, f: number, mid: number): number {
  return mid >= c.swingEnd && mid < c.resetEnd ? c.resetShare * magnetizingAt(c, f, mid) : 0;
}
