import type { FlybackCircuit } from './flyback-circuit.js';
import type { OperatingPoint } from './flyback-operating-point.js';
import { ringConstantsOf } from './flyback-ring-constants.js';

/** Iteration cap of the fixed point on the reflected voltage of the leakage ring. */
const RING_ITERATIONS = 20;
/** Relative change of the reflected voltage that ends that fixed point. */
const RING_TOLERANCE = 1e-13;
/**
 * A Newton step on the reflected voltage no larger than this fraction of the ring's nearest scale
 * (see ringThenClamp) is taken on the tangents of tb, ts and ic, with no further evaluation.
 */
const RING_LINEAR_REACH = 1e-7;

/**
 * The turn-off after the drain's rise to Vin + V0 (flyback-intervals.ts, drainRise), from the
 * current I1 the rise leaves in the leakage. Sets in `p`: the leakage ring's time tb, the clamp's
 * onset current ic and commutation time ts, the ring's peak above its centre, Ib and Vr.
 *
 * Without drain capacitance the clamp takes I1 at once: ts = Llk·I1/(Vc − Vr), the leakage current
 * falling at (Vc − Vr)/Llk while the magnetizing current falls at Vr/Lm (RCD clamp; Pressman,
 * Billings, Morey, 3rd ed., flyback leakage spike and clamp, from memory), with Vr = V0 + Rs·Ib/2
 * and Ib·(1 + Rs·ts/(2Lm)) = I1 − V0·ts/Lm. Eliminating Ib leaves A·ts² + B·ts − C = 0 with
 * A = Rs·Vc/(2Lm), B = Vc − V0 − Rs·I1/2 − Rs·Llk·I1/(2Lm), C = Llk·I1, whose positive root is
 * taken in the cancellation-free form 2C/(B + √(B² + 4AC)).
 *
 * With drain capacitance C the secondary clamps the magnetizing voltage at Vr while the leakage
 * still carries I1, so Llk and C ring about Vin + Vr: with u = vd − Vin − Vr, Llk·di/dt = −u and
 * C·du/dt = i, a lossless series LC (Mohan, Undeland, Robbins, 3rd ed., ch. 9 resonant
 * circuits, from memory), so ½·Llk·i² + ½·C·u² holds. From u0 = V0 − Vr (≤ 0) the ring's
 * amplitude is U = √((Z·I1)² + u0²), Z = √(Llk/C). If U > Vc − Vr the clamp diode conducts when
 * u reaches Vc − Vr, after tb = (asin((Vc − Vr)/U) + asin(−u0/U))/ω, with
 * ic² = I1² + (u0² − (Vc − Vr)²)/Z², and ts = Llk·ic/(Vc − Vr) as above: the drain capacitance
 * has taken ½·C·(Vc − Vr)² of the leakage energy, and the clamp receives only
 * ½·Llk·ic²·Vc/(Vc − Vr). Otherwise the drain peaks at Vin + Vr + U when the leakage current
 * reaches zero, tb = (π/2 + asin(−u0/U))/ω, and the clamp receives nothing. The magnetizing
 * current falls at Vr/Lm through tb + ts; Vr = V0 + Rs·Ib/2 is found by a fixed point.
 */
export function commutateTurnOff(
  c: FlybackCircuit,
  peakA: number,
  availableS: number,
  p: OperatingPoint,
): void {
  const capacitanceF = c.drainCapacitanceF;
  const llk = c.leakageInductanceH;
  p.leakageRingS = 0;
  p.leakageRingPeakV = 0;
  p.leakageRingReturnS = 0;
  if (capacitanceF > 0 && llk > 0 && peakA > 0) {
    RING_INPUTS[0] = peakA;
    RING_INPUTS[1] = availableS;
    ringThenClamp(c, p);
    return;
  }
  const lm = c.magnetizingInductanceH;
  const rs = c.reflectedResistanceOhm;
  const v0 = c.reflectedOffsetV;
  const vc = c.clampVoltageV;
  let ts = 0;
  let after = peakA;
  let reflected = v0 + (rs * peakA) / 2;
  if (llk > 0 && peakA > 0) {
    const a = (rs * vc) / (2 * lm);
    const b = vc - v0 - (rs * peakA) / 2 - (rs * llk * peakA) / (2 * lm);
    const cc = llk * peakA;
    const denominator = b + Math.sqrt(b * b + 4 * a * cc);
    ts = denominator > 0 ? (2 * cc) / denominator : Infinity;
    if (!(ts <= availableS)) {
      p.isValid = false;
      ts = availableS;
    }
    after = (peakA - (v0 * ts) / lm) / (1 + (rs * ts) / (2 * lm));
    reflected = v0 + (rs * after) / 2;
    // The magnetizing current must outlast the commutation, and the clamp must stay above Vr.
    if (!(after > 0)) p.isValid = false;
    if (!(vc > reflected)) {
      p.isValid = false;
      p.isClampBelowReflected = true;
    }
  }
  p.turnOffCommutationS = ts;
  p.afterCommutationCurrentA = after;
  p.turnOffReflectedV = reflected;
  p.clampOnsetCurrentA = llk > 0 ? peakA : 0;
  p.leakageRingPeakV = llk > 0 && peakA > 0 ? vc - reflected : 0;
}

/**
 * {@link ringThenClamp}'s turn-off current (A) and the time available (s). V8 does not inline
 * that function into the fixed points that call it, and a double passed as an argument to a
 * call it does not inline is boxed (a heap number each): passed here instead, they left a
 * CCM evaluation making 300 B instead of 540, a DCM one 680 B instead of 1 kB.
 */
const RING_INPUTS = new Float64Array(2);

/**
 * The leakage ring, then the clamp's commutation if the ring reaches it (see above). Vr = g(Vr)
 * is solved by Newton's method on g(Vr) − Vr, with g′ from the derivatives of tb, ts and ic in Vr
 * (below): g depends on Vr only through the fall time tb + ts, weighted by Rs·Vr/(2Lm), so g′ is
 * small and the step from a warm start (the last evaluation's Vr) mostly lands within round-off.
 * Once a step is within {@link RING_LINEAR_REACH} of the nearest scale of the ring's formulas,
 * tb, ts, ic and the ring's peak are taken on their tangents at the last exact evaluation,
 * without another arctangent: their error is of the order of that fraction squared.
 */
function ringThenClamp(c: FlybackCircuit, p: OperatingPoint): void {
  const peakA = RING_INPUTS[0] as number;
  const availableS = RING_INPUTS[1] as number;
  const lm = c.magnetizingInductanceH;
  const llk = c.leakageInductanceH;
  const rs = c.reflectedResistanceOhm;
  const v0 = c.reflectedOffsetV;
  const vc = c.clampVoltageV;
  const constants = ringConstantsOf(llk, c.drainCapacitanceF);
  const impedanceOhm = constants.impedanceOhm;
  const angularFrequency = constants.angularFrequency;
  const zi = impedanceOhm * peakA;
  // The previous evaluation's Vr when it is a plausible one (the duty-cycle and start-current
  // searches move in small steps), else the drop at half the turn-off current.
  const previous = p.turnOffReflectedV;
  let reflected = previous >= v0 && previous < v0 + rs * peakA ? previous : v0 + (rs * peakA) / 2;
  let ringS = 0;
  let ts = 0;
  let clampA = 0;
  let ringPeakV = 0;
  let after = peakA;
  for (let k = 0; k < RING_ITERATIONS; k++) {
    const clampV = vc - reflected;
    if (!(clampV > 0)) break;
    // The drain starts this far below the ring's centre, with the current I1.
    const offsetV = reflected - v0;
    // U² = (Z·I1)² + u0²; Z·ic = √(U² − (Vc − Vr)²). The two arcsines of tb as one angle:
    // asin(a/U) + asin(b/U) = atan2(a·√(U² − b²) + b·√(U² − a²), √(U² − a²)·√(U² − b²) − a·b)
    // with √(U² − u0²) = Z·I1 (one atan2 instead of two asin on this hot path).
    const amplitudeSquareV2 = zi * zi + offsetV * offsetV;
    // d/dVr of tb, ts, ic and the ring's peak (a = Vc − Vr falls, b = Vr − V0 rises with Vr):
    // d asin(a/U) = −(U² + a·b)/(U²·Z·ic), d asin(b/U) = Z·I1/U², d(Z·ic) = (a + b)/(Z·ic).
    let ringSlope: number;
    let tsSlope = 0;
    let clampSlope = 0;
    let peakSlope: number;
    // The step in Vr over which these formulas stay near their tangents, V: the smaller of U,
    // Vc − Vr and the distance to the clamp's threshold U = Vc − Vr (in either direction).
    let reachV: number;
    if (amplitudeSquareV2 > clampV * clampV) {
      const clampZ = Math.sqrt(amplitudeSquareV2 - clampV * clampV);
      ringS =
        Math.atan2(clampV * zi + offsetV * clampZ, clampZ * zi - clampV * offsetV) /
        angularFrequency;
      clampA = clampZ / impedanceOhm;
      ts = (llk * clampA) / clampV;
      ringPeakV = clampV;
      ringSlope =
        (zi * clampZ - amplitudeSquareV2 - clampV * offsetV) /
        (amplitudeSquareV2 * clampZ * angularFrequency);
      clampSlope = (clampV + offsetV) / (clampZ * impedanceOhm);
      tsSlope = (llk * (clampSlope + clampA / clampV)) / clampV;
      peakSlope = -1;
      reachV = Math.min(clampV, (clampZ * clampZ) / (clampV + offsetV));
    } else {
      ringS = (Math.PI / 2 + Math.atan2(offsetV, zi)) / angularFrequency;
      clampA = 0;
      ts = 0;
      ringPeakV = Math.sqrt(amplitudeSquareV2);
      ringSlope = zi / (amplitudeSquareV2 * angularFrequency);
      peakSlope = offsetV / ringPeakV;
      reachV = Math.min(ringPeakV, (clampV * clampV - amplitudeSquareV2) / (clampV + offsetV));
    }
    const totalS = ringS + ts;
    const divisor = 1 + (rs * totalS) / (2 * lm);
    after = (peakA - (v0 * totalS) / lm) / divisor;
    const next = v0 + (rs * after) / 2;
    const change = Math.abs(next - reflected);
    if (change <= RING_TOLERANCE * Math.abs(next)) {
      reflected = next;
      break;
    }
    // g′ = (Rs/2)·(d Ib/dT)·(dT/dVr), with d Ib/dT = −g/(Lm·(1 + Rs·T/(2Lm))).
    const slope = (-(rs / 2) * next * (ringSlope + tsSlope)) / (lm * divisor);
    const step = (next - reflected) / (1 - slope);
    if (!Number.isFinite(step)) {
      reflected = next;
      continue;
    }
    if (!(Math.abs(step) <= RING_LINEAR_REACH * reachV)) {
      reflected += step;
      continue;
    }
    ringS += ringSlope * step;
    ts += tsSlope * step;
    clampA += clampSlope * step;
    ringPeakV += peakSlope * step;
    const fallS = ringS + ts;
    after = (peakA - (v0 * fallS) / lm) / (1 + (rs * fallS) / (2 * lm));
    reflected = v0 + (rs * after) / 2;
    break;
  }
  if (!(vc > reflected)) {
    p.isValid = false;
    p.isClampBelowReflected = true;
  }
  if (!(ringS + ts <= availableS)) {
    p.isValid = false;
    const scale = availableS / (ringS + ts);
    ringS *= scale;
    ts *= scale;
  }
  // The magnetizing current must outlast the ring and the commutation.
  if (!(after > 0)) p.isValid = false;
  p.leakageRingS = ringS;
  p.clampOnsetCurrentA = clampA;
  p.leakageRingPeakV = ringPeakV;
  p.turnOffCommutationS = ts;
  p.afterCommutationCurrentA = after;
  p.turnOffReflectedV = reflected;
}

/**
 * Sets the ring's return in `p` (leakageRingReturnS): once the leakage current is zero at the
 * drain's peak, the ring swings back to its centre in a quarter period, π/(2ω), unless the
 * secondary stops conducting `untilS` (s) after that first. The engine takes the ring as damped
 * from there: its energy ½·C·u² is lost (flyback-losses.ts) and its charge C·u has passed
 * through the secondary (flyback-leakage-arcs.ts, leakageChargeAS).
 */
export function setLeakageRingReturn(c: FlybackCircuit, untilS: number, p: OperatingPoint): void {
  const capacitanceF = c.drainCapacitanceF;
  const llk = c.leakageInductanceH;
  if (!(capacitanceF > 0 && llk > 0 && p.leakageRingS > 0)) {
    p.leakageRingReturnS = 0;
    return;
  }
  const quarterS = ringConstantsOf(llk, capacitanceF).quarterS;
  p.leakageRingReturnS = Math.max(0, Math.min(quarterS, untilS));
}
