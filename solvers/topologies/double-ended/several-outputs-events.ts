import type { OutputStage } from '../buck-derived/output-stage.js';
import { isFreewheel, ringAdvance, type RingConstants, type RingSegment } from './node-ring.js';
import { stageDrops } from './referred-outputs.js';

/**
 * Several outputs in the light-load event model (issue 3; DEVELOPERS.md, "Light load with
 * several outputs: the event model"). The equivalent output (`referredOutputs`: the referred
 * inductances in parallel, Leq, its drops the Leq-weighted sums) runs the event half
 * (`solveEventHalf`) on output 0's secondary, and each output follows the common winding
 * voltage stretch by stretch: with a set of outputs conducting through their paths (the ring's
 * `shared` and `clamp` stretches, the turn-off swing included), L_k·dIL_k/dt = c_k·v − (Vo_k +
 * Von_k) while Leq·dI/dt = v − Eeq, so over a stretch IL_k moves by (c_k·Leq/L_k)·ΔI +
 * ((c_k·Eeq − Vo_k − Von_k)/L_k)·t; freewheeling (the winding at zero: the turn-on commutation
 * and the ring's `off` stretches) it falls at (Vo_k + Voff_k)/L_k, which is the same form with
 * the freewheel's Eeq and drops; the on-time at c_k·Vs. With c_k = n0/n_k. Over the half IL_k is
 * affine in (Vo_k, IL_k at turn-on), so periodicity and charge balance (its mean IL the load)
 * give both in closed form. The outputs' referred currents then sum to the equivalent's at every
 * instant where the equivalent's Eeq is the weighted sum of the outputs' Vo_k + drops, which the
 * caller's fixed point on the cross-regulated Vo_k reaches. Exact while every output conducts
 * wherever the equivalent does; where the equivalent's current is zero (the ring's `idle`
 * stretch) every output is taken to be at zero, exact where the outputs reach zero together
 * (their referred currents in proportion) and otherwise an approximation whose size is reported
 * (`snapA`, the largest current set to zero there, and `lowestA`, the lowest current at a
 * stretch's end): the caller rejects the corner where those are not small.
 * ref: Erickson & Maksimović, 2nd ed. (from memory), §2.3 (volt-second and charge balance) and
 * §6.3 (several outputs referred to one winding); superposition of a linear circuit's stretches,
 * common practice.
 */

/** The equivalent's solved half, as `eventState` has it (output 0's secondary, SI units). */
export interface EquivalentHalf {
  halfS: number;
  commutationS: number;
  onS: number;
  /** The on-time's winding voltage on output 0's secondary, Vp/n0, V. */
  onV: number;
  constants: RingConstants;
  /** The ring's stretches from the switches' opening to the half's end. */
  segments: readonly RingSegment[];
  /** The equivalent's current at the ring's end (the next half's start), A. */
  endA: number;
  /**
   * Whether the equivalent's current is held at zero at the on-time's start (the commutation
   * took it to zero) or at its end (the on-time too short to lift it): `runHalf`'s clamps,
   * which every output then follows (its current set to zero there, its charge over the
   * stretch taken as the equivalent's is).
   */
  isOnStartZero: boolean;
  isPeakZero: boolean;
}

/** One output following the equivalent over the half. */
export interface FollowedOutput {
  voltageV: number;
  /** Inductor current at the half's start (turn-on), A. */
  startA: number;
  /** After the turn-on commutation (the on-time's valley), A. */
  onStartA: number;
  /** As the switches open, A. */
  peakA: number;
  /** The current at the start of each ring stretch, A. */
  segmentStartsA: number[];
  /** Leq·c_k/L_k: the share of the equivalent's change it takes. */
  perRingA: number;
  /** Its own slope term with a path conducting, (c_k·Eeq − Vo_k − Von_k)/L_k, A/s. */
  perS: number;
  /** The same freewheeling, (c_k·Eeq,off − Vo_k − Voff_k)/L_k, A/s. */
  offPerS: number;
  /** The largest current set to zero where the equivalent idles, A. */
  snapA: number;
  /** The lowest current at a stretch's end (negative where the output would have stopped), A. */
  lowestA: number;
  /** Whether the current is zero anywhere in the half. */
  hasIdle: boolean;
}

/** An affine function a + b·Vo + e·IL0 of an output's voltage and turn-on current. */
interface Affine {
  a: number;
  b: number;
  e: number;
}

/**
 * Output `stage` (c = n0/n_k) following the equivalent's half `h`: its Vo and turn-on current
 * from periodicity and charge balance, and its current at every stretch's start; undefined where
 * that system is singular.
 */
export function followOutput(
  stage: OutputStage,
  c: number,
  h: EquivalentHalf,
): FollowedOutput | undefined {
  const k = h.constants;
  const l = stage.inductanceH;
  const leq = k.c.inductanceH;
  const drops = stageDrops(stage);
  const perRingA = (c * leq) / l;
  // Slopes' constant parts (A/s); each slope is (constant − Vo)/L.
  const pathConstV = c * k.c.pathV - drops.onV;
  const offConstV = c * k.c.freewheelV - drops.offV;
  // The walk: current (affine), charge (affine), stretch starts (affine).
  const i: Affine = { a: 0, b: 0, e: 1 };
  const q: Affine = { a: 0, b: 0, e: 0 };
  const starts: Affine[] = [];
  const snaps: Affine[] = [];
  const ends: Affine[] = [];
  // The turn-on commutation (winding at zero) and the on-time (c·Vs), without the ring's term;
  // where the equivalent's current is held at zero there, the output's is too.
  if (h.isOnStartZero) {
    snaps.push(affineAfter(i, l, -drops.offV, h.commutationS));
    q.e += h.commutationS / 2;
    i.a = 0;
    i.b = 0;
    i.e = 0;
  } else {
    advance(i, q, l, perRingA, -drops.offV, h.commutationS, 0, 0, 0);
  }
  const onStart: Affine = { a: i.a, b: i.b, e: i.e };
  if (h.isPeakZero) {
    snaps.push(affineAfter(i, l, c * h.onV - drops.onV, h.onS));
    q.a += (i.a * h.onS) / 2;
    q.b += (i.b * h.onS) / 2;
    q.e += (i.e * h.onS) / 2;
    i.a = 0;
    i.b = 0;
    i.e = 0;
  } else {
    advance(i, q, l, perRingA, c * h.onV - drops.onV, h.onS, 0, 0, 0);
  }
  const peak: Affine = { a: i.a, b: i.b, e: i.e };
  let hasIdle = false;
  for (let s = 0; s < h.segments.length; s++) {
    const segment = h.segments[s] as RingSegment;
    const startA = segment.start.inductorA;
    const endA =
      s + 1 < h.segments.length ? (h.segments[s + 1] as RingSegment).start.inductorA : h.endA;
    if (segment.mode === 'idle') {
      snaps.push({ a: i.a, b: i.b, e: i.e });
      i.a = 0;
      i.b = 0;
      i.e = 0;
      starts.push({ a: 0, b: 0, e: 0 });
      hasIdle = true;
      continue;
    }
    starts.push({ a: i.a, b: i.b, e: i.e });
    const chargeAS = ringAdvance(
      k,
      segment.mode,
      segment.side,
      segment.start,
      segment.durationS,
    ).chargeAS;
    const constV = isFreewheel(segment.mode) ? offConstV : pathConstV;
    advance(i, q, l, perRingA, constV, segment.durationS, endA - startA, chargeAS, startA);
    ends.push({ a: i.a, b: i.b, e: i.e });
  }
  // Periodicity: i(Vo, IL0) = IL0; charge: q(Vo, IL0) = Io·Th.
  const a11 = i.b;
  const a12 = i.e - 1;
  const b1 = -i.a;
  const a21 = q.b;
  const a22 = q.e;
  const b2 = stage.loadA * h.halfS - q.a;
  const det = a11 * a22 - a12 * a21;
  if (!(Math.abs(det) > 0) || !Number.isFinite(det)) return undefined;
  const voltageV = (b1 * a22 - a12 * b2) / det;
  const startA = (a11 * b2 - b1 * a21) / det;
  if (!Number.isFinite(voltageV) || !Number.isFinite(startA)) return undefined;
  const at = (f: Affine) => f.a + f.b * voltageV + f.e * startA;
  let snapA = 0;
  for (const f of snaps) snapA = Math.max(snapA, Math.abs(at(f)));
  let lowestA = Math.min(startA, at(onStart), at(peak));
  for (const f of ends) lowestA = Math.min(lowestA, at(f));
  const segmentStartsA = starts.map(at);
  if (startA <= 0 || at(onStart) <= 0) hasIdle = true;
  return {
    voltageV,
    startA,
    onStartA: at(onStart),
    peakA: at(peak),
    segmentStartsA,
    perRingA,
    perS: (pathConstV - voltageV) / l,
    offPerS: (offConstV - voltageV) / l,
    snapA,
    lowestA,
    hasIdle,
  };
}

/**
 * One stretch of `durationS` added to the current `i` and the charge `q` (both affine in Vo and
 * IL0): IL(t) = IL(s) + perRingA·(I(t) − I(s)) + (constV − Vo)·t/L, with the equivalent's change
 * ΔI and ∫I dt over the stretch. A module function, not a named arrow in `followOutput`: under
 * tsx esbuild's keepNames wraps each named arrow in a defineProperty call.
 */
function advance(
  i: Affine,
  q: Affine,
  l: number,
  perRingA: number,
  constV: number,
  durationS: number,
  ringDeltaA: number,
  ringChargeAS: number,
  ringStartA: number,
): void {
  q.a +=
    i.a * durationS +
    perRingA * (ringChargeAS - ringStartA * durationS) +
    (constV * durationS * durationS) / (2 * l);
  q.b += i.b * durationS - (durationS * durationS) / (2 * l);
  q.e += i.e * durationS;
  i.a += perRingA * ringDeltaA + (constV * durationS) / l;
  i.b -= durationS / l;
}

/** The current `i` would reach after `durationS` at slope (constV − Vo)/L (no ring term). */
function affineAfter(i: Affine, l: number, constV: number, durationS: number): Affine {
  return { a: i.a + (constV * durationS) / l, b: i.b - durationS / l, e: i.e };
}
