import type { Spec } from '../spec/spec-schema.js';
import { spiceNumber as n } from './spice-number.js';

/**
 * The simulated span and the measuring windows of a buck-derived deck (forwards, active clamp,
 * push-pull, bridges). Each averaging window holds whole rings of the first output's LC filter
 * (2π·√(L·C)), so its ring averages out; three windows back to back at the end (the last, the
 * previous and the earlier) let a test see whether the output has settled.
 */
export interface DeckTimeline {
  /** Switching periods simulated. */
  totalPeriods: number;
  /** Periods in one averaging window (whole rings of the output filter). */
  averagedPeriods: number;
  /** `from=… to=…` of the window `back` windows before the last (0: the last). */
  window(back: number): string;
  /** `from=… to=…` of the last switching period. */
  lastPeriod: string;
  /** Output k's (1-based) average voltage over the last, the previous and the earlier window. */
  outputVoltageMeasures(k: number): string[];
  /** The `.tran` line: to half an on-time past the last period, saved from three windows back. */
  tranLine(onTimeS: number, stepsPerPeriod: number): string;
}

/**
 * The timeline of a deck at `periodS`: `periodsToSimulate` periods when positive, otherwise the
 * deck's `periodsMin` or twelve rings of the output filter, whichever is longer.
 */
export function deckTimeline(
  spec: Spec,
  outputInductancesH: readonly number[],
  periodS: number,
  periodsToSimulate: number,
  periodsMin: number,
): DeckTimeline {
  const first = spec.outputs[0];
  const ringS = 2 * Math.PI * Math.sqrt((outputInductancesH[0] ?? 0) * (first?.capacitanceF ?? 0));
  const ringPeriods = Math.max(1, Math.round(ringS / periodS));
  const totalPeriods =
    periodsToSimulate > 0 ? Math.round(periodsToSimulate) : Math.max(periodsMin, 12 * ringPeriods);
  const averagedPeriods = ringPeriods * Math.max(1, Math.floor(totalPeriods / 4 / ringPeriods));
  const window = (back: number) =>
    `from=${n((totalPeriods - (back + 1) * averagedPeriods) * periodS)} to=${n((totalPeriods - back * averagedPeriods) * periodS)}`;
  return {
    totalPeriods,
    averagedPeriods,
    window,
    lastPeriod: `from=${n((totalPeriods - 1) * periodS)} to=${n(totalPeriods * periodS)}`,
    outputVoltageMeasures(k) {
      const voltage = `AVG par('v(out${k})-v(rtn${k})')`;
      return [
        `.meas tran output_${k}_voltage_v ${voltage} ${window(0)}`,
        `.meas tran output_${k}_voltage_previous_v ${voltage} ${window(1)}`,
        `.meas tran output_${k}_voltage_earlier_v ${voltage} ${window(2)}`,
      ];
    },
    tranLine(onTimeS, stepsPerPeriod) {
      return (
        `.tran ${n(periodS / stepsPerPeriod)} ${n(totalPeriods * periodS + onTimeS / 2)} ` +
        `${n((totalPeriods - 3 * averagedPeriods) * periodS)} ${n(periodS / stepsPerPeriod)} uic`
      );
    },
  };
}
