import { WINDING_THERMAL_CONDUCTIVITY_W_PER_M_K } from '../magnetics/winding-hot-spot.js';

/** Options of the transformer evaluation and design; every field optional. */
export interface TransformerEvaluationOptions {
  /**
   * Insulation between adjacent winding sections, m.
   * @defaultValue 1.5e-4 (three layers of 50 µm tape; common practice for functional
   * insulation only: reinforced insulation and creepage follow the applicable safety standard)
   */
  sectionInsulationM?: number;
  /**
   * Length kept free at each end of the window along the leg (bobbin wall, margin tape), m.
   * @defaultValue 5e-4
   */
  endMarginM?: number;
  /**
   * Largest window fill: outside cross-section of all turns (square per round wire) over the
   * window area. @defaultValue 0.5 (common practice: bobbin-wound round wire rarely fills more)
   */
  windowFillMax?: number;
  /**
   * Largest peak flux density over the saturation flux density at the corner's core
   * temperature. @defaultValue 0.8 (common practice: a margin for tolerances and transients)
   */
  fluxDensityUtilizationMax?: number;
  /**
   * Largest temperature rise of the wound core above the ambient, K.
   * @defaultValue 40 (common practice for a naturally cooled transformer)
   */
  temperatureRiseMaxK?: number;
  /**
   * Highest estimated winding hot-spot temperature (surface temperature plus the conduction
   * rise across the winding build), °C. @defaultValue 120 (common practice for a class-B-like
   * insulation system of enamelled wire, tape and bobbin, with margin below its rating; the
   * insulation system's own rating and the applicable safety standard decide)
   */
  hotSpotTemperatureMaxC?: number;
  /**
   * Effective thermal conductivity of the winding across its layers, W/(m·K).
   * @defaultValue 0.4 (common practice for a dry bobbin winding; see
   * WINDING_THERMAL_CONDUCTIVITY_W_PER_M_K)
   */
  windingThermalConductivityWPerMK?: number;
  /**
   * 'settled': loss and temperature iterated to agreement; 'at-limit': losses once at ambient +
   * temperatureRiseMaxK and the rise they cause (a cheap, pessimistic screen for a search).
   * @defaultValue 'settled'
   */
  thermalModel?: 'settled' | 'at-limit';
  /** Fixed-point iterations of loss and temperature. @defaultValue 40 */
  thermalIterationMax?: number;
  /**
   * Convergence of the temperature fixed point, K.
   * @defaultValue 0.05 (the surface relation itself is good to a few kelvin)
   */
  thermalToleranceK?: number;
  /** Harmonics of each winding current summed first (Dowell per harmonic). @defaultValue 32 */
  harmonicCount?: number;
  /** Cap on the harmonics summed; a Parseval tail estimate covers the rest. @defaultValue 64 */
  harmonicCountMax?: number;
  /**
   * Largest share of a winding's loss left to the tail estimate.
   * @defaultValue 0.05 (the tail estimate errs high, by at most about itself)
   */
  harmonicTailTolerance?: number;
}

/** The defaults of {@link TransformerEvaluationOptions}. */
export const TRANSFORMER_EVALUATION_DEFAULTS = {
  sectionInsulationM: 1.5e-4,
  endMarginM: 5e-4,
  windowFillMax: 0.5,
  fluxDensityUtilizationMax: 0.8,
  temperatureRiseMaxK: 40,
  hotSpotTemperatureMaxC: 120,
  windingThermalConductivityWPerMK: WINDING_THERMAL_CONDUCTIVITY_W_PER_M_K,
  thermalModel: 'settled',
  thermalIterationMax: 40,
  thermalToleranceK: 0.05,
  harmonicCount: 32,
  harmonicCountMax: 64,
  harmonicTailTolerance: 0.05,
} satisfies Required<TransformerEvaluationOptions>;
