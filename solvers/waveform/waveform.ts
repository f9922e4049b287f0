/**
 * A periodic piecewise-linear waveform over one period [0, periodS]. Breakpoints are given by
 * `timesS` (non-decreasing, first 0, last periodS) and `values`; two equal consecutive times
 * mark a jump. Values carry the unit of the field that holds the waveform (A or V).
 */
export interface Waveform {
  periodS: number;
  timesS: number[];
  values: number[];
}
