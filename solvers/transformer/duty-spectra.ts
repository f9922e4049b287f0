import { ObjectMemo } from '../object-memo.js';
import { currentSpectrum, type CurrentSpectrum } from '../magnetics/winding-ac-resistance.js';
import type { Waveform } from '../waveform/waveform.js';
import type { TransformerDuty } from './transformer-duty.js';
import { TRANSFORMER_EVALUATION_DEFAULTS } from './transformer-evaluation-options.js';

/** One array per winding of a duty, each holding its current's spectrum by corner. */
export type DutySpectra = Array<Array<CurrentSpectrum | undefined>>;

/**
 * Winding-current spectra already computed, per winding and corner, by the duty's windings (a
 * duty spread with another gap role shares them): a transformer search evaluates the same
 * converter currents with many builds, and chooses foil over them. Waveforms are plain data
 * nothing mutates.
 */
const SPECTRA = new ObjectMemo<TransformerDuty['windings'], DutySpectra>();

/** The spectra slots of `duty`, one array per winding (by corner), made on first use. */
export function dutySpectra(duty: TransformerDuty): DutySpectra {
  let spectra = SPECTRA.get(duty.windings);
  if (spectra === undefined) {
    spectra = duty.windings.map(() => []);
    SPECTRA.set(duty.windings, spectra);
  }
  return spectra;
}

/**
 * The spectrum of winding `k`'s current at corner `index` with at least `harmonicCount`
 * harmonics. The default count is always computed (the harmonics of a waveform do not depend on
 * how many are taken), so a screen's shorter spectrum serves the full evaluation too.
 */
export function spectrumAt(
  spectra: DutySpectra,
  current: Waveform,
  k: number,
  index: number,
  harmonicCount: number,
): CurrentSpectrum {
  const slots = spectra[k] as Array<CurrentSpectrum | undefined>;
  const known = slots[index];
  if (known !== undefined && known.harmonicSquaresA2.length >= harmonicCount) return known;
  const spectrum = currentSpectrum(
    current,
    Math.max(harmonicCount, TRANSFORMER_EVALUATION_DEFAULTS.harmonicCountMax),
  );
  slots[index] = spectrum;
  return spectrum;
}
