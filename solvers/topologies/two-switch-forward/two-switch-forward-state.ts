import type { ForwardDesign, ResetWindingForwardDesign } from '../../design/design-schema.js';
import { rectifierModel } from '../../devices/rectifier-model.js';
import { brentRoot } from '../../root-finding/brent-root.js';
import type { Spec } from '../../spec/spec-schema.js';
import {
  outputStagePoint,
  type OutputStage,
  type OutputStagePoint,
} from '../buck-derived/output-stage.js';
import type { OperatingCorner } from '../topology.js';
import { SWING_HOLD, turnOffSwingFraction } from '../buck-derived/turn-off-swing.js';
import { completeForwardState, forwardRing, forwardRingEnds } from './complete-forward-state.js';
import type { MagnetizingRing, RingEnds } from './magnetizing-ring.js';
import type { ForwardEventPeriod } from './light-load-period.js';
import { eventPeriodApplies, lightLoadState } from './light-load-state.js';
import {
  continuousOutputVoltageAt,
  continuousRegulatedState,
  continuousStateAt,
} from './two-switch-forward-continuous-state.js';

/** The two-switch forward at one corner, as the steady state sees it (SI units). */
export interface TwoSwitchForwardCircuit {
  inputVoltageV: number;
  periodS: number;
  magnetizingInductanceH: number;
  /** Primary-referred leakage inductance, H. */
  leakageInductanceH: number;
  /** Both switches' on-resistance plus the primary winding resistance, Ω. */
  primaryLoopResistanceOhm: number;
  primaryResistanceOhm: number;
  /**
   * Capacitance the winding sees at turn-off, F: both switches' in series (two-switch), or the one
   * switch's; 0 leaves the turn-off swing out.
   */
  turnOffCapacitanceF: number;
  /** Forward drop of each clamp diode (two-switch) or of the reset diode, V. */
  clampDiodeV: number;
  /** How the core resets: through two clamp diodes at −Vin, or a reset winding of Nr/Np. */
  reset: ForwardReset;
  turnsRatios: readonly number[];
  stages: readonly OutputStage[];
}

/** The core reset of a forward: two clamp diodes (two-switch forward) or a reset winding. */
export type ForwardReset =
  { kind: 'clamp-diodes' } | { kind: 'reset-winding'; resetTurnsRatio: number };

/** The choices of either forward; the reset-winding forward adds its Nr/Np. */
export type AnyForwardChoices = ForwardDesign['choices'] | ResetWindingForwardDesign['choices'];

/** The periodic steady state at one duty cycle. */
export interface TwoSwitchForwardState {
  dutyCycle: number;
  /**
   * Turn-on commutation over the period: the switch current rises through the leakage to the
   * reflected valley current while both rectifiers conduct and the winding is held at zero.
   */
  commutationFraction: number;
  /**
   * Turn-off swing over the period: after the gate turns off, the primary current carries the
   * switch node until the winding reaches zero (C·Vp/(I·T), {@link turnOffSwingFraction}).
   */
  turnOffSwingFraction: number;
  /**
   * The on-interval the stages and Lm see at the on-voltage: D − commutation + swing/2 (the
   * swing's linear fall from Vp to zero counts half).
   */
  stageDutyCycle: number;
  /**
   * Voltage across the magnetizing inductance (the ideal winding) during the on-interval, V: the
   * input less the resistive drops at the mean current and the leakage's Llk·di/dt.
   */
  primaryVoltageV: number;
  /** Magnetizing current at the swing's end (its peak), A: the start plus Vp·D'·T/Lm. */
  magnetizingPeakA: number;
  /**
   * Magnetizing current at turn-on, A: zero or negative, what the ring of Lm with the node
   * capacitance leaves after the reset ({@link magnetizingRing}).
   */
  magnetizingStartA: number;
  /** The ring of Lm with the node capacitance from the swing's end to the next turn-on. */
  ring: MagnetizingRing;
  /**
   * Largest magnitude of the reversed primary winding voltage, V: the clamp's (with its
   * resistive drop), or the ring's peak I1·Z short of it.
   */
  resetVoltageV: number;
  /** From the gate's turn-off until the magnetizing current is zero: swing, then the reset. */
  resetDutyCycle: number;
  points: OutputStagePoint[];
  /**
   * At light load (an output inductor discontinuous), the event period this state was solved from
   * (`light-load-state.ts`); omitted where the plain model above holds.
   */
  lightLoad?: ForwardEventPeriod;
  /**
   * Where the event period applied but its solve did not converge, so the plain model was kept:
   * why, for the corner's `modelFallback`.
   */
  modelFallback?: string;
}

/** The corner's `modelFallback` where the forward's event solve did not converge. */
export const FORWARD_EVENT_FALLBACK =
  'The light-load event solve did not converge at this corner, so the plain model was kept (the output inductor discontinuous, the magnetizing ring after the reset left out); at 10 % load and below its output can be 2–20 % under a circuit simulation’s.';

/** Default copper resistance of an output inductor at 20 °C, Ω, when the spec gives none. */
export const INDUCTOR_RESISTANCE_DEFAULT_OHM = 0.01;
/** Default clamp diode drop, V (the spec's description states it). */
export const CLAMP_DIODE_DEFAULT_V = 0.8;

/** Returns the circuit of `corner`: the spec's devices, the chosen parts, the corner's load. */
export function twoSwitchForwardCircuit(
  spec: Spec,
  choices: AnyForwardChoices,
  corner: OperatingCorner,
): TwoSwitchForwardCircuit {
  const reset: ForwardReset =
    'resetTurnsRatio' in choices
      ? { kind: 'reset-winding', resetTurnsRatio: choices.resetTurnsRatio }
      : { kind: 'clamp-diodes' };
  const switchCount = reset.kind === 'clamp-diodes' ? 2 : 1;
  return {
    reset,
    inputVoltageV: corner.inputVoltageV,
    periodS: 1 / spec.switchingFrequencyHz,
    magnetizingInductanceH: choices.magnetizingInductanceH,
    leakageInductanceH: choices.leakageInductanceH,
    primaryLoopResistanceOhm:
      switchCount * spec.primarySwitch.onResistanceOhm + choices.primaryResistanceOhm,
    primaryResistanceOhm: choices.primaryResistanceOhm,
    turnOffCapacitanceF: spec.primarySwitch.outputCapacitanceF / switchCount,
    clampDiodeV: spec.primaryClampDiode?.forwardVoltageV ?? CLAMP_DIODE_DEFAULT_V,
    turnsRatios: choices.outputTurnsRatios,
    stages: spec.outputs.map((output, k) => ({
      loadA: output.currentA * corner.loadFraction,
      inductanceH: choices.outputInductancesH[k] ?? 0,
      inductorResistanceOhm: choices.outputInductorResistancesOhm[k] ?? 0,
      windingResistanceOhm: choices.outputWindingResistancesOhm[k] ?? 0,
      rectifier: rectifierModel(output.rectifier),
    })),
  };
}

/**
 * Returns the steady state at duty cycle D: the primary voltage Vin − (k·Rds + Rp)·Ion (k switches) with the
 * mean on-interval primary current Ion = Σ ILon,k/nk + Im,pk/2 (a fixed point, since the stages
 * depend on it), Im,pk = Vp·D·T/Lm, and the reset at Vr: through both clamp diodes at
 * Vin + 2·Vf + Rp·Im, or through the reset winding at (Vin + Vf)·Np/Nr (volt-second balance on
 * Lm: Dr = Lm·Im,pk/(Vr·T)). When every stage conducts continuously the fixed point is solved in
 * closed form; otherwise by direct iteration.
 */
export function twoSwitchForwardStateAt(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
): TwoSwitchForwardState {
  return continuousStateAt(circuit, dutyCycle) ?? iteratedStateAt(circuit, dutyCycle);
}

/**
 * The first output's voltage (V) of {@link twoSwitchForwardStateAt}'s state, without its ring
 * (the same number: the ring only completes the state): what the duty-cycle searches read on
 * their trial steps (the ring behind the leakage's spike costs root searches).
 */
export function forwardOutputVoltageAt(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
): number {
  const continuous = continuousOutputVoltageAt(circuit, dutyCycle);
  if (continuous !== undefined) return continuous;
  return iteratedSolve(circuit, dutyCycle).points[0]?.voltageV ?? 0;
}

/** The steady state by direct iteration of the primary voltage and the commutation. */
function iteratedStateAt(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
): TwoSwitchForwardState {
  const { primaryV, points, commutation, swing } = iteratedSolve(circuit, dutyCycle);
  const { periodS, magnetizingInductanceH: lm } = circuit;
  const effectiveDuty = Math.max(dutyCycle - commutation + swing / 2, 1e-9);
  const rampA = (Math.max(0, primaryV) * effectiveDuty * periodS) / lm;
  let reflectedPeakA = 0;
  for (let k = 0; k < points.length; k++) {
    reflectedPeakA += (points[k]?.peakA ?? 0) / (circuit.turnsRatios[k] ?? 1);
  }
  return completeForwardState(
    circuit,
    dutyCycle,
    { commutation, swing },
    primaryV,
    forwardRing(circuit, dutyCycle, swing, rampA, reflectedPeakA),
    points,
  );
}

/** {@link iteratedStateAt}'s settled primary voltage, stage points, commutation and swing. */
function iteratedSolve(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
): { primaryV: number; points: OutputStagePoint[]; commutation: number; swing: number } {
  const { inputVoltageV: vin, periodS, magnetizingInductanceH: lm } = circuit;
  let primaryV = vin;
  let points: OutputStagePoint[] = [];
  let commutation = 0;
  let swing = 0;
  let previousV = primaryV;
  let previousGapV = 0;
  for (let pass = 0; pass < 100; pass++) {
    // The stages and Lm see the winding voltage only after the turn-on commutation, and half of
    // the turn-off swing.
    const effectiveDuty = Math.max(dutyCycle - commutation + swing / 2, 1e-9);
    points = circuit.stages.map((stage, k) =>
      outputStagePoint(stage, effectiveDuty, primaryV / (circuit.turnsRatios[k] ?? 1), periodS),
    );
    const rampA = (Math.max(0, primaryV) * effectiveDuty * periodS) / lm;
    let reflectedA = 0;
    let reflectedValleyA = 0;
    let reflectedPeakA = 0;
    let reflectedSlopeAPerS = rampA / (effectiveDuty * periodS);
    points.forEach((point, k) => {
      const n = circuit.turnsRatios[k] ?? 1;
      reflectedA += point.onMeanA / n;
      reflectedValleyA += point.valleyA / n;
      reflectedPeakA += point.peakA / n;
      reflectedSlopeAPerS += (point.peakA - point.valleyA) / (effectiveDuty * periodS * n);
    });
    const ring = forwardRingEnds(circuit, dutyCycle, swing, rampA, reflectedPeakA, ITERATION_RING);
    // The leakage in series takes Llk·di/dt of the rising primary current: a divider with the
    // reflected output inductances, so the winding (and Lm) sees that much less.
    const leakageDropV = circuit.leakageInductanceH * reflectedSlopeAPerS;
    // The magnetizing current's mean over the on-interval: its start plus half the ramp.
    const nextV =
      vin -
      circuit.primaryLoopResistanceOhm * (reflectedA + ring.startA + rampA / 2) -
      leakageDropV;
    // tc = Llk·ΔI/Vin (Mohan, Undeland, Robbins, 3rd ed. (from memory), §5-3, commutation
    // through a series inductance), held below the on-time: the switch current rises from zero
    // to the reflected valley plus the magnetizing start.
    const nextCommutation = Math.min(
      (circuit.leakageInductanceH * Math.max(0, reflectedValleyA + ring.startA)) / (vin * periodS),
      0.9 * dutyCycle,
    );
    const nextSwing = turnOffSwingFraction(
      circuit.turnOffCapacitanceF,
      primaryV,
      ring.turnOffA + reflectedPeakA,
      periodS,
      SWING_HOLD * (1 - effectiveDuty),
    );
    const isSettled =
      Math.abs(nextV - primaryV) <= 1e-13 * vin &&
      Math.abs(nextCommutation - commutation) <= 1e-13 &&
      Math.abs(nextSwing - swing) <= 1e-13;
    if (isSettled) {
      primaryV = nextV;
      commutation = nextCommutation;
      swing = nextSwing;
      break;
    }
    // While the commutation holds still, a secant step on Vp − G(Vp) over the last two passes
    // (the direct step G(Vp) otherwise, or when the secant is not usable) settles in about half
    // the passes.
    const gapV = nextV - primaryV;
    const secantV = primaryV - (gapV * (primaryV - previousV)) / (gapV - previousGapV);
    const isSecant =
      pass > 0 &&
      nextCommutation === commutation &&
      nextSwing === swing &&
      secantV > 0 &&
      Number.isFinite(secantV);
    previousV = primaryV;
    previousGapV = gapV;
    primaryV = isSecant ? secantV : nextV;
    commutation = nextCommutation;
    swing = nextSwing;
  }
  return { primaryV, points, commutation, swing };
}

/** Scratch of {@link iteratedStateAt}'s trial rings (read within the pass). */
const ITERATION_RING: RingEnds = {
  startA: NaN,
  turnOffA: NaN,
  ringEndS: NaN,
  reachesClamp: false,
  isCut: false,
};

/** Largest duty cycle the solver searches; beyond it the output is not reachable. */
export const DUTY_CYCLE_SEARCH_MAX = 0.999;

/**
 * Returns the steady state whose first output sits at `regulatedV` (V), or undefined when even
 * D = 0.999 falls short. The duty cycle is solved directly when every stage is in CCM there
 * ({@link continuousRegulatedState}), otherwise found by Brent's method.
 */
export function solveTwoSwitchForward(
  circuit: TwoSwitchForwardCircuit,
  regulatedV: number,
): TwoSwitchForwardState | undefined {
  // A CCM solution inside the searched duty cycles is reachable by construction, so the check at
  // D = 0.999 (a steady state whose ring the turn-on cuts, the dearest to solve) comes after it.
  const continuous = continuousRegulatedState(circuit, regulatedV, DUTY_CYCLE_SEARCH_MAX);
  if (continuous !== undefined) {
    // Continuous, but the inductors' referred valley below the magnetizing current the ring's
    // return leaves circulating: the event period (light-load-state.ts, `eventPeriodApplies`);
    // where its solve does not converge the continuous state stands, as before.
    if (!eventPeriodApplies(circuit, continuous)) return continuous;
    return lightLoadState(circuit, regulatedV, continuous) ?? continuous;
  }
  if (regulationError(circuit, regulatedV, DUTY_CYCLE_SEARCH_MAX) < 0) return undefined;
  const d = brentRoot((x) => regulationError(circuit, regulatedV, x), 1e-9, DUTY_CYCLE_SEARCH_MAX, {
    absoluteTolerance: 1e-13,
  });
  if (!Number.isFinite(d)) return undefined;
  const plain = twoSwitchForwardStateAt(circuit, d);
  // A discontinuous output inductor meets the ring's return: the event period (every output).
  if (!eventPeriodApplies(circuit, plain)) return plain;
  return (
    lightLoadState(circuit, regulatedV, plain) ?? {
      ...plain,
      modelFallback: FORWARD_EVENT_FALLBACK,
    }
  );
}

/** The first output's voltage at duty cycle D less its set point, V. */
function regulationError(
  circuit: TwoSwitchForwardCircuit,
  regulatedV: number,
  dutyCycle: number,
): number {
  return forwardOutputVoltageAt(circuit, dutyCycle) - regulatedV;
}
