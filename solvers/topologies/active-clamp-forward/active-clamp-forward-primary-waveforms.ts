import type { Waveform } from '../../waveform/waveform.js';
import { intervalWaveform } from '../buck-derived/interval-waveform.js';
import { rotateWaveform } from './rotate-waveform.js';
import type { ActiveClampCircuit } from './active-clamp-forward-circuit.js';
import type { ActiveClampState } from './active-clamp-forward-state.js';

/** The primary-side waveforms of one corner, A and V. */
export interface ActiveClampPrimaryWaveforms {
  magnetizingA: Waveform;
  /** Main switch current, which is also the current drawn from the input, A. */
  switchA: Waveform;
  /** Auxiliary switch current, which is the clamp capacitor current (positive charging it), A. */
  clampA: Waveform;
  /** Primary winding (leakage) current, A. */
  windingA: Waveform;
  switchV: Waveform;
  auxiliaryV: Waveform;
  capacitorV: Waveform;
  /**
   * Drain voltage just after the gate turns off (the clamp's side of the jump), V: the value the
   * turn-off overlap sees. Given here because the waveforms are advanced by the lead, so their
   * jump sits at (D + lead)·T − lead·T, which round-off may put on either side of D·T: reading
   * `switchV` at D·T gave the on-state drop instead about every other time.
   */
  turnOffDrainV: number;
  /** Clamp (auxiliary switch) current just after the gate turns off, A; same reason. */
  clampStartA: number;
}

/** Samples of the clamp capacitor's parabolic voltage per interval, so its polyline stays close. */
const CAPACITOR_SAMPLES = 6;

/** The parts the waveforms are read from: the state, the switches' resistances and the clamp. */
export interface ActiveClampParts {
  mainOnResistanceOhm: number;
  auxiliaryOnResistanceOhm: number;
  clampCapacitanceF: number;
  clampCapacitorEsrOhm: number;
}

/**
 * Returns the primary waveforms. On: Im ramps Im,v → Im,pk after the turn-on commutation and the
 * main switch carries Im + Σ iL,k/nk, then, held at Im,pk + ΣIpk/n, carries its drain (and the
 * auxiliary's capacitance) from the on-drop to Vin over the turn-off swing (the stages' ramps end
 * halfway through it, their equivalent on-interval). Off: the leakage current falls from Im,pk + ΣIpk/n to Im,pk
 * into the clamp (turn-off commutation), then the clamp capacitor drives Im back to Im,v; the
 * capacitor voltage is V0 + q(t)/Cc with q the charge taken since turn-off and V0 set so that its
 * mean over the reset is the state's clamp voltage. Idle before conduction: the drain sits at Vin
 * (winding at zero) and Im rests at Im,v; with a body-diode interval the main switch conducts
 * (negative current) before its gate. Drain: Rds·i on; Vin + vc + (Raux + ESR)·ic off.
 */
export function activeClampPrimaryWaveforms(
  circuit: ActiveClampCircuit,
  state: ActiveClampState,
  parts: ActiveClampParts,
): ActiveClampPrimaryWaveforms {
  // Built from the start of conduction (the body diode's, before the gate), then advanced so
  // that time 0 is the gate's turn-on.
  const d = state.dutyCycle + state.leadFraction;
  const c1 = state.onCommutationFraction;
  const swingEnd = d + state.offSwingFraction;
  const stageEnd = d + state.offExtensionFraction;
  const r0 = swingEnd + state.offCommutationFraction;
  const r1 = r0 + state.resetDutyCycle;
  const { periodS } = circuit;
  const vin = circuit.inputVoltageV;
  const swingA = state.magnetizingPeakA - state.magnetizingValleyA;
  // Lm sees Vp up to the gate's turn-off, then the swing's fall to zero.
  const atGateOffA = state.magnetizingValleyA + (swingA * (d - c1)) / (stageEnd - c1);
  const magnetizing = (f: number, mid: number): number => {
    if (mid < c1 || mid >= r1) return state.magnetizingValleyA;
    if (mid < d) return state.magnetizingValleyA + (swingA * (f - c1)) / (stageEnd - c1);
    if (mid < swingEnd) {
      return atGateOffA + ((state.magnetizingPeakA - atGateOffA) * (f - d)) / (swingEnd - d);
    }
    if (mid < r0) return state.magnetizingPeakA;
    return state.magnetizingPeakA - (swingA * (f - r0)) / state.resetDutyCycle;
  };
  let reflectedValleyA = 0;
  state.points.forEach(
    (point, k) => (reflectedValleyA += point.valleyA / (circuit.turnsRatios[k] ?? 1)),
  );
  // Over the swing the current is held at its turn-off value (the swing's constant-current model).
  const turnOffA = state.magnetizingPeakA + state.reflectedPeakA;
  const switchCurrent = (f: number, mid: number): number => {
    if (mid >= swingEnd) return 0;
    if (mid >= d) return turnOffA;
    // Through the leakage the current rises from zero to Im,v + ΣIv/n while the winding is held.
    if (mid < c1) return ((state.magnetizingValleyA + reflectedValleyA) * f) / c1;
    let reflectedA = 0;
    state.points.forEach((point, k) => {
      const iL = point.valleyA + ((point.peakA - point.valleyA) * (f - c1)) / (stageEnd - c1);
      reflectedA += iL / (circuit.turnsRatios[k] ?? 1);
    });
    return magnetizing(f, mid) + reflectedA;
  };
  const clampCurrent = (f: number, mid: number): number => {
    if (mid < swingEnd || mid >= r1) return 0;
    if (mid < r0) {
      return state.magnetizingPeakA + (state.reflectedPeakA * (r0 - f)) / (r0 - swingEnd);
    }
    return magnetizing(f, mid);
  };
  // Breaks: the intervals, the zero crossing of the reset ramp, and samples for the parabola.
  const breaks = [c1, d, stageEnd, swingEnd, r0, r1];
  const crossing = r0 + (state.magnetizingPeakA / swingA) * state.resetDutyCycle;
  if (crossing > r0 && crossing < r1) breaks.push(crossing);
  // The currents are linear between those; the capacitor's parabola takes samples as well.
  const sampled = [...breaks];
  for (let i = 1; i < CAPACITOR_SAMPLES; i++) {
    sampled.push(r0 + (state.resetDutyCycle * i) / CAPACITOR_SAMPLES);
    if (r0 > swingEnd) sampled.push(swingEnd + ((r0 - swingEnd) * i) / CAPACITOR_SAMPLES);
  }
  const ordered = [...new Set(sampled.filter((f) => f >= d && f <= r1))].sort((a, b) => a - b);
  // Charge q(f) since turn-off at each break (exact: the current is linear between breaks), and
  // its integral over the reset for the mean.
  const chargeAt = new Map<number, number>([[d, 0]]);
  let charge = 0;
  let resetIntegral = 0;
  for (let i = 1; i < ordered.length; i++) {
    const a = ordered[i - 1] as number;
    const b = ordered[i] as number;
    const mid = (a + b) / 2;
    const ia = clampCurrent(a, mid);
    const ib = clampCurrent(b, mid);
    const dt = (b - a) * periodS;
    if (a >= r0) resetIntegral += charge * dt + (ia * dt * dt) / 2 + ((ib - ia) * dt * dt) / 6;
    charge += ((ia + ib) / 2) * dt;
    chargeAt.set(b, charge);
  }
  const cc = parts.clampCapacitanceF;
  const restV = state.clampVoltageV - resetIntegral / (state.resetDutyCycle * periodS) / cc;
  const capacitorAt = (f: number, mid: number): number => {
    if (mid < d || mid >= r1) return restV;
    return restV + (chargeAt.get(f) ?? 0) / cc;
  };
  const onEndV = parts.mainOnResistanceOhm * switchCurrent(d, (c1 + d) / 2);
  const clampDropOhm = parts.auxiliaryOnResistanceOhm + parts.clampCapacitorEsrOhm;
  // The first interval of the clamp's conduction (after the swing), named by its midpoint as the
  // waveforms name it.
  const afterOff = (swingEnd + (ordered.find((f) => f > swingEnd) ?? r1)) / 2;
  const clampStartA = clampCurrent(swingEnd, afterOff);
  const wave = (value: (f: number, mid: number) => number, at: readonly number[] = breaks) =>
    rotateWaveform(intervalWaveform(periodS, at, value), state.leadFraction * periodS);
  return {
    magnetizingA: wave(magnetizing),
    switchA: wave(switchCurrent),
    clampA: wave(clampCurrent),
    windingA: wave((f, mid) => switchCurrent(f, mid) + clampCurrent(f, mid)),
    switchV: wave((f, mid) => {
      if (mid < d) return parts.mainOnResistanceOhm * switchCurrent(f, mid);
      if (mid < swingEnd) {
        return onEndV + ((state.offSwingDrainV - onEndV) * (f - d)) / (swingEnd - d);
      }
      if (mid < r1) return vin + capacitorAt(f, mid) + clampDropOhm * clampCurrent(f, mid);
      return vin;
    }, ordered.concat(breaks)),
    auxiliaryV: wave((f, mid) => {
      if (mid < d) return vin + restV - parts.mainOnResistanceOhm * switchCurrent(f, mid);
      if (mid < swingEnd) {
        return vin + restV - onEndV - ((state.offSwingDrainV - onEndV) * (f - d)) / (swingEnd - d);
      }
      if (mid < r1) return -parts.auxiliaryOnResistanceOhm * clampCurrent(f, mid);
      return restV;
    }),
    capacitorV: wave(capacitorAt, ordered.concat(breaks)),
    turnOffDrainV: vin + capacitorAt(swingEnd, afterOff) + clampDropOhm * clampStartA,
    clampStartA,
  };
}
