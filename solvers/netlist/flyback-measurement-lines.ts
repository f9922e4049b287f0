import { spiceNumber as n } from './spice-number.js';

/** When the flyback netlist measures: the period and the windows, counted in whole periods. */
export interface MeasurementWindows {
  periodS: number;
  onTimeS: number;
  /** Gate edge time, s; the switch changes state halfway through each edge. */
  edgeS: number;
  /** Periods simulated; averages end at the end of the last whole period. */
  totalPeriods: number;
  /** Periods each average spans; three windows of this length end the run. */
  averagedPeriods: number;
  /** Last periods whose switch current peaks are read. */
  peakPeriods: number;
  /** Fraction of the on-time skipped at its start for the current peak (0..1). */
  onTimeSkipFraction: number;
}

/**
 * Returns the `.meas` lines of the flyback netlist, in V and A: output_K_voltage_v (average over
 * the last window), output_K_voltage_previous_v and output_K_voltage_earlier_v (the two windows
 * before it, to judge or extrapolate settling), switch_current_peak_a (the last periods, skipping
 * the start of each on-time), switch_voltage_peak_v, input_current_average_a, clamp_voltage_v.
 */
export function flybackMeasurementLines(outputCount: number, w: MeasurementWindows): string[] {
  const { periodS, onTimeS, edgeS, totalPeriods, averagedPeriods } = w;
  const windowFrom = (back: number): string =>
    `from=${n((totalPeriods - (back + 1) * averagedPeriods) * periodS)} ` +
    `to=${n((totalPeriods - back * averagedPeriods) * periodS)}`;
  const last = windowFrom(0);
  const lines: string[] = [];
  for (let k = 1; k <= outputCount; k += 1) {
    // ngspice refuses AVG v(a,b); the par() form averages the difference itself.
    const voltage = `AVG par('v(out${k})-v(rtn${k})')`;
    lines.push(
      `.meas tran output_${k}_voltage_v ${voltage} ${last}`,
      `.meas tran output_${k}_voltage_previous_v ${voltage} ${windowFrom(1)}`,
      `.meas tran output_${k}_voltage_earlier_v ${voltage} ${windowFrom(2)}`,
    );
  }
  const peakNames: string[] = [];
  for (let j = 1; j <= w.peakPeriods; j += 1) {
    const onS = (totalPeriods - j) * periodS + edgeS / 2;
    const name = `switch_current_peak_a_${j}`;
    peakNames.push(name);
    // An ideal switch swings the capacitances of the circuit at once at turn-on, and in continuous
    // conduction the leakage current is still rising: skip the start of the on-time.
    lines.push(
      `.meas tran ${name} MAX i(vsense) from=${n(onS + w.onTimeSkipFraction * onTimeS)} to=${n(onS + onTimeS)}`,
    );
  }
  const largest = peakNames.reduce((acc, name) => `max(${acc},${name})`);
  lines.push(
    `.meas tran switch_current_peak_a param='${largest}'`,
    `.meas tran switch_voltage_peak_v MAX par('v(drain)-v(src)') ${last}`,
    `.meas tran input_current_average_a AVG par('-i(vin)') ${last}`,
    `.meas tran clamp_voltage_v AVG par('v(clamp)-v(in)') ${last}`,
  );
  return lines;
}
