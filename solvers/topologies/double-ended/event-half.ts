import { simulateRing, type RingConstants, type RingRun } from './node-ring.js';

/**
 * The light-load half of a one-output double-ended stage by events, with its output held at the
 * regulated voltage (issue 3; DEVELOPERS.md, "Light load: the event model"). Secondary-referred,
 * in the frame of the half being driven: the on-time forces the winding to Vs = Vp/n, the
 * inductor current rising from IL0 and the referred magnetizing current from m0; then the switches
 * open and the node rings (`simulateRing` with `isContinued`): the turn-off swing is its first
 * stretch (the winding from −Vs towards zero through the path just driven, Cr discharged by
 * IL + n·Im), then the freewheel while IL ≥ |n·Im|, the ring of Cr with L‖Lr through one path
 * and with Lr alone when IL is zero, the body diodes' clamp at ±Vd/n, every rectifier coming back
 * into conduction, and no damping, so the ring meets the next turn-on wherever it is. The half
 * is periodic when it ends with IL = IL0 and, mirrored, n·Im = −m0 (the winding is forced at
 * turn-on, so its voltage there is free); charge balance asks its mean IL to be the load.
 * ref: the circuit's own event sequence, as `test/bench/light-load-events.ts` and the
 * time-stepped `test/bench/light-load-reference.ts` (which ngspice follows within 0.3 % of the
 * output voltage at 3–10 % load); Erickson & Maksimović, 2nd ed. (from memory), §2.3
 * (volt-second and charge balance).
 */

/** One periodic light-load half (SI units; currents referred to the secondary). */
export interface EventHalf {
  /** Stage duty over the half: the on-time over the half-period (2·D). */
  stageDuty: number;
  /** Inductor current at the half's start (the turn-on), A. */
  inductorStartA: number;
  /** Inductor current as the on-time starts, after the commutation (the valley), A. */
  inductorOnStartA: number;
  /** The turn-on commutation, s. */
  commutationS: number;
  /** Referred magnetizing current at turn-on, in the frame of the half driven (usually < 0), A. */
  magnetizingStartA: number;
  /** Inductor current as the switches open, A. */
  inductorPeakA: number;
  /** Referred magnetizing current as the switches open, A. */
  magnetizingPeakA: number;
  /** Whether the inductor current is zero anywhere in the half (an idle stretch). */
  hasIdle: boolean;
}

/** The constants of one event solve: the ring circuit at the held Vo, the drive and the load. */
export interface EventContext {
  /** The ring constants with `pathV` = Vo + the path's drop, `freewheelV` likewise. */
  constants: RingConstants;
  /** The on-time's winding voltage on the secondary, Vp/n, V. */
  onV: number;
  halfS: number;
  loadA: number;
  /**
   * The turn-on commutation at the half's start, s: the winding at zero while the leakage takes
   * the primary current up. Follows the currents with `primary` (lagged, as the drive).
   */
  commutationS: number;
  /** Where given, the on-time's winding voltage follows the currents (`EventPrimary`). */
  primary?: EventPrimary;
}

/** The residuals of one half: periodicity of IL and of n·Im (mirrored), mean IL less the load. */
interface HalfRun {
  /** IL as the on-time starts (after the commutation), A. */
  inductorOnStartA: number;
  ilA: number;
  imA: number;
  excessA: number;
  run: RingRun;
  inductorPeakA: number;
  magnetizingPeakA: number;
}

/** One half at stage duty x from (IL0, m0); undefined where the stretches ran out. */
function runHalf(c: EventContext, x: number, il0: number, m0: number): HalfRun | undefined {
  const k = c.constants;
  const l = k.c.inductanceH;
  const onS = x * c.halfS;
  const tcS = c.commutationS;
  if (!(c.halfS - tcS - onS > 0)) return undefined;
  // The turn-on commutation: the winding held at zero while the leakage takes the current over,
  // every rectifier conducting (the freewheel), n·Im unchanged.
  const ilOn = Math.max(0, il0 - (k.c.freewheelV / l) * tcS);
  const il1 = Math.max(0, ilOn + ((c.onV - k.c.pathV) / l) * onS);
  const im1 = m0 + (c.onV / k.c.referredMagnetizingH) * onS;
  const run = simulateRing(
    k,
    { inductorA: il1, magnetizingA: im1, windingV: -c.onV },
    c.halfS - tcS - onS,
    false,
    true,
    -1,
  );
  if (!run.isComplete) return undefined;
  const chargeAS = ((il0 + ilOn) / 2) * tcS + ((ilOn + il1) / 2) * onS + run.chargeAS;
  return {
    inductorOnStartA: ilOn,
    ilA: run.end.inductorA - il0,
    imA: -run.end.magnetizingA - m0,
    excessA: chargeAS / c.halfS - c.loadA,
    run,
    inductorPeakA: il1,
    magnetizingPeakA: im1,
  };
}

/** Newton steps of {@link solveEventHalf} before it gives up. */
const EVENT_NEWTON_STEPS = 40;

/**
 * The primary side the on-time's winding voltage follows (`EventContext.primary`): Vp = Vd less
 * the loop resistance at the mean on-current and the leakage at its slope, both referred from the
 * secondary's IL and n·Im over the on-time, as `doubleEndedStateAt` takes them.
 */
export interface EventPrimary {
  driveV: number;
  turnsRatio: number;
  loopResistanceOhm: number;
  leakageInductanceH: number;
}

/** The on-time's winding voltage on the secondary, Vp/n, for a half's currents. */
function onVoltageOf(
  c: EventContext,
  x: number,
  il0: number,
  m0: number,
  il1: number,
  im1: number,
): number {
  const p = c.primary;
  if (p === undefined) return c.onV;
  const n = p.turnsRatio;
  const reflectedA = (il0 + il1 + m0 + im1) / (2 * n);
  const slopeAPerS = (il1 - il0 + im1 - m0) / (x * c.halfS * n);
  return (p.driveV - p.loopResistanceOhm * reflectedA - p.leakageInductanceH * slopeAPerS) / n;
}

/**
 * The turn-on commutation for a half's currents, s: the primary current rises from zero to
 * (IL + n·Im)/n at the on-time's start through the leakage at the drive voltage, tc = Llk·I/Vd
 * (as `doubleEndedStateAt`; none where that current is not positive), held below nine times the
 * on-time (the plain model's 0.9·D).
 */
function commutationOf(c: EventContext, x: number, ilOn: number, m0: number): number {
  const p = c.primary;
  if (p === undefined || !(p.leakageInductanceH > 0)) return 0;
  const turnOnA = (ilOn + m0) / p.turnsRatio;
  if (!(turnOnA > 0)) return 0;
  return Math.min((p.leakageInductanceH * turnOnA) / p.driveV, 9 * x * c.halfS);
}

/**
 * The stage duty and the two turn-on currents at which the half is periodic and delivers the
 * load, by Newton's method with forward differences from `guess` (a nearby solution: the last
 * solve's, or the old light-load model's), each step held to a fifth of the duty; with
 * `c.primary` the on-time's winding voltage follows the iterate's currents (lagged a step, a
 * plain fixed point inside the Newton steps: it moves by some 1e-4 of itself). The Jacobian is
 * kept while the residuals fall at least fourfold a step (the chord method), else evaluated
 * again. The three residuals (A) settle to 1e-11 of the currents' scale and the drive to 1e-13 of
 * itself. Undefined where it does not converge, or converges outside (0, 1] of duty. `c.onV` is
 * left at the solution's. ref: Newton's method for a periodic orbit (shooting) and its chord
 * variant, common practice; the 3×3 system by Cramer's rule.
 */
export function solveEventHalf(
  c: EventContext,
  guess: { stageDuty: number; inductorStartA: number; magnetizingStartA: number },
): EventHalf | undefined {
  let x = guess.stageDuty;
  let il0 = Math.max(0, guess.inductorStartA);
  let m0 = guess.magnetizingStartA;
  const scaleA = Math.max(c.loadA, 1e-6);
  const tolerance = 1e-11 * scaleA;
  let jacobian: number[] | undefined;
  let lastNorm = Infinity;
  for (let step = 0; step < EVENT_NEWTON_STEPS; step++) {
    if (!(x > 0 && x <= 1)) return undefined;
    const f = runHalf(c, x, il0, m0);
    if (f === undefined) return undefined;
    const norm = Math.abs(f.ilA) + Math.abs(f.imA) + Math.abs(f.excessA);
    const nextOnV = onVoltageOf(c, x, f.inductorOnStartA, m0, f.inductorPeakA, f.magnetizingPeakA);
    const nextTcS = commutationOf(c, x, f.inductorOnStartA, m0);
    const isDriveSettled =
      Math.abs(nextOnV - c.onV) <= 1e-13 * Math.abs(c.onV) &&
      Math.abs(nextTcS - c.commutationS) <= 1e-13 * c.halfS;
    if (norm <= tolerance && isDriveSettled) return eventHalfOf(c, x, il0, m0, f);
    if (jacobian === undefined || !(norm <= 0.25 * lastNorm)) {
      jacobian = jacobianAt(c, x, il0, m0, f, scaleA);
      if (jacobian === undefined) return undefined;
    }
    lastNorm = norm;
    const [a11, a12, a13, a21, a22, a23, a31, a32, a33] = jacobian as [
      number,
      number,
      number,
      number,
      number,
      number,
      number,
      number,
      number,
    ];
    const det = determinant(a11, a12, a13, a21, a22, a23, a31, a32, a33);
    if (!(Math.abs(det) > 0) || !Number.isFinite(det)) return undefined;
    const b1 = -f.ilA;
    const b2 = -f.imA;
    const b3 = -f.excessA;
    let stepX = determinant(b1, a12, a13, b2, a22, a23, b3, a32, a33) / det;
    let stepIl = determinant(a11, b1, a13, a21, b2, a23, a31, b3, a33) / det;
    let stepIm = determinant(a11, a12, b1, a21, a22, b2, a31, a32, b3) / det;
    if (!Number.isFinite(stepX) || !Number.isFinite(stepIl) || !Number.isFinite(stepIm)) {
      return undefined;
    }
    const limit = 0.2 * x;
    if (Math.abs(stepX) > limit) {
      const shrink = limit / Math.abs(stepX);
      stepX *= shrink;
      stepIl *= shrink;
      stepIm *= shrink;
    }
    x += stepX;
    il0 = Math.max(0, il0 + stepIl);
    m0 += stepIm;
    if (!isDriveSettled) {
      c.onV = nextOnV;
      c.commutationS = nextTcS;
    }
  }
  return undefined;
}

/**
 * The Jacobian of the residuals (rows IL, n·Im, excess; columns ∂/∂x, ∂/∂IL0, ∂/∂m0) by forward
 * differences, by rows; undefined where a perturbed half ran out of stretches.
 */
function jacobianAt(
  c: EventContext,
  x: number,
  il0: number,
  m0: number,
  f: HalfRun,
  scaleA: number,
): number[] | undefined {
  const dx = 1e-7 * x;
  const di = 1e-7 * scaleA;
  const sx = x + dx <= 1 ? dx : -dx;
  const byX = runHalf(c, x + sx, il0, m0);
  const byIl = runHalf(c, x, il0 + di, m0);
  const byIm = runHalf(c, x, il0, m0 + di);
  if (byX === undefined || byIl === undefined || byIm === undefined) return undefined;
  return [
    (byX.ilA - f.ilA) / sx,
    (byIl.ilA - f.ilA) / di,
    (byIm.ilA - f.ilA) / di,
    (byX.imA - f.imA) / sx,
    (byIl.imA - f.imA) / di,
    (byIm.imA - f.imA) / di,
    (byX.excessA - f.excessA) / sx,
    (byIl.excessA - f.excessA) / di,
    (byIm.excessA - f.excessA) / di,
  ];
}

/** The solved half's description from its run. */
function eventHalfOf(c: EventContext, x: number, il0: number, m0: number, f: HalfRun): EventHalf {
  const segments = simulateRing(
    c.constants,
    { inductorA: f.inductorPeakA, magnetizingA: f.magnetizingPeakA, windingV: -c.onV },
    c.halfS - c.commutationS - x * c.halfS,
    true,
    true,
    -1,
  ).segments;
  let hasIdle = il0 <= 0 || f.inductorOnStartA <= 0;
  for (const segment of segments ?? []) {
    if (segment.mode === 'idle' && segment.durationS > 0) hasIdle = true;
  }
  return {
    stageDuty: x,
    inductorStartA: il0,
    inductorOnStartA: f.inductorOnStartA,
    commutationS: c.commutationS,
    magnetizingStartA: m0,
    inductorPeakA: f.inductorPeakA,
    magnetizingPeakA: f.magnetizingPeakA,
    hasIdle,
  };
}

/** The determinant of a 3×3 matrix, by rows. */
function determinant(
  a11: number,
  a12: number,
  a13: number,
  a21: number,
  a22: number,
  a23: number,
  a31: number,
  a32: number,
  a33: number,
): number {
  return (
    a11 * (a22 * a33 - a23 * a32) - a12 * (a21 * a33 - a23 * a31) + a13 * (a21 * a32 - a22 * a31)
  );
}
