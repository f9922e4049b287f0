import { brentRoot } from '../../root-finding/brent-root.js';

/**
 * One period of a one-output forward at light load, event by event, referred to the secondary
 * (issue 3; DEVELOPERS.md, "Light load: the event period"). Lr = Lm/n², Cr = C·n² (C the
 * capacitance the winding sees), the clamp Vr/n, the referred magnetizing current i = n·Im
 * (positive as the on-time drives it) and the winding voltage v (positive in the forward
 * direction). After the on-time the node is in one of four stretches, each a closed form:
 * - `forward`: the forward rectifier alone carries the inductor (IL > 0): L·dIL/dt = v − P,
 *   Lr·di/dt = v, Cr·dv/dt = −(i + IL), P = Vo + the path's drop. L·IL − Lr·i falls at P, and
 *   (v − Vc, (i + IL)·√(L‖Lr/Cr)) turns at 1/√(L‖Lr·Cr) about Vc = P·Lr/(L + Lr): the turn-off
 *   swing and, after the ring's return, the drain of Lm and L in series.
 * - `reversed`: the forward rectifier off, Lr rings with Cr alone about zero (1/√(Lr·Cr)) while
 *   the inductor freewheels at −F/L to zero (F = Vo + the freewheel's drop); the winding is held
 *   at −Vr/n by the clamp while i > 0 there (`clamp`).
 * - `held`: both rectifiers conduct, the winding at zero, i unchanged (i < 0) and IL falling
 *   at F/L until IL = −i, where the forward rectifier alone is left (`forward`).
 * Lossless (common practice: an LC ring, ½·L·i² + ½·C·v² conserved); the circuit's damping (the
 * deck's 1 Ω behind each switch capacitance) is left out.
 */
export interface ForwardEventCircuit {
  /** Output inductance, H. */
  inductanceH: number;
  /** Lm/n², H. */
  referredMagnetizingH: number;
  /** C·n², F (> 0). */
  capacitanceF: number;
  /** The clamp referred, Vr/n, V. */
  clampV: number;
  /** Winding voltage during the on-time, Vp/n, V. */
  onV: number;
  /** Vo plus the forward path's drop, V. */
  pathV: number;
  /** Vo plus the freewheeling path's drop, V. */
  freewheelV: number;
  periodS: number;
  /** Leakage referred, Llk/n², H: the turn-on commutation (winding held at zero). */
  leakageH: number;
}

/** The state at a turn-on: inductor and referred magnetizing currents, A. */
export interface ForwardEventStart {
  inductorA: number;
  magnetizingA: number;
}

/** What one period gives: the end state, ∫IL dt, and what the stresses read. */
export interface ForwardEventPeriod {
  end: ForwardEventStart;
  chargeAS: number;
  /** The turn-on commutation, s. */
  commutationS: number;
  /** IL and i as the gate turns off, A. */
  inductorPeakA: number;
  magnetizingPeakA: number;
  /** Largest reversed winding voltage (≥ 0), V, and the largest forward one over the off-time. */
  reversedPeakV: number;
  forwardPeakV: number;
  /** Winding voltage at the next turn-on, V. */
  turnOnV: number;
  /** i at the swing's end (the winding first at zero), A. */
  swingEndMagnetizingA: number;
  /** i as the winding first returns to zero after the swing (the ring's end), A; NaN if never. */
  ringEndMagnetizingA: number;
  /** s after the gate's turn-off: the swing's end, the clamp's start and end, the ring's return. */
  swingEndS: number;
  clampStartS: number;
  clampEndS: number;
  ringReturnS: number;
  /** The forward rectifier alone carries the inductor somewhere after the ring's return. */
  hasDrain: boolean;
  /** The inductor current at zero somewhere in the off-time. */
  hasIdle: boolean;
}

type Mode = 'forward' | 'reversed' | 'clamp' | 'held';

/** Stretches one period may take before it is given up (a lossless ring re-triggering). */
const MAX_STRETCHES = 60;

/**
 * Returns one period at duty cycle D from `start`, or undefined where it ran out of stretches
 * or the winding swung past the on-voltage (the switches' body diodes, not modelled here).
 */
export function forwardEventPeriod(
  c: ForwardEventCircuit,
  dutyCycle: number,
  start: ForwardEventStart,
): ForwardEventPeriod | undefined {
  const l = c.inductanceH;
  const lr = c.referredMagnetizingH;
  const il0 = Math.max(0, start.inductorA);
  const im0 = start.magnetizingA;
  // ref: Mohan, Undeland, Robbins, 3rd ed. (from memory), §5-3: the commutation through the
  // leakage, tc = Llk·ΔI/V (the winding at zero while the primary current rises to IL + i).
  const onS = dutyCycle * c.periodS;
  const tcS = Math.min((c.leakageH * Math.max(0, il0 + im0)) / c.onV, 0.9 * onS);
  const ilOn = Math.max(0, il0 - (c.freewheelV / l) * tcS);
  let chargeAS = ((il0 + ilOn) / 2) * tcS;
  const riseS = onS - tcS;
  const il1 = Math.max(0, ilOn + ((c.onV - c.pathV) / l) * riseS);
  const im1 = im0 + (c.onV / lr) * riseS;
  chargeAS += ((ilOn + il1) / 2) * riseS;
  const offS = c.periodS - onS;
  const lp = (l * lr) / (l + lr);
  const omega = 1 / Math.sqrt(lp * c.capacitanceF);
  const zOhm = Math.sqrt(lp / c.capacitanceF);
  const centreV = (c.pathV * lr) / (l + lr);
  const idleOmega = 1 / Math.sqrt(lr * c.capacitanceF);
  const idleZOhm = Math.sqrt(lr / c.capacitanceF);
  const fallAPerS = c.freewheelV / l;
  let il = il1;
  let im = im1;
  let v = c.onV;
  let t = 0;
  let mode: Mode = il > 0 ? 'forward' : 'reversed';
  let reversedPeakV = 0;
  let forwardPeakV = 0;
  let ringEndMagnetizingA = NaN;
  let swingEndS = NaN;
  let swingEndMagnetizingA = NaN;
  let clampStartS = NaN;
  let clampEndS = NaN;
  let ringReturnS = NaN;
  let hasDrain = false;
  let hasIdle = il <= 0;
  let isAfterSwing = false;
  for (let n = 0; n < MAX_STRETCHES; n++) {
    const leftS = offS - t;
    if (leftS <= 0) break;
    if (mode === 'held') {
      // i < 0 circulates through the forward rectifier; IL falls to −i, then the drain.
      const toS = (il + im) / fallAPerS;
      const dt = Math.min(Math.max(toS, 0), leftS);
      chargeAS += (il - (fallAPerS * dt) / 2) * dt;
      il -= fallAPerS * dt;
      t += dt;
      if (dt < leftS) {
        il = -im;
        mode = 'forward';
        hasDrain = true;
      }
      continue;
    }
    if (mode === 'clamp') {
      const toS = (lr * im) / c.clampV;
      const dt = Math.min(toS, leftS);
      chargeAS += freewheelCharge(il, fallAPerS, dt);
      il = Math.max(0, il - fallAPerS * dt);
      if (il <= 0) hasIdle = true;
      im -= (c.clampV / lr) * dt;
      t += dt;
      if (dt < leftS) {
        im = 0;
        clampEndS = t;
        mode = 'reversed';
      }
      continue;
    }
    if (mode === 'reversed') {
      // v = v0·cos θ − i0·Z·sin θ, i = i0·cos θ + (v0/Z)·sin θ; the inductor freewheels.
      const y0 = v;
      const z0 = -im * idleZOhm;
      const amplitude = Math.sqrt(y0 * y0 + z0 * z0);
      const ilZeroS = il > 0 ? il / fallAPerS : Infinity;
      // The upper boundary: zero while the inductor freewheels, P once it is idle.
      let endS = Math.min(leftS, ilZeroS);
      let next: Mode | 'upper' | 'none' = 'none';
      const clampS = firstCrossingS(y0, z0, -c.clampV, idleOmega, -1);
      if (clampS < endS) {
        endS = clampS;
        next = 'clamp';
      }
      const upperV = il > 0 ? 0 : c.pathV;
      const upperS = firstCrossingS(y0, z0, upperV, idleOmega, 1);
      if (upperS < endS) {
        endS = upperS;
        next = 'upper';
      }
      // The trough, where i passes zero going down, if inside the stretch.
      const troughS = firstCrossingS(y0, z0, -amplitude * (1 - 1e-12), idleOmega, 0);
      if (troughS <= endS) reversedPeakV = Math.max(reversedPeakV, amplitude);
      const th = idleOmega * endS;
      const cos = Math.cos(th);
      const sin = Math.sin(th);
      chargeAS += freewheelCharge(il, fallAPerS, endS);
      il = Math.max(0, il - fallAPerS * endS);
      if (il <= 0) hasIdle = true;
      v = y0 * cos + z0 * sin;
      im = im * cos + (y0 / idleZOhm) * sin;
      t += endS;
      reversedPeakV = Math.max(reversedPeakV, -v);
      if (next === 'clamp') {
        v = -c.clampV;
        if (Number.isNaN(clampStartS)) clampStartS = t;
        mode = 'clamp';
      } else if (next === 'upper') {
        v = upperV;
        if (Number.isNaN(ringReturnS)) {
          ringReturnS = t;
          ringEndMagnetizingA = im;
        }
        // Rising through zero with the inductor freewheeling: both rectifiers hold the winding
        // while IL ≥ −i; otherwise, or at P with the inductor idle, the forward rectifier alone.
        if (il > 0 && il + im >= 0) mode = 'held';
        else {
          mode = 'forward';
          hasDrain = true;
        }
      }
      continue;
    }
    // `forward`: the forward rectifier alone conducts.
    const w0 = l * il - lr * im;
    const s0 = im + il;
    const y0 = v - centreV;
    const z0 = -s0 * zOhm;
    const vZeroS = firstCrossingS(y0, z0, -centreV, omega, -1);
    let endS = Math.min(leftS, vZeroS);
    // IL = (w0 − P·t + Lr·s(t))/(L + Lr), a line plus a sinusoid.
    const ilZeroS = firstRootS(
      {
        offset: w0 / (l + lr),
        slope: -c.pathV / (l + lr),
        cos: (lr * s0) / (l + lr),
        sin: (lr * y0) / zOhm / (l + lr),
        omega,
      },
      endS,
    );
    const isIdle = ilZeroS < endS;
    if (isIdle) endS = ilZeroS;
    const th = omega * endS;
    const cos = Math.cos(th);
    const sin = Math.sin(th);
    const amplitude = Math.sqrt(y0 * y0 + z0 * z0);
    const crestS = firstCrossingS(y0, z0, amplitude * (1 - 1e-12), omega, 0);
    if (crestS <= endS && isAfterSwing) forwardPeakV = Math.max(forwardPeakV, centreV + amplitude);
    const integralS = (s0 * sin + (y0 / zOhm) * (1 - cos)) / omega;
    chargeAS += (w0 * endS - (c.pathV * endS * endS) / 2 + lr * integralS) / (l + lr);
    const s = s0 * cos + (y0 / zOhm) * sin;
    v = centreV + y0 * cos + z0 * sin;
    il = isIdle ? 0 : (w0 - c.pathV * endS + lr * s) / (l + lr);
    im = s - (isIdle ? 0 : il);
    t += endS;
    if (isAfterSwing) forwardPeakV = Math.max(forwardPeakV, v);
    if (v > c.onV * (1 + 1e-9)) return undefined;
    if (isIdle) {
      hasIdle = true;
      mode = 'reversed';
    } else if (endS === vZeroS && endS < leftS) {
      v = 0;
      if (!isAfterSwing) {
        isAfterSwing = true;
        swingEndS = t;
        swingEndMagnetizingA = im;
      }
      if (im >= 0) mode = 'reversed';
      else mode = 'held';
    }
    if (!isAfterSwing && mode !== 'forward') {
      isAfterSwing = true;
      swingEndS = t;
      swingEndMagnetizingA = im;
    }
  }
  if (offS - t > 1e-12 * c.periodS) return undefined;
  return {
    end: { inductorA: il, magnetizingA: im },
    chargeAS,
    commutationS: tcS,
    inductorPeakA: il1,
    magnetizingPeakA: im1,
    reversedPeakV,
    forwardPeakV,
    turnOnV: v,
    swingEndMagnetizingA,
    ringEndMagnetizingA,
    swingEndS,
    clampStartS,
    clampEndS,
    ringReturnS,
    hasDrain,
    hasIdle,
  };
}

/** ∫IL dt over `dt` (s) for an inductor freewheeling from `il` (A) at `fall` (A/s) to zero. */
function freewheelCharge(il: number, fall: number, dt: number): number {
  if (il <= 0) return 0;
  const toZeroS = il / fall;
  const x = Math.min(dt, toZeroS);
  return (il - (fall * x) / 2) * x;
}

/**
 * The first t > 0 (s) where y0·cos ωt + z0·sin ωt = target, crossing downward (direction −1),
 * upward (+1) or either (0); Infinity if never.
 */
function firstCrossingS(
  y0: number,
  z0: number,
  target: number,
  omega: number,
  direction: -1 | 0 | 1,
): number {
  const r = Math.sqrt(y0 * y0 + z0 * z0);
  if (!(r > 0) || Math.abs(target) > r) return Infinity;
  const alpha = Math.atan2(z0, y0);
  const beta = Math.acos(Math.max(-1, Math.min(1, target / r)));
  // θ = α + β: y falling through the target (y = r·cos(θ − α)); θ = α − β: rising.
  const tiny = 1e-9;
  let best = Infinity;
  if (direction !== 1) best = Math.min(best, wrappedPhase(alpha + beta, tiny));
  if (direction !== -1) best = Math.min(best, wrappedPhase(alpha - beta, tiny));
  return best / omega;
}

/** θ in (tiny, 2π + tiny]. */
function wrappedPhase(th: number, tiny: number): number {
  let x = th - 2 * Math.PI * Math.floor(th / (2 * Math.PI));
  if (x < tiny) x += 2 * Math.PI;
  return x;
}

/** offset + slope·t + cos·cos ωt + sin·sin ωt. */
interface LineSine {
  offset: number;
  slope: number;
  cos: number;
  sin: number;
  omega: number;
}

function lineSineAt(k: LineSine, t: number): number {
  const th = k.omega * t;
  return k.offset + k.slope * t + k.cos * Math.cos(th) + k.sin * Math.sin(th);
}

/**
 * The first root in (0, endS] of a line plus a sinusoid, bracketed on steps of π/4 of phase and
 * refined by Brent's method; Infinity if none.
 */
function firstRootS(k: LineSine, endS: number): number {
  if (!Number.isFinite(endS) || endS <= 0) return Infinity;
  const stepS = Math.PI / 4 / k.omega;
  let a = 0;
  let fa = lineSineAt(k, 0);
  if (fa <= 0) {
    // Starting at zero (the drain from an idle inductor): a root only if it does not rise.
    a = 1e-6 * stepS;
    fa = lineSineAt(k, a);
    if (fa <= 0) return 0;
  }
  while (a < endS) {
    const b = Math.min(a + stepS, endS);
    const fb = lineSineAt(k, b);
    if (fb <= 0) {
      // Anonymous arrow: tsx's keepNames would name a named closure with a call each period.
      return brentRoot((t) => lineSineAt(k, t), a, b, {
        absoluteTolerance: 1e-15 + 1e-12 * b,
        valueAtLo: fa,
        valueAtHi: fb,
      });
    }
    a = b;
    fa = fb;
  }
  return Infinity;
}
