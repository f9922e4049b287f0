import type { RectifierModel } from '../../devices/rectifier-model.js';
import type { Waveform } from '../../waveform/waveform.js';
import type { OutputStage, OutputStagePoint } from '../buck-derived/output-stage.js';
import { intervalWaveform } from '../buck-derived/interval-waveform.js';
import { inductorCurrentAt, stageZeroAt, type HalfPeriodTiming } from './half-period-timing.js';
import type { SecondaryArrangement } from './secondary-stage.js';

/** The waveforms of one double-ended output over a switching period, A and V. */
export interface SecondaryWaveforms {
  inductorA: Waveform;
  /** The inductor current over one half-period, its own period (it repeats at 2·fs), A. */
  inductorHalfA: Waveform;
  /**
   * Current of each rectifier: center-tapped [half a, half b]; bridge [a upper, a lower, b upper,
   * b lower], where the a rectifiers conduct while the winding is driven positive.
   */
  rectifiersA: Waveform[];
  /** Reverse voltage of each rectifier, in the same order, V. */
  rectifiersV: Waveform[];
  /** Current of each secondary winding: both halves (center-tapped) or the one winding, A. */
  windingsA: Waveform[];
}

/**
 * Returns one output's waveforms. While one half drives the winding, its rectifiers carry the
 * inductor current and the others block the winding (2·Vs for a center-tapped secondary, Vs for
 * a bridge) less the conducting path's drops; while freewheeling, every rectifier carries half
 * the inductor current; during the turn-on commutation the driven side takes it over linearly;
 * with the inductor current at zero (DCM) the rectifiers share Vo in blocking. The magnetizing
 * current's share of the rectifier currents while freewheeling is left out.
 */
export function secondaryWaveforms(
  arrangement: SecondaryArrangement,
  stage: OutputStage,
  point: OutputStagePoint,
  timing: HalfPeriodTiming,
  secondaryVoltageV: number,
  periodS: number,
  rectifier: RectifierModel,
): SecondaryWaveforms {
  const zeroAt = stageZeroAt(point, timing.start, timing.onEnd);
  const local = (f: number, mid: number) => {
    const place = timing.place(f, mid);
    const midH = 2 * (mid - 0.5 * place.half);
    return { ...place, midH, iL: inductorCurrentAt(point, timing, place.h, midH) };
  };
  // The current of the rectifiers that conduct while half `side` drives the winding.
  const sideA = (side: 0 | 1) => (f: number, mid: number) => {
    const { half, h, midH, iL } = local(f, mid);
    if (midH < timing.start) {
      const share = h / (2 * timing.start);
      return iL * (half === side ? 0.5 + share : 0.5 - share);
    }
    if (midH < timing.onEnd) return half === side ? iL : 0;
    return iL / 2;
  };
  const isBridge = arrangement === 'full-bridge';
  const sideV = (side: 0 | 1) => (f: number, mid: number) => {
    const { half, midH, iL } = local(f, mid);
    if (midH >= zeroAt) return isBridge ? point.voltageV / 2 : point.voltageV;
    if (half === side || midH < timing.start || midH >= timing.onEnd) return 0;
    const pathDropV =
      rectifier.forwardVoltageV + (rectifier.resistanceOhm + stage.windingResistanceOhm) * iL;
    return (isBridge ? 1 : 2) * secondaryVoltageV - pathDropV;
  };
  const wave = (value: (f: number, mid: number) => number) =>
    intervalWaveform(periodS, timing.breaks, value);
  const a = wave(sideA(0));
  const b = wave(sideA(1));
  const va = wave(sideV(0));
  const vb = wave(sideV(1));
  return {
    inductorA: wave((f, mid) => local(f, mid).iL),
    inductorHalfA: intervalWaveform(periodS / 2, [timing.start, timing.onEnd, zeroAt], (h, mid) =>
      inductorCurrentAt(point, timing, h, mid),
    ),
    rectifiersA: isBridge ? [a, a, b, b] : [a, b],
    rectifiersV: isBridge ? [va, va, vb, vb] : [va, vb],
    windingsA: isBridge ? [wave((f, mid) => sideA(0)(f, mid) - sideA(1)(f, mid))] : [a, b],
  };
}
