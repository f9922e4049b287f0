import { copperResistancePerLength } from '../magnetics/copper-resistance-per-length.js';
import { windingAcResistance, type CurrentSpectrum } from '../magnetics/winding-ac-resistance.js';
import type { Waveform } from '../waveform/waveform.js';
import type { WindingWire } from './winding-wire.js';

/**
 * Insulating film between the turns of a foil winding, m: 50 µm (common practice: one or two
 * wraps of polyester film a few tens of µm thick; functional insulation only).
 */
export const FOIL_INSULATION_THICKNESS_M = 5e-5;

/**
 * Copper foil thicknesses the engine chooses from, m: 0.025 to 0.5 mm (common practice: the
 * strip thicknesses copper foil for windings is commonly supplied in, from memory).
 */
export const FOIL_THICKNESSES_M: readonly number[] = [
  25e-6, 35e-6, 50e-6, 70e-6, 100e-6, 150e-6, 200e-6, 250e-6, 300e-6, 400e-6, 500e-6,
];

/** Options of the engine's foil choice ({@link foilWindingChoice}, `foilBuild`). */
export interface FoilWindingChoiceOptions {
  /**
   * Most turns a winding may have for foil to be offered.
   * @defaultValue 10 (common practice: foil is wound for windings of a few turns at high current)
   */
  turnsMax?: number;
  /** Thicknesses tried, m. @defaultValue {@link FOIL_THICKNESSES_M} */
  thicknessesM?: readonly number[];
  /** Film between turns, m. @defaultValue {@link FOIL_INSULATION_THICKNESS_M} */
  insulationThicknessM?: number;
  /**
   * Copper temperature the thickness is chosen at, °C.
   * @defaultValue 100 (a hot winding, as the round-wire choice takes its skin depth)
   */
  temperatureC?: number;
}

/** The defaults of {@link FoilWindingChoiceOptions}. */
export const FOIL_WINDING_CHOICE_DEFAULTS = {
  turnsMax: 10,
  thicknessesM: FOIL_THICKNESSES_M,
  insulationThicknessM: FOIL_INSULATION_THICKNESS_M,
  temperatureC: 100,
} satisfies Required<FoilWindingChoiceOptions>;

/**
 * Returns the foil for a winding portion of `layerCount` layers (Dowell's M, ≥ 0.5) spanning the
 * breadth `breadthM` (m) and carrying `currentA` (a periodic current, A, or its spectrum): of the
 * thicknesses offered, the one with the least copper loss per metre of turn, Rdc'(t)·[Idc² +
 * Σ Fr(Δn, M)·In²] by Dowell harmonic by harmonic at the options' temperature. This is Dowell's
 * optimum thickness over the actual current (for a sinusoid and one layer, t ≈ (π/2)·δ).
 * @throws RangeError for no thicknesses, a non-positive breadth or a layer count below 0.5.
 */
export function foilWindingChoice(
  currentA: Waveform | CurrentSpectrum,
  layerCount: number,
  breadthM: number,
  options: FoilWindingChoiceOptions = {},
): Extract<WindingWire, { kind: 'foil' }> {
  const { thicknessesM, insulationThicknessM, temperatureC } = {
    ...FOIL_WINDING_CHOICE_DEFAULTS,
    ...options,
  };
  if (!(breadthM > 0 && Number.isFinite(breadthM))) {
    throw new RangeError(`foilWindingChoice: breadthM must be > 0, got ${breadthM}`);
  }
  let best: { thicknessM: number; lossW: number } | undefined;
  for (const thicknessM of thicknessesM) {
    const resistanceOhm = copperResistancePerLength(thicknessM * breadthM, { temperatureC });
    const { totalLossW } = windingAcResistance(
      currentA,
      {
        layerCount,
        turnsPerLayer: 1,
        breadthM,
        conductor: { kind: 'foil', thicknessM, widthM: breadthM },
      },
      resistanceOhm,
      { temperatureC },
    );
    if (best === undefined || totalLossW < best.lossW) best = { thicknessM, lossW: totalLossW };
  }
  if (best === undefined) throw new RangeError('foilWindingChoice: no thicknesses to choose from');
  return { kind: 'foil', thicknessM: best.thicknessM, widthM: breadthM, insulationThicknessM };
}
