import { roundWireGauge } from '../magnetics/round-wire-gauge.js';
import { skinDepth } from '../magnetics/skin-depth.js';
import type { WindingWire } from './winding-wire.js';

/** Options of {@link windingWireChoice}. */
export interface WindingWireChoiceOptions {
  /**
   * Current density the copper is sized for, A/m² (RMS current over copper area).
   * @defaultValue 4.5e6 (4.5 A/mm²; common practice for naturally cooled power transformers is
   * about 3 to 6 A/mm², the temperature rise being the real check)
   */
  currentDensityAPerM2?: number;
  /**
   * Largest bare diameter of one wire or strand over the skin depth at the switching frequency.
   * @defaultValue 2 (common practice: a conductor up to about two skin depths thick keeps the
   * AC resistance of a single layer near its DC value)
   */
  diameterToSkinDepthMax?: number;
  /** Parallel round wires beyond which a litz bundle is used instead. @defaultValue 4 */
  parallelCountMax?: number;
  /** Thinnest wire or strand considered, AWG. @defaultValue 44 */
  awgMax?: number;
  /** Thickest wire considered, AWG. @defaultValue 10 */
  awgMin?: number;
}

const DEFAULTS = {
  currentDensityAPerM2: 4.5e6,
  diameterToSkinDepthMax: 2,
  parallelCountMax: 4,
  awgMax: 44,
  awgMin: 10,
} satisfies Required<WindingWireChoiceOptions>;

/**
 * Returns the conductor for a winding carrying `currentRmsA` (A) at `frequencyHz` (Hz): the
 * thickest AWG size no thicker than diameterToSkinDepthMax·δ (δ at 100 °C, a hot winding), as
 * many in parallel as the current density needs, or a litz bundle of such strands when more
 * than parallelCountMax would be needed. Foil is not chosen here, since its width and layer
 * count come from the core and the turns: the transformer design offers it in place of such
 * litz on windings of few turns (`foilBuild`, `foilWindingChoice`).
 * @throws RangeError for a non-positive current or frequency.
 */
export function windingWireChoice(
  currentRmsA: number,
  frequencyHz: number,
  options: WindingWireChoiceOptions = {},
): WindingWire {
  const { currentDensityAPerM2, diameterToSkinDepthMax, parallelCountMax, awgMax, awgMin } = {
    ...DEFAULTS,
    ...options,
  };
  if (!(currentRmsA > 0 && Number.isFinite(currentRmsA))) {
    throw new RangeError(`windingWireChoice: currentRmsA must be > 0, got ${currentRmsA}`);
  }
  const diameterMaxM = diameterToSkinDepthMax * skinDepth(frequencyHz, { temperatureC: 100 });
  // AWG numbers grow as wire thins: the first gauge that fits is the thickest allowed.
  let awg = awgMin;
  while (awg < awgMax && roundWireGauge(awg).bareDiameterM > diameterMaxM) awg += 1;
  const areaNeededM2 = currentRmsA / currentDensityAPerM2;
  const oneAreaM2 = roundWireGauge(awg).copperAreaM2;
  const count = Math.max(1, Math.ceil(areaNeededM2 / oneAreaM2 - 1e-9));
  return count <= parallelCountMax
    ? { kind: 'round', awg, parallelCount: count }
    : { kind: 'litz', strandAwg: awg, strandCount: count };
}
