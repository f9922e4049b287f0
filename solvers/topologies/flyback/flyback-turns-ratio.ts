import { brentRoot } from '../../root-finding/brent-root.js';
import { searchBracket } from '../../root-finding/search-bracket.js';
import {
  CHOICE_CORNER_LABEL,
  updateChoiceDraft,
  type FlybackChoiceDraft,
} from './flyback-choice-draft.js';
import { flybackCircuit } from './flyback-circuit.js';
import { evaluateCcm, newOperatingPoint, type OperatingPoint } from './flyback-intervals.js';
import { solveFlybackSteadyState, type FlybackSteadyStateOptions } from './flyback-steady-state.js';

/**
 * Sets the draft's turns ratio so that the lowest input at full load needs exactly
 * targets.dutyCycleTarget, with every conduction drop and both leakage commutations, and returns
 * the CCM operating point there (undefined when that corner is not CCM at the target). Returns
 * false when no turns ratio gives a steady state at all.
 */
export function chooseTurnsRatio(
  draft: FlybackChoiceDraft,
  options: FlybackSteadyStateOptions,
  firstStep: number,
): { point: OperatingPoint | undefined } | false {
  const point = atTargetDuty(draft, options, firstStep);
  if (point !== undefined) return { point };
  return bySolving(draft, options, firstStep) ? { point: undefined } : false;
}

function cornerCircuit(draft: FlybackChoiceDraft) {
  const { spec, choices } = draft;
  return flybackCircuit(spec, choices, {
    label: CHOICE_CORNER_LABEL,
    inputVoltageV: spec.inputVoltageMinV,
    loadFraction: 1,
  });
}

/**
 * With D held at the target, the CCM periodicity residual is a function of n alone, so n is
 * one root search of cheap evaluations. Valid when the corner is CCM there (valley > 0).
 */
function atTargetDuty(
  draft: FlybackChoiceDraft,
  options: FlybackSteadyStateOptions,
  firstStep: number,
): OperatingPoint | undefined {
  const duty = draft.spec.targets.dutyCycleTarget;
  const iterations = options.commutationIterations ?? 30;
  const point = newOperatingPoint();
  // A larger n lengthens the reset volt-seconds: minus the residual rises with n.
  const rising = (n: number): number => {
    updateChoiceDraft(draft, { turnsRatio: n });
    evaluateCcm(cornerCircuit(draft), duty, point, iterations);
    return -point.residualA;
  };
  const guess = draft.choices.turnsRatio;
  const search = searchBracket(rising, guess, firstStep);
  if (!search.found) {
    updateChoiceDraft(draft, { turnsRatio: guess });
    return undefined;
  }
  const n = brentRoot(rising, search.lo, search.hi, {
    absoluteTolerance: 1e-13 * guess,
    maxIterations: options.maxIterations ?? 100,
  });
  rising(n);
  if (point.isValid && point.valleyCurrentA > 0 && Number.isFinite(n)) return point;
  updateChoiceDraft(draft, { turnsRatio: guess });
  return undefined;
}

/** The general search: full steady-state solves, for corners that are DCM at the target. */
function bySolving(
  draft: FlybackChoiceDraft,
  options: FlybackSteadyStateOptions,
  firstStep: number,
): boolean {
  const target = draft.spec.targets.dutyCycleTarget;
  const dutyError = (n: number): number => {
    updateChoiceDraft(draft, { turnsRatio: n });
    const outcome = solveFlybackSteadyState(cornerCircuit(draft), options);
    // No steady state: the losses outgrow what any duty cycle supplies, so "too high".
    return outcome.ok ? outcome.state.dutyCycle - target : 1;
  };
  const guess = draft.choices.turnsRatio;
  const search = searchBracket(dutyError, guess, firstStep);
  let n: number;
  if (search.found) {
    n = brentRoot(dutyError, search.lo, search.hi, {
      absoluteTolerance: 1e-13 * guess,
      maxIterations: options.maxIterations ?? 100,
    });
  } else if (search.bestValue < 0) {
    // D below the target for every n: a DCM-limited Lm sets D whatever n; keep the guess.
    n = guess;
  } else if (search.bestValue < 1) {
    // D above the target for every n (losses): the n that needs the least duty cycle.
    n = search.best;
  } else {
    return false;
  }
  updateChoiceDraft(draft, { turnsRatio: n });
  return true;
}
