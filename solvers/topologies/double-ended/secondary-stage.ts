import type { RectifierModel } from '../../devices/rectifier-model.js';
import type { OutputStage } from '../buck-derived/output-stage.js';

/** How one output's secondary is wound and rectified. */
export type SecondaryArrangement = 'center-tapped' | 'full-bridge';

/** Default secondary arrangement (common practice: center-tapped for low output voltages). */
export const SECONDARY_ARRANGEMENT_DEFAULT: SecondaryArrangement = 'center-tapped';

/** Rectifiers of one output: 2 for a center-tapped secondary, 4 for a bridge. */
export function rectifierCount(arrangement: SecondaryArrangement): number {
  return arrangement === 'center-tapped' ? 2 : 4;
}

/** The values a double-ended output stage is built from (SI units). */
export interface SecondaryStageValues {
  loadA: number;
  inductanceH: number;
  inductorResistanceOhm: number;
  /** Center-tapped: each half's resistance; bridge: the one winding's, Ω. */
  windingResistanceOhm: number;
  /** One rectifier's linear model. */
  rectifier: RectifierModel;
}

/**
 * Returns the buck-derived stage of one output. Center-tapped: one rectifier and one half in the
 * path while driven; both halves with their rectifiers in parallel while freewheeling, each
 * carrying half the inductor current (Vf + (Rd + Rw)·IL/2). Bridge: two rectifiers and the
 * winding in the path while driven (2·Vf + (2·Rd + Rw)·IL); all four while freewheeling, two in
 * series on each of two parallel paths (2·Vf + Rd·IL). ref: Mohan, Undeland, Robbins, 3rd ed.
 * (from memory), §10-5, center-tapped and bridge rectification; common practice.
 */
export function secondaryStage(
  arrangement: SecondaryArrangement,
  values: SecondaryStageValues,
): OutputStage {
  const { forwardVoltageV: vf, resistanceOhm: rd } = values.rectifier;
  const rw = values.windingResistanceOhm;
  // Built as one literal (not spread from a shared base), so every stage has the same shape.
  const isCenterTapped = arrangement === 'center-tapped';
  return {
    loadA: values.loadA,
    inductanceH: values.inductanceH,
    inductorResistanceOhm: values.inductorResistanceOhm,
    windingResistanceOhm: rw,
    rectifier: isCenterTapped
      ? { forwardVoltageV: vf, resistanceOhm: rd }
      : { forwardVoltageV: 2 * vf, resistanceOhm: 2 * rd },
    freewheel: isCenterTapped
      ? { forwardVoltageV: vf, resistanceOhm: (rd + rw) / 2 }
      : { forwardVoltageV: 2 * vf, resistanceOhm: rd },
  };
}
