import type { FlybackDesign } from '../../design/design-schema.js';
import type { Spec } from '../../spec/spec-schema.js';

/** The choices being iterated, with what they are derived from. Private to the flyback. */
export interface FlybackChoiceDraft {
  spec: Spec;
  choices: FlybackDesign['choices'];
  /** nk/n0 of each output (1 for output 0). */
  outputRatios: number[];
  /** Charge-weighted reflected voltage at nominal input and full load per unit n0, V. */
  reflectedPerTurnV: number;
}

/** The label of the corner at which the turns ratio and Lm are chosen. */
export const CHOICE_CORNER_LABEL = 'min-input/100pct-load';

/**
 * Sets the turns ratio and/or Lm of the draft and re-derives what follows from them: every
 * output's turns ratio, the leakage (leakageInductanceFraction × Lm unless the spec fixes it) and
 * the clamp voltage (voltageToReflectedRatio × reflected voltage unless the spec fixes it).
 */
export function updateChoiceDraft(
  draft: FlybackChoiceDraft,
  change: { turnsRatio?: number; magnetizingInductanceH?: number },
): void {
  const { choices, spec } = draft;
  const { transformer, clamp } = spec;
  if (change.turnsRatio !== undefined) choices.turnsRatio = change.turnsRatio;
  if (change.magnetizingInductanceH !== undefined) {
    choices.magnetizingInductanceH = change.magnetizingInductanceH;
  }
  const n = choices.turnsRatio;
  choices.outputTurnsRatios = draft.outputRatios.map((ratio) => ratio * n);
  choices.leakageInductanceH =
    transformer.leakageInductanceH ??
    transformer.leakageInductanceFraction * choices.magnetizingInductanceH;
  choices.clampVoltageV =
    clamp.voltageV ?? clamp.voltageToReflectedRatio * n * draft.reflectedPerTurnV;
}
