import { rcdClampLoss } from '../../losses/rcd-clamp-loss.js';
import { drawPoint, redrawnWaveform, reusableDrawing } from '../../waveform/piecewise-linear.js';
import { ascendingSampler, valueAt } from '../../waveform/value-at.js';
import type { Waveform } from '../../waveform/waveform.js';

/**
 * The push-pull's leakage spike at each switch's turn-off, with an RCD clamp from each drain: a
 * diode from the drain to a clamp capacitor held Vc above the input rail (`clamp.voltageV`, or
 * `clamp.voltageToReflectedRatio` times the highest input: the other half's voltage, which the
 * off switch's drain sits above the rail while the other half is driven, is at most the input,
 * so the clamp stays off then), discharged into the rail by a resistor.
 *
 * The circuit as switch a opens carrying I0 (the reflected inductor current and Im): the leakage
 * Llk runs from the rail to the winding's center-tap end, the winding (voltage e, Vp while
 * driven) to the drain, whose capacitance Ca (the switch's own) is at the on-state's zero. The
 * output inductor holds the reflected current while rectifier a conducts (e > 0), so the
 * winding's ampere-turns I0 differ from the leakage current i only by the other drain's
 * capacitance Cb, which moves with the winding (db = Vin + e): Llk·di/dt = Vin − va − e,
 * Ca·dva/dt = i, Cb·de/dt = i − I0. Four stretches follow, each to its event:
 *  1. both free: i charges Ca (and Cb only as i falls below I0), a ring of Llk with Ca and Cb in
 *     series, stepped (RK4, 200 steps a ring period) to the drain's reaching the clamp
 *     (va = Vin + Vc), the winding's reaching zero, or i's reaching zero (the drain's peak);
 *  2. drain clamped, winding free: u = Vc + e and y = i − I0 ring with Llk and Cb,
 *     u = u0·cos ωt + Zb·y0·sin ωt, until u = Vc (the winding at zero); the clamp takes the
 *     charge I0·t − Cb·e0 there;
 *  3. winding held at zero by the freewheeling secondary (its rectifiers carry i − I0 between
 *     them, Im held), drain free: Llk rings with Ca about the rail, to the clamp or to its peak
 *     √(a0² + (Za·i0)²) above the rail;
 *  4. both clamped: i falls at Vc/Llk to zero; the clamp takes ½·i²·Llk/Vc.
 * The clamp's energy per turn-off is Vc times its charge. Where the leakage reaches the clamp
 * at once (Z·I0 ≫ Vin + Vc, the usual case) that is ½·Llk·iz²·Vc/(Vc − Vr) with Vr = 0 (the RCD
 * relation of the flyback, whose Vr is the winding voltage the secondary holds while the
 * leakage current falls: here zero, the freewheel), iz the leakage current as the winding
 * reaches zero, iz ≈ I0 − √(Vp·(Vp + 2·Vc))/Zb, plus Vc·(I0·tz − Cb·Vp) taken while it falls; the
 * rest of ½·Llk·I0² goes through the winding to the output while it falls (stretch 2) and into
 * the drain capacitance. After the clamp releases the drain rings back to the rail with Llk and
 * Ca: ½·Ca·V² (V the peak above the rail) is rung away. With no drain capacitance the clamp
 * takes all of ½·Llk·I0², as the model before the clamp booked it. The volt-seconds stretch 2
 * adds to the drive (e falls over tz instead of the turn-off swing's t_s) are not in the steady
 * state.
 * ref: Pressman, Billings, Morey, Switching Power Supply Design, 3rd ed. (from memory): the
 * leakage spike of a push-pull and the RCD clamp relation; the LC rings are series resonances
 * (common practice); derived here, and checked against ngspice (Debian) in the netlist test.
 */
export interface PushPullTurnOffSpike {
  /** The drain's peak above the input rail, V: Vc where the ring reaches the clamp. */
  aboveRailV: number;
  /** From the gate's turn-off to the peak (the clamp's onset), s. */
  riseS: number;
  /** While the clamp conducts, s. */
  holdS: number;
  /** From the peak back to the rail (a quarter of the ring of Llk with Ca), s. */
  fallS: number;
  /** Power into the clamp, both switches, W. */
  clampW: number;
  /** Power left in the drain capacitance above the rail and rung away, both switches, W. */
  ringW: number;
}

/** What {@link pushPullTurnOffSpike} needs (SI units). */
export interface PushPullSpikeValues {
  leakageH: number;
  /** The switch current at the gate's turn-off, A. */
  turnOffA: number;
  /** One switch's drain capacitance, F. */
  switchCapacitanceF: number;
  /** The clamp capacitor's voltage above the rail, V. */
  clampV: number;
  inputV: number;
  /** The winding's voltage while driven (Vp), V. */
  windingV: number;
  frequencyHz: number;
}

const RING_STEPS = 200;

/**
 * The scratch columns the drawings below are drawn in (one at a time): each waveform drawn
 * then costs one array of its kept points per column, not the columns grown point by point,
 * a merged list of times and a second copy for the waveform.
 */
const DRAWN = reusableDrawing();
/** The times a drawing adds to the waveform's own (at most 17). */
const EXTRA: number[] = [];
/** The spike's polyline (four points). */
const BUMP_TIMES = [0, 0, 0, 0];
const BUMP_VALUES = [0, 0, 0, 0];
const STEPS_MAX = 2000;

/**
 * Returns the spike of a push-pull switch at turn-off, from the four stretches of
 * {@link PushPullTurnOffSpike}.
 * @throws RangeError unless leakageH > 0 and clampV > 0.
 */
export function pushPullTurnOffSpike(v: PushPullSpikeValues): PushPullTurnOffSpike {
  const llk = v.leakageH;
  const vc = v.clampV;
  if (!(llk > 0 && vc > 0)) {
    throw new RangeError(`pushPullTurnOffSpike: leakage ${llk} H, clamp ${vc} V`);
  }
  const i0 = Math.abs(v.turnOffA);
  const c = Math.max(0, v.switchCapacitanceF);
  const fs2 = 2 * v.frequencyHz;
  if (c === 0 || i0 === 0) {
    // The drain reaches the clamp and the winding zero at once; the clamp takes ½·Llk·I0².
    return {
      aboveRailV: i0 > 0 ? vc : 0,
      riseS: 0,
      holdS: (llk * i0) / vc,
      fallS: 0,
      clampW: rcdClampLoss(llk, i0, vc, 0, fs2),
      ringW: 0,
    };
  }
  const vin = v.inputV;
  const z = Math.sqrt(llk / c);
  const w = 1 / Math.sqrt(llk * c);
  const fallS = Math.PI / (2 * w);
  // Stretch 1, stepped: state (i, va, e).
  const ws = 1 / Math.sqrt(llk * (c / 2));
  const dt = (2 * Math.PI) / ws / RING_STEPS;
  let t = 0;
  let i = i0;
  let va = 0;
  let e = Math.max(0, v.windingV);
  const top = vin + vc;
  let next: 'clamp' | 'freewheel' | 'peak' = 'peak';
  const h = dt / 2;
  for (let step = 0; step < STEPS_MAX; step++) {
    // RK4 on d/dt (i, va, e) = ((Vin − va − e)/Llk, i/Ca, (i − I0)/Cb), written out (no arrays).
    const di1 = (vin - va - e) / llk;
    const dv1 = i / c;
    const de1 = (i - i0) / c;
    const ia = i + h * di1;
    const di2 = (vin - (va + h * dv1) - (e + h * de1)) / llk;
    const dv2 = ia / c;
    const de2 = (ia - i0) / c;
    const ib = i + h * di2;
    const di3 = (vin - (va + h * dv2) - (e + h * de2)) / llk;
    const dv3 = ib / c;
    const de3 = (ib - i0) / c;
    const ic = i + dt * di3;
    const di4 = (vin - (va + dt * dv3) - (e + dt * de3)) / llk;
    const dv4 = ic / c;
    const de4 = (ic - i0) / c;
    const i2 = i + (dt / 6) * (di1 + 2 * di2 + 2 * di3 + di4);
    const va2 = va + (dt / 6) * (dv1 + 2 * dv2 + 2 * dv3 + dv4);
    const e2 = e + (dt / 6) * (de1 + 2 * de2 + 2 * de3 + de4);
    // The first event within the step, by linear interpolation.
    const fClamp = va2 >= top ? (top - va) / (va2 - va) : Infinity;
    const fZero = e2 <= 0 ? e / (e - e2) : Infinity;
    const fPeak = i2 <= 0 ? i / (i - i2) : Infinity;
    const f = Math.min(fClamp, fZero, fPeak);
    if (f <= 1) {
      t += f * dt;
      i += f * (i2 - i);
      va += f * (va2 - va);
      e += f * (e2 - e);
      next = f === fClamp ? 'clamp' : f === fZero ? 'freewheel' : 'peak';
      break;
    }
    t += dt;
    i = i2;
    va = va2;
    e = e2;
  }
  if (next === 'peak') {
    const above = Math.max(0, va - vin);
    return {
      aboveRailV: above,
      riseS: t,
      holdS: 0,
      fallS,
      clampW: 0,
      ringW: ringPower(c, above, v.frequencyHz),
    };
  }
  let charge = 0;
  let riseS = t;
  let holdS = 0;
  if (next === 'clamp') {
    // Stretch 2: the drain clamped, the winding falling to zero.
    const u0 = vc + e;
    const y0 = i - i0;
    const r = Math.hypot(u0, z * y0);
    const phase = Math.atan2(z * y0, u0);
    const tz = vc >= r ? 0 : Math.max(0, (Math.acos(vc / r) + phase) / w);
    const yz = y0 * Math.cos(w * tz) - (u0 / z) * Math.sin(w * tz);
    charge += i0 * tz - c * e;
    holdS += tz;
    i = Math.max(0, i0 + yz);
  } else {
    // Stretch 3: the winding held at zero, the drain ringing about the rail.
    const a0 = va - vin;
    const r = Math.hypot(a0, z * i);
    const theta = Math.atan2(a0, z * i);
    if (!(r > vc)) {
      riseS += Math.max(0, Math.PI / 2 - theta) / w;
      return {
        aboveRailV: r,
        riseS,
        holdS: 0,
        fallS,
        clampW: 0,
        ringW: ringPower(c, r, v.frequencyHz),
      };
    }
    riseS += Math.max(0, Math.asin(vc / r) - theta) / w;
    i = Math.sqrt(r * r - vc * vc) / z;
  }
  // Stretch 4: both clamped, the leakage current falling at Vc/Llk.
  charge += (0.5 * i * i * llk) / vc;
  holdS += (llk * i) / vc;
  return {
    aboveRailV: vc,
    riseS,
    holdS,
    fallS,
    clampW: vc * Math.max(0, charge) * fs2,
    ringW: ringPower(c, vc, v.frequencyHz),
  };
}

/** ½·C·V² twice a period, W. */
function ringPower(c: number, aboveRailV: number, frequencyHz: number): number {
  return c * aboveRailV * aboveRailV * frequencyHz;
}

/**
 * Returns `wave` (a switch's voltage, V) with the spike drawn from `startS` (the gate's turn-off)
 * on: up to the rail `railV` plus the spike over the rise, held, back to the rail; the larger of the two where the
 * waveform is already above the rail there (light load: the node's ring). Drawn no further than
 * `endS` (the next half's start, where the drain moves with the other half's drive). `wave` is a
 * waveform made by `piecewiseLinear`'s rules (every engine waveform is): its points before and
 * after the spike are taken as kept (`redrawnWaveform`), not checked again.
 */
export function withTurnOffSpike(
  wave: Waveform,
  spike: PushPullTurnOffSpike,
  railV: number,
  startS: number,
  endS: number,
): Waveform {
  if (!(spike.aboveRailV > 0) || !(endS > startS)) return wave;
  const peakV = railV + spike.aboveRailV;
  const bumpTimes = BUMP_TIMES;
  bumpTimes[0] = startS;
  bumpTimes[1] = startS + spike.riseS;
  bumpTimes[2] = startS + spike.riseS + spike.holdS;
  bumpTimes[3] = startS + spike.riseS + spike.holdS + spike.fallS;
  const bumpValues = BUMP_VALUES;
  bumpValues[0] = valueAt(wave, startS);
  bumpValues[1] = peakV;
  bumpValues[2] = peakV;
  bumpValues[3] = railV;
  const stopS = Math.min(endS, bumpTimes[3] as number);
  const { timesS, values } = wave;
  const drawing = DRAWN;
  drawing.count = 0;
  let i = 0;
  for (; i < timesS.length && (timesS[i] as number) <= startS; i++) {
    drawPoint(drawing, timesS[i] as number, values[i] as number);
  }
  const headCount = drawing.count;
  // Without drain capacitance the drain jumps to the clamp.
  if (spike.riseS === 0) {
    drawPoint(drawing, startS, Math.max(valueAt(wave, startS), peakV));
  }
  // Inside the spike: the union of both sets of times (each ascending, merged), the larger value.
  const extra = EXTRA;
  let extraCount = 0;
  for (let k = 0; k < 4; k++) {
    const t = bumpTimes[k] as number;
    if (t > startS && t < stopS) extra[extraCount++] = t;
  }
  extra[extraCount++] = stopS;
  const sample = ascendingSampler(wave);
  const cursor = CURSOR;
  cursor.own = i;
  cursor.other = 0;
  while (true) {
    const t = nextMergedTime(cursor, timesS, stopS, extra, extraCount);
    if (Number.isNaN(t)) break;
    if (drawing.count > 0 && t === drawing.timesS[drawing.count - 1]) continue;
    drawPoint(drawing, t, Math.max(sample(t), bumpAt(bumpTimes, bumpValues, t)));
  }
  // After it: the waveform as it was (a jump back to it where the spike was cut at endS).
  if (stopS < (bumpTimes[3] as number)) {
    drawPoint(drawing, stopS, valueAt(wave, stopS));
  }
  for (; i < timesS.length && (timesS[i] as number) < stopS; i++);
  const tailAt = drawing.count;
  for (; i < timesS.length; i++) {
    drawPoint(drawing, timesS[i] as number, values[i] as number);
  }
  return redrawnWaveform(wave.periodS, drawing, headCount, tailAt);
}

/** The spike's polyline at t (its times ascending, t within them). */
function bumpAt(times: readonly number[], values: readonly number[], t: number): number {
  for (let k = 1; k < times.length; k++) {
    const t1 = times[k] as number;
    if (t === t1) return values[k] as number;
    if (t < t1) {
      const t0 = times[k - 1] as number;
      const v0 = values[k - 1] as number;
      const v1 = values[k] as number;
      return t1 > t0 ? v0 + ((v1 - v0) * (t - t0)) / (t1 - t0) : v1;
    }
  }
  return values[values.length - 1] as number;
}

/**
 * The off switch's ring as the other switch turns on (push-pull with leakage). Once the turn-on
 * commutation has ended (the freewheeling rectifier stops) the winding is free: the driven half's
 * leakage, the winding and the off half's leakage, Llk + Llk in series, charge the off drain's
 * capacitance C from its start x0 (above the rail; zero after a freewheel) towards its driven
 * level, Vp above the rail. An LC step: x = Vp − (Vp − x0)·cos ωt, ω = 1/√(2·Llk·C), the ring's
 * current (Vp − x0)/Z·sin ωt, Z = √(2·Llk/C), which the driven switch carries on top of its own
 * (the off half's current is referred through the winding to the driven half). Undamped the
 * drain reaches 2·Vp − x0 above the rail after half a ring period (about 3·Vin from the freewheel)
 * unless the clamp, Vc above the rail, takes it: it conducts from cos ωt = (Vp − Vc)/(Vp − x0),
 * at the ring current ic = √((Vp − x0)² − (Vc − Vp)²)/Z, which then falls at (Vc − Vp)/(2·Llk)
 * to zero, the clamp taking the charge ½·2·Llk·ic²/(Vc − Vp). The ring is taken as lossless up to
 * its first peaks (the current's at a quarter period, the drain's at half) and damped after
 * (lumped, as the turn-off's ring): the energy above the driven level, ½·C·(peak − Vp)², is
 * rung away at each turn-on. An LC step's overshoot (common practice), derived here; checked
 * against ngspice (Debian) in the netlist tests.
 */
export interface PushPullTurnOnRing {
  /** The off drain's peak above the rail, V (Vc where the ring reaches the clamp). */
  aboveRailV: number;
  /** From the winding's release to the drain's peak (or the clamp's onset), s. */
  riseS: number;
  /** While the clamp conducts, s. */
  holdS: number;
  /** Half a ring period, s (the drawn fall back to the driven level). */
  fallS: number;
  /** The ring current's first peak, A (at a quarter period; 0 where the drain starts above Vp). */
  currentA: number;
  /** A quarter of the ring's period, s. */
  quarterS: number;
  /** Power into the clamp, both turn-ons, W. */
  clampW: number;
  /** Power rung away above the driven level, both turn-ons, W. */
  ringW: number;
}

/** What {@link pushPullTurnOnRing} needs (SI units). */
export interface PushPullTurnOnValues {
  leakageH: number;
  /** One switch's drain capacitance, F. */
  switchCapacitanceF: number;
  /** The clamp capacitor's voltage above the rail, V. */
  clampV: number;
  /** The winding's voltage while driven (Vp), V. */
  windingV: number;
  /** The off drain above the rail as the winding is released, V. */
  startAboveRailV: number;
  frequencyHz: number;
}

/**
 * Returns the off switch's ring at the other switch's turn-on ({@link PushPullTurnOnRing}), or
 * undefined where there is none (no leakage or no drain capacitance, or the drain starts at or
 * above its driven level).
 */
export function pushPullTurnOnRing(v: PushPullTurnOnValues): PushPullTurnOnRing | undefined {
  const l2 = 2 * v.leakageH;
  const c = v.switchCapacitanceF;
  const vp = v.windingV;
  const vc = v.clampV;
  const step = vp - v.startAboveRailV;
  if (!(l2 > 0 && c > 0 && step > 0 && vc > vp)) return undefined;
  const z = Math.sqrt(l2 / c);
  const w = 1 / Math.sqrt(l2 * c);
  const fs2 = 2 * v.frequencyHz;
  const halfS = Math.PI / w;
  const undampedV = vp + step;
  if (undampedV <= vc) {
    return {
      aboveRailV: undampedV,
      riseS: halfS,
      holdS: 0,
      fallS: halfS,
      currentA: step / z,
      quarterS: halfS / 2,
      clampW: 0,
      ringW: 0.5 * c * step * step * fs2,
    };
  }
  const ic = Math.sqrt(step * step - (vc - vp) ** 2) / z;
  const charge = (0.5 * l2 * ic * ic) / (vc - vp);
  return {
    aboveRailV: vc,
    riseS: Math.acos((vp - vc) / step) / w,
    holdS: (l2 * ic) / (vc - vp),
    fallS: halfS,
    currentA: step / z,
    quarterS: halfS / 2,
    clampW: vc * charge * fs2,
    ringW: 0.5 * c * (vc - vp) ** 2 * fs2,
  };
}

/**
 * Returns `wave` (the driven switch's current, A) with the turn-on ring's current added from
 * `startS` (the winding's release): a half sine of `amplitudeA` over `halfCycleS`, then damped
 * (lumped); cut at `endS` (the gate's turn-off). `wave` is a waveform made by `piecewiseLinear`'s
 * rules: its points before and after the sine are taken as kept (`redrawnWaveform`).
 */
export function withTurnOnRingCurrent(
  wave: Waveform,
  amplitudeA: number,
  startS: number,
  halfCycleS: number,
  endS: number,
): Waveform {
  const stopS = Math.min(startS + halfCycleS, endS);
  if (!(amplitudeA > 0) || !(stopS > startS)) return wave;
  const { timesS, values } = wave;
  const drawing = DRAWN;
  drawing.count = 0;
  let i = 0;
  for (; i < timesS.length && (timesS[i] as number) <= startS; i++) {
    drawPoint(drawing, timesS[i] as number, values[i] as number);
  }
  const headCount = drawing.count;
  if (drawing.count === 0 || drawing.timesS[drawing.count - 1] !== startS) {
    drawPoint(drawing, startS, valueAt(wave, startS));
  }
  const extra = EXTRA;
  let extraCount = 0;
  const pieces = 16;
  // The sine's crest itself, where it lies within the cut, in its place among the pieces.
  const crestS = startS + halfCycleS / 2;
  let isCrestIn = !(crestS < stopS);
  for (let k = 1; k < pieces; k++) {
    const t = startS + ((stopS - startS) * k) / pieces;
    if (!isCrestIn && crestS <= t) {
      extra[extraCount++] = crestS;
      isCrestIn = true;
    }
    extra[extraCount++] = t;
  }
  if (!isCrestIn) extra[extraCount++] = crestS;
  const sample = ascendingSampler(wave);
  const cursor = CURSOR;
  cursor.own = i;
  cursor.other = 0;
  while (true) {
    const t = nextMergedTime(cursor, timesS, stopS, extra, extraCount);
    if (Number.isNaN(t)) break;
    if (drawing.count > 0 && t === drawing.timesS[drawing.count - 1]) continue;
    // The half sine from startS, zero outside (startS, stopS).
    const ring =
      t > startS && t < stopS ? amplitudeA * Math.sin((Math.PI * (t - startS)) / halfCycleS) : 0;
    drawPoint(drawing, t, sample(t) + ring);
  }
  // Where the gate's turn-off cuts the sine: its value there, on the waveform just before.
  if (stopS < startS + halfCycleS) {
    const beforeS = stopS - 1e-6 * (stopS - startS);
    drawPoint(
      drawing,
      stopS,
      valueAt(wave, beforeS) + amplitudeA * Math.sin((Math.PI * (stopS - startS)) / halfCycleS),
    );
  }
  // The waveform's own points from the cut on (a jump there kept).
  for (; i < timesS.length && (timesS[i] as number) < stopS; i++);
  if ((timesS[i] ?? Infinity) > stopS) {
    drawPoint(drawing, stopS, valueAt(wave, stopS));
  }
  const tailAt = drawing.count;
  for (; i < timesS.length; i++) {
    drawPoint(drawing, timesS[i] as number, values[i] as number);
  }
  return redrawnWaveform(wave.periodS, drawing, headCount, tailAt);
}

/** Where {@link nextMergedTime} stands in its two lists. */
interface MergeCursor {
  /** The next index of `timesS`. */
  own: number;
  /** The next index of `extra`. */
  other: number;
}

/** The cursor of the drawing under way (one at a time; neither drawing calls another). */
const CURSOR: MergeCursor = { own: 0, other: 0 };

/**
 * The next of the times of `timesS` from `cursor.own` up to (not including) `stopS`, merged
 * with `extra`'s first `extraCount` from `cursor.other` (both ascending; `timesS`'s first at a
 * tie), the cursor stepped past it; NaN when both are spent. The same times in the same order
 * as sorting the two together, walked in place instead of kept as a list for each drawing.
 */
function nextMergedTime(
  cursor: MergeCursor,
  timesS: readonly number[],
  stopS: number,
  extra: readonly number[],
  extraCount: number,
): number {
  const j = cursor.own;
  const k = cursor.other;
  const own = j < timesS.length && (timesS[j] as number) < stopS ? (timesS[j] as number) : NaN;
  const other = k < extraCount ? (extra[k] as number) : NaN;
  if (Number.isNaN(other) || own <= other) {
    if (!Number.isNaN(own)) cursor.own = j + 1;
    return own;
  }
  cursor.other = k + 1;
  return other;
}
