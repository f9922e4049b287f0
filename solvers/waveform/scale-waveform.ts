import type { Waveform } from './waveform.js';

/**
 * Returns a new waveform with every value multiplied by `factor` (dimensionless, or a unit
 * conversion such as a turns ratio); the breakpoint times are copied unchanged.
 * @throws RangeError when factor is not finite.
 */
export function scaleWaveform(w: Waveform, factor: number): Waveform {
  if (!Number.isFinite(factor)) {
    throw new RangeError(`scaleWaveform: factor must be finite, got ${factor}`);
  }
  return { periodS: w.periodS, timesS: w.timesS.slice(), values: w.values.map((v) => v * factor) };
}
