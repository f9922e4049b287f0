import { broydenUpdate, solveLinear } from '../../root-finding/linear-unknowns.js';
import { broydenUpdateThree, solveThreeByThree } from '../../root-finding/three-unknowns.js';
import { simulateRing, type RingConstants, type RingRun, type RingState } from './node-ring.js';

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
  /**
   * With leakage in the ring (`RingCircuit.leakageH`): the current the turn-on commutation picks
   * up, IL0 + m0 − j0 (j0 the leakage current the ring left, in the frame of the half driven;
   * IL less the rectifiers' difference iM − j at the ring's end), A; 0 without.
   */
  pickUpA: number;
  /** The ring's start as the switches open (with leakage its node voltage and current). */
  ringStart: RingState;
}

/** The constants of one event solve: the ring circuit at the held Vo, the drive and the load. */
export interface EventContext {
  /** The ring constants with `pathV` = Vo + the path's drop, `freewheelV` likewise. */
  constants: RingConstants;
  /**
   * The on-time's winding voltage on the secondary, Vp/n, V. With `primary` each half takes its
   * own (`onVoltageOf`) and the solve leaves here the solution's.
   */
  onV: number;
  halfS: number;
  loadA: number;
  /**
   * The turn-on commutation at the half's start, s: the winding at zero while the leakage takes
   * the primary current up. With `primary` each half takes its own (`commutationOf`) and the
   * solve leaves here the solution's.
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
  /** The on-time's winding voltage (V) and the commutation (s) this half took. */
  onV: number;
  commutationS: number;
  /**
   * With leakage in the ring: the periodicity of the current the commutation picks up (the
   * ring's end against the half's start), A; else 0.
   */
  jA: number;
  ringStart: RingState;
}

/**
 * One half at stage duty x from (IL0, m0); undefined where the stretches ran out. With
 * `c.primary` the commutation and the on-time's winding voltage are the ones this half's own
 * currents give (`commutationOf`, `onVoltageOf`), else `c`'s.
 */
function runHalf(
  c: EventContext,
  x: number,
  il0: number,
  m0: number,
  pickUpA?: number,
): HalfRun | undefined {
  const k = c.constants;
  const l = k.c.inductanceH;
  const onS = x * c.halfS;
  const tcS = c.primary === undefined ? c.commutationS : commutationOf(c, x, il0, m0, pickUpA);
  if (!(c.halfS - tcS - onS > 0)) return undefined;
  // The turn-on commutation: the winding held at zero while the leakage takes the current over,
  // every rectifier conducting (the freewheel), n·Im unchanged.
  const ilOn = Math.max(0, il0 - (k.c.freewheelV / l) * tcS);
  const onV = c.primary === undefined ? c.onV : onVoltageOf(c, onS, ilOn, m0);
  const il1 = Math.max(0, ilOn + ((onV - k.c.pathV) / l) * onS);
  const im1 = m0 + (onV / k.c.referredMagnetizingH) * onS;
  const leakageH = k.c.leakageH ?? 0;
  // With leakage the node starts above the winding by the leakage's drop over the on-time.
  const ringStart: RingState =
    leakageH > 0
      ? {
          inductorA: il1,
          magnetizingA: im1,
          windingV: -onV,
          leakageA: im1 + il1,
          nodeV: -onV - (leakageH * (il1 - ilOn + im1 - m0)) / onS,
        }
      : { inductorA: il1, magnetizingA: im1, windingV: -onV };
  const run = simulateRing(k, ringStart, c.halfS - tcS - onS, false, true, -1);
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
    onV,
    commutationS: tcS,
    // The current the next turn-on's commutation picks up: IL less the rectifiers' difference.
    jA:
      leakageH > 0
        ? run.end.inductorA -
          (run.end.magnetizingA - (run.end.leakageA ?? 0)) -
          (pickUpA ?? il0 + m0)
        : 0,
    ringStart,
  };
}

/**
 * The Jacobian a solve ends with, kept for the next solve of a nearby circuit (several outputs:
 * the next pass on the cross-regulated voltages moves the equivalent's drops a little), whose
 * first step then takes it as it is (Broyden's update after) instead of three more halves.
 */
export interface EventMemory {
  jacobian?: number[];
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

/**
 * The on-time's winding voltage on the secondary, Vp/n, that a half's own currents give: Vp = Vd
 * less the loop resistance at the mean on-current (IL + n·Im from the valley `ilOn` and `m0` to
 * the peaks, over n) and the leakage at its slope, with the peaks IL1 = ilOn + (Vs − Vw)·ton/L
 * (at least zero) and n·Im1 = m0 + Vs·ton/Lr themselves following Vs: linear in Vs, so solved in
 * closed form (the half's own fixed point, which a lagged update reached only geometrically).
 */
function onVoltageOf(c: EventContext, onS: number, ilOn: number, m0: number): number {
  const p = c.primary as EventPrimary;
  const n = p.turnsRatio;
  const k = c.constants.c;
  const l = k.inductanceH;
  const lr = k.referredMagnetizingH;
  const r = p.loopResistanceOhm;
  const llk = p.leakageInductanceH;
  // n·Vs = Vd − R·(ilOn + IL1 + m0 + n·Im1)/(2n) − Llk·(IL1 − ilOn + n·Im1 − m0)/(ton·n).
  const risingV =
    (p.driveV - (r / n) * (ilOn + m0) + ((r * onS) / (2 * n) + llk / n) * (k.pathV / l)) /
    (n + ((r * onS) / (2 * n) + llk / n) * (1 / l + 1 / lr));
  if (ilOn + ((risingV - k.pathV) / l) * onS >= 0) return risingV;
  // IL1 held at zero (an on-time too short to lift the inductor current).
  return (
    (p.driveV - (r / (2 * n)) * (ilOn + 2 * m0) + (llk * ilOn) / (onS * n)) /
    (n + (r * onS) / (2 * n * lr) + llk / (n * lr))
  );
}

/**
 * The turn-on commutation a half's currents give, s: the primary current rises from zero to
 * (IL + n·Im)/n at the on-time's start through the leakage at the drive voltage, tc = Llk·I/Vd
 * (as `doubleEndedStateAt`; none where that current is not positive), with the valley IL at the
 * commutation's end, il0 − (Vo + Vf)·tc/L (at least zero): linear in tc, so solved in closed
 * form; held below nine times the on-time (the plain model's 0.9·D).
 */
function commutationOf(
  c: EventContext,
  x: number,
  il0: number,
  m0: number,
  pickUpA?: number,
): number {
  const p = c.primary;
  if (p === undefined || !(p.leakageInductanceH > 0)) return 0;
  const perA = p.leakageInductanceH / (p.turnsRatio * p.driveV);
  const fallAPerS = c.constants.c.freewheelV / c.constants.c.inductanceH;
  // With leakage in the ring the leakage current starts where the ring left it, so the current
  // to pick up is the ring's (`pickUpA`: IL0 + m0 − j0), not IL0 + m0.
  let tcS = (perA * (pickUpA ?? il0 + m0)) / (1 + perA * fallAPerS);
  // The valley at zero before the commutation ends: the current is n·Im's alone.
  if (il0 - fallAPerS * tcS < 0) tcS = perA * (pickUpA === undefined ? m0 : pickUpA - il0);
  if (!(tcS > 0)) return 0;
  return Math.min(tcS, 9 * x * c.halfS);
}

/**
 * Where {@link solveEventHalf} starts: the stage duty, the turn-on currents (A) and, with leakage,
 * the current the turn-on commutation picks up (A).
 */
export interface EventHalfGuess {
  stageDuty: number;
  inductorStartA: number;
  magnetizingStartA: number;
  pickUpA?: number;
}

/**
 * The stage duty and the two turn-on currents at which the half is periodic and delivers the
 * load, by Newton's method with forward differences from `guess` (a nearby solution: the last
 * solve's, or the old light-load model's), each step held to a fifth of the duty; with
 * `c.primary` every half (the Jacobian's too) takes the on-time's winding voltage and the
 * commutation its own currents give, in closed form, so the Newton steps solve the whole system.
 * The Jacobian is kept while the residuals fall at least fourfold a step, with Broyden's update
 * after each step, else evaluated again. (A drive lagged a step and a Jacobian kept unchanged,
 * as before, fell about fourfold a step: 8–18 steps and 57–101 halves for a bench design's
 * three light-load corners, where these take 5–8 steps and 32–51 halves.) The three residuals
 * (A) settle to 1e-11 of the currents' scale. Undefined where it does not converge, or
 * converges outside (0, 1] of duty. `c.onV` and `c.commutationS` are left at the solution's.
 * ref: Newton's method for a periodic orbit (shooting), the chord method and Broyden's update
 * (Broyden 1965; Kelley, Solving Nonlinear Equations with Newton's Method, from memory), common
 * practice; the 3×3 system by Cramer's rule.
 */
export function solveEventHalf(
  c: EventContext,
  guess: EventHalfGuess,
  memory?: EventMemory,
): EventHalf | undefined {
  if ((c.constants.c.leakageH ?? 0) > 0) return solveLeakyEventHalf(c, guess, memory);
  let x = guess.stageDuty;
  let il0 = Math.max(0, guess.inductorStartA);
  let m0 = guess.magnetizingStartA;
  const scaleA = Math.max(c.loadA, 1e-6);
  const tolerance = 1e-11 * scaleA;
  let jacobian: number[] | undefined = memory?.jacobian;
  let lastNorm = Infinity;
  let last: HalfRun | undefined;
  let lastX = x;
  let lastIl = il0;
  let lastIm = m0;
  for (let step = 0; step < EVENT_NEWTON_STEPS; step++) {
    if (!(x > 0 && x <= 1)) return undefined;
    const f = runHalf(c, x, il0, m0);
    if (f === undefined) return undefined;
    const norm = Math.abs(f.ilA) + Math.abs(f.imA) + Math.abs(f.excessA);
    if (norm <= tolerance) {
      c.onV = f.onV;
      c.commutationS = f.commutationS;
      if (memory !== undefined && jacobian !== undefined) memory.jacobian = jacobian;
      return eventHalfOf(c, x, il0, m0, f);
    }
    if (jacobian === undefined || !(norm <= 0.25 * lastNorm)) {
      jacobian = jacobianAt(c, x, il0, m0, f, scaleA);
      if (jacobian === undefined) return undefined;
    } else if (last !== undefined) {
      broydenUpdateThree(
        jacobian,
        x - lastX,
        il0 - lastIl,
        m0 - lastIm,
        f.ilA - last.ilA,
        f.imA - last.imA,
        f.excessA - last.excessA,
        x,
        scaleA,
        scaleA,
      );
    }
    lastNorm = norm;
    last = f;
    lastX = x;
    lastIl = il0;
    lastIm = m0;
    const step3 = solveThreeByThree(jacobian, -f.ilA, -f.imA, -f.excessA);
    if (step3 === undefined) return undefined;
    let [stepX, stepIl, stepIm] = step3;
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
  }
  return undefined;
}

/** Halves {@link settledHalf} runs at one duty before it gives up. */
const SETTLE_HALVES = 400;

/**
 * The half the circuit settles on at stage duty `x`, as it does: the half run again and again,
 * each from the last one's end (mirrored), from zero currents, until its end repeats to 1e-6 of
 * the load's current (the map contracts geometrically where the half is one the circuit settles
 * on); its turn-on state and its excess (mean IL less the load), A. Undefined where the
 * stretches run out or it has not settled within {@link SETTLE_HALVES} halves.
 */
function settledHalf(
  c: EventContext,
  x: number,
): { il0: number; m0: number; d0: number; excessA: number } | undefined {
  const isLeaky = (c.constants.c.leakageH ?? 0) > 0;
  const closeA = 1e-6 * Math.max(c.loadA, 1e-6);
  let il0 = 0;
  let m0 = 0;
  let d0 = 0;
  for (let k = 0; k < SETTLE_HALVES; k++) {
    const f = runHalf(c, x, il0, m0, isLeaky ? d0 : undefined);
    if (f === undefined) return undefined;
    const moveA = Math.abs(f.ilA) + Math.abs(f.imA) + Math.abs(f.jA);
    il0 = Math.max(0, il0 + f.ilA);
    m0 += f.imA;
    d0 += f.jA;
    if (moveA <= closeA) return { il0, m0, d0, excessA: f.excessA };
  }
  return undefined;
}

/**
 * The stage duty of a half whose gate is on for `gateOnS` (s) from the turn-on state (IL0, m0,
 * the current picked up): the gate's on-time less the commutation those currents give
 * (`commutationOf`, held to 0.9 of the gate's on-time, the plain model's 0.9·D), over the
 * half-period. `runHalf` at that stage duty takes the same commutation (its hold, nine times
 * the on-time after it, is the same bound).
 */
function stageDutyAtGate(
  c: EventContext,
  gateOnS: number,
  il0: number,
  m0: number,
  pickUpA?: number,
): number {
  const tcS =
    c.primary === undefined
      ? c.commutationS
      : Math.min(commutationOf(c, 1, il0, m0, pickUpA), 0.9 * gateOnS);
  return (gateOnS - tcS) / c.halfS;
}

/**
 * The half the circuit settles on with the gate on for `gateOnS` (s) each half (a controller at
 * its shortest on-time, where the commutation eats into the pulse), as `settledHalf` runs it:
 * again and again from zero currents, each half's stage duty from its own turn-on state
 * (`stageDutyAtGate`), until its end repeats to 1e-6 of the load's current; then one more half
 * from the settled state gives the half and its excess (mean IL less the load, A). Not Newton's
 * periodic half: at a push-pull's floor (`model-fallback-scan.ts --seed 11 --count 150 --outputs
 * 1`, spec 126, 400 V) that converged from the settled state on a stage duty 0.3 % off the
 * floor's, another half than the one the circuit settles on. `c.onV` and `c.commutationS` are
 * left at the half's. Undefined where the stretches run out or it has not settled within
 * {@link SETTLE_HALVES} halves.
 */
export function settledHalfAtGate(
  c: EventContext,
  gateOnS: number,
): { half: EventHalf; excessA: number } | undefined {
  const isLeaky = (c.constants.c.leakageH ?? 0) > 0;
  const closeA = 1e-6 * Math.max(c.loadA, 1e-6);
  let il0 = 0;
  let m0 = 0;
  let d0 = 0;
  for (let k = 0; k < SETTLE_HALVES; k++) {
    const pickUpA = isLeaky ? d0 : undefined;
    const x = stageDutyAtGate(c, gateOnS, il0, m0, pickUpA);
    if (!(x > 0 && x <= 1)) return undefined;
    const f = runHalf(c, x, il0, m0, pickUpA);
    if (f === undefined) return undefined;
    const moveA = Math.abs(f.ilA) + Math.abs(f.imA) + Math.abs(f.jA);
    if (moveA <= closeA) {
      c.onV = f.onV;
      c.commutationS = f.commutationS;
      return { half: eventHalfOf(c, x, il0, m0, f, isLeaky ? d0 : 0), excessA: f.excessA };
    }
    il0 = Math.max(0, il0 + f.ilA);
    m0 += f.imA;
    d0 += f.jA;
  }
  return undefined;
}

/**
 * {@link solveEventHalf} from the half the circuit settles on at a duty bracketed by the load:
 * the settled half's excess (`settledHalf`) at the lowest stage duty (0.02) must fall short of
 * the load and at `highX` exceed it; regula falsi (the Illinois variant) on the duty until the
 * excess is within 1e-3 of the load's current, and Newton's method from that duty and its
 * settled state. For a corner where Newton's steps from the plain state's duty (and from half of
 * it) swing without converging although a half settles between them: an 18–36 V half bridge with
 * three outputs at 18 V and 4.6 % load (`model-fallback-scan.ts --seed 11 --count 150`, spec
 * 118), whose plain stage duty is 0.81, both starts failing, settles delivering the load at 0.569,
 * where Newton converges in 2 steps. Undefined where the excess does not change sign between the
 * bounds (at the highest inputs of 300–400 V bridges at 2–8 % load it exceeds the load at every
 * duty: no regulated half; `onNoRegulatedHalf` is called where the half settled at the lowest
 * duty already delivers the load), a trial does not settle, or Newton fails. ref: regula falsi, Illinois
 * variant (Dowell & Jarratt 1971, from memory), common practice.
 */
export function solveEventHalfBracketed(
  c: EventContext,
  highX: number,
  memory?: EventMemory,
  onNoRegulatedHalf?: () => void,
): EventHalf | undefined {
  let lo = 0.02;
  let hi = Math.min(0.98, Math.max(highX, 2 * lo));
  const atLo = settledHalf(c, lo);
  if (atLo === undefined) return undefined;
  if (!(atLo.excessA < 0)) {
    // The half settled at the lowest stage duty delivers the load or more.
    if (atLo.excessA >= 0) onNoRegulatedHalf?.();
    return undefined;
  }
  const atHi = settledHalf(c, hi);
  if (atHi === undefined || !(atHi.excessA > 0)) return undefined;
  let fLo = atLo.excessA;
  let fHi = atHi.excessA;
  let best = Math.abs(fLo) < Math.abs(fHi) ? { x: lo, ...atLo } : { x: hi, ...atHi };
  let side = 0;
  const closeA = 1e-3 * Math.max(c.loadA, 1e-6);
  for (let k = 0; k < 40 && Math.abs(best.excessA) > closeA; k++) {
    const x = hi - (fHi * (hi - lo)) / (fHi - fLo);
    const at = settledHalf(c, x);
    if (at === undefined) return undefined;
    if (Math.abs(at.excessA) < Math.abs(best.excessA)) best = { x, ...at };
    if (at.excessA > 0) {
      hi = x;
      fHi = at.excessA;
      if (side === 1) fLo /= 2;
      side = 1;
    } else {
      lo = x;
      fLo = at.excessA;
      if (side === -1) fHi /= 2;
      side = -1;
    }
  }
  if (!(Math.abs(best.excessA) <= closeA)) return undefined;
  const isLeaky = (c.constants.c.leakageH ?? 0) > 0;
  return solveEventHalf(
    c,
    {
      stageDuty: best.x,
      inductorStartA: best.il0,
      magnetizingStartA: best.m0,
      ...(isLeaky ? { pickUpA: best.d0 } : {}),
    },
    memory,
  );
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

/**
 * The solved half's description from its run (whose ring, from the half's own start over the
 * rest of the half, says whether it idled: no second simulation for its stretches).
 */
function eventHalfOf(
  c: EventContext,
  x: number,
  il0: number,
  m0: number,
  f: HalfRun,
  d0 = 0,
): EventHalf {
  const hasIdle = il0 <= 0 || f.inductorOnStartA <= 0 || f.run.hasIdle;
  return {
    stageDuty: x,
    inductorStartA: il0,
    inductorOnStartA: f.inductorOnStartA,
    commutationS: c.commutationS,
    magnetizingStartA: m0,
    inductorPeakA: f.inductorPeakA,
    magnetizingPeakA: f.magnetizingPeakA,
    hasIdle,
    pickUpA: d0,
    ringStart: f.ringStart,
  };
}

/**
 * {@link solveEventHalf} with the leakage in the ring (`RingCircuit.leakageH`): a fourth unknown,
 * the current the turn-on commutation picks up, d0 = IL0 + m0 − j0 (the ring may leave the
 * leakage current j anywhere while the rectifiers freewheel; d0 is zero where the next half's
 * rectifier already conducts, 2·IL0 where the last half's still does), and its periodicity a
 * fourth residual; the commutation takes d0 instead of IL0 + m0. d0 rather than j0: where the
 * ring ends with a rectifier conducting j is tied to the other currents, and a j0 apart from them
 * made the steps wander. The same Newton steps (forward differences, the Jacobian kept while the
 * residuals fall fourfold a step, Broyden's update after), Gaussian elimination for the step; d0
 * starts at IL0 + m0 (j0 = 0, as without leakage), at least zero. A half found is taken only if
 * the circuit settles on it (`isSettling`).
 */
function solveLeakyEventHalf(
  c: EventContext,
  guess: EventHalfGuess,
  memory?: EventMemory,
): EventHalf | undefined {
  let x = guess.stageDuty;
  let il0 = Math.max(0, guess.inductorStartA);
  let m0 = guess.magnetizingStartA;
  // The unknown is the current the commutation picks up, IL0 + m0 − d0; it starts as without
  // leakage in the ring (d0 = 0), at least zero.
  let d0 = guess.pickUpA ?? Math.max(0, il0 + m0);
  const scaleA = Math.max(c.loadA, 1e-6);
  const tolerance = 1e-11 * scaleA;
  let jacobian: number[] | undefined =
    memory?.jacobian !== undefined && memory.jacobian.length === 16 ? memory.jacobian : undefined;
  let lastNorm = Infinity;
  let last: HalfRun | undefined;
  let lastU = [x, il0, m0, d0];
  for (let step = 0; step < EVENT_NEWTON_STEPS; step++) {
    if (!(x > 0 && x <= 1)) return undefined;
    const f = runHalf(c, x, il0, m0, d0);
    if (f === undefined) return undefined;
    const norm = Math.abs(f.ilA) + Math.abs(f.imA) + Math.abs(f.jA) + Math.abs(f.excessA);
    if (norm <= tolerance) {
      c.onV = f.onV;
      c.commutationS = f.commutationS;
      if (memory !== undefined && jacobian !== undefined) memory.jacobian = jacobian;
      if (!isSettling(leakyJacobianAt(c, [x, il0, m0, d0], f, scaleA, 1))) return undefined;
      return eventHalfOf(c, x, il0, m0, f, d0);
    }
    const u = [x, il0, m0, d0];
    if (jacobian === undefined || !(norm <= 0.25 * lastNorm)) {
      jacobian = leakyJacobianAt(c, u, f, scaleA);
      if (jacobian === undefined) return undefined;
    } else if (last !== undefined) {
      broydenUpdate(
        jacobian,
        u.map((v, i) => v - (lastU[i] as number)),
        [f.ilA - last.ilA, f.imA - last.imA, f.jA - last.jA, f.excessA - last.excessA],
      );
    }
    lastNorm = norm;
    last = f;
    lastU = u;
    const delta = solveLinear(jacobian, [-f.ilA, -f.imA, -f.jA, -f.excessA]);
    if (delta === undefined) return undefined;
    const limit = 0.2 * x;
    const shrink = Math.abs(delta[0] as number) > limit ? limit / Math.abs(delta[0] as number) : 1;
    x += shrink * (delta[0] as number);
    il0 = Math.max(0, il0 + shrink * (delta[1] as number));
    m0 += shrink * (delta[2] as number);
    d0 += shrink * (delta[3] as number);
  }
  return undefined;
}

/**
 * Whether the half found is one the circuit settles on at its duty cycle: the map from the
 * turn-on state (IL0, m0, the current picked up) to the half's end, mirrored, has every
 * eigenvalue inside the unit circle (its Jacobian is the residuals' columns 2–4 plus the
 * identity). With the leakage in the ring a half can be periodic yet unstable (a 300 V full bridge
 * at 10 % load: a half at D = 0.386 delivering the load, where ngspice at that duty cycle settles
 * 4 % above it, and at D = 0.316 on a half that reaches the next rail before turn-on); such a
 * corner keeps the old light-load path. ref: the Jury stability test for a cubic (Jury, Theory
 * and Application of the z-Transform Method, 1964, from memory), common practice.
 */
function isSettling(jacobian: number[] | undefined): boolean {
  if (jacobian === undefined) return false;
  const m = [
    (jacobian[1] as number) + 1,
    jacobian[2] as number,
    jacobian[3] as number,
    jacobian[5] as number,
    (jacobian[6] as number) + 1,
    jacobian[7] as number,
    jacobian[9] as number,
    jacobian[10] as number,
    (jacobian[11] as number) + 1,
  ] as [number, number, number, number, number, number, number, number, number];
  const [a, b, cc, d, e, f, g, h, i] = m;
  // λ³ + a2·λ² + a1·λ + a0, the characteristic polynomial of m.
  const a2 = -(a + e + i);
  const a1 = a * e - b * d + a * i - cc * g + e * i - f * h;
  const a0 = -(a * (e * i - f * h) - b * (d * i - f * g) + cc * (d * h - e * g));
  const at1 = 1 + a2 + a1 + a0;
  const atMinus1 = -1 + a2 - a1 + a0;
  return (
    at1 > 0 && atMinus1 < 0 && Math.abs(a0) < 1 && Math.abs(a0 * a0 - 1) > Math.abs(a0 * a2 - a1)
  );
}

/**
 * The residuals' Jacobian of {@link solveLeakyEventHalf} by forward differences, by rows. From
 * `firstColumn` on: `isSettling` reads only the three current columns, so it skips the duty
 * cycle's (one half fewer to run; that column is left NaN).
 */
function leakyJacobianAt(
  c: EventContext,
  u: readonly number[],
  f: HalfRun,
  scaleA: number,
  firstColumn = 0,
): number[] | undefined {
  const [x, il0, m0, d0] = u as [number, number, number, number];
  const dx = 1e-7 * x;
  const di = 1e-7 * scaleA;
  const sx = x + dx <= 1 ? dx : -dx;
  const columns = [
    firstColumn > 0 ? undefined : runHalf(c, x + sx, il0, m0, d0),
    runHalf(c, x, il0 + di, m0, d0),
    runHalf(c, x, il0, m0 + di, d0),
    runHalf(c, x, il0, m0, d0 + di),
  ];
  const steps = [sx, di, di, di];
  const jacobian: number[] = new Array<number>(16).fill(Number.NaN);
  for (let col = firstColumn; col < 4; col++) {
    const g = columns[col];
    if (g === undefined) return undefined;
    const h = steps[col] as number;
    jacobian[col] = (g.ilA - f.ilA) / h;
    jacobian[4 + col] = (g.imA - f.imA) / h;
    jacobian[8 + col] = (g.jA - f.jA) / h;
    jacobian[12 + col] = (g.excessA - f.excessA) / h;
  }
  return jacobian;
}
