import {
  outputStagePoint,
  type OutputStage,
  type OutputStagePoint,
} from '../buck-derived/output-stage.js';
import { SWING_HOLD, turnOffSwingFraction } from '../buck-derived/turn-off-swing.js';
import { completeForwardState } from './complete-forward-state.js';
import type { TwoSwitchForwardCircuit, TwoSwitchForwardState } from './two-switch-forward-state.js';

/**
 * The steady state when every stage is in CCM, or undefined when one is not (or the primary
 * voltage would not be positive). In CCM each stage's ripple is D'·(1 − D')·(Vs − Rw·Io)·T/L
 * (D' = D − tc + ts/2 the stage duty cycle after the commutation tc and with half the turn-off
 * swing ts) and its on-interval mean current is Io, so for a given shift s = tc − ts/2 the
 * primary voltage of the direct iteration's update is affine in itself and solved directly
 * ({@link continuousPrimaryV}); the shift, a smooth function of itself, is then found by the
 * secant method on s − (tc(s) − ts(s)/2), started as the direct iteration.
 */
export function continuousStateAt(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
): TwoSwitchForwardState | undefined {
  let previous = 0;
  let previousGap = continuousEdges(circuit, dutyCycle, previous).shift - previous;
  if (Number.isNaN(previousGap)) return undefined;
  let shift = previous + previousGap;
  let isSettled = Math.abs(previousGap) <= COMMUTATION_TOLERANCE;
  for (let pass = 0; pass < 100 && !isSettled; pass++) {
    const next = continuousEdges(circuit, dutyCycle, shift).shift;
    if (Number.isNaN(next)) return undefined;
    const gap = next - shift;
    isSettled = Math.abs(gap) <= COMMUTATION_TOLERANCE;
    // Secant step on s − (tc − ts/2); a direct step where the secant has no slope or leaves
    // the stage duty cycle outside (0, 1) or the commutation hold 0.9·D.
    const secant = shift - (gap * (shift - previous)) / (gap - previousGap);
    previous = shift;
    previousGap = gap;
    const isUsable = secant <= 0.9 * dutyCycle && dutyCycle - secant < 1;
    shift = isSettled || !isUsable ? next : secant;
  }
  if (!isSettled) return undefined;
  const edges = continuousEdges(circuit, dutyCycle, shift);
  return continuousStateFrom(circuit, dutyCycle, edges);
}

/** The CCM steady state at duty cycle D with its commutation and swing, or undefined if not CCM. */
function continuousStateFrom(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
  edges: { commutation: number; swing: number },
): TwoSwitchForwardState | undefined {
  const { periodS, stages, turnsRatios } = circuit;
  const effectiveDuty = Math.max(dutyCycle - edges.commutation + edges.swing / 2, 1e-9);
  const primaryV = continuousPrimaryV(circuit, effectiveDuty);
  if (!(primaryV > 0)) return undefined;
  const points: OutputStagePoint[] = [];
  for (let k = 0; k < stages.length; k++) {
    const point = outputStagePoint(
      stages[k] as OutputStage,
      effectiveDuty,
      primaryV / (turnsRatios[k] ?? 1),
      periodS,
    );
    if (point.mode !== 'ccm' || !Number.isFinite(point.peakA)) return undefined;
    points.push(point);
  }
  const magnetizingPeakA = (primaryV * effectiveDuty * periodS) / circuit.magnetizingInductanceH;
  return completeForwardState(circuit, dutyCycle, edges, primaryV, magnetizingPeakA, points);
}

/** Settling tolerance on the commutation fraction, as in the direct iteration. */
const COMMUTATION_TOLERANCE = 1e-13;

/**
 * The primary winding voltage (V) when every stage is in CCM at duty cycle D' (after the
 * commutation): the solution of
 * Vp = Vin − R·(Σ Io/n + Vp·D'·T/(2·Lm)) − Llk·(Vp/Lm + Σ (1 − D')·(Vp/n − Rw·Io)/(L·n)).
 */
function continuousPrimaryV(circuit: TwoSwitchForwardCircuit, effectiveDuty: number): number {
  const { inputVoltageV: vin, periodS, magnetizingInductanceH: lm, stages, turnsRatios } = circuit;
  const llk = circuit.leakageInductanceH;
  const loopOhm = circuit.primaryLoopResistanceOhm;
  const offFraction = 1 - effectiveDuty;
  let loadSum = 0;
  let slopeConstant = 0;
  let slopePerVolt = 0;
  for (let k = 0; k < stages.length; k++) {
    const stage = stages[k] as OutputStage;
    const n = turnsRatios[k] ?? 1;
    const ln = stage.inductanceH * n;
    loadSum += stage.loadA / n;
    slopeConstant += (offFraction * stage.windingResistanceOhm * stage.loadA) / ln;
    slopePerVolt += offFraction / (ln * n);
  }
  return (
    (vin - loopOhm * loadSum + llk * slopeConstant) /
    (1 + (loopOhm * effectiveDuty * periodS) / (2 * lm) + llk / lm + llk * slopePerVolt)
  );
}

/**
 * The commutation tc (held below 0.9·D) and turn-off swing ts that a trial shift s = tc − ts/2
 * implies when every stage is in CCM, and their own shift; NaN when the primary voltage of
 * {@link continuousPrimaryV} is not positive.
 */
function continuousEdges(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
  shift: number,
): { commutation: number; swing: number; shift: number } {
  const effectiveDuty = Math.max(dutyCycle - shift, 1e-9);
  const primaryV = continuousPrimaryV(circuit, effectiveDuty);
  if (!(primaryV > 0)) return { commutation: NaN, swing: NaN, shift: NaN };
  const sums = reflectedSums(circuit, effectiveDuty, primaryV);
  const commutation = Math.min(commutationOf(circuit, sums), 0.9 * dutyCycle);
  const swing = swingOf(circuit, effectiveDuty, primaryV, sums);
  return { commutation, swing, shift: commutation - swing / 2 };
}

/**
 * Σ Iv,k/nk and Σ Ipk,k/nk (A) when every stage is in CCM at stage duty cycle D' and primary
 * voltage Vp (V): Io ∓ ΔIL/2.
 */
function reflectedSums(
  circuit: TwoSwitchForwardCircuit,
  effectiveDuty: number,
  primaryV: number,
): { valleyA: number; peakA: number } {
  const { periodS, stages, turnsRatios } = circuit;
  let valleyA = 0;
  let peakA = 0;
  for (let k = 0; k < stages.length; k++) {
    const stage = stages[k] as OutputStage;
    const n = turnsRatios[k] ?? 1;
    const rippleA =
      (effectiveDuty *
        (1 - effectiveDuty) *
        (primaryV / n - stage.windingResistanceOhm * stage.loadA) *
        periodS) /
      stage.inductanceH;
    valleyA += (stage.loadA - rippleA / 2) / n;
    peakA += (stage.loadA + rippleA / 2) / n;
  }
  return { valleyA, peakA };
}

/** The turn-on commutation over the period, Llk·Σ Iv,k/nk / (Vin·T). */
function commutationOf(circuit: TwoSwitchForwardCircuit, sums: { valleyA: number }): number {
  return (
    (circuit.leakageInductanceH * Math.max(0, sums.valleyA)) /
    (circuit.inputVoltageV * circuit.periodS)
  );
}

/** The turn-off swing over the period at the turn-off current Vp·D'·T/Lm + Σ Ipk,k/nk. */
function swingOf(
  circuit: TwoSwitchForwardCircuit,
  effectiveDuty: number,
  primaryV: number,
  sums: { peakA: number },
): number {
  const { periodS } = circuit;
  const magnetizingPeakA = (primaryV * effectiveDuty * periodS) / circuit.magnetizingInductanceH;
  return turnOffSwingFraction(
    circuit.turnOffCapacitanceF,
    primaryV,
    magnetizingPeakA + sums.peakA,
    periodS,
    SWING_HOLD * (1 - effectiveDuty),
  );
}

/**
 * Returns the steady state whose first output sits at `regulatedV` (V) when every stage is in
 * CCM there, or undefined when one is not (or the solution leaves the searched duty cycles, or
 * the commutation reaches its 0.9·D hold). In CCM the first output is affine in the stage's duty
 * cycle D': Vo = D'·(Vp/n − Rw·Io) − Vf − (Rd + RL)·Io, so D' = (Vo + Vf + (Rd + RL)·Io) /
 * (Vp/n − Rw·Io), a fixed point through the weak dependence of Vp on D'; the commutation and the
 * turn-off swing that D' implies are then explicit, and D = D' + tc − ts/2.
 */
export function continuousRegulatedState(
  circuit: TwoSwitchForwardCircuit,
  regulatedV: number,
  searchMax: number,
): TwoSwitchForwardState | undefined {
  const { stages, turnsRatios } = circuit;
  const first = stages[0];
  if (first === undefined) return undefined;
  const n = turnsRatios[0] ?? 1;
  const io = first.loadA;
  const offsetV =
    regulatedV +
    first.rectifier.forwardVoltageV +
    (first.rectifier.resistanceOhm + first.inductorResistanceOhm) * io;
  const windingV = first.windingResistanceOhm * io;
  let effectiveDuty = offsetV / (circuit.inputVoltageV / n - windingV);
  let isSettled = false;
  for (let pass = 0; pass < 100 && !isSettled; pass++) {
    const primaryV = continuousPrimaryV(circuit, effectiveDuty);
    const next = offsetV / (primaryV / n - windingV);
    if (!(next > 0 && next < 1)) return undefined;
    isSettled = Math.abs(next - effectiveDuty) <= DUTY_TOLERANCE;
    effectiveDuty = next;
  }
  if (!isSettled) return undefined;
  const primaryV = continuousPrimaryV(circuit, effectiveDuty);
  const sums = reflectedSums(circuit, effectiveDuty, primaryV);
  const commutation = commutationOf(circuit, sums);
  const swing = swingOf(circuit, effectiveDuty, primaryV, sums);
  const dutyCycle = effectiveDuty + commutation - swing / 2;
  if (!(dutyCycle >= 1e-9 && dutyCycle <= searchMax) || commutation >= 0.9 * dutyCycle) {
    return undefined;
  }
  return continuousStateFrom(circuit, dutyCycle, { commutation, swing });
}

/** Settling tolerance on the stage duty cycle D', a little below the duty-cycle search's. */
const DUTY_TOLERANCE = 1e-15;
