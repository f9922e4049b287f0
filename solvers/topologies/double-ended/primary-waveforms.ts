import type { Waveform } from '../../waveform/waveform.js';
import { intervalWaveform } from '../buck-derived/interval-waveform.js';
import type { DoubleEndedCircuit, DoubleEndedState } from './double-ended-state.js';
import { inductorCurrentAt, type HalfPeriodTiming } from './half-period-timing.js';

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
 * holds while it is at zero, and mirrors in the other half; the driven switches carry Im plus the
 * reflected inductor currents, rising from zero through the leakage during the commutation; no
 * switch conducts while the secondary freewheels. Switch voltages: push-pull Vin + Vp while the
 * other half is driven (the other half's voltage adds to the input), else Vin; bridges Vin less
 * the conducting partner's drop while the other diagonal is on, else Vin/2 (equal capacitances
 * share the input).
 */
export function primaryWaveforms(
  circuit: DoubleEndedCircuit,
  state: DoubleEndedState,
  timing: HalfPeriodTiming,
  onResistanceOhm: number,
): PrimaryWaveforms {
  const { start, onEnd } = timing;
  const peakA = state.magnetizingPeakA;
  const vin = circuit.inputVoltageV;
  // Magnetizing current in the positive half; the negative half mirrors it.
  const magnetizingHalf = (h: number, midH: number) => {
    if (midH < start) return -peakA;
    if (midH < onEnd) return -peakA + (2 * peakA * (h - start)) / (onEnd - start);
    return peakA;
  };
  const place = (f: number, mid: number) => {
    const p = timing.place(f, mid);
    return { ...p, midH: 2 * (mid - 0.5 * p.half), sign: p.half === 0 ? 1 : -1 };
  };
  const reflectedAt = (h: number, midH: number) => {
    let sum = 0;
    state.points.forEach((point, k) => {
      sum += inductorCurrentAt(point, timing, h, midH) / (circuit.turnsRatios[k] ?? 1);
    });
    return sum;
  };
  // Magnitude of the driven switches' current within a half.
  const drivenA = (h: number, midH: number) => {
    if (midH < start) {
      return ((reflectedAt(start, start) - peakA) * h) / start;
    }
    if (midH < onEnd) return magnetizingHalf(h, midH) + reflectedAt(h, midH);
    return 0;
  };
  const primary = (f: number, mid: number) => {
    const { h, midH, sign } = place(f, mid);
    return sign * drivenA(h, midH);
  };
  const switchCurrent = (side: 0 | 1) => (f: number, mid: number) => {
    const { half, h, midH } = place(f, mid);
    return half === side ? drivenA(h, midH) : 0;
  };
  const isPushPull = circuit.bridge.kind === 'push-pull';
  const switchVoltage = (side: 0 | 1) => (f: number, mid: number) => {
    const { half, h, midH } = place(f, mid);
    const isDriven = midH < onEnd;
    if (half === side)
      return isDriven ? onResistanceOhm * drivenA(h, midH) : isPushPull ? vin : vin / 2;
    if (isPushPull) return isDriven && midH >= start ? vin + state.primaryVoltageV : vin;
    return isDriven ? vin - onResistanceOhm * drivenA(h, midH) : vin / 2;
  };
  const wave = (value: (f: number, mid: number) => number) =>
    intervalWaveform(circuit.periodS, timing.breaks, value);
  const sideCurrents = [wave(switchCurrent(0)), wave(switchCurrent(1))] as const;
  const sideVoltages = [wave(switchVoltage(0)), wave(switchVoltage(1))] as const;
  const halves = circuit.bridge.switchHalves;
  return {
    magnetizingA: wave((f, mid) => {
      const { h, midH, sign } = place(f, mid);
      return sign * magnetizingHalf(h, midH);
    }),
    primaryA: wave(primary),
    switchesA: halves.map((side) => sideCurrents[side]),
    switchesV: halves.map((side) => sideVoltages[side]),
    railA:
      circuit.bridge.kind === 'half-bridge'
        ? sideCurrents[0]
        : wave((f, mid) => {
            const { h, midH } = place(f, mid);
            return drivenA(h, midH);
          }),
  };
}
