import { windingTemperatureC } from '../../spec/winding-temperature.js';
import type { FlybackDesign } from '../../design/design-schema.js';
import { rectifierModel } from '../../devices/rectifier-model.js';
import { copperResistance } from '../../materials/copper-resistance.js';
import { failure, success, type Issue, type Result } from '../../result.js';
import type { Spec } from '../../spec/spec-schema.js';
import { flybackCircuit } from './flyback-circuit.js';
import { flybackCurrentStats } from './flyback-current-stats.js';
import { flybackCurrentWaveforms } from './flyback-current-waveforms.js';
import { flybackRingTraces } from './flyback-ring-traces.js';
import { flybackDeliverablePowerW } from './flyback-deliverable-power.js';
import { flybackOutputVoltages } from './flyback-output-voltages.js';
import {
  CHOICE_CORNER_LABEL,
  updateChoiceDraft,
  type FlybackChoiceDraft,
} from './flyback-choice-draft.js';
import { chooseMagnetizingInductance } from './flyback-magnetizing-inductance.js';
import { solveFlybackSteadyState, type FlybackSteadyStateOptions } from './flyback-steady-state.js';
import { chooseTurnsRatio } from './flyback-turns-ratio.js';

/** What the flyback chooses: the design's choices block. */
export type FlybackChoices = FlybackDesign['choices'];

/** Options of {@link chooseFlyback}; the steady-state options apply to every solve inside. */
export interface FlybackChoiceOptions extends FlybackSteadyStateOptions {
  /**
   * Largest relative change of any choice between passes that ends the fixed point.
   * @defaultValue 1e-10
   */
  choiceTolerance?: number;
  /**
   * Pass cap of the fixed point over turns ratio, Lm, clamp voltage and further outputs' turns.
   * @defaultValue 40
   */
  maxChoiceIterations?: number;
}

const DEFAULTS = { choiceTolerance: 1e-10, maxChoiceIterations: 40 } satisfies Required<
  Pick<FlybackChoiceOptions, 'choiceTolerance' | 'maxChoiceIterations'>
>;

/**
 * Chooses what the spec leaves open, at full load: the turns ratio so that the lowest input needs
 * exactly targets.dutyCycleTarget with every conduction drop and the leakage commutation; Lm so
 * that the magnetizing ripple over its average at the lowest input is the ripple target; the
 * clamp voltage from the reflected voltage at nominal input; the further outputs' turns so that
 * their estimated voltages are right at nominal input. The choices interact, so they are
 * iterated to a common fixed point.
 */
export function chooseFlyback(
  spec: Spec,
  options: FlybackChoiceOptions = {},
): Result<FlybackChoices> {
  const { choiceTolerance, maxChoiceIterations } = { ...DEFAULTS, ...options };
  const { transformer, targets, limits, clamp } = spec;
  const regulated = spec.outputs[0];
  if (regulated === undefined) throw new RangeError('chooseFlyback: the spec has no outputs');
  const isTurnsFixed =
    transformer.turnsRatio !== undefined || transformer.outputTurnsRatios !== undefined;
  if (!isTurnsFixed && targets.dutyCycleTarget > limits.dutyCycleMax) {
    return failure([
      {
        code: 'duty_cycle_limit',
        path: ['targets', 'dutyCycleTarget'],
        constraint: 'dutyCycleTarget <= dutyCycleMax',
        quantity: 'dutyCycle',
        required: targets.dutyCycleTarget,
        limit: limits.dutyCycleMax,
      },
    ]);
  }
  const models = spec.outputs.map((output) => rectifierModel(output.rectifier));
  const regulatedPerTurnV = regulated.voltageV + (models[0]?.forwardVoltageV ?? 0);
  // Further outputs start from the ideal ratio (Vo_k + Vf_k)/(Vo_0 + Vf_0) of their turns.
  // Fixed turns (transformer.outputTurnsRatios) keep their ratios to the first output's turns.
  const fixedRatios = transformer.outputTurnsRatios;
  const fixedFirst = fixedRatios?.[0];
  const ratios = spec.outputs.map((output, k) =>
    fixedRatios !== undefined && fixedFirst !== undefined
      ? (fixedRatios[k] ?? fixedFirst) / fixedFirst
      : regulatedPerTurnV / (output.voltageV + (models[k]?.forwardVoltageV ?? 0)),
  );
  const vMin = spec.inputVoltageMinV;
  const periodS = 1 / spec.switchingFrequencyHz;
  const dutyTarget = targets.dutyCycleTarget;
  // Lossless CCM flyback: D/(1 − D) = n·(Vo + Vf)/Vin (Erickson & Maksimović, 2nd ed. (from
  // memory), §6.3.4).
  const losslessTurnsRatio = (dutyTarget * vMin) / ((1 - dutyTarget) * regulatedPerTurnV);
  const fixedTurnsRatio = transformer.turnsRatio ?? fixedFirst;
  const turnsRatio = fixedTurnsRatio ?? losslessTurnsRatio;
  // Lossless CCM at the lowest input: Im = Iref/(1 − D), ΔIm = target·Im, Lm = Vin·D·T/ΔIm.
  const losslessDuty = (turnsRatio * regulatedPerTurnV) / (vMin + turnsRatio * regulatedPerTurnV);
  const referredA = spec.outputs.reduce(
    (sum, output, k) => sum + output.currentA / ((ratios[k] ?? 1) * turnsRatio),
    0,
  );
  const initialInductanceH =
    (vMin * losslessDuty * periodS * (1 - losslessDuty)) /
    (targets.magnetizingRippleRatioTarget * referredA);
  const draft: FlybackChoiceDraft = {
    spec,
    outputRatios: ratios,
    reflectedPerTurnV: regulatedPerTurnV,
    choices: {
      turnsRatio,
      outputTurnsRatios: [],
      magnetizingInductanceH: transformer.magnetizingInductanceH ?? initialInductanceH,
      leakageInductanceH: 0,
      reflectedVoltageV: turnsRatio * regulatedPerTurnV,
      clampVoltageV: 0,
      primaryResistanceOhm: copperResistance(
        transformer.primaryResistanceOhm,
        windingTemperatureC(spec),
      ),
      outputWindingResistancesOhm: spec.outputs.map((output) =>
        copperResistance(output.windingResistanceOhm, windingTemperatureC(spec)),
      ),
      origins: {
        turnsRatio: isTurnsFixed ? 'spec' : 'target',
        magnetizingInductanceH:
          transformer.magnetizingInductanceH === undefined ? 'target' : 'spec',
        leakageInductanceH: transformer.leakageInductanceH === undefined ? 'default' : 'spec',
        clampVoltageV: clamp.voltageV === undefined ? 'default' : 'spec',
      },
    },
  };
  const { choices } = draft;
  updateChoiceDraft(draft, {});
  const givenLeakageIssue = checkLeakage(choices);
  if (givenLeakageIssue !== undefined) return failure([givenLeakageIssue]);
  const isTurnsRatioFree = !isTurnsFixed;
  for (let pass = 0; pass < maxChoiceIterations; pass++) {
    const before = [
      choices.turnsRatio,
      choices.magnetizingInductanceH,
      choices.clampVoltageV,
      ...ratios,
    ];
    // A wide first step: the lossless guess lies well above the lossy turns ratio.
    const firstStep = pass === 0 ? 0.3 : 1e-3;
    let isSolvable = true;
    if (transformer.magnetizingInductanceH === undefined) {
      isSolvable = chooseMagnetizingInductance(draft, options, {
        tolerance: choiceTolerance,
        maxSteps: maxChoiceIterations,
        isTurnsRatioFree,
        firstStep,
      });
    } else if (isTurnsRatioFree) {
      isSolvable = chooseTurnsRatio(draft, options, firstStep) !== false;
    }
    if (!isSolvable) return failure([undeliverable(draft, losslessTurnsRatio)]);
    updateFromNominal(draft, options);
    const after = [
      choices.turnsRatio,
      choices.magnetizingInductanceH,
      choices.clampVoltageV,
      ...ratios,
    ];
    const change = Math.max(...after.map((value, i) => Math.abs(value / (before[i] ?? value) - 1)));
    if (change <= choiceTolerance) break;
  }
  const leakageIssue = checkLeakage(choices);
  return leakageIssue === undefined ? success(choices) : failure([leakageIssue]);
}

/**
 * At nominal input and full load: the charge-weighted reflected voltage (which sets a clamp
 * voltage not fixed by the spec) and each further output's turns ratio, set so that its estimated
 * voltage equals its target with its own drops kept.
 */
function updateFromNominal(draft: FlybackChoiceDraft, options: FlybackSteadyStateOptions): void {
  const { spec, choices } = draft;
  const circuit = flybackCircuit(spec, choices, {
    label: 'nominal-input/100pct-load',
    inputVoltageV: spec.inputVoltageNominalV,
    loadFraction: 1,
  });
  const outcome = solveFlybackSteadyState(circuit, options);
  if (!outcome.ok) return;
  const currents = flybackCurrentWaveforms(
    circuit,
    outcome.state,
    flybackRingTraces(circuit, outcome.state),
  );
  const voltages = flybackOutputVoltages(
    circuit,
    spec.outputs[0]?.voltageV ?? 0,
    flybackCurrentStats(circuit, currents).referredSecondaryA,
  );
  const reflectedV = voltages.reflectedVoltageV;
  draft.reflectedPerTurnV = reflectedV / choices.turnsRatio;
  choices.reflectedVoltageV = reflectedV;
  spec.outputs.forEach((output, k) => {
    const estimateV = voltages.outputVoltagesV[k];
    const n = choices.outputTurnsRatios[k];
    if (k === 0 || estimateV === undefined || n === undefined) return;
    if (spec.transformer.outputTurnsRatios !== undefined) return;
    const dropV = reflectedV / n - estimateV;
    draft.outputRatios[k] = reflectedV / (output.voltageV + dropV) / choices.turnsRatio;
  });
  updateChoiceDraft(draft, {});
}

/** The issue when no turns ratio gives a steady state at the lowest input and full load. */
function undeliverable(draft: FlybackChoiceDraft, losslessTurnsRatio: number): Issue {
  const { spec } = draft;
  updateChoiceDraft(draft, { turnsRatio: losslessTurnsRatio });
  return {
    code: 'power_not_deliverable',
    path: ['outputs'],
    constraint: 'outputPowerW <= deliverablePowerW',
    quantity: 'outputPowerW',
    required: spec.outputs.reduce((sum, output) => sum + output.voltageV * output.currentA, 0),
    limit: flybackDeliverablePowerW(spec, draft.choices, {
      label: CHOICE_CORNER_LABEL,
      inputVoltageV: spec.inputVoltageMinV,
      loadFraction: 1,
    }),
    corner: CHOICE_CORNER_LABEL,
  };
}

/** A leakage inductance at or above Lm is not a transformer. */
function checkLeakage(choices: FlybackChoices): Issue | undefined {
  if (!(choices.leakageInductanceH >= choices.magnetizingInductanceH)) return undefined;
  return {
    code: 'non_physical_value',
    path: ['transformer', 'leakageInductanceH'],
    constraint: 'leakageInductanceH < magnetizingInductanceH',
    quantity: 'leakageInductanceH',
    required: choices.leakageInductanceH,
    limit: choices.magnetizingInductanceH,
  };
}
