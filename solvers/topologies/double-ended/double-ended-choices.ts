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
import { brentRoot } from '../../root-finding/brent-root.js';
import { secantRoot } from '../../root-finding/secant-root.js';
import type { Spec } from '../../spec/spec-schema.js';
import {
  doubleEndedCircuit,
  doubleEndedStateAt,
  leakageKneeDuty,
  stateTurnOffA,
  type DoubleEndedCircuit,
  INDUCTOR_RESISTANCE_DEFAULT_OHM,
  solveDoubleEnded,
  type DoubleEndedChoices,
  type DoubleEndedState,
  withTurnsRatios,
  drivenDuty,
  isPhysicalState,
} from './double-ended-state.js';
import { DOUBLE_ENDED_DUTY_CYCLE_MAX, type PrimaryBridge } from './primary-bridge.js';
import { SECONDARY_ARRANGEMENT_DEFAULT, secondaryStage } from './secondary-stage.js';

/**
 * Magnetizing current peak over the reflected full-load current at the lowest input, when Lm is
 * chosen: 0.1 (common practice: a transformer's magnetizing current is a small fraction of the
 * load current, a few to ten percent; the forward family uses the same rule).
 */
export const MAGNETIZING_CURRENT_RATIO_DEFAULT = 0.1;
/** Output inductor ripple over full-load current at the highest input, when not in the spec. */
export const OUTPUT_RIPPLE_RATIO_DEFAULT = 0.3;

const PASSES = 30;
const TOLERANCE = 1e-10;

/**
 * Chooses what the spec leaves open for a push-pull or bridge: the turns ratio so that the
 * lowest input at full load needs exactly targets.dutyCycleTarget (each switch's on-time over the
 * period) with every drop; Lm so that the magnetizing peak is 0.1 of the reflected load current
 * there; each output inductance so that its ripple at the highest input and full load is the
 * ripple target; the further outputs' turns for their voltage at nominal input and full load;
 * each secondary center-tapped unless the spec says otherwise. A fixed point, as the choices
 * interact.
 */
export function chooseDoubleEnded(spec: Spec, bridge: PrimaryBridge): Result<DoubleEndedChoices> {
  const held = chooseWithKnee(spec, bridge, true);
  // Held below the leakage's knee (`KNEE_MARGIN`) no turns ratio may reach the output (Vo(n)
  // then has a hump the search's bracket misses, or its top is too low): the choice is made
  // again from the start with the target duty cycle as it is, on the knee's flat side.
  if (held.ok || !held.isKneeMet) return held.result;
  return chooseWithKnee(spec, bridge, false).result;
}

/** `chooseDoubleEnded`, the lowest input's duty cycle held below the knee or not. */
function chooseWithKnee(
  spec: Spec,
  bridge: PrimaryBridge,
  isKneeHeld: boolean,
): { result: Result<DoubleEndedChoices>; ok: boolean; isKneeMet: boolean } {
  const lowTrials: TurnsTrials = { last: undefined, isKneeHeld };
  const result = chooseFrom(spec, bridge, lowTrials);
  return { result, ok: result.ok, isKneeMet: lowTrials.isKneeMet === true };
}

/** The choice of `chooseDoubleEnded`, its lowest input's turns-ratio trials in `lowTrials`. */
function chooseFrom(
  spec: Spec,
  bridge: PrimaryBridge,
  lowTrials: TurnsTrials,
): Result<DoubleEndedChoices> {
  const { transformer, targets, limits } = spec;
  const dutyLimit = Math.min(limits.dutyCycleMax, DOUBLE_ENDED_DUTY_CYCLE_MAX);
  const fixedRatios = transformer.outputTurnsRatios;
  const isTurnsFree = transformer.turnsRatio === undefined && fixedRatios === undefined;
  if (isTurnsFree && targets.dutyCycleTarget > dutyLimit) {
    return failure([
      {
        code: 'duty_cycle_limit',
        path: ['targets', 'dutyCycleTarget'],
        constraint: 'dutyCycleTarget <= min(dutyCycleMax, 0.5)',
        quantity: 'dutyCycle',
        required: targets.dutyCycleTarget,
        limit: dutyLimit,
      },
    ]);
  }
  const periodS = 1 / spec.switchingFrequencyHz;
  const vMin = spec.inputVoltageMinV;
  const d0 = targets.dutyCycleTarget;
  const arrangements = spec.outputs.map(
    (o) => o.secondaryArrangement ?? SECONDARY_ARRANGEMENT_DEFAULT,
  );
  // The driven path's forward drop: one rectifier (center-tapped) or two (bridge).
  const onDropsV = spec.outputs.map(
    (output, k) =>
      secondaryStage(arrangements[k] ?? SECONDARY_ARRANGEMENT_DEFAULT, {
        loadA: output.currentA,
        inductanceH: 1,
        inductorResistanceOhm: 0,
        windingResistanceOhm: 0,
        rectifier: rectifierModel(output.rectifier),
      }).rectifier.forwardVoltageV,
  );
  const perTurnV = spec.outputs.map((output, k) => output.voltageV + (onDropsV[k] ?? 0));
  // Lossless CCM: Vo = 2·D·Vd/n (Mohan, Undeland, Robbins, 3rd ed. (from memory), §10-5).
  const losslessN = (2 * d0 * bridge.driveFraction * vMin) / (perTurnV[0] ?? 1);
  const n0 = transformer.turnsRatio ?? fixedRatios?.[0] ?? losslessN;
  const ratioTarget = targets.outputInductorRippleRatioTarget ?? OUTPUT_RIPPLE_RATIO_DEFAULT;
  const choices: DoubleEndedChoices = {
    turnsRatio: n0,
    outputTurnsRatios: spec.outputs.map(
      (_, k) => fixedRatios?.[k] ?? (n0 * (perTurnV[0] ?? 1)) / (perTurnV[k] ?? 1),
    ),
    magnetizingInductanceH: 1,
    leakageInductanceH: 0,
    // First guess: lossless ripple at the highest input, D = d0·Vmin/Vmax; refined below.
    outputInductancesH: spec.outputs.map(
      (output, k) =>
        output.inductanceH ??
        ((perTurnV[k] ?? 1) * (1 - (2 * d0 * vMin) / spec.inputVoltageMaxV) * periodS) /
          (2 * ratioTarget * output.currentA),
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
    secondaryArrangements: arrangements,
    origins: {
      turnsRatio: isTurnsFree ? 'target' : 'spec',
      magnetizingInductanceH: transformer.magnetizingInductanceH === undefined ? 'target' : 'spec',
      leakageInductanceH: transformer.leakageInductanceH === undefined ? 'default' : 'spec',
      outputInductancesH: spec.outputs.map((o) =>
        o.inductanceH === undefined ? 'target' : 'spec',
      ),
      secondaryArrangements: spec.outputs.map((o) =>
        o.secondaryArrangement === undefined ? 'default' : 'spec',
      ),
    },
  };
  // The helpers below are module-level functions, not named closures: under tsx (the service's
  // and the bench's runtime) esbuild's keepNames gives each named closure an
  // Object.defineProperty call, five a choice (two choices an evaluation).
  choices.magnetizingInductanceH =
    transformer.magnetizingInductanceH ??
    (bridge.driveFraction * vMin * d0 * periodS) /
      (2 * MAGNETIZING_CURRENT_RATIO_DEFAULT * reflectedLoadA(spec, choices));
  choices.leakageInductanceH = leakageOf(spec, choices);
  const regulatedV = spec.outputs[0]?.voltageV ?? 0;
  // With the turns ratio fixed, a corner that D = 0.5 cannot regulate is for the corners to
  // report with its numbers; the other choices are made at D = 0.5 there.
  // Each solve starts from the last pass's state at the same input (`warm`): the choices move
  // less from pass to pass, so the duty cycle and the fixed point start close to their roots.
  const mixing: ChoiceMixing = { after: [], residuals: [] };
  let lastHigh: DoubleEndedState | undefined;
  let lastNominal: DoubleEndedState | undefined;
  for (let pass = 0; pass < PASSES; pass++) {
    const before = [
      choices.magnetizingInductanceH,
      ...choices.outputTurnsRatios,
      ...choices.outputInductancesH,
    ];
    if (isTurnsFree) {
      const ratios = choices.outputTurnsRatios.map((n) => n / choices.turnsRatio);
      // Only the turns change during this search: the stages are built once.
      const voltageAt = turnsRatioError(
        choices,
        ratios,
        choiceCircuit(spec, bridge, choices, vMin),
        d0,
        regulatedV,
        lowTrials,
      );
      // Drops that need less than half the lossless turns ratio are not a workable design.
      // Secant steps from the last pass's ratio first (its second point 1e-3 away on the first
      // pass, 1e-6 later, as the ratio settles); Brent's method backs them.
      const lo = losslessN * TURNS_SEARCH_FLOOR;
      // The turn-off swing lengthens the drive by up to half the rest of the half, (1/2 − d0)/2
      // (`turnOffSwingS`), which the drops need not outweigh: the bracket reaches that far.
      const swingRoom =
        spec.primarySwitch.outputCapacitanceF > 0 ? Math.max(0, 0.5 - d0) / (2 * d0) : 0;
      const hi = losslessN * TURNS_SEARCH_CEILING * (1 + swingRoom);
      const tolerance = { absoluteTolerance: 1e-12 * losslessN };
      const start = Math.min(choices.turnsRatio, losslessN);
      const step = pass === 0 ? 1e-3 : 1e-6;
      const fast = secantRoot(voltageAt, start, start * (1 - step), lo, hi, tolerance);
      const n = Number.isFinite(fast) ? fast : brentRoot(voltageAt, lo, hi, tolerance);
      if (!Number.isFinite(n)) return notReached(spec, choices, ratios, vMin, d0, lo, hi, bridge);
      voltageAt(n);
    }
    // With the turns ratio just chosen, the lowest input needs exactly d0: the search's last
    // state is there.
    const low = isTurnsFree
      ? lowTrials.last
      : choiceState(spec, bridge, choices, vMin, regulatedV, isTurnsFree, lowTrials.last);
    if (low === undefined) return notSolved(spec, bridge, choices, 'min', vMin);
    if (!isTurnsFree) lowTrials.last = low;
    if (transformer.magnetizingInductanceH === undefined) {
      choices.magnetizingInductanceH =
        (low.primaryVoltageV * drivenDuty(low) * periodS) /
        (2 * MAGNETIZING_CURRENT_RATIO_DEFAULT * reflectedLoadA(spec, choices));
    }
    choices.leakageInductanceH = leakageOf(spec, choices);
    // The highest input sets the free inductances; nominal input the further outputs' turns.
    const isInductanceFree = spec.outputs.some((o) => o.inductanceH === undefined);
    const high = isInductanceFree
      ? choiceState(spec, bridge, choices, spec.inputVoltageMaxV, regulatedV, isTurnsFree, lastHigh)
      : low;
    const nominal =
      spec.outputs.length > 1
        ? choiceState(
            spec,
            bridge,
            choices,
            spec.inputVoltageNominalV,
            regulatedV,
            isTurnsFree,
            lastNominal,
          )
        : low;
    if (high === undefined) return notSolved(spec, bridge, choices, 'max', spec.inputVoltageMaxV);
    if (nominal === undefined) {
      return notSolved(spec, bridge, choices, 'nominal', spec.inputVoltageNominalV);
    }
    lastHigh = high;
    lastNominal = nominal;
    const stages = choiceCircuit(spec, bridge, choices, spec.inputVoltageNominalV).stages;
    spec.outputs.forEach((output, k) => {
      const stage = stages[k];
      if (stage === undefined) return;
      const io = output.currentA;
      const rl = stage.inductorResistanceOhm;
      const rw = stage.windingResistanceOhm;
      const on = stage.rectifier;
      const off = stage.freewheel ?? on;
      if (output.inductanceH === undefined) {
        // ΔIL = (Vo + Vf + (Rd + RL)·Io)·(1 − 2D)·(T/2)/L at the highest input, full load (CCM),
        // with the freewheeling path's drop.
        const offV = output.voltageV + off.forwardVoltageV + (off.resistanceOhm + rl) * io;
        const d = 2 * drivenDuty(high);
        choices.outputInductancesH[k] = (offV * (1 - d) * (periodS / 2)) / (ratioTarget * io);
      }
      if (k === 0) return;
      // Invert the CCM balance for the secondary voltage this output needs at nominal input.
      const d = 2 * drivenDuty(nominal);
      const secondaryV =
        (output.voltageV + (1 - d) * (off.forwardVoltageV + off.resistanceOhm * io) + rl * io) / d +
        on.forwardVoltageV +
        (rw + on.resistanceOhm) * io;
      if (fixedRatios === undefined)
        choices.outputTurnsRatios[k] = nominal.primaryVoltageV / secondaryV;
    });
    const after = [
      choices.magnetizingInductanceH,
      ...choices.outputTurnsRatios,
      ...choices.outputInductancesH,
    ];
    const residuals = after.map((v, i) => v / (before[i] ?? v) - 1);
    const change = Math.max(...residuals.map(Math.abs));
    if (change <= TOLERANCE) break;
    mixChoices(choices, mixing, after, residuals);
    choices.leakageInductanceH = leakageOf(spec, choices);
  }
  choices.turnsRatio = choices.outputTurnsRatios[0] ?? choices.turnsRatio;
  if (bridge.kind === 'push-pull' && choices.leakageInductanceH > 0) {
    // The RCD clamp from each drain (push-pull-clamp.ts): Vc above the rail, from the spec or
    // the ratio times the other half's voltage, at most the highest input, so that the clamp
    // stays off while the other half is driven. Only where there is leakage, so that a design
    // without it keeps its shape.
    choices.clampVoltageV =
      spec.clamp.voltageV ?? spec.clamp.voltageToReflectedRatio * spec.inputVoltageMaxV;
    choices.origins.clampVoltageV = spec.clamp.voltageV === undefined ? 'default' : 'spec';
  }
  return success(choices);
}

/** Σ Io,k/nk: the load current referred to the primary, A. */
function reflectedLoadA(spec: Spec, choices: DoubleEndedChoices): number {
  return spec.outputs.reduce(
    (sum, o, k) => sum + o.currentA / (choices.outputTurnsRatios[k] ?? 1),
    0,
  );
}

/** The spec's leakage, else its fraction of the chosen magnetizing inductance, H. */
function leakageOf(spec: Spec, choices: DoubleEndedChoices): number {
  const { transformer } = spec;
  return (
    transformer.leakageInductanceH ??
    transformer.leakageInductanceFraction * choices.magnetizingInductanceH
  );
}

/** The circuit at full load and `inputVoltageV` with the choices so far. */
function choiceCircuit(
  spec: Spec,
  bridge: PrimaryBridge,
  choices: DoubleEndedChoices,
  inputVoltageV: number,
): DoubleEndedCircuit {
  return doubleEndedCircuit(spec, bridge, choices, {
    label: 'choice',
    inputVoltageV,
    loadFraction: 1,
  });
}

/**
 * The regulated state at full load and `inputVoltageV` from `warm`; with the turns ratio fixed,
 * the state at the largest duty cycle where none regulates, where that is a steady state at all
 * (`isPhysicalState`): else undefined, as where the turns ratio is free.
 */
function choiceState(
  spec: Spec,
  bridge: PrimaryBridge,
  choices: DoubleEndedChoices,
  inputVoltageV: number,
  regulatedV: number,
  isTurnsFree: boolean,
  warm: DoubleEndedState | undefined,
): DoubleEndedState | undefined {
  const circuit = choiceCircuit(spec, bridge, choices, inputVoltageV);
  const regulated = solveDoubleEnded(circuit, regulatedV, warm);
  if (regulated !== undefined || isTurnsFree) return regulated;
  const atMax = doubleEndedStateAt(circuit, DOUBLE_ENDED_DUTY_CYCLE_MAX, warm);
  return isPhysicalState(circuit, atMax) ? atMax : undefined;
}

/**
 * The choice's failure where no turns ratio in [lo, hi] reaches the first output at the lowest
 * input and the target duty cycle: the most it reaches over that range (Vo(n) has a hump where
 * the drops grow with the reflected current, so not always at the low end). The trials start
 * afresh and are not held below the leakage's knee, so that the figure is at the target duty
 * cycle and the choice's own knee trials (`chooseDoubleEnded`) are left as they were.
 */
function notReached(
  spec: Spec,
  choices: DoubleEndedChoices,
  ratios: readonly number[],
  vMin: number,
  d0: number,
  lo: number,
  hi: number,
  bridge: PrimaryBridge,
): Result<DoubleEndedChoices> {
  const trials: TurnsTrials = { last: undefined, isKneeHeld: false };
  const regulatedV = spec.outputs[0]?.voltageV ?? 0;
  const circuit = choiceCircuit(spec, bridge, choices, vMin);
  const errorAt = turnsRatioError(choices, ratios, circuit, d0, regulatedV, trials);
  // A buck-derived stage's output is at most its secondary's drive voltage, Vd/n.
  const reachedV = highestOutputV(
    (n) => physicalOutputV(errorAt(n) + regulatedV, circuit.driveVoltageV / n),
    lo,
    hi,
  );
  return failure<DoubleEndedChoices>([
    turnsSearchShortfallIssue(
      spec,
      reachedV,
      d0,
      Math.min(spec.limits.dutyCycleMax, DOUBLE_ENDED_DUTY_CYCLE_MAX),
      ' (more with the turn-off swing)',
    ),
  ]);
}

/**
 * The choice's failure where the regulated solve at `inputVoltageV` and full load finds no duty
 * cycle (`solveDoubleEnded`: even D = 0.5 falls short): the first output there at D = 0.5.
 */
function notSolved(
  spec: Spec,
  bridge: PrimaryBridge,
  choices: DoubleEndedChoices,
  input: 'min' | 'nominal' | 'max',
  inputVoltageV: number,
): Result<DoubleEndedChoices> {
  const circuit = choiceCircuit(spec, bridge, choices, inputVoltageV);
  const state = doubleEndedStateAt(circuit, DOUBLE_ENDED_DUTY_CYCLE_MAX);
  const n = choices.outputTurnsRatios[0] ?? choices.turnsRatio;
  const firstStage = circuit.stages[0];
  return failure<DoubleEndedChoices>([
    outputShortfallIssue(spec, {
      input,
      reachedV: physicalOutputV(state.points[0]?.voltageV ?? NaN, circuit.driveVoltageV / n),
      at: 'dutyCycle 0.5',
      path: shortfallPath(spec),
      // Lossless CCM: Vo = 2·D·Vd/n − Vf (Mohan, Undeland, Robbins, 3rd ed. (from memory), §10-5).
      losslessDutyCycle:
        (n * (spec.outputs[0]?.voltageV ?? 0) + n * (firstStage?.rectifier.forwardVoltageV ?? 0)) /
        (2 * circuit.driveVoltageV),
      dutyCycleLimit: Math.min(spec.limits.dutyCycleMax, DOUBLE_ENDED_DUTY_CYCLE_MAX),
    }),
  ]);
}

/** The turns-ratio trials of the choice: the last trial's state, which starts the next one's. */
interface TurnsTrials {
  last: DoubleEndedState | undefined;
  /** Whether the lowest input's duty cycle is held below the leakage's knee (`KNEE_MARGIN`). */
  isKneeHeld: boolean;
  /** Whether a trial met the knee below the target duty cycle. */
  isKneeMet?: boolean;
}

/**
 * The first output's voltage less `regulatedV` (V) at duty cycle `dutyCycle` on `lowCircuit`, as
 * a function of the turns ratio n, which it sets in `choices` (each output's ratio kept in
 * proportion). Each trial's fixed point starts from the last trial's state, kept in `trials`
 * across the choice's passes. A factory, not a named arrow in the choice's pass loop: under tsx
 * (the service's and the bench's runtime) esbuild's keepNames wraps every named arrow in an
 * Object.defineProperty call.
 */
function turnsRatioError(
  choices: DoubleEndedChoices,
  ratios: readonly number[],
  lowCircuit: DoubleEndedCircuit,
  dutyCycle: number,
  regulatedV: number,
  trials: TurnsTrials,
): (n: number) => number {
  return (n) => {
    choices.turnsRatio = n;
    choices.outputTurnsRatios = ratios.map((r) => r * n);
    const circuit = withTurnsRatios(lowCircuit, choices.outputTurnsRatios);
    trials.last = doubleEndedStateAt(circuit, dutyCycle, trials.last);
    // A bridge whose leakage decay would outlast the off-time at the target duty cycle: above
    // that knee the output hardly follows D (`leakageKneeDuty`), so the lowest input is given
    // the knee's duty cycle less a margin instead (continuous in n: the knee follows the
    // turn-off current at the target).
    if (trials.isKneeHeld) {
      const knee = leakageKneeDuty(circuit, stateTurnOffA(circuit, trials.last)) - KNEE_MARGIN;
      if (knee < dutyCycle && knee > 0) {
        trials.isKneeMet = true;
        trials.last = doubleEndedStateAt(circuit, knee, trials.last);
      }
    }
    return (trials.last.points[0]?.voltageV ?? 0) - regulatedV;
  };
}

/**
 * How far below the leakage's knee (`leakageKneeDuty`) the lowest input's duty cycle is put
 * where the knee lies below the target: 0.01 of the period, so that the regulated duty cycle
 * stays where the output follows it (there some 2·Vd/n per unit of D) and a small difference
 * between the choice's and the corner's states cannot move it onto the knee's flat side.
 */
const KNEE_MARGIN = 0.01;

/** The last choice pass's plain update and its residuals (`mixChoices`). */
interface ChoiceMixing {
  after: number[];
  residuals: number[];
}

/**
 * Mixes the choice pass's plain update `after` (Lm, each output's turns ratio, each output
 * inductance) with the last pass's, as the state's fixed point does (one-step Anderson mixing,
 * the secant through the last two passes, in relative units), and writes it into `choices`.
 * The plain passes shrink the change some 8 times each, alternating in sign, so the choice took
 * about 12 passes to settle to 1e-10. The first output's turns ratio is left as its search set
 * it; a step that grew the residual keeps the plain update. Only where the passes start
 * changes: the choice still settles where a plain pass moves nothing by more than 1e-10.
 * ref: D. G. Anderson, J. ACM 12 (1965) 547 (from memory); Walker & Ni, SIAM J. Numer. Anal.
 * 49 (2011) 1715, depth m = 1 (from memory).
 */
function mixChoices(
  choices: DoubleEndedChoices,
  mixing: ChoiceMixing,
  after: readonly number[],
  residuals: readonly number[],
): void {
  const { after: lastAfter, residuals: lastResiduals } = mixing;
  let dot = 0;
  let squared = 0;
  let norm = 0;
  let lastNorm = 0;
  const isComparable = lastResiduals.length === residuals.length;
  for (let i = 0; isComparable && i < residuals.length; i++) {
    const r = residuals[i] ?? 0;
    const dr = r - (lastResiduals[i] ?? 0);
    dot += r * dr;
    squared += dr * dr;
    norm += r * r;
    lastNorm += (lastResiduals[i] ?? 0) ** 2;
  }
  mixing.after = [...after];
  mixing.residuals = [...residuals];
  if (!isComparable || !(norm < lastNorm) || !(squared > 0)) return;
  const gamma = dot / squared;
  const mixed = after.map((v, i) => v - gamma * (v - (lastAfter[i] ?? v)));
  const outputs = choices.outputTurnsRatios.length;
  choices.magnetizingInductanceH = mixed[0] ?? choices.magnetizingInductanceH;
  for (let k = 1; k < outputs; k++) {
    choices.outputTurnsRatios[k] = mixed[1 + k] ?? choices.outputTurnsRatios[k] ?? 1;
  }
  for (let k = 0; k < choices.outputInductancesH.length; k++) {
    choices.outputInductancesH[k] = mixed[1 + outputs + k] ?? choices.outputInductancesH[k] ?? 0;
  }
}
