import { windingTemperatureC } from '../../spec/winding-temperature.js';
import { highestOutputV } from '../highest-output.js';
import {
  outputShortfallIssue,
  physicalOutputV,
  shortfallPath,
  turnsSearchShortfallIssue,
  TURNS_SEARCH_CEILING,
  TURNS_SEARCH_FLOOR,
} from '../power-not-deliverable.js';
import { rectifierModel } from '../../devices/rectifier-model.js';
import { copperResistance } from '../../materials/copper-resistance.js';
import { failure, success, type Result } from '../../result.js';
import type { Spec } from '../../spec/spec-schema.js';
import {
  MAGNETIZING_CURRENT_RATIO_DEFAULT,
  OUTPUT_RIPPLE_RATIO_DEFAULT,
} from '../two-switch-forward/two-switch-forward-choices.js';
import { INDUCTOR_RESISTANCE_DEFAULT_OHM } from '../two-switch-forward/two-switch-forward-state.js';
import {
  activeClampCircuit,
  CLAMP_CAPACITOR_ESR_DEFAULT_OHM,
  type ActiveClampChoices,
} from './active-clamp-forward-circuit.js';
import { clampCharge } from './clamp-charge.js';
import { activeClampStateAt, solveActiveClamp } from './active-clamp-forward-state.js';
import { stageSecondaryVoltageFor } from './stage-inversion.js';

/**
 * Peak-to-peak clamp voltage ripple over its mean at the highest input and full load, when the
 * clamp capacitance is chosen: 0.05 (common practice (from memory): a few percent, which puts
 * the resonance of Lm with the clamp capacitor well below the switching frequency).
 */
export const CLAMP_RIPPLE_RATIO_DEFAULT = 0.05;

const PASSES = 40;
const TOLERANCE = 1e-10;

/**
 * Chooses what the spec leaves open, as the other forwards do: the turns ratio so that the lowest
 * input at full load needs exactly targets.dutyCycleTarget with every drop; Lm so that the
 * magnetizing swing (peak to peak) there is 0.1 of the reflected full-load current; each output
 * inductance for the ripple target at the highest input and full load; the further outputs'
 * turns for their voltage at nominal input and full load; and the clamp capacitance for a
 * ripple of 0.05 of the clamp voltage at the highest input and full load (where it is largest:
 * ΔVc/Vc = (1 − D)²·T²/(8·Lm·Cc) lossless). The choices interact: a fixed point.
 */
export function chooseActiveClampForward(spec: Spec): Result<ActiveClampChoices> {
  const { transformer, targets, limits } = spec;
  const fixedRatios = transformer.outputTurnsRatios;
  const isTurnsFree = transformer.turnsRatio === undefined && fixedRatios === undefined;
  if (isTurnsFree && targets.dutyCycleTarget > limits.dutyCycleMax) {
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
  const periodS = 1 / spec.switchingFrequencyHz;
  const vMin = spec.inputVoltageMinV;
  const d0 = targets.dutyCycleTarget;
  const models = spec.outputs.map((output) => rectifierModel(output.rectifier));
  const perTurnV = spec.outputs.map((o, k) => o.voltageV + (models[k]?.forwardVoltageV ?? 0));
  // Lossless CCM forward: Vo = D·Vin/n (Mohan, Undeland, Robbins, 3rd ed. (from memory), §10-4).
  const losslessN = (d0 * vMin) / (perTurnV[0] ?? 1);
  const n0 = transformer.turnsRatio ?? fixedRatios?.[0] ?? losslessN;
  const ratioTarget = targets.outputInductorRippleRatioTarget ?? OUTPUT_RIPPLE_RATIO_DEFAULT;
  const choices: ActiveClampChoices = {
    turnsRatio: n0,
    outputTurnsRatios: spec.outputs.map(
      (_, k) => fixedRatios?.[k] ?? (n0 * (perTurnV[0] ?? 1)) / (perTurnV[k] ?? 1),
    ),
    magnetizingInductanceH: 1,
    leakageInductanceH: 0,
    outputInductancesH: spec.outputs.map(
      (o) => o.inductanceH ?? (0.5 * (o.voltageV + 1) * periodS) / (ratioTarget * o.currentA),
    ),
    primaryResistanceOhm: copperResistance(
      transformer.primaryResistanceOhm,
      windingTemperatureC(spec),
    ),
    outputWindingResistancesOhm: spec.outputs.map((o) =>
      copperResistance(o.windingResistanceOhm, windingTemperatureC(spec)),
    ),
    outputInductorResistancesOhm: spec.outputs.map((o) =>
      copperResistance(
        o.inductorResistanceOhm ?? INDUCTOR_RESISTANCE_DEFAULT_OHM,
        windingTemperatureC(spec),
      ),
    ),
    clampCapacitanceF: spec.activeClamp?.capacitanceF ?? 1,
    clampCapacitorEsrOhm: spec.activeClamp?.capacitorEsrOhm ?? CLAMP_CAPACITOR_ESR_DEFAULT_OHM,
    origins: {
      turnsRatio: isTurnsFree ? 'target' : 'spec',
      magnetizingInductanceH: transformer.magnetizingInductanceH === undefined ? 'target' : 'spec',
      leakageInductanceH: transformer.leakageInductanceH === undefined ? 'default' : 'spec',
      outputInductancesH: spec.outputs.map((o) =>
        o.inductanceH === undefined ? 'target' : 'spec',
      ),
      clampCapacitanceF: spec.activeClamp?.capacitanceF === undefined ? 'target' : 'spec',
    },
  };
  const reflectedA = () =>
    spec.outputs.reduce((sum, o, k) => sum + o.currentA / (choices.outputTurnsRatios[k] ?? 1), 0);
  const leakageOf = () =>
    transformer.leakageInductanceH ??
    transformer.leakageInductanceFraction * choices.magnetizingInductanceH;
  choices.magnetizingInductanceH =
    transformer.magnetizingInductanceH ??
    (vMin * d0 * periodS) / (MAGNETIZING_CURRENT_RATIO_DEFAULT * reflectedA());
  choices.leakageInductanceH = leakageOf();
  const at = (inputVoltageV: number) =>
    activeClampCircuit(spec, choices, { label: 'choice', inputVoltageV, loadFraction: 1 });
  const regulatedV = spec.outputs[0]?.voltageV ?? 0;
  const firstRatio = () => choices.outputTurnsRatios[0] ?? choices.turnsRatio;
  // The first output at `inputVoltageV`, full load and duty cycle D, where it is physical.
  const firstV = (inputVoltageV: number, dutyCycle: number) =>
    physicalOutputV(
      activeClampStateAt(at(inputVoltageV), dutyCycle)?.points[0]?.voltageV ?? NaN,
      inputVoltageV / firstRatio(),
    );
  // With the turns ratio free the ratio has no floor here (the inversion scales it each pass),
  // so a choice that fails, at any input, is first checked at the lowest input and the target
  // duty cycle: the most the first output reaches there over the two other forwards' turns
  // search range (two-switch-forward-choices.ts), which is how those report it. (Where the
  // leakage's commutation grows faster than the ratio falls, the passes drive the ratio down
  // until no steady state exists, at the highest input as often as at the lowest.)
  const bestAtTarget = () => {
    const { turnsRatio, outputTurnsRatios } = choices;
    const ratios = outputTurnsRatios.map((n) => n / turnsRatio);
    const bestV = highestOutputV(
      (n) => {
        choices.turnsRatio = n;
        choices.outputTurnsRatios = ratios.map((r) => r * n);
        return firstV(vMin, d0);
      },
      TURNS_SEARCH_FLOOR * losslessN,
      TURNS_SEARCH_CEILING * losslessN,
    );
    // The ratios as the choice left them, for a figure at another input (`notSolved`).
    choices.turnsRatio = turnsRatio;
    choices.outputTurnsRatios = outputTurnsRatios;
    return bestV;
  };
  const notReached = (reachedV: number) =>
    failure<ActiveClampChoices>([
      turnsSearchShortfallIssue(spec, reachedV, d0, limits.dutyCycleMax),
    ]);
  // A regulated solve that finds no duty cycle: the first output at dutyCycleMax.
  const notSolved = (input: 'min' | 'nominal' | 'max', inputVoltageV: number) => {
    if (isTurnsFree) {
      const bestV = bestAtTarget();
      if (bestV < regulatedV) return notReached(bestV);
    }
    return failure<ActiveClampChoices>([
      outputShortfallIssue(spec, {
        input,
        reachedV: firstV(inputVoltageV, limits.dutyCycleMax),
        at: 'dutyCycle dutyCycleMax',
        path: shortfallPath(spec),
        // Lossless CCM forward, D = n·(Vo + Vf)/Vin (as `losslessN` above).
        losslessDutyCycle: (firstRatio() * (perTurnV[0] ?? 1)) / inputVoltageV,
        dutyCycleLimit: limits.dutyCycleMax,
      }),
    ]);
  };
  for (let pass = 0; pass < PASSES; pass++) {
    const before = [
      choices.magnetizingInductanceH,
      ...choices.outputTurnsRatios,
      ...choices.outputInductancesH,
    ];
    const low = isTurnsFree
      ? activeClampStateAt(at(vMin), d0)
      : solveActiveClamp(at(vMin), regulatedV);
    const firstStage = at(vMin).stages[0];
    if (firstStage === undefined) throw new Error('chooseActiveClampForward: no output');
    if (low === undefined) return notSolved('min', vMin);
    // The stage's duty cycle from the gate: after the commutation, with half the turn-off swing.
    const lowDuty = low.stageDutyCycle - low.leadFraction;
    if (isTurnsFree) {
      // Invert the first stage at the target duty cycle for the secondary voltage it needs.
      const secondaryV = stageSecondaryVoltageFor(firstStage, lowDuty, regulatedV, periodS);
      if (!(secondaryV > 0)) return notReached(bestAtTarget());
      const scale = low.primaryVoltageV / secondaryV / choices.turnsRatio;
      choices.turnsRatio *= scale;
      choices.outputTurnsRatios = choices.outputTurnsRatios.map((n) => n * scale);
    }
    if (transformer.magnetizingInductanceH === undefined) {
      choices.magnetizingInductanceH =
        (low.primaryVoltageV * lowDuty * periodS) /
        (MAGNETIZING_CURRENT_RATIO_DEFAULT * reflectedA());
    }
    choices.leakageInductanceH = leakageOf();
    const high = solveActiveClamp(at(spec.inputVoltageMaxV), regulatedV);
    const nominalCircuit = at(spec.inputVoltageNominalV);
    const nominal = solveActiveClamp(nominalCircuit, regulatedV);
    if (high === undefined) return notSolved('max', spec.inputVoltageMaxV);
    if (nominal === undefined) return notSolved('nominal', spec.inputVoltageNominalV);
    spec.outputs.forEach((output, k) => {
      const model = models[k];
      if (model === undefined) return;
      const io = output.currentA;
      if (output.inductanceH === undefined) {
        const rl = choices.outputInductorResistancesOhm[k] ?? 0;
        // ΔIL = (Vo + Vf + (Rd + RL)·Io)·(1 − D)·T/L at the highest input (CCM at full load).
        const offV = output.voltageV + model.forwardVoltageV + (model.resistanceOhm + rl) * io;
        const highDuty = high.stageDutyCycle - high.leadFraction;
        choices.outputInductancesH[k] = (offV * (1 - highDuty) * periodS) / (ratioTarget * io);
      }
      const stage = nominalCircuit.stages[k];
      if (k === 0 || stage === undefined) return;
      const nominalDuty = nominal.stageDutyCycle - nominal.leadFraction;
      const secondaryV = stageSecondaryVoltageFor(stage, nominalDuty, output.voltageV, periodS);
      if (secondaryV > 0 && fixedRatios === undefined) {
        choices.outputTurnsRatios[k] = nominal.primaryVoltageV / secondaryV;
      }
    });
    if (spec.activeClamp?.capacitanceF === undefined) {
      choices.clampCapacitanceF =
        clampCharge(high, periodS) / (CLAMP_RIPPLE_RATIO_DEFAULT * high.clampVoltageV);
    }
    const after = [
      choices.magnetizingInductanceH,
      ...choices.outputTurnsRatios,
      ...choices.outputInductancesH,
    ];
    const change = Math.max(...after.map((v, i) => Math.abs(v / (before[i] ?? v) - 1)));
    if (change <= TOLERANCE) break;
  }
  choices.turnsRatio = choices.outputTurnsRatios[0] ?? choices.turnsRatio;
  return success(choices);
}
