import type { OutputStage } from '../buck-derived/output-stage.js';
import {
  lightLoadPoint,
  type DoubleEndedStagePoint,
  type NodeCapacitance,
} from './light-load-point.js';
import {
  referredOutputs,
  stageDrops,
  type ReferredOutputs,
  type StageDrops,
} from './referred-outputs.js';
import { ringedOutputs } from './several-outputs-ring.js';

/**
 * The outputs of a double-ended converter as the shared fall sees them (SI units): each stage,
 * its turns ratio n_k (primary over secondary turns) and the primary's magnetizing inductance.
 */
export interface SeveralOutputs {
  stages: readonly OutputStage[];
  turnsRatios: readonly number[];
  magnetizingInductanceH: number;
}

/**
 * Returns each output's steady state over half a period (duty cycle D over the half, primary
 * voltage Vp, half-period Th) when the outputs share the fall of the magnetizing current at light
 * load, or undefined where there is no shared fall (the plain stages then answer, unchanged) or
 * where an output's own current would leave the shape this model assumes.
 *
 * While the secondaries freewheel every winding sits at zero and the outputs' rectifiers carry
 * the magnetizing current between them: ampere-turn balance with the primary open gives
 * Im = Σ_k (i_ak − i_bk)/n_k, and output k can carry at most IL_k/n_k of it. Which output carries
 * how much is not fixed while the windings sit at zero, and does not matter to the inductor
 * currents. Once Σ_k IL_k/n_k falls to Im, every output has one rectifier off and the primary
 * winding leaves zero at v: Lm·dIm/dt = −v, L_k·dIL_k/dt = v/n_k − (Vo_k + Vf_k) and
 * Im = Σ_k IL_k/n_k, so Σ_k IL_k/n_k falls as one inductor Leq = 1/Σ_k 1/(n_k²·L_k) (the outputs
 * referred to the primary, in parallel) into Eeq = Leq·Σ_k (Vo_k + Vf_k)/(n_k·L_k), in series
 * with Lm; v = Lm·Eeq/(Leq + Lm). That is the one-output shared fall of `lightLoadPoint` for an
 * equivalent output, referred here to output 0's secondary (so that its winding voltage and
 * magnetizing currents read as output 0's): the equivalent's current is Σ_k (n0/n_k)·IL_k, its
 * inductance Leq/n0², its drops the same Leq-weighted sums of each output's drops (referred), and
 * its load Σ_k (n0/n_k)·Io_k. Its Vo is solved by charge balance as for one output.
 *
 * Each output then follows the common winding voltage (Vp/n_k on, zero, then v/n_k):
 * volt-second balance over the half gives its Vo, and charge balance its valley, exactly while
 * every output conducts through the half (the equivalent's valley above zero). Where the
 * equivalent falls to zero before the half ends (discontinuous conduction), each output is taken
 * to reach zero with it and its Vo is set by its own charge balance over that shape: exact where
 * the outputs' referred currents keep their proportions (an output's inductance chosen for the
 * same relative ripple, and drops in proportion to the voltage), otherwise an estimate. An
 * output whose current would reach zero before the shared fall, or whose valley would lie below
 * zero, leaves this model: undefined. With the switch-node capacitance `node` (referred to output
 * 0's secondary) the equivalent's fall starts with the node ring (`lightLoadPoint`), and the
 * outputs follow it (`ringedOutputs`) where each conducts through it.
 * ref: Mohan, Undeland, Robbins, 3rd ed. (from memory), §10-5 and §10-4-2 (the magnetizing
 * current through freewheeling rectifiers); Erickson & Maksimović, 2nd ed. (from memory), §2.3
 * (volt-second and charge balance) and §6.3 (several outputs referred to one winding).
 */
export function severalOutputsFall(
  outputs: SeveralOutputs,
  dutyCycle: number,
  primaryVoltageV: number,
  halfS: number,
  previous: readonly DoubleEndedStagePoint[],
  node?: NodeCapacitance,
): DoubleEndedStagePoint[] | undefined {
  const { stages, turnsRatios } = outputs;
  const n0 = turnsRatios[0] ?? 1;
  const referred = referredOutputs(stages, turnsRatios, n0);
  if (referred === undefined) return undefined;
  const secondaryVoltageV = primaryVoltageV / n0;
  const referredMagnetizingH = outputs.magnetizingInductanceH / (n0 * n0);
  const hintV = equivalentVoltageHint(previous, referred);
  const hasNode = node !== undefined && node.capacitanceF > 0;
  let equivalent = lightLoadPoint(
    referred.stage,
    dutyCycle,
    secondaryVoltageV,
    halfS,
    referredMagnetizingH,
    hintV,
    hasNode ? node : undefined,
  );
  if (equivalent.sharedFall?.ring !== undefined) {
    const ringed = ringedOutputs(stages, referred, equivalent, secondaryVoltageV, dutyCycle);
    if (ringed !== undefined) return ringed;
    equivalent = lightLoadPoint(
      referred.stage,
      dutyCycle,
      secondaryVoltageV,
      halfS,
      referredMagnetizingH,
      hintV,
    );
  }
  const fall = equivalent.sharedFall;
  if (fall === undefined) return undefined;
  const isContinuous = equivalent.mode === 'ccm';
  const frame: HalfFrame = {
    onS: dutyCycle * halfS,
    firstS: (fall.startFraction - dutyCycle) * halfS,
    sharedS: (fall.endFraction - fall.startFraction) * halfS,
    halfS,
  };
  const points: DoubleEndedStagePoint[] = [];
  for (let k = 0; k < stages.length; k++) {
    const stage = stages[k] as OutputStage;
    const c = n0 / (turnsRatios[k] ?? 1);
    const drops = stageDrops(stage);
    // Output k's winding: Vp/n_k while driven, v/n_k in the shared fall (referred: times c).
    const winding = { onV: (c * primaryVoltageV) / n0, sharedV: c * fall.windingVoltageV };
    const shape = isContinuous
      ? continuousShape(stage, drops, winding, frame)
      : discontinuousShape(stage, drops, winding, frame);
    if (shape === undefined) return undefined;
    points.push({
      mode: equivalent.mode,
      voltageV: shape.voltageV,
      valleyA: shape.valleyA,
      peakA: shape.peakA,
      freewheelDutyCycle: equivalent.freewheelDutyCycle,
      onMeanA: (shape.valleyA + shape.peakA) / 2,
      sharedFall: {
        magnetizingStartA: fall.magnetizingStartA / c,
        magnetizingEndOfOnA: fall.magnetizingEndOfOnA / c,
        startA: shape.startA,
        endA: isContinuous ? shape.valleyA : 0,
        startFraction: fall.startFraction,
        endFraction: fall.endFraction,
        windingVoltageV: winding.sharedV,
        freewheelMagnetizingA: shape.startA,
      },
    });
  }
  return points;
}

/** The intervals of the half: on, freewheeling before the shared fall, the shared fall, s. */
interface HalfFrame {
  onS: number;
  firstS: number;
  sharedS: number;
  halfS: number;
}

/** One output's voltage and current over the half, V and A. */
interface OutputShape {
  voltageV: number;
  valleyA: number;
  peakA: number;
  /** Inductor current as the shared fall starts. */
  startA: number;
}

/** The equivalent's Vo from the last pass's outputs (Σ_k weight·Vo_k/c_k), where they shared a fall. */
function equivalentVoltageHint(
  previous: readonly DoubleEndedStagePoint[],
  referred: ReferredOutputs,
): number | undefined {
  if (previous.length !== referred.weights.length) return undefined;
  let voltageV = 0;
  for (let k = 0; k < previous.length; k++) {
    const point = previous[k] as DoubleEndedStagePoint;
    if (point.sharedFall === undefined) return undefined;
    voltageV +=
      ((referred.weights[k] as number) * point.voltageV) / (referred.factors[k] as number);
  }
  return voltageV;
}

/**
 * Every output conducting through the half: Vo from volt-seconds,
 * Th·Vo = ton·(Vs − Von) + tshared·(v − Von) − tfirst·Voff, and the valley from the half's
 * charge, Th·Io.
 */
function continuousShape(
  stage: OutputStage,
  drops: StageDrops,
  winding: { onV: number; sharedV: number },
  f: HalfFrame,
): OutputShape | undefined {
  const voltageV =
    (f.onS * (winding.onV - drops.onV) +
      f.sharedS * (winding.sharedV - drops.onV) -
      f.firstS * drops.offV) /
    f.halfS;
  const s = relativeShape(stage, drops, winding, f, voltageV, 'free');
  const valleyA = stage.loadA - s.chargeAS / f.halfS;
  if (!(valleyA >= 0) || !(s.startA + valleyA >= 0)) return undefined;
  return { voltageV, valleyA, peakA: s.peakA + valleyA, startA: s.startA + valleyA };
}

/**
 * The equivalent reaching zero before the half's end: each output from zero, to zero with it at
 * the shared fall's end, its Vo from its own charge (the charge is linear in Vo).
 */
function discontinuousShape(
  stage: OutputStage,
  drops: StageDrops,
  winding: { onV: number; sharedV: number },
  f: HalfFrame,
): OutputShape | undefined {
  const at0 = relativeShape(stage, drops, winding, f, 0, 'zero');
  const at1 = relativeShape(stage, drops, winding, f, 1, 'zero');
  const perVolt = at1.chargeAS - at0.chargeAS;
  if (!(perVolt < 0)) return undefined;
  const voltageV = (stage.loadA * f.halfS - at0.chargeAS) / perVolt;
  const s = relativeShape(stage, drops, winding, f, voltageV, 'zero');
  if (!(voltageV > 0) || !(s.startA >= 0)) return undefined;
  return { voltageV, valleyA: 0, peakA: s.peakA, startA: s.startA };
}

/**
 * The output's current over the half from a valley of zero at a trial Vo: its peak, its value
 * as the shared fall starts and the charge ∫IL dt over the half, A and A·s. `end`: the shared
 * fall runs at the output's own slope (`free`) or ends at zero (`zero`).
 */
function relativeShape(
  stage: OutputStage,
  drops: StageDrops,
  winding: { onV: number; sharedV: number },
  f: HalfFrame,
  voltageV: number,
  end: 'free' | 'zero',
): { peakA: number; startA: number; chargeAS: number } {
  const l = stage.inductanceH;
  const peakA = ((winding.onV - drops.onV - voltageV) * f.onS) / l;
  const startA = peakA - ((voltageV + drops.offV) * f.firstS) / l;
  const endA =
    end === 'zero' ? 0 : startA + ((winding.sharedV - drops.onV - voltageV) * f.sharedS) / l;
  const chargeAS =
    (peakA / 2) * f.onS + ((peakA + startA) / 2) * f.firstS + ((startA + endA) / 2) * f.sharedS;
  return { peakA, startA, chargeAS };
}
