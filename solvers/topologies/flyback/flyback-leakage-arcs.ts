import type { FlybackCircuit } from './flyback-circuit.js';
import type { OperatingPoint } from './flyback-operating-point.js';
import { ringConstantsOf, type RingConstants } from './flyback-ring-constants.js';

/**
 * Largest phase step (rad) between the points the waveforms draw along the leakage ring; each arc
 * gets at least two steps, so that it has an inner point (see {@link leakageRingArcs}).
 */
const LEAKAGE_PHASE_STEP = Math.PI / 8;

/** The leakage ring's arcs as the waveforms draw them (flyback-ring-traces.ts). */
export interface LeakageRingArcs {
  /** Z = √(Llk/C), Ω. */
  impedanceOhm: number;
  /** U: the ring's amplitude about its centre Vin + Vr, V. */
  amplitudeV: number;
  /** θ0: the ring's phase where it starts, at the drain's rise to Vin + V0 (rad). */
  fromPhase: number;
  /** Phase the ring advances over tb (rad), drawn in `riseSteps` equal steps. */
  riseSpan: number;
  riseSteps: number;
  /** The leakage's charge over tb, C·(u_pk − u0), A·s (see {@link leakageChargeAS}). */
  riseChargeAS: number;
  /** Phase the return advances over its time (rad), drawn in `returnSteps` equal steps. */
  returnSpan: number;
  returnSteps: number;
  /** The leakage's charge over the return, −C·u_pk·(1 − cos ωτ), A·s. */
  returnChargeAS: number;
}

/**
 * The arcs of the leakage ring of `p` (flyback-turn-off.ts): u = U·sin θ and
 * i = (U/Z)·cos θ from θ0 = −asin((Vr − V0)/U) over ω·tb, then the return u = u_pk·cos φ,
 * i = −(u_pk/Z)·sin φ over ω·τ; each drawn at most π/8 apart, in at least two steps, with the
 * exact charge of each arc. The chords between points of a sinusoid lose the same fraction of
 * each step's charge, 1 − (h/2)·cot(h/2) (about 1.3 % at h = π/8; the trapezoidal rule on
 * cos θ, common practice), so the waveforms scale an arc's inner currents until its chords carry
 * the arc's charge (flyback-ring-traces.ts): the leakage's charge then agrees with
 * {@link leakageChargeAS} and the outputs' charge balance holds, with few points per arc.
 */
export function leakageRingArcs(c: FlybackCircuit, p: OperatingPoint): LeakageRingArcs {
  const constants = ringConstantsOf(c.leakageInductanceH, c.drainCapacitanceF);
  const impedanceOhm = constants.impedanceOhm;
  const offsetV = p.turnOffReflectedV - c.reflectedOffsetV;
  const zi = impedanceOhm * p.transitionEndCurrentA;
  const amplitudeV = Math.sqrt(zi * zi + offsetV * offsetV);
  const secondsPerRadian = constants.secondsPerRadian;
  const riseSpan = p.leakageRingS / secondsPerRadian;
  const returnSpan = p.leakageRingReturnS / secondsPerRadian;
  return {
    impedanceOhm,
    amplitudeV,
    fromPhase: amplitudeV > 0 ? -Math.asin(Math.min(1, offsetV / amplitudeV)) : 0,
    riseSpan,
    riseSteps: Math.max(2, Math.ceil(riseSpan / LEAKAGE_PHASE_STEP)),
    riseChargeAS: riseChargeOf(c, p),
    returnSpan,
    returnSteps: Math.max(2, Math.ceil(returnSpan / LEAKAGE_PHASE_STEP)),
    returnChargeAS: -returnChargeOf(c, p, constants),
  };
}

/**
 * The charge the leakage carries from the start of secondary conduction to the end of the ring's
 * return, A·s: over the ring ∫i dt = C·Δu (C·du/dt = i), C·(u_pk − u0) with u0 = V0 − Vr and
 * u_pk the ring's peak above its centre; ic·ts/2 into the clamp; and the return's
 * C·u_pk·(1 − cos ωτ), negative. The referred secondary carries the magnetizing current less
 * this; the waveforms draw the arcs with these charges (see {@link leakageRingArcs}).
 */
export function leakageChargeAS(c: FlybackCircuit, p: OperatingPoint): number {
  const clampChargeAS = (p.clampOnsetCurrentA * p.turnOffCommutationS) / 2;
  if (!(p.leakageRingS > 0)) return clampChargeAS;
  const constants = ringConstantsOf(c.leakageInductanceH, c.drainCapacitanceF);
  return riseChargeOf(c, p) + clampChargeAS - returnChargeOf(c, p, constants);
}

/** C·(u_pk − u0): the leakage's charge over the ring's rise, A·s. */
function riseChargeOf(c: FlybackCircuit, p: OperatingPoint): number {
  return c.drainCapacitanceF * (p.leakageRingPeakV + p.turnOffReflectedV - c.reflectedOffsetV);
}

/** C·u_pk·(1 − cos ωτ): the magnitude of the leakage's charge over the return, A·s. */
function returnChargeOf(c: FlybackCircuit, p: OperatingPoint, constants: RingConstants): number {
  const returnS = p.leakageRingReturnS;
  // The return mostly lasts the quarter period (every CCM pass): its cosine is kept.
  if (returnS !== constants.returnS) {
    constants.returnS = returnS;
    constants.returnFraction = 1 - Math.cos(returnS / constants.secondsPerRadian);
  }
  return c.drainCapacitanceF * p.leakageRingPeakV * constants.returnFraction;
}
