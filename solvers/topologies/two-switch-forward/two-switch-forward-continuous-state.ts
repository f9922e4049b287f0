import {
  outputStagePoint,
  type OutputStage,
  type OutputStagePoint,
} from '../buck-derived/output-stage.js';
import { SWING_HOLD, turnOffSwingFraction } from '../buck-derived/turn-off-swing.js';
import {
  completeForwardState,
  forwardClampV,
  forwardLeakageDampingOhm,
  forwardRing,
  forwardRingEnds,
} from './complete-forward-state.js';
import {
  magnetizingRing,
  ringEnds,
  type MagnetizingRing,
  type RingEnds,
} from './magnetizing-ring.js';
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
  const edges = continuousEdgesAt(circuit, dutyCycle);
  return edges === undefined ? undefined : continuousStateFrom(circuit, dutyCycle, edges);
}

/**
 * The first output's voltage (V) of {@link continuousStateAt}'s state, without its ring (the
 * same number: the ring only completes the state), or undefined where that is undefined: what
 * the duty-cycle searches read on their trial steps.
 */
export function continuousOutputVoltageAt(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
): number | undefined {
  const edges = continuousEdgesAt(circuit, dutyCycle);
  if (edges === undefined) return undefined;
  return continuousPointsFrom(circuit, dutyCycle, edges, false)?.points[0]?.voltageV;
}

/** The settled commutation and swing of {@link continuousStateAt}, or undefined. */
function continuousEdgesAt(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
): { commutation: number; swing: number } | undefined {
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
  return Number.isNaN(edges.shift) ? undefined : edges;
}

/** The CCM steady state at duty cycle D with its commutation and swing, or undefined if not CCM. */
function continuousStateFrom(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
  edges: { commutation: number; swing: number },
): TwoSwitchForwardState | undefined {
  const solved = continuousPointsFrom(circuit, dutyCycle, edges, true);
  if (solved === undefined) return undefined;
  const { primary, points } = solved;
  return completeForwardState(circuit, dutyCycle, edges, primary.primaryV, primary.ring!, points);
}

/** The primary and the stages' points of {@link continuousStateFrom} (its ring if asked for). */
function continuousPointsFrom(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
  edges: { commutation: number; swing: number },
  withRing: boolean,
): { primary: ContinuousPrimary; points: OutputStagePoint[] } | undefined {
  const { periodS, stages, turnsRatios } = circuit;
  const effectiveDuty = Math.max(dutyCycle - edges.commutation + edges.swing / 2, 1e-9);
  const primary = continuousPrimary(circuit, effectiveDuty, dutyCycle, withRing);
  if (primary === undefined) return undefined;
  const { primaryV } = primary;
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
  return { primary, points };
}

/** The primary voltage, the magnetizing ring and the edges they imply. */
interface ContinuousPrimary {
  primaryV: number;
  /** The ring (left out unless asked for). */
  ring: MagnetizingRing | undefined;
  /** Turn-on commutation (not yet held below 0.9·D) and turn-off swing over the period. */
  commutation: number;
  swing: number;
}

/**
 * The primary voltage at stage duty cycle D' when every stage is in CCM, with the magnetizing
 * ring it implies, or undefined when the voltage is not positive. The ring's start current moves
 * the primary loop's drop (R·(start + ramp/2)) and, when the turn-on cuts the ring, the swing
 * moves the time it has, so the three are a fixed point: iterated directly from a zero start
 * (R·dI0/dVp is of order R·D'·T/Lm, tiny; short of the clamp the mean is zero and it settles in
 * two passes). With `dutyCycle` undefined D = D' + tc − ts/2 follows the edges. `withRing`:
 * the result carries its ring (drawn from the last pass's numbers, the same as the pass read).
 */
function continuousPrimary(
  circuit: TwoSwitchForwardCircuit,
  effectiveDuty: number,
  dutyCycle: number | undefined,
  withRing = false,
): ContinuousPrimary | undefined {
  const direct = uncutPrimary(circuit, effectiveDuty, dutyCycle, withRing);
  if (direct !== null) return direct;
  const { periodS } = circuit;
  let startA = 0;
  let commutation = 0;
  let swing = 0;
  let result: ContinuousPrimary | undefined;
  // The last pass's ring, drawn whole only for the result (the passes read three numbers).
  let ringD = NaN;
  let ringSwing = NaN;
  let ringRampA = NaN;
  let ringPeakA = NaN;
  for (let pass = 0; pass < 50; pass++) {
    const primaryV = continuousPrimaryV(circuit, effectiveDuty, startA, 0.5);
    if (!(primaryV > 0)) return undefined;
    const sums = reflectedSums(circuit, effectiveDuty, primaryV, SUMS);
    const rampA = (primaryV * effectiveDuty * periodS) / circuit.magnetizingInductanceH;
    const d = dutyCycle ?? effectiveDuty + commutation - swing / 2;
    const ring = forwardRingEnds(circuit, d, swing, rampA, sums.peakA, RING_ENDS);
    ringD = d;
    ringSwing = swing;
    ringRampA = rampA;
    ringPeakA = sums.peakA;
    const nextCommutation = commutationOf(circuit, sums, ring.startA);
    const nextSwing = turnOffSwingFraction(
      circuit.turnOffCapacitanceF,
      primaryV,
      ring.turnOffA + sums.peakA,
      periodS,
      SWING_HOLD * (1 - effectiveDuty),
    );
    result = { primaryV, ring: undefined, commutation: nextCommutation, swing: nextSwing };
    const isSettled =
      Math.abs(ring.startA - startA) <= 1e-14 * rampA &&
      Math.abs(nextCommutation - commutation) <= 1e-15 &&
      Math.abs(nextSwing - swing) <= 1e-15;
    startA = ring.startA;
    commutation = nextCommutation;
    swing = nextSwing;
    if (isSettled) break;
  }
  if (result !== undefined && withRing) {
    result.ring = forwardRing(circuit, ringD, ringSwing, ringRampA, ringPeakA);
  }
  return result;
}

/**
 * {@link continuousPrimary} in one step when the turn-on does not cut the ring, else null: the
 * ring's start is then −Vr/Z past the clamp (a constant) or −ramp/2 short of it (the
 * magnetizing mean over the on-interval is zero), so the primary voltage is direct, and the
 * case is the one whose ramp agrees with it (past the clamp the mean −Vr/Z + ramp/2 is negative
 * below ramp = 2·Vr/Z, which raises Vp and the ramp: at most one case agrees). Undefined when
 * the voltage is not positive. The ring itself only `withRing` (its numbers are the same).
 */
function uncutPrimary(
  circuit: TwoSwitchForwardCircuit,
  effectiveDuty: number,
  dutyCycle: number | undefined,
  withRing: boolean,
): ContinuousPrimary | undefined | null {
  const { periodS, magnetizingInductanceH: lm, turnOffCapacitanceF: capacitanceF } = circuit;
  const clampV = forwardClampV(circuit);
  const limitA = capacitanceF > 0 ? clampV * Math.sqrt(capacitanceF / lm) : 0;
  let primaryV = continuousPrimaryV(circuit, effectiveDuty, -limitA, 0.5);
  let rampA = (primaryV * effectiveDuty * periodS) / lm;
  if (circuit.leakageInductanceH > 0 && capacitanceF > 0) {
    return uncutLeakyPrimary(circuit, effectiveDuty, dutyCycle, withRing, primaryV, rampA);
  }
  if (rampA < 2 * limitA) {
    primaryV = continuousPrimaryV(circuit, effectiveDuty, 0, 0);
    rampA = (primaryV * effectiveDuty * periodS) / lm;
  }
  if (!(primaryV > 0)) return undefined;
  const sums = reflectedSums(circuit, effectiveDuty, primaryV, SUMS);
  const ring = ringEnds(rampA, lm, capacitanceF, clampV, Infinity, RING_ENDS);
  const swing = turnOffSwingFraction(
    capacitanceF,
    primaryV,
    ring.turnOffA + sums.peakA,
    periodS,
    SWING_HOLD * (1 - effectiveDuty),
  );
  const commutation = commutationOf(circuit, sums, ring.startA);
  const d = dutyCycle ?? effectiveDuty + commutation - swing / 2;
  if (!(ring.ringEndS <= (1 - d - swing) * periodS)) return null;
  return {
    primaryV,
    ring: withRing ? magnetizingRing(rampA, lm, capacitanceF, clampV, Infinity) : undefined,
    commutation,
    swing,
  };
}

/**
 * {@link uncutPrimary} with leakage: the spike ahead of the ring moves its start short of the
 * clamp (and carries the node to the clamp below ramp = 2·Vr/Z), so only the clamp's case is
 * direct (start −Vr/Z, from `primaryV` and `rampA` solved for it), taken where the ring behind
 * the spike reaches the clamp before the turn-on; else null (the passes of continuousPrimary).
 */
function uncutLeakyPrimary(
  circuit: TwoSwitchForwardCircuit,
  effectiveDuty: number,
  dutyCycle: number | undefined,
  withRing: boolean,
  primaryV: number,
  rampA: number,
): ContinuousPrimary | null {
  const { periodS, magnetizingInductanceH: lm, turnOffCapacitanceF: capacitanceF } = circuit;
  const clampV = forwardClampV(circuit);
  // As the ring has it (magnetizing-ring.ts), so that its start is this one to the bit.
  const limitA = clampV / Math.sqrt(lm / capacitanceF);
  if (!(primaryV > 0) || !(rampA > limitA)) return null;
  const sums = reflectedSums(circuit, effectiveDuty, primaryV, SUMS);
  const startA = -limitA;
  const swing = turnOffSwingFraction(
    capacitanceF,
    primaryV,
    rampA + startA + sums.peakA,
    periodS,
    SWING_HOLD * (1 - effectiveDuty),
  );
  const commutation = commutationOf(circuit, sums, startA);
  const d = dutyCycle ?? effectiveDuty + commutation - swing / 2;
  const availableS = (1 - d - swing) * periodS;
  const leakage = {
    leakageH: circuit.leakageInductanceH,
    dampingOhm: forwardLeakageDampingOhm(circuit),
    reflectedPeakA: sums.peakA,
  };
  const ring = ringEnds(rampA, lm, capacitanceF, clampV, availableS, RING_ENDS, leakage);
  if (!ring.reachesClamp || ring.isCut || ring.startA !== rampA - limitA - rampA) return null;
  return {
    primaryV,
    ring: withRing
      ? magnetizingRing(rampA, lm, capacitanceF, clampV, availableS, leakage)
      : undefined,
    commutation,
    swing,
  };
}

/** Scratch of {@link reflectedSums} for its two callers (read before the next call). */
const SUMS = { valleyA: NaN, peakA: NaN };

/** Scratch of {@link uncutPrimary}'s ring numbers (read before the next call). */
const RING_ENDS: RingEnds = {
  startA: NaN,
  turnOffA: NaN,
  ringEndS: NaN,
  reachesClamp: false,
  isCut: false,
};

/** Settling tolerance on the commutation fraction, as in the direct iteration. */
const COMMUTATION_TOLERANCE = 1e-13;

/**
 * The primary winding voltage (V) when every stage is in CCM at duty cycle D' (after the
 * commutation) and the magnetizing current's mean over the on-interval is I0 + k·ΔI (k = ½ from
 * a start I0, 0 when the start is −ΔI/2 and I0 is passed as 0): the solution of
 * Vp = Vin − R·(Σ Io/n + I0 + k·Vp·D'·T/Lm) − Llk·(Vp/Lm + Σ (1 − D')·(Vp/n − Rw·Io)/(L·n)).
 */
function continuousPrimaryV(
  circuit: TwoSwitchForwardCircuit,
  effectiveDuty: number,
  magnetizingStartA: number,
  rampShare: number,
): number {
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
    (vin - loopOhm * (loadSum + magnetizingStartA) + llk * slopeConstant) /
    (1 + (loopOhm * rampShare * effectiveDuty * periodS) / lm + llk / lm + llk * slopePerVolt)
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
  const primary = continuousPrimary(circuit, effectiveDuty, dutyCycle);
  if (primary === undefined) return { commutation: NaN, swing: NaN, shift: NaN };
  const commutation = Math.min(primary.commutation, 0.9 * dutyCycle);
  const { swing } = primary;
  return { commutation, swing, shift: commutation - swing / 2 };
}

/**
 * Σ Iv,k/nk and Σ Ipk,k/nk (A) when every stage is in CCM at stage duty cycle D' and primary
 * voltage Vp (V): Io ∓ ΔIL/2, written into `out`.
 */
function reflectedSums(
  circuit: TwoSwitchForwardCircuit,
  effectiveDuty: number,
  primaryV: number,
  out: { valleyA: number; peakA: number },
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
  out.valleyA = valleyA;
  out.peakA = peakA;
  return out;
}

/**
 * The turn-on commutation over the period, Llk·(Σ Iv,k/nk + I0) / (Vin·T): the switch current
 * rises from zero to the reflected valley plus the magnetizing start I0.
 */
function commutationOf(
  circuit: TwoSwitchForwardCircuit,
  sums: { valleyA: number },
  magnetizingStartA: number,
): number {
  return (
    (circuit.leakageInductanceH * Math.max(0, sums.valleyA + magnetizingStartA)) /
    (circuit.inputVoltageV * circuit.periodS)
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
  let primary: ContinuousPrimary | undefined;
  for (let pass = 0; pass < 100 && !isSettled; pass++) {
    primary = continuousPrimary(circuit, effectiveDuty, undefined);
    if (primary === undefined) return undefined;
    const next = offsetV / (primary.primaryV / n - windingV);
    if (!(next > 0 && next < 1)) return undefined;
    isSettled = Math.abs(next - effectiveDuty) <= DUTY_TOLERANCE;
    effectiveDuty = next;
  }
  if (!isSettled) return undefined;
  primary = continuousPrimary(circuit, effectiveDuty, undefined);
  if (primary === undefined) return undefined;
  const { commutation, swing } = primary;
  const dutyCycle = effectiveDuty + commutation - swing / 2;
  if (!(dutyCycle >= 1e-9 && dutyCycle <= searchMax) || commutation >= 0.9 * dutyCycle) {
    return undefined;
  }
  return continuousStateFrom(circuit, dutyCycle, { commutation, swing });
}

/** Settling tolerance on the stage duty cycle D', a little below the duty-cycle search's. */
const DUTY_TOLERANCE = 1e-15;
