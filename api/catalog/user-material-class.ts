import type { MaterialClass } from '../../solvers/index.js';
import type { UserMaterialRecord } from '../stores/material-store.js';

/**
 * What a user material lacks, filled in when a design uses it. Loss points are posted at one
 * temperature, so the loss is taken flat in temperature. The other defaults lean to the safe
 * side for a power ferrite (common practice, from memory): saturation 0.3 T, below what
 * manganese-zinc and nickel-zinc power ferrites keep at 100 °C (about 0.35–0.4 T and 0.3 T); μi
 * 1000, below most power ferrites, so an ungapped core's magnetizing current and a gapped core's
 * turns come out larger rather than smaller; μi within ±25 %, the usual ferrite tolerance.
 */
export const USER_MATERIAL_DEFAULTS = {
  /** ct(T) = 1 at every temperature: the points' own temperature, wherever the core runs. */
  lossTemperatureFactor: { ct2: 0, ct1: 0, ct0: 1 },
  /** The saturation points' temperatures, °C; the one flux density is held between them. */
  saturationLowTemperatureC: 25,
  saturationHighTemperatureC: 100,
  /** Saturation flux density when none was posted, T. */
  saturationFluxDensityT: 0.3,
  /** Initial relative permeability when none was posted (dimensionless). */
  initialPermeability: 1000,
  /** Relative tolerance of μi when none was posted, a fraction 0..1. */
  initialPermeabilityTolerance: 0.25,
} as const;

/**
 * Returns a stored user material as the engine's material: its id, the fitted Steinmetz
 * coefficients, the points' frequency span, and the posted extras or USER_MATERIAL_DEFAULTS.
 */
export function userMaterialClass(record: UserMaterialRecord): MaterialClass {
  const d = USER_MATERIAL_DEFAULTS;
  const saturationT = record.saturationFluxDensityT ?? d.saturationFluxDensityT;
  return {
    id: record.id,
    steinmetz: { ...record.fit.coefficients },
    lossTemperatureFactor: { ...d.lossTemperatureFactor },
    saturation: {
      lowTemperatureC: d.saturationLowTemperatureC,
      lowFluxDensityT: saturationT,
      highTemperatureC: d.saturationHighTemperatureC,
      highFluxDensityT: saturationT,
    },
    initialPermeability: record.initialPermeability ?? d.initialPermeability,
    initialPermeabilityTolerance:
      record.initialPermeabilityTolerance ?? d.initialPermeabilityTolerance,
    frequencyMinHz: record.frequencyMinHz,
    frequencyMaxHz: record.frequencyMaxHz,
  };
}

const posted = (isPosted: boolean) => (isPosted ? 'as posted' : 'the service default');

/**
 * The model note a design gets when its material was filled in from a user material: where the
 * numbers came from and which of them are defaults.
 */
export function userMaterialNote(record: UserMaterialRecord): string {
  const material = userMaterialClass(record);
  const { fit } = record;
  const d = USER_MATERIAL_DEFAULTS;
  return [
    `magnetics.material was filled in from the user material '${record.name}' (id ${record.id}):`,
    `Steinmetz coefficients fitted to its ${record.lossPoints.length} loss points`,
    `(RMS log10 error ${fit.rmsLog10Error.toPrecision(3)}, worst relative error ${fit.worstRelativeError.toPrecision(3)}),`,
    `which span ${record.frequencyMinHz}–${record.frequencyMaxHz} Hz and ${record.peakFluxDensityMinT}–${record.peakFluxDensityMaxT} T;`,
    'loss temperature factor flat (1), since the points are at one temperature;',
    `saturation ${material.saturation.lowFluxDensityT} T at ${d.saturationLowTemperatureC} °C and ${d.saturationHighTemperatureC} °C (${posted(record.saturationFluxDensityT !== undefined)}, conservative for power ferrites);`,
    `initial permeability ${material.initialPermeability} (${posted(record.initialPermeability !== undefined)})`,
    `within ±${material.initialPermeabilityTolerance} (${posted(record.initialPermeabilityTolerance !== undefined)}).`,
    'Loss outside the points’ span is an extrapolation of the fit; send magnetics.material yourself to set other numbers.',
  ].join(' ');
}
