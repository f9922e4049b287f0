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
 * The circuit as switch a opens carrying I0 (the magnetizing current Im and the outputs'
 * inductor currents referred, IL): each half's leakage Llk runs from the rail to its end of the
 * winding, each with the stated damping across it (R = `LEAKAGE_DAMPING_RATIO`·√(Llk/C),
 * leakage-damping.ts, a ring Q of about that figure), and each drain has its capacitance C; the
 * winding's voltage e (Vp while driven) follows from the transformer's relation with the
 * resistances across the leakages: the primary's ampere-turns, ja − jb with j the current of a
 * half (leakage and resistor), are Im plus the rectifiers' share s of IL, |s| ≤ IL, and
 * ja − jb = iLa − iLb + (vb − va − 2·e)/R, so with x = iLa − iLb − Im + (vb − va)/R
 * e = R·(x − IL)/2 above IL (rectifier a carries the inductors), R·(x + IL)/2 below −IL
 * (rectifier b) and zero between (both conduct: the freewheel holds the winding). The state
 * (iLa, iLb, va, vb), Llk·diLa/dt = Vin − va − e, Llk·diLb/dt = Vin − vb + e, C·dva/dt = ja,
 * C·dvb/dt = jb, is stepped (RK4, at least 200 steps a ring of Llk with C) from the gate's
 * turn-off (va at zero, vb at Vin + Vp) to the drain's peak, where ja falls to zero: a drain at
 * Vin + Vc is held by the clamp, which takes ja while it is positive, and the other drain is held
 * at zero by its body diode. Im and IL are taken as constant over the spike (some 10–200 ns).
 * Until 2026-12-05 the model had the other drain's capacitance straight on the winding (no
 * leakage between them) and no resistance across the leakage: its winding then fell with that
 * drain, slowly, and the leakage current fell faster against Vc + e, so the clamp took less
 * charge than the circuit (the invented 18–36 V push-pull at 24 V and 10 % load: 15.9 against
 * some 18 nC a turn-off; DEVELOPERS.md, "The push-pull's turn-off spike against a ring-resolved
 * deck"). The clamp's energy per turn-off is Vc times its charge; the rest of ½·Llk·I0² goes
 * through the winding to the output, into the damping and into the drain capacitance. After the
 * clamp releases the drain rings back to the rail with Llk and C: ½·C·V² (V the peak above the
 * rail) is taken as rung away. With no drain capacitance the clamp takes all of ½·Llk·I0². The
 * volt-seconds the winding's fall adds to the drive are not in the steady state.
 * ref: Pressman, Billings, Morey, Switching Power Supply Design, 3rd ed. (from memory): the
 * leakage spike of a push-pull and the RCD clamp relation; the LC rings are series resonances
 * (common practice); derived here, and checked against ngspice (Debian) in the netlist tests.
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
  /**
   * The magnetizing current at the gate's turn-off, A (the rest of `turnOffA` is the outputs'
   * inductor currents, referred, which the rectifiers carry).
   */
  magnetizingA: number;
  /** One switch's drain capacitance, F. */
  switchCapacitanceF: number;
  /** The clamp capacitor's voltage above the rail, V. */
  clampV: number;
  inputV: number;
  /** The winding's voltage while driven (Vp), V. */
  windingV: number;
  frequencyHz: number;
  /**
   * The resistance across each leakage over √(Llk/C) (the stated damping,
   * `LEAKAGE_DAMPING_RATIO`).
   */
  dampingRatio: number;
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
/** The stepped spike's limit, in rings of Llk with C (the clamp's hold is Llk·I0/Vc). */
const RINGS_MAX = 200;

/** The spike's state and the constants its rates need (one spike at a time). */
const SPIKE = {
  llk: 0,
  c: 0,
  r: 0,
  vin: 0,
  top: 0,
  im: 0,
  il: 0,
  isClampedA: false,
  isHeldB: false,
};
/** The rates RK4 reads, [diLa, diLb, dva, dvb], and the stage's currents [ja, jb]. */
const RATE = [0, 0, 0, 0];
const HALF_CURRENTS = [0, 0];

/** Writes the spike's rates at (iLa, iLb, va, vb) into RATE, and ja, jb into HALF_CURRENTS. */
function spikeRates(iLa: number, iLb: number, va: number, vb: number): void {
  const k = SPIKE;
  const x = iLa - iLb - k.im + (vb - va) / k.r;
  const e = x > k.il ? (k.r * (x - k.il)) / 2 : x < -k.il ? (k.r * (x + k.il)) / 2 : 0;
  const vla = k.vin - va - e;
  const vlb = k.vin - vb + e;
  const ja = iLa + vla / k.r;
  const jb = iLb + vlb / k.r;
  RATE[0] = vla / k.llk;
  RATE[1] = vlb / k.llk;
  RATE[2] = k.isClampedA ? 0 : ja / k.c;
  RATE[3] = k.isHeldB ? 0 : jb / k.c;
  HALF_CURRENTS[0] = ja;
  HALF_CURRENTS[1] = jb;
}

/**
 * Returns the spike of a push-pull switch at turn-off ({@link PushPullTurnOffSpike}).
 * @throws RangeError unless leakageH > 0, clampV > 0 and dampingRatio > 0.
 */
export function pushPullTurnOffSpike(v: PushPullSpikeValues): PushPullTurnOffSpike {
  const llk = v.leakageH;
  const vc = v.clampV;
  if (!(llk > 0 && vc > 0 && v.dampingRatio > 0)) {
    throw new RangeError(
      `pushPullTurnOffSpike: leakage ${llk} H, clamp ${vc} V, damping ${v.dampingRatio}`,
    );
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
  const vp = Math.max(0, v.windingV);
  const w = 1 / Math.sqrt(llk * c);
  const fallS = Math.PI / (2 * w);
  const r = v.dampingRatio * Math.sqrt(llk / c);
  const k = SPIKE;
  k.llk = llk;
  k.c = c;
  k.r = r;
  k.vin = vin;
  k.top = vin + vc;
  k.im = Math.min(i0, Math.abs(v.magnetizingA));
  k.il = i0 - k.im;
  k.isClampedA = false;
  k.isHeldB = false;
  // The step: RING_STEPS a ring, and short enough against the winding's relation, whose rate
  // (both leakages against R) is about R/Llk = dampingRatio·ω while the winding is free.
  const steps = Math.max(RING_STEPS, Math.ceil((2 * Math.PI * v.dampingRatio) / 1.5));
  const dt = (2 * Math.PI) / w / steps;
  const h = dt / 2;
  // The on-state: va at zero, vb at Vin + Vp, the switch carrying I0 (the resistor across
  // leakage a takes (Vin − Vp)/R of it, b's none).
  let iLa = i0 - (vin - vp) / r;
  let iLb = 0;
  let va = 0;
  let vb = vin + vp;
  let t = 0;
  let riseS = NaN;
  let holdS = 0;
  let charge = 0;
  let above = 0;
  for (let step = 0; step < RINGS_MAX * steps; step++) {
    spikeRates(iLa, iLb, va, vb);
    const ja0 = HALF_CURRENTS[0] as number;
    const jb0 = HALF_CURRENTS[1] as number;
    if (!(ja0 > 0)) {
      // The drain's peak (ja at zero): below the clamp, or the clamp's release.
      above = k.isClampedA ? vc : Math.max(0, va - vin);
      if (!k.isClampedA) riseS = t;
      break;
    }
    // The other drain: held at zero by its body diode while its current would take it below.
    k.isHeldB = vb <= 0 && jb0 < 0;
    const a1 = RATE[0] as number;
    const b1 = RATE[1] as number;
    const c1 = RATE[2] as number;
    const d1 = RATE[3] as number;
    spikeRates(iLa + h * a1, iLb + h * b1, va + h * c1, vb + h * d1);
    const ja2 = HALF_CURRENTS[0] as number;
    const a2 = RATE[0] as number;
    const b2 = RATE[1] as number;
    const c2 = RATE[2] as number;
    const d2 = RATE[3] as number;
    spikeRates(iLa + h * a2, iLb + h * b2, va + h * c2, vb + h * d2);
    const ja3 = HALF_CURRENTS[0] as number;
    const a3 = RATE[0] as number;
    const b3 = RATE[1] as number;
    const c3 = RATE[2] as number;
    const d3 = RATE[3] as number;
    spikeRates(iLa + dt * a3, iLb + dt * b3, va + dt * c3, vb + dt * d3);
    const ja4 = HALF_CURRENTS[0] as number;
    const vaNext = va + (dt / 6) * (c1 + 2 * c2 + 2 * c3 + (RATE[2] as number));
    if (!k.isClampedA && vaNext >= k.top) {
      // The clamp's onset within the step (linear in va): step there, then hold the drain.
      const f = (k.top - va) / (vaNext - va);
      const fdt = f * dt;
      iLa += (fdt / 6) * (a1 + 2 * a2 + 2 * a3 + (RATE[0] as number));
      iLb += (fdt / 6) * (b1 + 2 * b2 + 2 * b3 + (RATE[1] as number));
      vb += (fdt / 6) * (d1 + 2 * d2 + 2 * d3 + (RATE[3] as number));
      va = k.top;
      t += fdt;
      riseS = t;
      k.isClampedA = true;
      continue;
    }
    if (k.isClampedA) {
      // The clamp's charge over the step: Simpson's rule on ja.
      charge += (dt / 6) * (ja0 + 2 * ja2 + 2 * ja3 + ja4);
      holdS += dt;
    }
    iLa += (dt / 6) * (a1 + 2 * a2 + 2 * a3 + (RATE[0] as number));
    iLb += (dt / 6) * (b1 + 2 * b2 + 2 * b3 + (RATE[1] as number));
    va = k.isClampedA ? k.top : vaNext;
    vb += (dt / 6) * (d1 + 2 * d2 + 2 * d3 + (RATE[3] as number));
    if (vb < 0 && !k.isHeldB) vb = 0;
    t += dt;
  }
  if (Number.isNaN(riseS)) riseS = t;
  if (k.isClampedA) above = vc;
  else if (above === 0) above = Math.max(0, va - vin);
  return {
    aboveRailV: above,
    riseS,
    holdS,
    fallS,
    clampW: vc * Math.max(0, charge) * fs2,
    ringW: ringPower(c, above, v.frequencyHz),
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
