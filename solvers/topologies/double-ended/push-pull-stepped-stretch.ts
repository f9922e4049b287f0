/**
 * The stepping of `pushPullShortDeadTime` (push-pull-short-dead-time.ts, whose header gives the
 * circuit): one stretch of the half at a time, RK4 at a fixed step. Between the winding's mode
 * changes and the drains' diode events these equations are linear, so RK4's step is an affine
 * map of the state and of the referred inductor current at the step's start, middle and end
 * (s' = M·s + P·il + q): read off the step once per mode (12: each drain free or not, the
 * winding's three modes) and per stretch, then applied (the same step, 5·9 products against
 * four rate evaluations; the answers as RK4's to some 1e-12). A step whose winding mode at its
 * end is not the one at its start is taken by RK4 itself, the mode read at each stage, as before.
 * ref: RK4 on a linear system is its degree-4 Taylor polynomial in h·A (common practice).
 */

/** iLa, iLb, va, vb, Im. */
export const SIZE = 5;

/** An off drain's state: pinned by its switch, free, held at zero (body diode), held at the clamp. */
export const ON = 0;
export const FREE = 1;
const LOW = 2;
const HIGH = 3;

export interface SteppedCircuit {
  vin: number;
  llk: number;
  c: number;
  rp: number;
  rd: number;
  lm: number;
  top: number;
  /** 1/(rd + rp), (rd + rp)/2. */
  perSum: number;
  halfSum: number;
}

/** The winding's mode: rectifier a conducting, both freewheeling, rectifier b; or read from the state. */
const RECTIFIER_A = 1;
const FREEWHEEL = 0;
const RECTIFIER_B = -1;
const FROM_STATE = 2;

/** The transformer's current at e = 0 less the magnetizing current, at state y. */
function excess(k: SteppedCircuit, y: Float64Array): number {
  const y0 = y[0] as number;
  const y1 = y[1] as number;
  return (k.rd * (y0 - y1) + (y[3] as number) - (y[2] as number)) * k.perSum - (y[4] as number);
}

function modeOf(xm: number, il: number): number {
  return xm > il ? RECTIFIER_A : xm < -il ? RECTIFIER_B : FREEWHEEL;
}

/**
 * The rates at state y with the referred inductor current il, the drains free or not, the
 * winding in `mode` (FROM_STATE: as the state sets it). The winding e of half a: x the
 * transformer's current at e = 0, e set by the rectifier that conducts (|x| > il) or zero.
 */
function rate(
  k: SteppedCircuit,
  y: Float64Array,
  il: number,
  isFreeA: boolean,
  isFreeB: boolean,
  mode: number,
  out: Float64Array,
): void {
  const xm = excess(k, y);
  const m = mode === FROM_STATE ? modeOf(xm, il) : mode;
  const e =
    m === RECTIFIER_A ? k.halfSum * (xm - il) : m === RECTIFIER_B ? k.halfSum * (xm + il) : 0;
  const y0 = y[0] as number;
  const y1 = y[1] as number;
  const y2 = y[2] as number;
  const y3 = y[3] as number;
  const ia = (k.rd * y0 + k.vin - y2 - e) * k.perSum;
  const ib = (k.rd * y1 + k.vin - y3 + e) * k.perSum;
  out[0] = (k.vin - y2 - e - k.rp * ia) / k.llk;
  out[1] = (k.vin - y3 + e - k.rp * ib) / k.llk;
  out[2] = isFreeA ? ia / k.c : 0;
  out[3] = isFreeB ? ib / k.c : 0;
  out[4] = e / k.lm;
}

/** RK4's stages (the engine is single-threaded and these calls do not nest). */
const W = {
  k1: new Float64Array(SIZE),
  k2: new Float64Array(SIZE),
  k3: new Float64Array(SIZE),
  k4: new Float64Array(SIZE),
  y: new Float64Array(SIZE),
};
const NEXT = new Float64Array(SIZE);

/** One RK4 step of h from s into out (out may be s). */
function rk4(
  k: SteppedCircuit,
  s: Float64Array,
  il: readonly [number, number, number],
  h: number,
  drains: readonly [boolean, boolean],
  mode: number,
  out: Float64Array,
): void {
  const { k1, k2, k3, k4, y } = W;
  const [isFreeA, isFreeB] = drains;
  rate(k, s, il[0], isFreeA, isFreeB, mode, k1);
  for (let i = 0; i < SIZE; i++) y[i] = (s[i] as number) + (h / 2) * (k1[i] as number);
  rate(k, y, il[1], isFreeA, isFreeB, mode, k2);
  for (let i = 0; i < SIZE; i++) y[i] = (s[i] as number) + (h / 2) * (k2[i] as number);
  rate(k, y, il[1], isFreeA, isFreeB, mode, k3);
  for (let i = 0; i < SIZE; i++) y[i] = (s[i] as number) + h * (k3[i] as number);
  rate(k, y, il[2], isFreeA, isFreeB, mode, k4);
  for (let i = 0; i < SIZE; i++) {
    out[i] =
      (s[i] as number) +
      (h / 6) *
        ((k1[i] as number) + 2 * (k2[i] as number) + 2 * (k3[i] as number) + (k4[i] as number));
  }
}

/**
 * RK4's step of one mode (drains free or not, the winding's mode) as the affine map it is on
 * these linear equations: s' = M·s + P·(il at the step's start, middle, end) + q, row-major
 * (M 5×5, P 5×3), read off the step itself.
 */
interface StepMap {
  m: Float64Array;
  p: Float64Array;
  q: Float64Array;
}

function stepMapOf(k: SteppedCircuit, h: number, key: number): StepMap {
  const drains: [boolean, boolean] = [(key & 1) !== 0, (key & 2) !== 0];
  const mode = (key >> 2) - 1;
  const zero = new Float64Array(SIZE);
  const q = new Float64Array(SIZE);
  rk4(k, zero, [0, 0, 0], h, drains, mode, q);
  const m = new Float64Array(SIZE * SIZE);
  const p = new Float64Array(SIZE * 3);
  const probe = new Float64Array(SIZE);
  const out = new Float64Array(SIZE);
  for (let j = 0; j < SIZE; j++) {
    probe.fill(0);
    probe[j] = 1;
    rk4(k, probe, [0, 0, 0], h, drains, mode, out);
    for (let i = 0; i < SIZE; i++) m[i * SIZE + j] = (out[i] as number) - (q[i] as number);
  }
  for (let j = 0; j < 3; j++) {
    const il: [number, number, number] = [0, 0, 0];
    il[j] = 1;
    rk4(k, zero, il, h, drains, mode, out);
    for (let i = 0; i < SIZE; i++) p[i * 3 + j] = (out[i] as number) - (q[i] as number);
  }
  return { m, p, q };
}

/**
 * One stretch of the half: `steps` equal steps of h from t0, the referred inductor current read
 * once for all halves (at each half step: `il`, 2·steps + 1), and the step's
 * affine maps as the modes are met (by drains and winding, 12).
 */
export interface Stretch {
  h: number;
  steps: number;
  il: Float64Array;
  maps: Array<StepMap | undefined>;
}

export function steppedStretch(
  referredInductorA: (timeS: number) => number,
  t0: number,
  span: number,
  steps: number,
): Stretch {
  const maps = new Array<StepMap | undefined>(12).fill(undefined);
  if (!(span > 0) || steps <= 0) return { h: 0, steps: 0, il: new Float64Array(0), maps };
  const h = span / steps;
  const il = new Float64Array(2 * steps + 1);
  for (let j = 0; j <= 2 * steps; j++) il[j] = referredInductorA(t0 + (j * h) / 2);
  return { h, steps, il, maps };
}

export interface Peaks {
  switchPeakA: number;
  drainPeakV: number;
}

/**
 * Steps s over the stretch with the drains in `drains` (ON, FREE, LOW, HIGH; updated); where
 * `record` is given, reads the driven switch's current and the off drain's voltage at each
 * step. Each step takes its mode's affine map; where the winding's mode at the step's end is
 * not the one at its start, the step is taken again by RK4 itself with the mode read at each stage.
 */
export function stepStretch(
  k: SteppedCircuit,
  s: Float64Array,
  stretch: Stretch,
  drains: Int8Array,
  record?: Peaks,
): void {
  const { h, steps, il, maps } = stretch;
  const { rd, vin, perSum, halfSum, top } = k;
  const next = NEXT;
  const ils: [number, number, number] = [0, 0, 0];
  let a = drains[0] as number;
  let b = drains[1] as number;
  let switchPeakA = record === undefined ? 0 : record.switchPeakA;
  let drainPeakV = record === undefined ? 0 : record.drainPeakV;
  let s0 = s[0] as number;
  let s1 = s[1] as number;
  let s2 = s[2] as number;
  let s3 = s[3] as number;
  let s4 = s[4] as number;
  for (let n = 0; n < steps; n++) {
    const il0 = il[2 * n] as number;
    const ilMid = il[2 * n + 1] as number;
    const il1 = il[2 * n + 2] as number;
    const mode = modeOf((rd * (s0 - s1) + s3 - s2) * perSum - s4, il0);
    const key = (a === FREE ? 1 : 0) + (b === FREE ? 2 : 0) + 4 * (mode + 1);
    let map = maps[key];
    if (map === undefined) {
      map = stepMapOf(k, h, key);
      maps[key] = map;
    }
    const { m, p, q } = map;
    const f0 = (p[0] as number) * il0 + (p[1] as number) * ilMid + (p[2] as number) * il1;
    const f1 = (p[3] as number) * il0 + (p[4] as number) * ilMid + (p[5] as number) * il1;
    const f2 = (p[6] as number) * il0 + (p[7] as number) * ilMid + (p[8] as number) * il1;
    const f3 = (p[9] as number) * il0 + (p[10] as number) * ilMid + (p[11] as number) * il1;
    const f4 = (p[12] as number) * il0 + (p[13] as number) * ilMid + (p[14] as number) * il1;
    let n0 =
      (m[0] as number) * s0 +
      (m[1] as number) * s1 +
      (m[2] as number) * s2 +
      (m[3] as number) * s3 +
      (m[4] as number) * s4 +
      f0 +
      (q[0] as number);
    let n1 =
      (m[5] as number) * s0 +
      (m[6] as number) * s1 +
      (m[7] as number) * s2 +
      (m[8] as number) * s3 +
      (m[9] as number) * s4 +
      f1 +
      (q[1] as number);
    let n2 =
      (m[10] as number) * s0 +
      (m[11] as number) * s1 +
      (m[12] as number) * s2 +
      (m[13] as number) * s3 +
      (m[14] as number) * s4 +
      f2 +
      (q[2] as number);
    let n3 =
      (m[15] as number) * s0 +
      (m[16] as number) * s1 +
      (m[17] as number) * s2 +
      (m[18] as number) * s3 +
      (m[19] as number) * s4 +
      f3 +
      (q[3] as number);
    let n4 =
      (m[20] as number) * s0 +
      (m[21] as number) * s1 +
      (m[22] as number) * s2 +
      (m[23] as number) * s3 +
      (m[24] as number) * s4 +
      f4 +
      (q[4] as number);
    let xm = (rd * (n0 - n1) + n3 - n2) * perSum - n4;
    if (modeOf(xm, il1) !== mode) {
      // The winding changed its mode within the step: RK4 itself, the mode read at each stage.
      s[0] = s0;
      s[1] = s1;
      s[2] = s2;
      s[3] = s3;
      s[4] = s4;
      ils[0] = il0;
      ils[1] = ilMid;
      ils[2] = il1;
      rk4(k, s, ils, h, [a === FREE, b === FREE], FROM_STATE, next);
      n0 = next[0] as number;
      n1 = next[1] as number;
      n2 = next[2] as number;
      n3 = next[3] as number;
      n4 = next[4] as number;
      xm = (rd * (n0 - n1) + n3 - n2) * perSum - n4;
    }
    s0 = n0;
    s1 = n1;
    s2 = n2;
    s3 = n3;
    s4 = n4;
    // The half currents after the step, and the off drains' diodes (held at zero or at the
    // clamp, or let go).
    const e = xm > il1 ? halfSum * (xm - il1) : xm < -il1 ? halfSum * (xm + il1) : 0;
    const ia = (rd * s0 + vin - s2 - e) * perSum;
    const ib = (rd * s1 + vin - s3 + e) * perSum;
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
    if (s3 > drainPeakV) drainPeakV = s3;
  }
  s[0] = s0;
  s[1] = s1;
  s[2] = s2;
  s[3] = s3;
  s[4] = s4;
  drains[0] = a;
  drains[1] = b;
  if (record !== undefined) {
    record.switchPeakA = switchPeakA;
    record.drainPeakV = drainPeakV;
  }
}
