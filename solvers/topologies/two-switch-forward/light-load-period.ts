import { brentRoot } from '../../root-finding/brent-root.js';

/**
 * One period of a forward at light load, event by event, referred to the first output's
 * secondary (issue 3; DEVELOPERS.md, "Light load: the event period"). Lr = Lm/n², Cr = C·n² (n
 * the first output's turns ratio, C the capacitance the winding sees), the clamp Vr/n, the
 * referred magnetizing current i = n·Im (positive as the on-time drives it) and the winding
 * voltage v (positive in the forward direction). Output k's secondary sees q·v (q = n/nk), so
 * referred its inductance is Lk/q², its paths' voltages P/q and F/q and its current q·ILk
 * (`ForwardEventOutput`; q = 1 for the first). After the on-time the node is in one of four
 * stretches, each a closed form:
 * - `forward`: the forward rectifiers of the outputs that conduct (the on-set) carry their
 *   inductors: Lk·dILk/dt = v − Pk, Lr·di/dt = v, Cr·dv/dt = −(i + ΣILk). The on-set is one
 *   branch, 1/Leq = Σ1/Lk, Peq = Leq·ΣPk/Lk, Ieq = ΣILk (parallel sources behind inductors,
 *   common practice); Leq·Ieq − Lr·i falls at Peq, and (v − Vc, (i + Ieq)·√(Leq‖Lr/Cr)) turns
 *   at 1/√(Leq‖Lr·Cr) about Vc = Peq·Lr/(Leq + Lr); each ILk = ILk0 + (Leq·(Ieq − Ieq0) +
 *   (Peq − Pk)·t)/Lk. An output leaves the set where its current reaches zero, and an idle one
 *   joins where v rises to its Pk. It is the turn-off swing (from v = Vp/n: the swing is no
 *   longer the constant-current estimate here) and, after the ring's return, the drain of Lm
 *   and the inductors in series (the mechanism measured in the study below).
 * - `reversed`, no forward rectifier on: Lr rings with Cr alone about zero (1/√(Lr·Cr)) while
 *   the inductors freewheel at −F/L to zero (F = Vo + the freewheel's drop); the winding is held
 *   at −Vr/n by the clamp while i > 0 there (`clamp`). It ends at v = 0 rising while an inductor
 *   freewheels, or at the least Pk once all are idle.
 * - `held`: rectifier pairs conduct, the winding at zero, i unchanged (i < 0) and each IL
 *   falling at F/L until ΣIL = −i, where the forward rectifiers alone are left (`forward`).
 * Lossless (common practice: an LC ring, ½·L·i² + ½·C·v² conserved); the circuit's damping (the
 * deck's 1 Ω behind each switch capacitance) is left out. With one output every sum is that
 * output's own number, so the arithmetic is the one-output model's.
 */
export interface ForwardEventOutput {
  /** Output inductance referred to the first secondary, Lk·(nk/n)², H. */
  inductanceH: number;
  /** Vo plus the forward path's drop, referred (× nk/n), V. */
  pathV: number;
  /** Vo plus the freewheeling path's drop, referred, V. */
  freewheelV: number;
}

export interface ForwardEventCircuit {
  /** The outputs, the regulated one first. */
  outputs: readonly ForwardEventOutput[];
  /** Lm/n², H. */
  referredMagnetizingH: number;
  /** C·n², F (> 0). */
  capacitanceF: number;
  /** The clamp referred, Vr/n, V. */
  clampV: number;
  /** Winding voltage during the on-time, Vp/n, V. */
  onV: number;
  periodS: number;
  /** Leakage referred, Llk/n², H: the turn-on commutation (winding held at zero). */
  leakageH: number;
}

/** The state at a turn-on: each output's referred inductor current and i, A. */
export interface ForwardEventStart {
  inductorsA: readonly number[];
  magnetizingA: number;
}

/** What one period gives: the end state, each output's ∫IL dt, and what the stresses read. */
export interface ForwardEventPeriod {
  end: ForwardEventStart;
  /** Each output's ∫IL dt over the period, referred, A·s. */
  chargesAS: number[];
  /** The turn-on commutation, s. */
  commutationS: number;
  /** Each output's referred IL as the gate turns off, and their sum, A. */
  inductorPeaksA: number[];
  inductorPeakA: number;
  /** i as the gate turns off, A. */
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
  /** A forward rectifier alone carries its inductor somewhere after the ring's return. */
  hasDrain: boolean;
  /** An inductor current at zero somewhere in the off-time. */
  hasIdle: boolean;
}

type Mode = 'forward' | 'reversed' | 'clamp' | 'held';

/**
 * Stretches one period may take before it is given up (a lossless ring re-triggering): 60 for
 * one output, 20 more for each other (each adds its own zero and its join).
 */
const STRETCHES_FIRST = 60;
const STRETCHES_EACH_OTHER = 20;

/**
 * Returns one period at duty cycle D from `start`, or undefined where it ran out of stretches
 * or the winding swung past the on-voltage (the switches' body diodes, not modelled here).
 */
export function forwardEventPeriod(
  c: ForwardEventCircuit,
  dutyCycle: number,
  start: ForwardEventStart,
): ForwardEventPeriod | undefined {
  const outs = c.outputs;
  const count = outs.length;
  const lr = c.referredMagnetizingH;
  const im0 = start.magnetizingA;
  // Sized once (this runs for every Newton trial).
  const il = new Array<number>(count);
  const fall = new Array<number>(count);
  const isOn = new Array<boolean>(count);
  const chargesAS = new Array<number>(count);
  const inductorPeaksA = new Array<number>(count);
  let il0Sum = 0;
  for (let k = 0; k < count; k++) {
    const x = Math.max(0, start.inductorsA[k] ?? 0);
    il[k] = x;
    il0Sum += x;
    fall[k] =
      (outs[k] as ForwardEventOutput).freewheelV / (outs[k] as ForwardEventOutput).inductanceH;
  }
  // ref: Mohan, Undeland, Robbins, 3rd ed. (from memory), §5-3: the commutation through the
  // leakage, tc = Llk·ΔI/V (the winding at zero while the primary current rises to ΣIL + i).
  const onS = dutyCycle * c.periodS;
  const tcS = Math.min((c.leakageH * Math.max(0, il0Sum + im0)) / c.onV, 0.9 * onS);
  const riseS = onS - tcS;
  let inductorPeakA = 0;
  let isAnyOn = false;
  let hasIdle = false;
  for (let k = 0; k < count; k++) {
    const o = outs[k] as ForwardEventOutput;
    const il0 = il[k] as number;
    const ilOn = Math.max(0, il0 - (fall[k] as number) * tcS);
    let chargeAS = ((il0 + ilOn) / 2) * tcS;
    const il1 = Math.max(0, ilOn + ((c.onV - o.pathV) / o.inductanceH) * riseS);
    chargeAS += ((ilOn + il1) / 2) * riseS;
    il[k] = il1;
    chargesAS[k] = chargeAS;
    inductorPeaksA[k] = il1;
    inductorPeakA += il1;
    isOn[k] = il1 > 0;
    if (il1 > 0) isAnyOn = true;
    else hasIdle = true;
  }
  const im1 = im0 + (c.onV / lr) * riseS;
  const offS = c.periodS - onS;
  const idleOmega = 1 / Math.sqrt(lr * c.capacitanceF);
  const idleZOhm = Math.sqrt(lr / c.capacitanceF);
  let im = im1;
  let v = c.onV;
  let t = 0;
  let mode: Mode = isAnyOn ? 'forward' : 'reversed';
  let reversedPeakV = 0;
  let forwardPeakV = 0;
  let ringEndMagnetizingA = NaN;
  let swingEndS = NaN;
  let swingEndMagnetizingA = NaN;
  let clampStartS = NaN;
  let clampEndS = NaN;
  let ringReturnS = NaN;
  let hasDrain = false;
  let isAfterSwing = false;
  const maxStretches = STRETCHES_FIRST + STRETCHES_EACH_OTHER * (count - 1);
  let ringLeq = NaN;
  let ringPeq = NaN;
  let omega = NaN;
  let zOhm = NaN;
  let centreV = NaN;
  for (let stretch = 0; stretch < maxStretches; stretch++) {
    const leftS = offS - t;
    if (leftS <= 0) break;
    if (mode === 'held') {
      // i < 0 circulates through the forward rectifiers; ΣIL falls to −i, then the drain.
      let sumA = 0;
      let sumFall = 0;
      let zeroS = Infinity;
      let zeroK = -1;
      let active = 0;
      let last = -1;
      for (let k = 0; k < count; k++) {
        const x = il[k] as number;
        if (!(x > 0)) continue;
        sumA += x;
        sumFall += fall[k] as number;
        active++;
        last = k;
        const toZeroS = x / (fall[k] as number);
        if (toZeroS < zeroS) {
          zeroS = toZeroS;
          zeroK = k;
        }
      }
      if (active === 0) {
        mode = 'reversed';
        continue;
      }
      const toS = (sumA + im) / sumFall;
      const sumS = Math.max(toS, 0);
      const dt = Math.min(sumS, leftS, zeroS);
      for (let k = 0; k < count; k++) {
        const x = il[k] as number;
        if (!(x > 0)) continue;
        const f = fall[k] as number;
        chargesAS[k] = (chargesAS[k] as number) + (x - (f * dt) / 2) * dt;
        il[k] = x - f * dt;
      }
      t += dt;
      if (dt < leftS) {
        if (dt === sumS) {
          if (active === 1) il[last] = -im;
          for (let k = 0; k < count; k++) isOn[k] = (il[k] as number) > 0;
          mode = anyTrue(isOn) ? 'forward' : 'reversed';
          hasDrain = true;
        } else {
          // One inductor reached zero first: the others hold the winding on.
          il[zeroK] = 0;
          hasIdle = true;
        }
      }
      continue;
    }
    if (mode === 'clamp') {
      const toS = (lr * im) / c.clampV;
      const dt = Math.min(toS, leftS);
      if (freewheelAll(il, fall, chargesAS, dt)) hasIdle = true;
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
      // v = v0·cos θ − i0·Z·sin θ, i = i0·cos θ + (v0/Z)·sin θ; the inductors freewheel.
      const y0 = v;
      const z0 = -im * idleZOhm;
      const amplitude = Math.sqrt(y0 * y0 + z0 * z0);
      let ilZeroS = Infinity;
      let leastPathV = Infinity;
      let leastK = -1;
      for (let k = 0; k < count; k++) {
        const x = il[k] as number;
        if (x > 0) ilZeroS = Math.min(ilZeroS, x / (fall[k] as number));
        const p = (outs[k] as ForwardEventOutput).pathV;
        if (p < leastPathV) {
          leastPathV = p;
          leastK = k;
        }
      }
      const isFreewheeling = ilZeroS < Infinity;
      // The upper boundary: zero while an inductor freewheels, the least P once all are idle.
      let endS = Math.min(leftS, ilZeroS);
      let next: Mode | 'upper' | 'none' = 'none';
      const clampS = firstCrossingS(y0, z0, -c.clampV, idleOmega, -1);
      if (clampS < endS) {
        endS = clampS;
        next = 'clamp';
      }
      const upperV = isFreewheeling ? 0 : leastPathV;
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
      if (freewheelAll(il, fall, chargesAS, endS)) hasIdle = true;
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
        // Rising through zero with inductors freewheeling: the rectifier pairs hold the winding
        // while ΣIL ≥ −i; otherwise, or at P with the inductors idle, forward rectifiers alone.
        let sumA = 0;
        for (let k = 0; k < count; k++) {
          const x = il[k] as number;
          isOn[k] = x > 0 || (!isFreewheeling && k === leastK);
          if (x > 0) sumA += x;
        }
        // The least P's output drains where nothing else would (one output: always it).
        if (!anyTrue(isOn)) isOn[leastK] = true;
        if (sumA > 0 && sumA + im >= 0) mode = 'held';
        else {
          mode = 'forward';
          hasDrain = true;
        }
      }
      continue;
    }
    // `forward`: the on-set's forward rectifiers conduct, taken as one branch.
    let leq = NaN;
    let peq = 0;
    let ieq = 0;
    let onCount = 0;
    for (let k = 0; k < count; k++) {
      if (!isOn[k]) continue;
      const o = outs[k] as ForwardEventOutput;
      if (onCount === 0) {
        leq = o.inductanceH;
        peq = o.pathV;
      } else {
        peq = (peq * o.inductanceH + o.pathV * leq) / (leq + o.inductanceH);
        leq = (leq * o.inductanceH) / (leq + o.inductanceH);
      }
      ieq += il[k] as number;
      onCount++;
    }
    if (leq !== ringLeq || peq !== ringPeq) {
      // The ring of this on-set (kept while the set's branch stays: one output, always).
      ringLeq = leq;
      ringPeq = peq;
      const lp = (leq * lr) / (leq + lr);
      omega = 1 / Math.sqrt(lp * c.capacitanceF);
      zOhm = Math.sqrt(lp / c.capacitanceF);
      centreV = (peq * lr) / (leq + lr);
    }
    const w0 = leq * ieq - lr * im;
    const s0 = im + ieq;
    const y0 = v - centreV;
    const z0 = -s0 * zOhm;
    const vZeroS = firstCrossingS(y0, z0, -centreV, omega, -1);
    let endS = Math.min(leftS, vZeroS);
    // Ieq = (w0 − Peq·t + Lr·s(t))/(Leq + Lr), a line plus a sinusoid; each ILk follows it.
    const eq: LineSine = {
      offset: w0 / (leq + lr),
      slope: -peq / (leq + lr),
      cos: (lr * s0) / (leq + lr),
      sin: (lr * y0) / zOhm / (leq + lr),
      omega,
    };
    let event: 'none' | 'idle' | 'join' = 'none';
    let eventK = -1;
    for (let k = 0; k < count; k++) {
      const o = outs[k] as ForwardEventOutput;
      if (isOn[k]) {
        const zeroS = firstRootS(
          onCount === 1 ? eq : outputLine(eq, o, il[k] as number, ieq, leq, peq),
          endS,
        );
        if (zeroS < endS) {
          endS = zeroS;
          event = 'idle';
          eventK = k;
        }
      } else {
        const joinS = firstCrossingS(y0, z0, o.pathV - centreV, omega, 1);
        if (joinS < endS) {
          endS = joinS;
          event = 'join';
          eventK = k;
        }
      }
    }
    const isIdle = event === 'idle';
    const th = omega * endS;
    const cos = Math.cos(th);
    const sin = Math.sin(th);
    const amplitude = Math.sqrt(y0 * y0 + z0 * z0);
    const crestS = firstCrossingS(y0, z0, amplitude * (1 - 1e-12), omega, 0);
    if (crestS <= endS && isAfterSwing) forwardPeakV = Math.max(forwardPeakV, centreV + amplitude);
    const integralS = (s0 * sin + (y0 / zOhm) * (1 - cos)) / omega;
    const eqChargeAS = (w0 * endS - (peq * endS * endS) / 2 + lr * integralS) / (leq + lr);
    const s = s0 * cos + (y0 / zOhm) * sin;
    v = centreV + y0 * cos + z0 * sin;
    const ieqEnd = (w0 - peq * endS + lr * s) / (leq + lr);
    let onSumA = 0;
    for (let k = 0; k < count; k++) {
      if (!isOn[k]) continue;
      const x = il[k] as number;
      if (onCount === 1) {
        chargesAS[k] = (chargesAS[k] as number) + eqChargeAS;
        il[k] = isIdle ? 0 : ieqEnd;
      } else {
        const o = outs[k] as ForwardEventOutput;
        const a = leq / o.inductanceH;
        const b = (peq - o.pathV) / o.inductanceH;
        chargesAS[k] =
          (chargesAS[k] as number) +
          x * endS +
          a * (eqChargeAS - ieq * endS) +
          (b * endS * endS) / 2;
        il[k] = isIdle && k === eventK ? 0 : Math.max(0, x + a * (ieqEnd - ieq) + b * endS);
      }
      onSumA += il[k] as number;
    }
    im = s - onSumA;
    t += endS;
    if (isAfterSwing) forwardPeakV = Math.max(forwardPeakV, v);
    if (v > c.onV * (1 + 1e-9)) return undefined;
    if (isIdle) {
      hasIdle = true;
      isOn[eventK] = false;
      if (!anyTrue(isOn)) mode = 'reversed';
    } else if (event === 'join') {
      isOn[eventK] = true;
    } else if (endS === vZeroS && endS < leftS) {
      v = 0;
      if (!isAfterSwing) {
        isAfterSwing = true;
        swingEndS = t;
        swingEndMagnetizingA = im;
      }
      for (let k = 0; k < count; k++) isOn[k] = false;
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
    end: { inductorsA: il, magnetizingA: im },
    chargesAS,
    commutationS: tcS,
    inductorPeaksA,
    inductorPeakA,
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

/**
 * Output k's current in the on-set as a line plus a sinusoid, from the branch's:
 * ILk = ILk0 + (Leq·(Ieq − Ieq0) + (Peq − Pk)·t)/Lk.
 */
function outputLine(
  eq: LineSine,
  o: ForwardEventOutput,
  startA: number,
  eqStartA: number,
  leq: number,
  peq: number,
): LineSine {
  const a = leq / o.inductanceH;
  return {
    offset: startA + a * (eq.offset - eqStartA),
    slope: a * eq.slope + (peq - o.pathV) / o.inductanceH,
    cos: a * eq.cos,
    sin: a * eq.sin,
    omega: eq.omega,
  };
}

/**
 * Every inductor freewheels for `dt` (s): their charge and currents, in place; true where one
 * is then at zero.
 */
function freewheelAll(il: number[], fall: number[], chargesAS: number[], dt: number): boolean {
  let isAnyIdle = false;
  for (let k = 0; k < il.length; k++) {
    const x = il[k] as number;
    const f = fall[k] as number;
    chargesAS[k] = (chargesAS[k] as number) + freewheelCharge(x, f, dt);
    const next = Math.max(0, x - f * dt);
    il[k] = next;
    if (next <= 0) isAnyIdle = true;
  }
  return isAnyIdle;
}

/** Whether any flag is set (a loop: this runs in every stretch of every period). */
function anyTrue(flags: readonly boolean[]): boolean {
  for (const flag of flags) if (flag) return true;
  return false;
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
