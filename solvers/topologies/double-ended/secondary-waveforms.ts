import type { RectifierModel } from '../../devices/rectifier-model.js';
import type { Waveform } from '../../waveform/waveform.js';
import type { OutputStage } from '../buck-derived/output-stage.js';
import { gridHalfWaveform, gridWaveform, type HalfPeriodGrid } from './half-period-grid.js';
import type { DoubleEndedStagePoint } from './light-load-point.js';
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
 * Returns output `k`'s waveforms. While one half drives the winding, its rectifiers carry the
 * inductor current and the others block the winding (2·Vs for a center-tapped secondary, Vs for
 * a bridge) less the conducting path's drops; while freewheeling, every rectifier carries half
 * the inductor current; during the turn-on commutation the driven side takes it over linearly;
 * with the inductor current at zero (DCM) the rectifiers share Vo in blocking. The magnetizing
 * current's share of the rectifier currents while freewheeling is left out, except with a shared
 * fall (light load): then the side just driven carries (IL − n·Im)/2 and the other (IL + n·Im)/2
 * until they meet, after which the other side alone carries IL while the winding, at Vw, is
 * blocked by the side just driven.
 */
export function secondaryWaveforms(
  arrangement: SecondaryArrangement,
  stage: OutputStage,
  point: DoubleEndedStagePoint,
  grid: HalfPeriodGrid,
  k: number,
  secondaryVoltageV: number,
  periodS: number,
  rectifier: RectifierModel,
): SecondaryWaveforms {
  const inductor = grid.inductorA[k] ?? [];
  const idle = grid.idle[k] ?? [];
  const iL = (j: number, end: 0 | 1) => inductor[2 * j + end] ?? 0;
  // The current of the rectifiers that conduct while half `side` drives the winding.
  const fall = point.sharedFall;
  // With the node ring (one output), its stretches: a rectifier conducting on the side about to
  // be driven (+1) or just driven (−1), both freewheeling, or none (idle).
  const ring = k === 0 ? grid.ring : undefined;
  const sideA = (side: 0 | 1) => (j: number, end: 0 | 1, half: 0 | 1) => {
    const kind = grid.kinds[j];
    const ringMode = ring?.modes[j];
    if (ring !== undefined && ringMode !== undefined) {
      const il = iL(j, end);
      if (ringMode === 'idle') return 0;
      if (ringMode === 'off') {
        const im = ring.magnetizingA[2 * j + end] ?? 0;
        return Math.max(0, (il + (half === side ? -im : im)) / 2);
      }
      const isJustDriven = half === side;
      return (ring.sides[j] ?? 1) > 0 === isJustDriven ? 0 : il;
    }
    if (fall !== undefined && kind === 'shared') return half === side ? 0 : iL(j, end);
    if (fall !== undefined && kind === 'off') {
      const imA = fall.magnetizingEndOfOnA;
      return Math.max(0, (iL(j, end) + (half === side ? -imA : imA)) / 2);
    }
    if (kind === 'commutation') {
      const share = (grid.edges[j + end] as number) / (2 * grid.start);
      return iL(j, end) * (half === side ? 0.5 + share : 0.5 - share);
    }
    if (kind === 'on') return half === side ? iL(j, end) : 0;
    return iL(j, end) / 2;
  };
  const isBridge = arrangement === 'full-bridge';
  const blockingV = (isBridge ? 1 : 2) * secondaryVoltageV;
  const pathOhm = rectifier.resistanceOhm + stage.windingResistanceOhm;
  const sideV = (side: 0 | 1) => (j: number, end: 0 | 1, half: 0 | 1) => {
    if (ring !== undefined && ring.modes[j] !== undefined) {
      // The winding at v (towards the next half's drive) reverse-biases the side just driven;
      // idle, each side holds Vo against the winding's own swing.
      const v = (half === side ? 1 : -1) * (ring.windingV[2 * j + end] ?? 0);
      const reverseV =
        ring.modes[j] === 'idle'
          ? isBridge
            ? (point.voltageV + v) / 2
            : point.voltageV + v
          : (isBridge ? 1 : 2) * v - rectifier.forwardVoltageV - pathOhm * iL(j, end);
      return Math.max(0, reverseV);
    }
    if (idle[j] === true) return isBridge ? point.voltageV / 2 : point.voltageV;
    if (fall !== undefined && grid.kinds[j] === 'shared') {
      if (half !== side) return 0;
      const blockV = (isBridge ? 1 : 2) * fall.windingVoltageV;
      return Math.max(0, blockV - rectifier.forwardVoltageV - pathOhm * iL(j, end));
    }
    if (half === side || grid.kinds[j] !== 'on') return 0;
    return blockingV - rectifier.forwardVoltageV - pathOhm * iL(j, end);
  };
  const wave = (value: (j: number, end: 0 | 1, half: 0 | 1) => number) =>
    gridWaveform(grid, periodS, value);
  const a = wave(sideA(0));
  const b = wave(sideA(1));
  const va = wave(sideV(0));
  const vb = wave(sideV(1));
  const aA = sideA(0);
  const bA = sideA(1);
  return {
    inductorA: wave(iL),
    inductorHalfA: gridHalfWaveform(grid, periodS, iL),
    rectifiersA: isBridge ? [a, a, b, b] : [a, b],
    rectifiersV: isBridge ? [va, va, vb, vb] : [va, vb],
    windingsA: isBridge ? [wave((j, end, half) => aA(j, end, half) - bA(j, end, half))] : [a, b],
  };
}
