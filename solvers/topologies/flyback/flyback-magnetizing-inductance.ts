import { average } from '../../waveform/average.js';
import { peakToPeak } from '../../waveform/peak-to-peak.js';
import {
  CHOICE_CORNER_LABEL,
  updateChoiceDraft,
  type FlybackChoiceDraft,
} from './flyback-choice-draft.js';
import { flybackCircuit } from './flyback-circuit.js';
import { flybackCurrentWaveforms } from './flyback-current-waveforms.js';
import { flybackRingTraces } from './flyback-ring-traces.js';
import {
  solveFlybackSteadyState,
  type FlybackSteadyState,
  type FlybackSteadyStateOptions,
} from './flyback-steady-state.js';
import { chooseJointly } from './flyback-joint-choice.js';
import { chooseTurnsRatio } from './flyback-turns-ratio.js';

/**
 * Sets the draft's Lm so that the magnetizing ripple over its average at the lowest input and
 * full load equals targets.magnetizingRippleRatioTarget, re-choosing the turns ratio at each step
 * when it is free. Ripple ∝ 1/Lm, so Lm ← Lm·ripple/target is exact in the lossless CCM limit
 * (ΔIm = Vin·D·T/Lm; Erickson & Maksimović, 2nd ed. (from memory), §2.2) and converges fast with
 * losses.
 * Returns false when a free turns ratio finds no steady state at all.
 */
export function chooseMagnetizingInductance(
  draft: FlybackChoiceDraft,
  options: FlybackSteadyStateOptions,
  settings: { tolerance: number; maxSteps: number; isTurnsRatioFree: boolean; firstStep: number },
): boolean {
  const { spec } = draft;
  const corner = {
    label: CHOICE_CORNER_LABEL,
    inputVoltageV: spec.inputVoltageMinV,
    loadFraction: 1,
  };
  const duty = spec.targets.dutyCycleTarget;
  // Fast path: both free and the corner continuous, one Newton solve for (n, Lm) together.
  const iterations = options.commutationIterations ?? 30;
  if (settings.isTurnsRatioFree && chooseJointly(draft, settings.tolerance, iterations))
    return true;
  for (let step = 0; step < settings.maxSteps; step++) {
    let state: FlybackSteadyState | undefined;
    if (settings.isTurnsRatioFree) {
      const chosen = chooseTurnsRatio(draft, options, step === 0 ? settings.firstStep : 1e-3);
      if (chosen === false) return false;
      if (chosen.point !== undefined) {
        // As solveFlybackSteadyState has it: the drain's rise at turn-off precedes conduction.
        const demagnetizingDutyCycle =
          1 -
          duty +
          (chosen.point.turnOnCommutationS - chosen.point.turnOffTransitionS) *
            spec.switchingFrequencyHz;
        state = { ...chosen.point, mode: 'ccm', dutyCycle: duty, demagnetizingDutyCycle };
      }
    }
    const circuit = flybackCircuit(spec, draft.choices, corner);
    if (state === undefined) {
      const outcome = solveFlybackSteadyState(circuit, options);
      if (!outcome.ok) return true;
      state = outcome.state;
    }
    const magnetizingA = flybackCurrentWaveforms(
      circuit,
      state,
      flybackRingTraces(circuit, state),
    ).magnetizingA;
    const ratio =
      peakToPeak(magnetizingA) / average(magnetizingA) / spec.targets.magnetizingRippleRatioTarget;
    updateChoiceDraft(draft, {
      magnetizingInductanceH: draft.choices.magnetizingInductanceH * ratio,
    });
    if (Math.abs(ratio - 1) <= settings.tolerance) return true;
  }
  return true;
}
