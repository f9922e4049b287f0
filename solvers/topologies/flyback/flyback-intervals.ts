import type { FlybackCircuit } from './flyback-circuit.js';
import { idleRing, idleRingAt, type IdleRing, type IdleRingState } from './flyback-idle-ring.js';
import type { OperatingPoint } from './flyback-operating-point.js';
import { leakageChargeAS } from './flyback-leakage-arcs.js';
import { commutateTurnOff, setLeakageRingReturn } from './flyback-turn-off.js';

export { newOperatingPoint, type OperatingPoint } from './flyback-operating-point.js';

/** Relative change of a commutation time (fraction of the period) that ends its fixed point. */
const COMMUTATION_TOLERANCE = 1e-13;
/**
 * Largest ratio of successive changes at which the commutation fixed point is extrapolated
 * (Aitken's Δ², see evaluateCcm); a larger one is not taken as linear convergence.
 */
const EXTRAPOLATION_RATIO_MAX = 0.5;

/**
 * Fills `p` with the CCM operating point at duty cycle D: the valley current Iv from charge
 * balance (the referred secondary charge over the period equals Σ Ik/nk · T; Erickson &
 * Maksimović, 2nd ed., §2.3 capacitor charge balance) and the residual of periodicity of the
 * magnetizing current (volt-second balance, §2.2). With the commutation times held fixed every
 * current is affine in Iv, so Iv is exact; t1 and ts are then updated by a fixed point. With a
 * drain capacitance the leakage ring (tb) and the leakage's charge are held fixed likewise.
 * Every time, the drain's rise and the leakage's charge start from the last evaluation in `p`
 * (the duty-cycle searches move in small steps). The fixed point converges linearly, at about
 * the commutation's share of the period per pass; each pass after the first is extrapolated by
 * the ratio r of its change to the last one's, x + r/(1 − r)·Δx (Aitken's Δ² process; Burden and
 * Faires, Numerical Analysis, §2.5, from memory). Together they took the bench flyback's
 * passes per design from 1,425 to 882.
 */
export function evaluateCcm(
  c: FlybackCircuit,
  duty: number,
  p: OperatingPoint,
  iterations: number,
): void {
  const periodS = c.periodS;
  const lm = c.magnetizingInductanceH;
  const llk = c.leakageInductanceH;
  const lt = lm + llk;
  const rp = c.primaryLoopResistanceOhm;
  const rs = c.reflectedResistanceOhm;
  const v0 = c.reflectedOffsetV;
  const vin = c.inputVoltageV;
  const onS = duty * periodS;
  const offS = periodS - onS;
  const requiredCharge = c.referredLoadCurrentA * periodS;
  p.isValid = true;
  p.isClampBelowReflected = false;
  let t1 = Math.min(p.turnOnCommutationS, onS);
  let ts = Math.min(p.turnOffCommutationS, offS);
  // The leakage ring with the drain capacitance (flyback-turn-off.ts) and the charge the leakage
  // carries from the start of secondary conduction.
  const hasRing = c.drainCapacitanceF > 0 && llk > 0;
  let tb = hasRing ? Math.min(p.leakageRingS, offS) : 0;
  // The drain's rise at turn-off: its time and the change of the magnetizing current over it.
  let tc = Math.min(p.turnOffTransitionS, offS);
  let rise = p.transitionEndCurrentA - p.peakCurrentA;
  if (!Number.isFinite(rise)) rise = 0;
  let leakAS = hasRing ? leakageChargeAS(c, p) : 0;
  if (!Number.isFinite(leakAS)) leakAS = 0;
  let valley = 0;
  let onset = 0;
  let peakA = 0;
  let after = 0;
  let end = 0;
  let previousChange = Infinity;
  for (let k = 0; k <= iterations; k++) {
    // Each current as x0 + x1·Iv. Interval 1: Ia = Iv − (V0 + Rs·Iv/2)·t1/Lm.
    const a0 = (-v0 * t1) / lm;
    const a1 = 1 - (rs * t1) / (2 * lm);
    // Interval 2: Lt·ΔI/t2 = Vin − Rp·(Ia + Ipk)/2 (leakage in series with Lm while the rectifier
    // blocks).
    const t2 = onS - t1;
    const g = t2 / (lt + (rp * t2) / 2);
    const p0 = a0 * (1 - rp * g) + vin * g;
    const p1 = a1 * (1 - rp * g);
    // Drain rise: Ipk + rise after tc (held fixed like ts). The ring and the commutation:
    // Ib·(1 + Rs·(tb + ts)/(2Lm)) = Ipk + rise − V0·(tb + ts)/Lm.
    const fallS = tb + ts;
    const h = 1 / (1 + (rs * fallS) / (2 * lm));
    const b0 = (p0 + rise - (v0 * fallS) / lm) * h;
    const b1 = p1 * h;
    // Interval 4: Lm·(Ib − Iend)/t4 = V0 + Rs·(Ib + Iend)/2.
    const t4 = offS - tc - fallS;
    const u = (lm - (rs * t4) / 2) / (lm + (rs * t4) / 2);
    const w = (v0 * t4) / (lm + (rs * t4) / 2);
    const e0 = b0 * u - w;
    const e1 = b1 * u;
    // Referred secondary charge: triangles in intervals 1 and 3, trapezoid in interval 4; with
    // the ring, the magnetizing current's trapezoid over tb + ts less the leakage's charge.
    const q0 = hasRing
      ? ((p0 + rise + b0) * fallS) / 2 - leakAS + ((b0 + e0) * t4) / 2
      : (b0 * ts) / 2 + ((b0 + e0) * t4) / 2;
    const q1 = hasRing
      ? t1 / 2 + ((p1 + b1) * fallS) / 2 + ((b1 + e1) * t4) / 2
      : t1 / 2 + (b1 * ts) / 2 + ((b1 + e1) * t4) / 2;
    valley = (requiredCharge - q0) / q1;
    onset = a0 + a1 * valley;
    peakA = p0 + p1 * valley;
    after = b0 + b1 * valley;
    end = e0 + e1 * valley;
    if (k === iterations) break;
    // Turn-on commutation: the switch current rises at (Vin − Rp·Ia/2 + Vr1)/Llk until it meets
    // the magnetizing current, which falls at Vr1/Lm (Vr1 = V0 + Rs·Iv/2).
    let t1Next = 0;
    if (llk > 0 && valley > 0) {
      const vr1 = v0 + (rs * valley) / 2;
      t1Next = valley / ((vin - (rp * onset) / 2 + vr1) / llk + vr1 / lm);
      if (!(t1Next >= 0) || t1Next > onS) {
        p.isValid = false;
        t1Next = onS;
      }
    }
    drainRise(c, peakA, p);
    const tcNext = Math.min(p.turnOffTransitionS, offS);
    const riseNext = p.transitionEndCurrentA - peakA;
    commutateTurnOff(c, p.transitionEndCurrentA, offS - tcNext, p);
    const tsNext = p.turnOffCommutationS;
    const tbNext = p.leakageRingS;
    if (hasRing) setLeakageRingReturn(c, offS - tcNext - tbNext - tsNext, p);
    const change =
      Math.abs(t1Next - t1) + Math.abs(tsNext - ts) + Math.abs(tcNext - tc) + Math.abs(tbNext - tb);
    if (change <= COMMUTATION_TOLERANCE * periodS) {
      t1 = t1Next;
      ts = tsNext;
      tb = tbNext;
      tc = tcNext;
      rise = riseNext;
      break;
    }
    // The leakage's charge enters only the next pass: none is computed for the pass that ends
    // the fixed point.
    const leakNext = hasRing ? leakageChargeAS(c, p) : 0;
    const ratio = change / previousChange;
    const gain = ratio > 0 && ratio < EXTRAPOLATION_RATIO_MAX ? ratio / (1 - ratio) : 0;
    previousChange = change;
    // Extrapolated times stay inside their intervals; the next pass checks them again.
    t1 = Math.min(Math.max(0, t1Next + gain * (t1Next - t1)), onS);
    ts = Math.max(0, tsNext + gain * (tsNext - ts));
    tb = Math.max(0, tbNext + gain * (tbNext - tb));
    tc = Math.max(0, tcNext + gain * (tcNext - tc));
    rise = riseNext + gain * (riseNext - rise);
    leakAS = leakNext + gain * (leakNext - leakAS);
    p.isValid = true;
    p.isClampBelowReflected = false;
  }
  // The secondary must conduct alone after the turn-off commutation: where the drain's rise, the
  // ring and the commutation fill the off-time there is no such interval, and the waveforms have
  // no demagnetizing slope (a 1 µH leakage at 18 V and D = 0.95 in a draft of the choices).
  if (!(offS - tc - tb - ts > COMMUTATION_TOLERANCE * periodS)) p.isValid = false;
  p.valleyCurrentA = valley;
  p.turnOnDrainV = vin + v0 + rs * valley;
  p.turnOffTransitionS = tc;
  p.transitionEndCurrentA = peakA + rise;
  p.onsetCurrentA = onset;
  p.peakCurrentA = peakA;
  p.afterCommutationCurrentA = after;
  p.turnOnCommutationS = t1;
  p.turnOffCommutationS = ts;
  p.leakageRingS = tb;
  p.conductionEndS = periodS;
  p.residualA = Number.isFinite(end - valley) ? end - valley : NaN;
}

/** Relative tolerance (of the ring's current bound) on the DCM start current. */
const START_CURRENT_TOLERANCE = 1e-13;
/** Iteration cap of the safeguarded Newton search for the DCM start current. */
const START_CURRENT_ITERATIONS = 200;
/** A start current whose residual exceeds this fraction of the bound is not periodic. */
const START_CURRENT_ACCEPTED = 1e-9;

/**
 * The idle ring of the circuit {@link evaluateDcm} was last given: a corner's DCM search
 * evaluates one circuit at every trial duty cycle, and the ring is a function of the circuit
 * alone (circuits are plain data nothing changes once made). Made again for each evaluation, it
 * was 200 B of a DCM evaluation's 570.
 */
let lastRingCircuit: FlybackCircuit | undefined;
let lastRing: IdleRing | undefined;

/**
 * Fills `p` with the DCM operating point at duty cycle D: the magnetizing current I0 at turn-on
 * (the idle ring's, flyback-idle-ring.ts), Ipk from Lt·(Ipk − I0)/(DT) = Vin − Rp·(I0 + Ipk)/2,
 * the turn-off commutation, the demagnetizing time from Lm·Ib = (V0 + Rs·Ib/2)·td, and the
 * residual of charge balance, Ib·(ts + td)/(2T) − Σ Ik/nk (Erickson & Maksimović, 2nd ed. (from
 * memory), §5.3); with the leakage ring (flyback-turn-off.ts), (I1 + Ib)·(tb + ts)/2 + Ib·td/2
 * less the leakage's charge, over T. I0 is periodic: the ring started where the secondary
 * current ends, at D·T + tc + tb + ts + td, must give I0 again at T. That residual, ring(T − tend(I0)) − I0, falls with I0
 * (its slope is cos ωτ − 1 on the ring, below −1 on the clamp), so a Newton search kept inside a
 * shrinking bracket of ±V0/Z finds it. A start current so low that the secondary would still
 * conduct at T has no idle interval: the search then keeps I0 = 0 and the caller sees tend > T.
 */
export function evaluateDcm(c: FlybackCircuit, duty: number, p: OperatingPoint): void {
  const periodS = c.periodS;
  if (c !== lastRingCircuit) {
    lastRingCircuit = c;
    lastRing = idleRing(c);
  }
  const ring = lastRing as IdleRing;
  const lm = c.magnetizingInductanceH;
  const lt = lm + c.leakageInductanceH;
  const rp = c.primaryLoopResistanceOhm;
  const onS = duty * periodS;
  const state: IdleRingState = { currentA: 0, drainV: c.inputVoltageV, slopeAps: 0 };
  const peakSlope = (lt - (rp * onS) / 2) / (lt + (rp * onS) / 2);
  const bound = ring.currentBoundA;
  // The first trial is the last evaluation's start current (the duty-cycle search moves in small
  // steps near its root), inside the bracket; zero, the model without the ring, if none.
  const last = p.valleyCurrentA;
  const warm = Number.isFinite(last) ? Math.min(Math.max(last, -0.999 * bound), 0.999 * bound) : 0;
  periodicStart(c, ring, duty, peakSlope, warm, p, state);
  // The ring may also repeat on a start so low that the switch current never turns positive and
  // the secondary never conducts (a 200 V two-output flyback at 2 % load, I0 = −0.02 A against
  // +0.015 A): a start carried over from another branch can land there, and the duty-cycle search
  // then took a jump between the branches for a root. Such a start is searched again from zero.
  if (warm !== 0 && !(dcmPeakA(c, onS, START.currentA) > 0)) {
    periodicStart(c, ring, duty, peakSlope, 0, p, state);
  }
  const start = START.currentA;
  const isPeriodic = START.isPeriodic;
  const peakA = dcmPeakA(c, onS, start);
  // The commutation of the root itself decides validity, not those of the trials.
  p.isValid = true;
  p.isClampBelowReflected = false;
  const end = dcmConductionEndS(c, duty, start, p);
  const idleS = periodS - end;
  idleRingAt(ring, Math.max(0, idleS), state);
  const after = p.afterCommutationCurrentA;
  p.valleyCurrentA = start;
  p.onsetCurrentA = start;
  p.peakCurrentA = peakA;
  p.turnOnCommutationS = 0;
  p.turnOnDrainV = idleS >= 0 ? state.drainV : c.inputVoltageV;
  p.conductionEndS = end;
  if (!isPeriodic) p.isValid = false;
  const conductionS = end - onS - p.turnOffTransitionS;
  if (p.leakageRingS > 0) {
    // The magnetizing current's trapezoid over the ring and the commutation, its triangle over
    // the demagnetizing time, less the leakage's charge (flyback-turn-off.ts).
    const fallS = p.leakageRingS + p.turnOffCommutationS;
    const chargeAS =
      ((p.transitionEndCurrentA + after) * fallS) / 2 +
      (after * (conductionS - fallS)) / 2 -
      leakageChargeAS(c, p);
    p.residualA = chargeAS / periodS - c.referredLoadCurrentA;
  } else {
    p.residualA = (after * conductionS) / (2 * periodS) - c.referredLoadCurrentA;
  }
}

/** {@link periodicStart}'s result: the start current found, A, and whether it repeats. */
const START = { currentA: 0, isPeriodic: true };

/**
 * The DCM start current I0 at duty cycle D from the first trial `trial` into {@link START}: the
 * safeguarded Newton search of {@link evaluateDcm} on ring(T − tend(I0)) − I0. `state` and `p`
 * are scratch (the commutations of the trials are filled into `p`).
 */
function periodicStart(
  c: FlybackCircuit,
  ring: IdleRing,
  duty: number,
  peakSlope: number,
  firstTrial: number,
  p: OperatingPoint,
  state: IdleRingState,
): void {
  const periodS = c.periodS;
  const lm = c.magnetizingInductanceH;
  START.currentA = 0;
  START.isPeriodic = true;
  const bound = ring.currentBoundA;
  if (!(bound > 0)) return;
  let lo = -bound;
  let hi = bound;
  const tolerance = START_CURRENT_TOLERANCE * bound;
  // The trial with an idle interval and the smallest |residual| so far.
  let best = NaN;
  let bestResidual = Infinity;
  let trial = firstTrial;
  let previous = NaN;
  let previousResidual = NaN;
  for (let k = 0; k < START_CURRENT_ITERATIONS && hi - lo > tolerance; k++) {
    const idleS = periodS - dcmConductionEndS(c, duty, trial, p);
    if (!(idleS >= 0)) {
      // No idle interval at this start current: the root lies lower.
      hi = trial;
      trial = (lo + hi) / 2;
      previous = NaN;
      continue;
    }
    idleRingAt(ring, idleS, state);
    const residual = state.currentA - trial;
    if (Math.abs(residual) < Math.abs(bestResidual)) {
      best = trial;
      bestResidual = residual;
    }
    if (Math.abs(residual) <= tolerance) break;
    if (residual > 0) lo = trial;
    else hi = trial;
    // The secant through the last two trials; on the first, d(residual)/dI0 = (di/dτ)·(dτ/dI0)
    // − 1 with dτ/dI0 ≈ −(dIpk/dI0)·Lm/(V0 + Rs·Ib).
    let derivative: number;
    if (Number.isFinite(previous) && previous !== trial) {
      derivative = (residual - previousResidual) / (trial - previous);
    } else {
      const after = p.afterCommutationCurrentA;
      const endSlope = (lm * peakSlope) / (c.reflectedOffsetV + c.reflectedResistanceOhm * after);
      derivative = -state.slopeAps * endSlope - 1;
    }
    previous = trial;
    previousResidual = residual;
    const next = trial - residual / derivative;
    trial = next > lo && next < hi ? next : (lo + hi) / 2;
  }
  if (Number.isFinite(best)) {
    START.currentA = best;
    // No periodic start with an idle interval: the secondary would conduct at T (not DCM).
    START.isPeriodic = Math.abs(bestResidual) <= START_CURRENT_ACCEPTED * bound;
  }
}

/*
 * The two helpers below are module functions, not arrows inside `evaluateDcm`: under tsx (the
 * service's and the bench's runtime) esbuild's keepNames wraps every named arrow in an
 * Object.defineProperty call, and `evaluateDcm` runs at every trial duty cycle of every corner.
 */

/** DCM peak current from the start current I0: Ipk = (Vin·DT + I0·(Lt − Rp·DT/2)) / (Lt + Rp·DT/2), A. */
function dcmPeakA(c: FlybackCircuit, onS: number, startA: number): number {
  const lt = c.magnetizingInductanceH + c.leakageInductanceH;
  const rp = c.primaryLoopResistanceOhm;
  return (c.inputVoltageV * onS + startA * (lt - (rp * onS) / 2)) / (lt + (rp * onS) / 2);
}

/**
 * The end of secondary conduction (s from turn-on) for the DCM start current I0: the drain's
 * rise, the leakage ring, the turn-off commutation and the demagnetizing time, each filled into
 * `p` on the way.
 */
function dcmConductionEndS(
  c: FlybackCircuit,
  duty: number,
  startA: number,
  p: OperatingPoint,
): number {
  const onS = duty * c.periodS;
  const offS = c.periodS - onS;
  drainRise(c, dcmPeakA(c, onS, startA), p);
  const riseS = p.turnOffTransitionS;
  commutateTurnOff(c, p.transitionEndCurrentA, offS - riseS, p);
  const after = p.afterCommutationCurrentA;
  const demagnetizingS =
    after > 0
      ? (c.magnetizingInductanceH * after) /
        (c.reflectedOffsetV + (c.reflectedResistanceOhm * after) / 2)
      : 0;
  setLeakageRingReturn(c, demagnetizingS, p);
  return onS + riseS + p.leakageRingS + p.turnOffCommutationS + demagnetizingS;
}

/**
 * Turn-off: the switch opens with Ipk in L = Lm + Llk, which charges the drain capacitance C
 * from 0 to Vin + V0 before the secondary can conduct. L·di/dt = Vin − vd, C·dvd/dt = i is a
 * lossless ring about Vin, so ½·L·i² + ½·C·(vd − Vin)² holds: the current when the drain reaches
 * Vin + V0 is √(Ipk² + C·(Vin² − V0²)/L), after (asin(Vin/(Z·A)) + asin(V0/(Z·A)))/ω with
 * A² = Ipk² + C·Vin²/L (common practice: series LC with a source). A current too small to lift
 * the drain that far leaves the point invalid. Sets the transition time and end current in `p`.
 */
function drainRise(c: FlybackCircuit, peakA: number, p: OperatingPoint): void {
  const capacitanceF = c.drainCapacitanceF;
  p.turnOffTransitionS = 0;
  p.transitionEndCurrentA = peakA;
  if (!(capacitanceF > 0) || !(peakA > 0)) return;
  const l = c.magnetizingInductanceH + c.leakageInductanceH;
  const vin = c.inputVoltageV;
  const v0 = Math.max(0, c.reflectedOffsetV);
  const impedanceOhm = Math.sqrt(l / capacitanceF);
  const amplitudeA = Math.sqrt(peakA * peakA + (capacitanceF * vin * vin) / l);
  const amplitudeV = impedanceOhm * amplitudeA;
  if (!(v0 <= amplitudeV)) {
    p.isValid = false;
    p.transitionEndCurrentA = 0;
    return;
  }
  const endA = Math.sqrt(Math.max(0, peakA * peakA + (capacitanceF * (vin * vin - v0 * v0)) / l));
  // The two arcsines as one angle, as in flyback-turn-off.ts: with Z·A the amplitude,
  // √((Z·A)² − Vin²) = Z·Ipk and √((Z·A)² − V0²) = Z·I1.
  const zPeakV = impedanceOhm * peakA;
  const zEndV = impedanceOhm * endA;
  p.turnOffTransitionS =
    Math.atan2(vin * zEndV + v0 * zPeakV, zPeakV * zEndV - vin * v0) * Math.sqrt(l * capacitanceF);
  p.transitionEndCurrentA = endA;
}
