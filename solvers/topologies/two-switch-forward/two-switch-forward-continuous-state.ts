import {
  outputStagePoint,
  type OutputStage,
  type OutputStagePoint,
} from '../buck-derived/output-stage.js';
import { completeForwardState } from './complete-forward-state.js';
import type { TwoSwitchForwardCircuit, TwoSwitchForwardState } from './two-switch-forward-state.js';

/**
 * The steady state when every stage is in CCM, or undefined when one is not (or the primary
 * voltage would not be positive). In CCM each stage's ripple is D'·(1 − D')·(Vs − Rw·Io)·T/L
 * (D' the duty cycle after the commutation) and its on-interval mean current is Io, so for a
 * given commutation the primary voltage of the direct iteration's update is affine in itself
 * and solved directly ({@link continuousPrimaryV}); the commutation fraction, a smooth function
 * of itself, is then found by the secant method on c − tc(c), started as the direct iteration.
 */
export function continuousStateAt(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
): TwoSwitchForwardState | undefined {
  let previous = 0;
  let previousGap = continuousCommutation(circuit, dutyCycle, previous) - previous;
  if (Number.isNaN(previousGap)) return undefined;
  let commutation = previous + previousGap;
  let isSettled = Math.abs(previousGap) <= COMMUTATION_TOLERANCE;
  for (let pass = 0; pass < 100 && !isSettled; pass++) {
    const next = continuousCommutation(circuit, dutyCycle, commutation);
    if (Number.isNaN(next)) return undefined;
    const gap = next - commutation;
    isSettled = Math.abs(gap) <= COMMUTATION_TOLERANCE;
    // Secant step on c − tc(c); a direct step where the secant has no slope or leaves [0, 0.9·D].
    const secant = commutation - (gap * (commutation - previous)) / (gap - previousGap);
    previous = commutation;
    previousGap = gap;
    commutation = isSettled || !(secant >= 0 && secant <= 0.9 * dutyCycle) ? next : secant;
  }
  if (!isSettled) return undefined;
  return continuousStateFrom(circuit, dutyCycle, commutation);
}

/** The CCM steady state at duty cycle D with commutation fraction tc, or undefined if not CCM. */
function continuousStateFrom(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
  commutation: number,
): TwoSwitchForwardState | undefined {
  const { periodS, stages, turnsRatios } = circuit;
  const effectiveDuty = Math.max(dutyCycle - commutation, 1e-9);
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
  return completeForwardState(circuit, dutyCycle, commutation, primaryV, magnetizingPeakA, points);
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
 * The commutation fraction tc(c) that a trial commutation c implies when every stage is in CCM,
 * held below 0.9·D; NaN when the primary voltage of {@link continuousPrimaryV} is not positive.
 */
function continuousCommutation(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
  commutation: number,
): number {
  const effectiveDuty = Math.max(dutyCycle - commutation, 1e-9);
  const primaryV = continuousPrimaryV(circuit, effectiveDuty);
  if (!(primaryV > 0)) return NaN;
  return Math.min(commutationAt(circuit, effectiveDuty, primaryV), 0.9 * dutyCycle);
}

/**
 * The turn-on commutation over the period, Llk·Σ Iv,k/nk / (Vin·T), when every stage is in CCM
 * at stage duty cycle D' and primary voltage Vp (V), with the valleys Io − ΔIL/2.
 */
function commutationAt(
  circuit: TwoSwitchForwardCircuit,
  effectiveDuty: number,
  primaryV: number,
): number {
  const { inputVoltageV: vin, periodS, stages, turnsRatios } = circuit;
  let valleySum = 0;
  for (let k = 0; k < stages.length; k++) {
    const stage = stages[k] as OutputStage;
    const n = turnsRatios[k] ?? 1;
    const rippleA =
      (effectiveDuty *
        (1 - effectiveDuty) *
        (primaryV / n - stage.windingResistanceOhm * stage.loadA) *
        periodS) /
      stage.inductanceH;
    valleySum += (stage.loadA - rippleA / 2) / n;
  }
  return (circuit.leakageInductanceH * Math.max(0, valleySum)) / (vin * periodS);
}

/**
 * Returns the steady state whose first output sits at `regulatedV` (V) when every stage is in
 * CCM there, or undefined when one is not (or the solution leaves the searched duty cycles, or
 * the commutation reaches its 0.9·D hold). In CCM the first output is affine in the stage's duty
 * cycle D': Vo = D'·(Vp/n − Rw·Io) − Vf − (Rd + RL)·Io, so D' = (Vo + Vf + (Rd + RL)·Io) /
 * (Vp/n − Rw·Io), a fixed point through the weak dependence of Vp on D'; the commutation that D'
 * implies is then explicit, and D = D' + tc.
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
  const commutation = commutationAt(
    circuit,
    effectiveDuty,
    continuousPrimaryV(circuit, effectiveDuty),
  );
  const dutyCycle = effectiveDuty + commutation;
  if (!(dutyCycle >= 1e-9 && dutyCycle <= searchMax) || commutation >= 0.9 * dutyCycle) {
    return undefined;
  }
  return continuousStateFrom(circuit, dutyCycle, commutation);
}

/** Settling tolerance on the stage duty cycle D', a little below the duty-cycle search's. */
const DUTY_TOLERANCE = 1e-15;
