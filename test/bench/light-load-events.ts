/**
 * The idealized light-load circuit of `light-load-reference.ts` by exact stretches instead of
 * time steps: each stretch in closed form, each event in closed form (the winding reaching the
 * rail, zero or a rectifier's threshold: an acos) or by bisection on the one falling stretch of
 * the inductor current that holds its zero. A bench tool, not the engine: it shows what an event
 * solve of the light-load half costs and checks the time-stepped reference (the two agree within
 * 0.03 % of the mean inductor current in the cases of DEVELOPERS.md, "Light load below 5 %: a
 * fair deck and an idealized reference").
 *
 * Secondary-referred, in the frame of the half being driven (w > 0 the polarity just driven,
 * rectifier path a conducting for w > 0, b for w < 0): Lr·dIm/dt = w, Cr·dw/dt = −Im − ia + ib,
 * L·dIL/dt = ±w − Vj on the conducting path, −Voff in the freewheel (both paths, w = 0, while
 * IL ≥ |Im|); the winding is forced to Vs during the on-time and clamped at ±Vs by the body
 * diodes. With one path conducting, p = ±w rings about Vw = Vj·Lr/(L + Lr) at
 * ω = 1/√((L‖Lr)·Cr); with none, w rings about zero at 1/√(Lr·Cr).
 * ref: common practice, a series LC ring about its source voltage (as in the engine's
 * `ringAdvance`); the event sequence is the circuit's own.
 */

/** The secondary-referred circuit of one corner (SI units). */
export interface LightLoadCircuit {
  /** The drive voltage on the secondary, Vd/n, V. */
  driveV: number;
  referredMagnetizingH: number;
  inductanceH: number;
  capacitanceF: number;
  /** The conducting path's drop and the freewheel's, at the load current, V. */
  onDropV: number;
  offDropV: number;
  halfS: number;
}

/** The state at a half's start (the turn-on forces the winding to the drive voltage). */
export interface LightLoadState {
  windingV: number;
  magnetizingA: number;
  inductorA: number;
}

/** Events a half may take before it is abandoned (never reached in the cases checked). */
const MAX_EVENTS = 500;

/**
 * The first t in (0, tMax] where centre + a·cos ωt + b·sin ωt crosses `level` upwards
 * (`direction` +1) or downwards (−1), in closed form (an acos); Infinity if none (a level it only
 * touches counts as none).
 */
function levelCrossing(
  centre: number,
  a: number,
  b: number,
  omega: number,
  level: number,
  direction: 1 | -1,
  tMax: number,
): number {
  const r = Math.hypot(a, b);
  const c = r > 0 ? (level - centre) / r : Infinity;
  if (!(c > -1 && c < 1)) return Infinity;
  // a·cos θ + b·sin θ = r·cos(θ − φ): upwards where θ − φ ≡ −acos c, downwards where ≡ +acos c.
  const phi = Math.atan2(b, a);
  const alpha = Math.acos(c);
  let theta = phi + (direction > 0 ? -alpha : alpha);
  theta -= TWO_PI * Math.floor(theta / TWO_PI);
  if (theta <= 1e-12) theta += TWO_PI;
  const t = theta / omega;
  return t <= tMax ? t : Infinity;
}

const TWO_PI = 2 * Math.PI;

/**
 * The first t in (0, tMax] where IL(t) = il0 + k·t + (a·sin ωt − b·cos ωt + b)/(ω·L) reaches
 * zero, with L·dIL/dt = p(t) − Vj, p = centre + a·cos ωt + b·sin ωt: IL falls only while p < Vj,
 * so its minima are where p rises through Vj (and at tMax); the first minimum at or below zero
 * brackets the root on the falling stretch before it, where bisection finds it. Infinity if none.
 */
function inductorZero(
  ilAt: (t: number) => number,
  centre: number,
  a: number,
  b: number,
  omega: number,
  thresholdV: number,
  tMax: number,
): number {
  const r = Math.hypot(a, b);
  const c = r > 0 ? (thresholdV - centre) / r : centre < thresholdV ? -Infinity : Infinity;
  let lo = 0;
  let hi = tMax;
  if (c > -1 && c < 1) {
    // Falling stretches: θ − φ in (acos c, 2π − acos c); each ends at an upward crossing.
    const period = TWO_PI / omega;
    const fallS = (TWO_PI - 2 * Math.acos(c)) / omega;
    let riseThrough = levelCrossing(centre, a, b, omega, thresholdV, 1, Infinity);
    let found = false;
    for (let turn = 0; turn < 100_000 && riseThrough < tMax; turn++) {
      if (ilAt(riseThrough) <= 0) {
        lo = Math.max(0, riseThrough - fallS);
        hi = riseThrough;
        found = true;
        break;
      }
      riseThrough += period;
    }
    if (!found) {
      if (!(ilAt(tMax) <= 0)) return Infinity;
      // The last falling stretch, cut by tMax.
      lo = Math.max(0, riseThrough - period);
    }
  } else if (c <= -1) {
    // p ≥ Vj throughout: IL does not fall.
    return Infinity;
  } else if (!(ilAt(tMax) <= 0)) {
    return Infinity;
  }
  // IL falls on [lo, hi] from above zero (or zero at a start on the threshold) to at or below it.
  if (lo <= 0) lo = 1e-14 * tMax;
  for (let i = 0; i < 80 && hi - lo > 1e-14 * tMax; i++) {
    const mid = (lo + hi) / 2;
    if (ilAt(mid) <= 0) hi = mid;
    else lo = mid;
  }
  return hi;
}

/** One half from `start` at the per-switch duty cycle `duty`, and its end mirrored for the next. */
export function eventHalf(
  c: LightLoadCircuit,
  duty: number,
  outputV: number,
  start: LightLoadState,
): { next: LightLoadState; chargeAS: number; events: number } {
  const lr = c.referredMagnetizingH;
  const l = c.inductanceH;
  const cr = c.capacitanceF;
  const vs = c.driveV;
  const vj = outputV + c.onDropV;
  const voff = outputV + c.offDropV;
  const parallelH = (l * lr) / (l + lr);
  const omega = 1 / Math.sqrt(parallelH * cr);
  const idleOmega = 1 / Math.sqrt(lr * cr);
  const centreV = (vj * lr) / (l + lr);
  const nudgeV = 1e-9 * vs;
  const onS = 2 * duty * c.halfS;
  let im = start.magnetizingA;
  let il = start.inductorA;
  // The on-time: the winding forced to Vs.
  const ilOn = Math.max(0, il + ((vs - vj) / l) * onS);
  let chargeAS = ((il + ilOn) / 2) * onS;
  il = ilOn;
  im += (vs / lr) * onS;
  let w = vs;
  let t = onS;
  let events = 0;
  while (t < c.halfS * (1 - 1e-15) && events < MAX_EVENTS) {
    events++;
    const left = c.halfS - t;
    if (il > 0 && w === 0 && Math.abs(im) <= il) {
      // The freewheel, until IL falls to |Im| (a path stops) or the half ends.
      const dt = Math.min(left, ((il - Math.abs(im)) * l) / voff);
      const ilEnd = Math.max(0, il - (voff / l) * dt);
      chargeAS += ((il + ilEnd) / 2) * dt;
      il = ilEnd;
      t += dt;
      // The path that stops is the one carrying (IL − |Im|)/2: the winding leaves zero
      // towards the other path's side.
      if (dt < left) w = im > 0 ? -nudgeV : nudgeV;
      continue;
    }
    if (il > 0 || Math.abs(w) >= vj) {
      // One path, s the sign of w: p = s·w, m = s·Im, S = m + IL is the capacitor's discharge.
      const s = w > 0 ? 1 : -1;
      const p0 = s * w;
      const m0 = s * im;
      const sumA = m0 + il;
      if (p0 >= vs * (1 - 1e-12) && sumA < 0) {
        // Clamped at the rail until S returns to zero (the excess goes back to the input).
        const dt = Math.min(left, -sumA / (vs / parallelH - vj / l));
        const ilEnd = il + ((vs - vj) / l) * dt;
        chargeAS += ((il + ilEnd) / 2) * dt;
        il = ilEnd;
        im = s * (m0 + (vs / lr) * dt);
        w = s * vs;
        t += dt;
        continue;
      }
      const a = p0 - centreV;
      const b = -sumA / (cr * omega);
      const pAt = (x: number) => centreV + a * Math.cos(omega * x) + b * Math.sin(omega * x);
      const ilAt = (x: number) =>
        il +
        ((centreV - vj) * x + (a * Math.sin(omega * x) - b * Math.cos(omega * x) + b) / omega) / l;
      const tRail = levelCrossing(centreV, a, b, omega, vs, 1, left);
      const tZeroV = levelCrossing(centreV, a, b, omega, 0, -1, left);
      const tZeroIl = inductorZero(ilAt, centreV, a, b, omega, vj, Math.min(left, tRail, tZeroV));
      const dt = Math.max(Math.min(left, tZeroIl, tRail, tZeroV), 1e-14 * c.halfS);
      const sin = Math.sin(omega * dt);
      const cos = Math.cos(omega * dt);
      chargeAS +=
        il * dt +
        ((centreV - vj) * dt * dt) / 2 / l +
        ((a * (1 - cos)) / omega - (b * sin) / omega + b * dt) / omega / l;
      im = s * (m0 + (centreV * dt + (a * sin + b * (1 - cos)) / omega) / lr);
      il = dt === tZeroIl ? 0 : Math.max(0, ilAt(dt));
      w = s * (dt === tRail ? vs : dt === tZeroV ? 0 : pAt(dt));
      // Through zero: the freewheel if IL can carry Im, else the other path's side.
      if (dt === tZeroV && !(il > 0 && Math.abs(im) <= il)) w = -s * nudgeV;
      t += dt;
      continue;
    }
    // No path: Lr rings with Cr about zero until the winding reaches a path's threshold ±Vj.
    const a0 = w;
    const b0 = -im / (cr * idleOmega);
    const wAt = (x: number) => a0 * Math.cos(idleOmega * x) + b0 * Math.sin(idleOmega * x);
    let dt = left;
    if (Math.hypot(a0, b0) >= vj) {
      dt = Math.min(
        left,
        levelCrossing(0, a0, b0, idleOmega, vj, 1, left),
        levelCrossing(0, a0, b0, idleOmega, -vj, -1, left),
      );
    }
    const wEnd = wAt(dt);
    im += (a0 * Math.sin(idleOmega * dt) + b0 * (1 - Math.cos(idleOmega * dt))) / idleOmega / lr;
    w = dt < left ? Math.sign(wEnd) * vj : wEnd;
    il = 0;
    t += dt;
  }
  return {
    next: { windingV: -w, magnetizingA: -im, inductorA: il },
    chargeAS,
    events,
  };
}

/**
 * The settled mean inductor current over a half, A, from rest (halves mirrored until it settles
 * to 1e-6 of itself over 20), with the halves and events it took.
 */
export function eventMeanInductorA(
  c: LightLoadCircuit,
  duty: number,
  outputV: number,
): { meanA: number; halves: number; events: number } {
  let state: LightLoadState = { windingV: 0, magnetizingA: 0, inductorA: 0 };
  const means: number[] = [];
  let events = 0;
  for (let half = 0; half < 4000; half++) {
    const run = eventHalf(c, duty, outputV, state);
    events += run.events;
    state = run.next;
    means.push(run.chargeAS / c.halfS);
    if (means.length > 20) {
      const recent = means.slice(-20);
      if (Math.max(...recent) - Math.min(...recent) <= 1e-6 * Math.abs(recent[19] ?? 0)) break;
    }
  }
  const recent = means.slice(-20);
  return {
    meanA: recent.reduce((x, y) => x + y, 0) / recent.length,
    halves: means.length,
    events,
  };
}

/**
 * The per-switch duty cycle at which the circuit delivers `loadA` with the output at `outputV`,
 * solved together with the two currents at turn-on (IL and n·Im; the winding is forced there):
 * three equations, the half ending where it started (mirrored) in both currents and its mean IL
 * at the load, by Newton's method with forward differences from `dutyGuess` and rest, each step
 * held to a fifth of the duty cycle. This is the problem a design's light-load corner poses (its
 * Vo is the target), without a Vo solve nested in each duty-cycle trial. NaN where it does not
 * converge in 40 steps. Returns the halves it simulated.
 */
export function eventDutyForLoad(
  c: LightLoadCircuit,
  outputV: number,
  loadA: number,
  dutyGuess: number,
): { duty: number; steps: number; halves: number } {
  let duty = dutyGuess;
  let ilA = 0;
  let imA = 0;
  let halves = 0;
  const residuals = (d: number, il: number, im: number): [number, number, number] => {
    const run = eventHalf(c, d, outputV, { windingV: 0, magnetizingA: im, inductorA: il });
    halves++;
    return [run.next.inductorA - il, run.next.magnetizingA - im, run.chargeAS / c.halfS - loadA];
  };
  const det = (m: number[][]) =>
    (m[0]?.[0] ?? 0) * ((m[1]?.[1] ?? 0) * (m[2]?.[2] ?? 0) - (m[1]?.[2] ?? 0) * (m[2]?.[1] ?? 0)) -
    (m[0]?.[1] ?? 0) * ((m[1]?.[0] ?? 0) * (m[2]?.[2] ?? 0) - (m[1]?.[2] ?? 0) * (m[2]?.[0] ?? 0)) +
    (m[0]?.[2] ?? 0) * ((m[1]?.[0] ?? 0) * (m[2]?.[1] ?? 0) - (m[1]?.[1] ?? 0) * (m[2]?.[0] ?? 0));
  for (let step = 0; step < 40; step++) {
    const f = residuals(duty, ilA, imA);
    if (Math.abs(f[0]) + Math.abs(f[1]) + Math.abs(f[2]) <= 1e-7 * loadA) {
      return { duty, steps: step, halves };
    }
    const dutyStep = 1e-6;
    const currentStep = 1e-6 * Math.max(loadA, 1e-3);
    const byDuty = residuals(duty + dutyStep, ilA, imA);
    const byIl = residuals(duty, ilA + currentStep, imA);
    const byIm = residuals(duty, ilA, imA + currentStep);
    const jacobian = [0, 1, 2].map((r) => [
      ((byDuty[r] ?? 0) - (f[r] ?? 0)) / dutyStep,
      ((byIl[r] ?? 0) - (f[r] ?? 0)) / currentStep,
      ((byIm[r] ?? 0) - (f[r] ?? 0)) / currentStep,
    ]);
    const whole = det(jacobian);
    // Cramer's rule for J·x = −f.
    const column = (k: number) =>
      jacobian.map((row, r) => row.map((v, j) => (j === k ? -(f[r] ?? 0) : v)));
    let dDuty = det(column(0)) / whole;
    let dIl = det(column(1)) / whole;
    let dIm = det(column(2)) / whole;
    if (!Number.isFinite(dDuty) || !Number.isFinite(dIl) || !Number.isFinite(dIm)) break;
    const limit = 0.2 * duty;
    if (Math.abs(dDuty) > limit) {
      const k = limit / Math.abs(dDuty);
      dDuty *= k;
      dIl *= k;
      dIm *= k;
    }
    duty += dDuty;
    ilA = Math.max(0, ilA + dIl);
    imA += dIm;
  }
  return { duty: NaN, steps: 40, halves };
}
