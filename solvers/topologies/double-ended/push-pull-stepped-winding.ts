import { FREE, type Stretch, type SteppedCircuit } from './push-pull-stepped-stretch.js';

/**
 * The stepping of `pushPullShortDeadTime` with the rectifiers' capacitance across the winding
 * (`RECTIFIER_CAPACITANCE_F`, referred to half a of the primary: Cw), where it is not negligible.
 * The winding e is then a state of its own: free while a rectifier side conducts (rectifier a
 * for e > 0, b for e < 0, carrying the whole referred inductor current il), Cw·de/dt =
 * ia − ib − Im ∓ il, the blocking rectifiers' capacitance charging through both halves; held at
 * zero while both freewheel, which it leaves where the transformer's current at e = 0 less Im,
 * x, passes ±il, and enters where e reaches zero (as the drains' diodes: at the steps). With
 * Cw = 0 the winding follows the state algebraically (`push-pull-stepped-stretch.ts`); this is
 * that model's limit as Cw·(R + Rp)/2, the winding's own settling through the damping
 * resistors, falls to nothing. Each step is RK4's affine map for its mode (drains, winding),
 * read off the step once per mode and stretch, as there.
 * ref: the circuit's own equations; RK4 on a linear system is its degree-4 Taylor polynomial in
 * h·A (common practice).
 */

/** iLa, iLb, va, vb, Im, e. */
export const WINDING_SIZE = 6;

/** The winding: rectifier a conducting (e free), both freewheeling (e held at 0), rectifier b. */
export const WINDING_A = 0;
export const WINDING_HELD = 1;
export const WINDING_B = 2;

const LOW = 2;
const HIGH = 3;

/** The rates at state y with the referred inductor current il. */
function rate(
  k: SteppedCircuit,
  cw: number,
  y: Float64Array,
  il: number,
  isFreeA: boolean,
  isFreeB: boolean,
  winding: number,
  out: Float64Array,
): void {
  const e = y[5] as number;
  const ia = (k.rd * (y[0] as number) + k.vin - (y[2] as number) - e) * k.perSum;
  const ib = (k.rd * (y[1] as number) + k.vin - (y[3] as number) + e) * k.perSum;
  out[0] = (k.vin - (y[2] as number) - e - k.rp * ia) / k.llk;
  out[1] = (k.vin - (y[3] as number) + e - k.rp * ib) / k.llk;
  out[2] = isFreeA ? ia / k.c : 0;
  out[3] = isFreeB ? ib / k.c : 0;
  out[4] = e / k.lm;
  const side = winding === WINDING_A ? 1 : winding === WINDING_B ? -1 : 0;
  out[5] = side === 0 ? 0 : (ia - ib - (y[4] as number) - side * il) / cw;
}

interface StepMap {
  m: Float64Array;
  p: Float64Array;
  q: Float64Array;
}

/** RK4's step of one mode read off as s' = M·s + P·(il at start, middle, end) + q. */
function stepMapOf(k: SteppedCircuit, cw: number, h: number, key: number): StepMap {
  const isFreeA = (key & 1) !== 0;
  const isFreeB = (key & 2) !== 0;
  const winding = key >> 2;
  const n = WINDING_SIZE;
  const k1 = new Float64Array(n);
  const k2 = new Float64Array(n);
  const k3 = new Float64Array(n);
  const k4 = new Float64Array(n);
  const y = new Float64Array(n);
  const step = (s: Float64Array, il: readonly number[], out: Float64Array) => {
    rate(k, cw, s, il[0] as number, isFreeA, isFreeB, winding, k1);
    for (let i = 0; i < n; i++) y[i] = (s[i] as number) + (h / 2) * (k1[i] as number);
    rate(k, cw, y, il[1] as number, isFreeA, isFreeB, winding, k2);
    for (let i = 0; i < n; i++) y[i] = (s[i] as number) + (h / 2) * (k2[i] as number);
    rate(k, cw, y, il[1] as number, isFreeA, isFreeB, winding, k3);
    for (let i = 0; i < n; i++) y[i] = (s[i] as number) + h * (k3[i] as number);
    rate(k, cw, y, il[2] as number, isFreeA, isFreeB, winding, k4);
    for (let i = 0; i < n; i++) {
      const sum =
        (k1[i] as number) + 2 * (k2[i] as number) + 2 * (k3[i] as number) + (k4[i] as number);
      out[i] = (s[i] as number) + (h / 6) * sum;
    }
  };
  const zero = new Float64Array(n);
  const q = new Float64Array(n);
  step(zero, [0, 0, 0], q);
  const m = new Float64Array(n * n);
  const p = new Float64Array(n * 3);
  const probe = new Float64Array(n);
  const out = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    probe.fill(0);
    probe[j] = 1;
    step(probe, [0, 0, 0], out);
    for (let i = 0; i < n; i++) m[i * n + j] = (out[i] as number) - (q[i] as number);
  }
  for (let j = 0; j < 3; j++) {
    const il = [0, 0, 0];
    il[j] = 1;
    step(zero, il, out);
    for (let i = 0; i < n; i++) p[i * 3 + j] = (out[i] as number) - (q[i] as number);
  }
  return { m, p, q };
}

/** What a stretch's steps read: the driven switch's current, each drain's voltage (highest). */
export interface WindingPeaks {
  switchPeakA: number;
  drainAPeakV: number;
  drainBPeakV: number;
}

/** The maps of one stretch, by mode (drains free or not, the winding's three states). */
export function windingMaps(): Array<StepMap | undefined> {
  return new Array<StepMap | undefined>(12).fill(undefined);
}

/**
 * Steps s (WINDING_SIZE) over the stretch (its step and referred inductor current; `maps` its
 * own, from {@link windingMaps}) with the drains in `drains` (ON, FREE, LOW, HIGH) and the
 * winding in `state[0]` (both updated); where `record` is given, the highest driven current and
 * drain voltages after each step.
 */
export function stepWindingStretch(
  k: SteppedCircuit,
  cw: number,
  s: Float64Array,
  stretch: Stretch,
  maps: Array<StepMap | undefined>,
  drains: Int8Array,
  state: Int8Array,
  record?: WindingPeaks,
): void {
  const { h, steps, il } = stretch;
  const { rd, vin, perSum, top } = k;
  let s0 = s[0] as number;
  let s1 = s[1] as number;
  let s2 = s[2] as number;
  let s3 = s[3] as number;
  let s4 = s[4] as number;
  let s5 = s[5] as number;
  let switchPeakA = record?.switchPeakA ?? 0;
  let drainAPeakV = record?.drainAPeakV ?? 0;
  let drainBPeakV = record?.drainBPeakV ?? 0;
  let a = drains[0] as number;
  let b = drains[1] as number;
  let winding = state[0] as number;
  for (let step = 0; step < steps; step++) {
    const il0 = il[2 * step] as number;
    const ilMid = il[2 * step + 1] as number;
    const il1 = il[2 * step + 2] as number;
    const key = (a === FREE ? 1 : 0) + (b === FREE ? 2 : 0) + 4 * winding;
    let map = maps[key];
    if (map === undefined) {
      map = stepMapOf(k, cw, h, key);
      maps[key] = map;
    }
    const { m, p, q } = map;
    const n0 =
      (m[0] as number) * s0 +
      (m[1] as number) * s1 +
      (m[2] as number) * s2 +
      (m[3] as number) * s3 +
      (m[4] as number) * s4 +
      (m[5] as number) * s5 +
      (p[0] as number) * il0 +
      (p[1] as number) * ilMid +
      (p[2] as number) * il1 +
      (q[0] as number);
    const n1 =
      (m[6] as number) * s0 +
      (m[7] as number) * s1 +
      (m[8] as number) * s2 +
      (m[9] as number) * s3 +
      (m[10] as number) * s4 +
      (m[11] as number) * s5 +
      (p[3] as number) * il0 +
      (p[4] as number) * ilMid +
      (p[5] as number) * il1 +
      (q[1] as number);
    const n2 =
      (m[12] as number) * s0 +
      (m[13] as number) * s1 +
      (m[14] as number) * s2 +
      (m[15] as number) * s3 +
      (m[16] as number) * s4 +
      (m[17] as number) * s5 +
      (p[6] as number) * il0 +
      (p[7] as number) * ilMid +
      (p[8] as number) * il1 +
      (q[2] as number);
    const n3 =
      (m[18] as number) * s0 +
      (m[19] as number) * s1 +
      (m[20] as number) * s2 +
      (m[21] as number) * s3 +
      (m[22] as number) * s4 +
      (m[23] as number) * s5 +
      (p[9] as number) * il0 +
      (p[10] as number) * ilMid +
      (p[11] as number) * il1 +
      (q[3] as number);
    const n4 =
      (m[24] as number) * s0 +
      (m[25] as number) * s1 +
      (m[26] as number) * s2 +
      (m[27] as number) * s3 +
      (m[28] as number) * s4 +
      (m[29] as number) * s5 +
      (p[12] as number) * il0 +
      (p[13] as number) * ilMid +
      (p[14] as number) * il1 +
      (q[4] as number);
    const n5 =
      (m[30] as number) * s0 +
      (m[31] as number) * s1 +
      (m[32] as number) * s2 +
      (m[33] as number) * s3 +
      (m[34] as number) * s4 +
      (m[35] as number) * s5 +
      (p[15] as number) * il0 +
      (p[16] as number) * ilMid +
      (p[17] as number) * il1 +
      (q[5] as number);
    s0 = n0;
    s1 = n1;
    s2 = n2;
    s3 = n3;
    s4 = n4;
    s5 = n5;
    // The winding held at zero as e crosses it; let go where x passes ±il.
    if ((winding === WINDING_A && s5 < 0) || (winding === WINDING_B && s5 > 0)) {
      s5 = 0;
      winding = WINDING_HELD;
    }
    const ia = (rd * s0 + vin - s2 - s5) * perSum;
    const ib = (rd * s1 + vin - s3 + s5) * perSum;
    if (winding === WINDING_HELD) {
      const x = ia - ib - s4;
      if (x > il1) winding = WINDING_A;
      else if (x < -il1) winding = WINDING_B;
    }
    // The off drains' diodes (held at zero or at the clamp, or let go).
    if (a === FREE) {
      if (s2 < 0) {
        s2 = 0;
        a = LOW;
      } else if (s2 > top) {
        s2 = top;
        a = HIGH;
      }
    } else if (a === LOW) {
      if (ia > 0) a = FREE;
    } else if (a === HIGH) {
      if (ia < 0) a = FREE;
    }
    if (b === FREE) {
      if (s3 < 0) {
        s3 = 0;
        b = LOW;
      } else if (s3 > top) {
        s3 = top;
        b = HIGH;
      }
    } else if (b === LOW) {
      if (ib > 0) b = FREE;
    } else if (b === HIGH) {
      if (ib < 0) b = FREE;
    }
    if (ia > switchPeakA) switchPeakA = ia;
    if (s2 > drainAPeakV) drainAPeakV = s2;
    if (s3 > drainBPeakV) drainBPeakV = s3;
  }
  s[0] = s0;
  s[1] = s1;
  s[2] = s2;
  s[3] = s3;
  s[4] = s4;
  s[5] = s5;
  if (record !== undefined) {
    record.switchPeakA = switchPeakA;
    record.drainAPeakV = drainAPeakV;
    record.drainBPeakV = drainBPeakV;
  }
  drains[0] = a;
  drains[1] = b;
  state[0] = winding;
}
