import type { Waveform } from '../../waveform/waveform.js';
import type { DoubleEndedCircuit, DoubleEndedState } from './double-ended-state.js';
import { gridWaveform, type HalfPeriodGrid } from './half-period-grid.js';

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
  grid: HalfPeriodGrid,
  onResistanceOhm: number,
): PrimaryWaveforms {
  const { start, onEnd } = grid;
  const peakA = state.magnetizingPeakA;
  const vin = circuit.inputVoltageV;
  let reflectedValleyA = 0;
  state.points.forEach((point, k) => {
    reflectedValleyA += point.valleyA / (circuit.turnsRatios[k] ?? 1);
  });
  // Per interval end (index 2j + end): magnetizing current and the driven switches' current,
  // both in the positive half; the negative half mirrors them.
  const magnetizing: number[] = [];
  const driven: number[] = [];
  grid.kinds.forEach((kind, j) => {
    for (const end of [0, 1] as const) {
      const h = grid.edges[j + end] as number;
      if (kind === 'commutation') {
        magnetizing.push(-peakA);
        driven.push(((reflectedValleyA - peakA) * h) / start);
      } else if (kind === 'on') {
        const im = -peakA + (2 * peakA * (h - start)) / (onEnd - start);
        let reflectedA = 0;
        grid.inductorA.forEach((values, k) => {
          reflectedA += (values[2 * j + end] ?? 0) / (circuit.turnsRatios[k] ?? 1);
        });
        magnetizing.push(im);
        driven.push(im + reflectedA);
      } else {
        magnetizing.push(peakA);
        driven.push(0);
      }
    }
  });
  const at = (values: number[], j: number, end: 0 | 1) => values[2 * j + end] ?? 0;
  const sign = (half: 0 | 1) => (half === 0 ? 1 : -1);
  const isPushPull = circuit.bridge.kind === 'push-pull';
  const idleV = isPushPull ? vin : vin / 2;
  const wave = (value: (j: number, end: 0 | 1, half: 0 | 1) => number) =>
    gridWaveform(grid, circuit.periodS, value);
  const sideCurrents = ([0, 1] as const).map((side) =>
    wave((j, end, half) => (half === side ? at(driven, j, end) : 0)),
  );
  const sideVoltages = ([0, 1] as const).map((side) =>
    wave((j, end, half) => {
      const kind = grid.kinds[j];
      if (half === side) return kind === 'off' ? idleV : onResistanceOhm * at(driven, j, end);
      if (isPushPull) return kind === 'on' ? vin + state.primaryVoltageV : vin;
      return kind === 'off' ? idleV : vin - onResistanceOhm * at(driven, j, end);
    }),
  );
  const railA =
    circuit.bridge.kind === 'half-bridge'
      ? (sideCurrents[0] as Waveform)
      : wave((j, end) => at(driven, j, end));
  return {
    magnetizingA: wave((j, end, half) => sign(half) * at(magnetizing, j, end)),
    primaryA: wave((j, end, half) => sign(half) * at(driven, j, end)),
    switchesA: circuit.bridge.switchHalves.map((side) => sideCurrents[side] as Waveform),
    switchesV: circuit.bridge.switchHalves.map((side) => sideVoltages[side] as Waveform),
    railA,
  };
}
