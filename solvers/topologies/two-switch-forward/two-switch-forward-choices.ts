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
import type { ForwardDesign, ResetWindingForwardDesign } from '../../design/design-schema.js';
import { rectifierModel } from '../../devices/rectifier-model.js';
import { copperResistance } from '../../materials/copper-resistance.js';
import { failure, success, type Result } from '../../result.js';
import { brentRoot } from '../../root-finding/brent-root.js';
import type { Spec } from '../../spec/spec-schema.js';
import {
  INDUCTOR_RESISTANCE_DEFAULT_OHM,
  solveTwoSwitchForward,
  twoSwitchForwardCircuit,
  forwardOutputVoltageAt,
  type AnyForwardChoices,
  type ForwardReset,
} from './two-switch-forward-state.js';
import { forwardDutyCycleLimit } from './two-switch-forward-limits.js';

/** What the two-switch forward chooses: the design's choices block. */
export type ForwardChoices = ForwardDesign['choices'];

/**
 * Magnetizing current peak over the reflected full-load current at the lowest input, when Lm is
 * chosen: 0.1 (common practice: a forward transformer's magnetizing current is a small fraction
 * of the load current, a few to ten percent).
 */
export const MAGNETIZING_CURRENT_RATIO_DEFAULT = 0.1;
/** Output inductor ripple over full-load current at the highest input, when not in the spec. */
export const OUTPUT_RIPPLE_RATIO_DEFAULT = 0.3;

const PASSES = 30;
const TOLERANCE = 1e-10;

/**
 * Chooses what the spec leaves open: the turns ratio so that the lowest input at full load needs
 * exactly targets.dutyCycleTarget with every drop; Lm so that the magnetizing peak is 0.1 of the
 * reflected load current there; each output inductance so that its ripple at the highest input
 * and full load is the ripple target; the further outputs' turns so that they meet their voltage
 * at nominal input and full load (continuous conduction). The choices interact: a fixed point.
 */
export function chooseTwoSwitchForward(spec: Spec): Result<ForwardChoices> {
  return chooseForward(spec, { kind: 'clamp-diodes' });
}

/**
 * Chooses the forward with a reset winding as {@link chooseTwoSwitchForward} does, with the
 * reset-to-primary turns ratio from forward.resetTurnsRatio, or 1 by default (common practice:
 * a bifilar reset winding with Nr = Np, which limits D to 0.5).
 */
export function chooseResetWindingForward(
  spec: Spec,
): Result<ResetWindingForwardDesign['choices']> {
  const chosen = chooseForward(spec, {
    kind: 'reset-winding',
    resetTurnsRatio: spec.forward?.resetTurnsRatio ?? 1,
  });
  if (!chosen.ok) return chosen;
  if (!('resetTurnsRatio' in chosen.value)) throw new Error('chooseForward lost resetTurnsRatio');
  return success(chosen.value);
}

function chooseForward(spec: Spec, reset: ForwardReset): Result<AnyForwardChoices> {
  const { transformer, targets, limits } = spec;
  const ownLimit = forwardDutyCycleLimit(reset);
  const dutyLimit = Math.min(limits.dutyCycleMax, ownLimit);
  const fixedRatios = transformer.outputTurnsRatios;
  const isTurnsFree = transformer.turnsRatio === undefined && fixedRatios === undefined;
  if (isTurnsFree && targets.dutyCycleTarget > dutyLimit) {
    return failure([
      {
        code: 'duty_cycle_limit',
        path: ['targets', 'dutyCycleTarget'],
        constraint:
          reset.kind === 'clamp-diodes'
            ? 'dutyCycleTarget <= min(dutyCycleMax, 0.5)'
            : 'dutyCycleTarget <= min(dutyCycleMax, 1 / (1 + resetTurnsRatio))',
        quantity: 'dutyCycle',
        required: targets.dutyCycleTarget,
        limit: dutyLimit,
      },
    ]);
  }
  const periodS = 1 / spec.switchingFrequencyHz;
  const vMin = spec.inputVoltageMinV;
  const d0 = targets.dutyCycleTarget;
  const models = spec.outputs.map((output) => rectifierModel(output.rectifier));
  const perTurnV = spec.outputs.map(
    (output, k) => output.voltageV + (models[k]?.forwardVoltageV ?? 0),
  );
  // Lossless CCM forward: Vo = D·Vin/n (Mohan, Undeland, Robbins, 3rd ed. (from memory), §10-4).
  const losslessN = (d0 * vMin) / (perTurnV[0] ?? 1);
  const n0 = transformer.turnsRatio ?? fixedRatios?.[0] ?? losslessN;
  const ratioTarget = targets.outputInductorRippleRatioTarget ?? OUTPUT_RIPPLE_RATIO_DEFAULT;
  const base: ForwardChoices = {
    turnsRatio: n0,
    outputTurnsRatios: spec.outputs.map(
      (_, k) => fixedRatios?.[k] ?? (n0 * (perTurnV[0] ?? 1)) / (perTurnV[k] ?? 1),
    ),
    magnetizingInductanceH: 1,
    leakageInductanceH: 0,
    outputInductancesH: spec.outputs.map(
      (output) =>
        output.inductanceH ??
        (0.5 * (output.voltageV + 1) * periodS) / (ratioTarget * output.currentA),
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
    origins: {
      turnsRatio: isTurnsFree ? 'target' : 'spec',
      magnetizingInductanceH: transformer.magnetizingInductanceH === undefined ? 'target' : 'spec',
      leakageInductanceH: transformer.leakageInductanceH === undefined ? 'default' : 'spec',
      outputInductancesH: spec.outputs.map((o) =>
        o.inductanceH === undefined ? 'target' : 'spec',
      ),
    },
  };
  const choices: AnyForwardChoices =
    reset.kind === 'reset-winding'
      ? {
          ...base,
          resetTurnsRatio: reset.resetTurnsRatio,
          origins: {
            ...base.origins,
            resetTurnsRatio: spec.forward?.resetTurnsRatio === undefined ? 'default' : 'spec',
          },
        }
      : base;
  const reflectedA = () =>
    spec.outputs.reduce((sum, o, k) => sum + o.currentA / (choices.outputTurnsRatios[k] ?? 1), 0);
  choices.magnetizingInductanceH =
    transformer.magnetizingInductanceH ??
    (vMin * d0 * periodS) / (MAGNETIZING_CURRENT_RATIO_DEFAULT * reflectedA());
  const leakageOf = () =>
    transformer.leakageInductanceH ??
    transformer.leakageInductanceFraction * choices.magnetizingInductanceH;
  choices.leakageInductanceH = leakageOf();
  const at = (inputVoltageV: number) =>
    twoSwitchForwardCircuit(spec, choices, { label: 'choice', inputVoltageV, loadFraction: 1 });
  const regulatedV = spec.outputs[0]?.voltageV ?? 0;
  const firstRatio = () => choices.outputTurnsRatios[0] ?? choices.turnsRatio;
  // The first output at `inputVoltageV`, full load and duty cycle D, where it is physical.
  const firstV = (inputVoltageV: number, dutyCycle: number) =>
    physicalOutputV(
      forwardOutputVoltageAt(at(inputVoltageV), dutyCycle),
      inputVoltageV / firstRatio(),
    );
  // Lossless CCM forward, D = n·(Vo + Vf)/Vin (as `losslessN` above).
  const losslessDuty = (inputVoltageV: number) =>
    (firstRatio() * (perTurnV[0] ?? 1)) / inputVoltageV;
  // A regulated solve that finds no duty cycle: the first output at the duty-cycle limit.
  const notSolved = (input: 'min' | 'nominal' | 'max', inputVoltageV: number) =>
    failure<AnyForwardChoices>([
      outputShortfallIssue(spec, {
        input,
        reachedV: firstV(inputVoltageV, dutyLimit),
        at:
          reset.kind === 'clamp-diodes'
            ? 'dutyCycle min(dutyCycleMax, 0.5)'
            : 'dutyCycle min(dutyCycleMax, 1 / (1 + resetTurnsRatio))',
        path: shortfallPath(spec),
        losslessDutyCycle: losslessDuty(inputVoltageV),
        dutyCycleLimit: dutyLimit,
      }),
    ]);
  let previousN: number | undefined;
  let previousLm = choices.magnetizingInductanceH;
  let previousGapLm = 0;
  for (let pass = 0; pass < PASSES; pass++) {
    const before = [
      choices.magnetizingInductanceH,
      ...choices.outputTurnsRatios,
      ...choices.outputInductancesH,
    ];
    if (isTurnsFree) {
      const ratios = choices.outputTurnsRatios.map((n) => n / choices.turnsRatio);
      const voltageAt = (n: number) => {
        choices.turnsRatio = n;
        choices.outputTurnsRatios = ratios.map((r) => r * n);
        return forwardOutputVoltageAt(at(vMin), d0) - regulatedV;
      };
      const n = turnsRatioRoot(voltageAt, losslessN, previousN);
      if (!Number.isFinite(n)) {
        // No ratio in the search's range reaches the output at the target duty cycle: the most
        // it reaches over that range (Vo(n) has a hump where the drops grow with the reflected
        // current, so not always at the range's low end).
        const reachedV = highestOutputV(
          (x) => physicalOutputV(voltageAt(x) + regulatedV, vMin / x),
          TURNS_SEARCH_FLOOR * losslessN,
          TURNS_SEARCH_CEILING * losslessN,
        );
        return failure([turnsSearchShortfallIssue(spec, reachedV, d0, dutyLimit)]);
      }
      choices.turnsRatio = n;
      choices.outputTurnsRatios = ratios.map((r) => r * n);
      previousN = n;
    }
    const low = solveTwoSwitchForward(at(vMin), regulatedV);
    if (low === undefined) return notSolved('min', vMin);
    if (transformer.magnetizingInductanceH === undefined) {
      const currentLm = choices.magnetizingInductanceH;
      const updatedLm =
        (low.primaryVoltageV * low.stageDutyCycle * periodS) /
        (MAGNETIZING_CURRENT_RATIO_DEFAULT * reflectedA());
      // The passes converge linearly (the turns ratio and Lm pull on each other through the
      // leakage and the magnetizing current); a secant step on Lm − G(Lm) over the last two
      // passes takes most of that slow mode out. The direct step where it is not usable.
      const gapLm = updatedLm - currentLm;
      const secantLm = currentLm - (gapLm * (currentLm - previousLm)) / (gapLm - previousGapLm);
      const isSecant = pass > 0 && secantLm > 0.5 * updatedLm && secantLm < 2 * updatedLm;
      previousLm = currentLm;
      previousGapLm = gapLm;
      choices.magnetizingInductanceH = isSecant ? secantLm : updatedLm;
    }
    choices.leakageInductanceH = leakageOf();
    const high = solveTwoSwitchForward(at(spec.inputVoltageMaxV), regulatedV);
    const nominal = solveTwoSwitchForward(at(spec.inputVoltageNominalV), regulatedV);
    if (high === undefined) return notSolved('max', spec.inputVoltageMaxV);
    if (nominal === undefined) return notSolved('nominal', spec.inputVoltageNominalV);
    spec.outputs.forEach((output, k) => {
      const model = models[k];
      if (model === undefined) return;
      const io = output.currentA;
      const rl = choices.outputInductorResistancesOhm[k] ?? 0;
      const rw = choices.outputWindingResistancesOhm[k] ?? 0;
      if (output.inductanceH === undefined) {
        // ΔIL = (Vo + Vf + (Rd + RL)·Io)·(1 − D)·T/L at the highest input (CCM at full load).
        const offV = output.voltageV + model.forwardVoltageV + (model.resistanceOhm + rl) * io;
        choices.outputInductancesH[k] =
          (offV * (1 - high.stageDutyCycle) * periodS) / (ratioTarget * io);
      }
      if (k === 0 || fixedRatios !== undefined) return;
      // Invert the CCM balance for the secondary voltage this output needs at nominal input.
      // The stage's own duty cycle: the on-time after the turn-on commutation, with half the
      // turn-off swing.
      const d = nominal.stageDutyCycle;
      const secondaryV =
        (output.voltageV + (1 - d) * (model.forwardVoltageV + model.resistanceOhm * io) + rl * io) /
          d +
        model.forwardVoltageV +
        (rw + model.resistanceOhm) * io;
      choices.outputTurnsRatios[k] = nominal.primaryVoltageV / secondaryV;
    });
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

/** Half-width of the bracket around the previous pass's turns ratio, relative. */
const TURNS_BRACKET = 1e-3;

/**
 * Returns the turns ratio where `voltageAt` (the first output's error, V) is zero, by Brent's
 * method over 0.5–1.001 of the lossless ratio (drops that need less than half of it are not a
 * workable design); NaN when that range holds no root. From the second pass on, the choices have
 * barely moved, so a bracket of ±0.1 % around the previous pass's ratio (inside that range) is
 * tried first: it saves about half the trial steady states.
 */
function turnsRatioRoot(
  voltageAt: (n: number) => number,
  losslessN: number,
  previousN: number | undefined,
): number {
  const lo = losslessN * TURNS_SEARCH_FLOOR;
  const hi = losslessN * TURNS_SEARCH_CEILING;
  const options = { absoluteTolerance: 1e-12 * losslessN };
  if (previousN !== undefined) {
    const narrowLo = Math.max(lo, previousN * (1 - TURNS_BRACKET));
    const narrowHi = Math.min(hi, previousN * (1 + TURNS_BRACKET));
    const n = narrowLo < narrowHi ? brentRoot(voltageAt, narrowLo, narrowHi, options) : NaN;
    if (Number.isFinite(n)) return n;
  }
  return brentRoot(voltageAt, lo, hi, options);
}
