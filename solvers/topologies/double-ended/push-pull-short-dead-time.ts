/**
 * The push-pull's half period stepped with both drains behind their leakages, for a corner whose
 * dead time is shorter than the off drain's ring takes to die (issue 3; DEVELOPERS.md, "The
 * push-pull's short dead time"). There the turn-on ring (`pushPullTurnOnRing`) does not start
 * from the rail: the drain that opened rings with its leakage through the dead time and meets
 * the other switch's turn-on wherever the ring's phase and damping leave it, and the turn-on ring
 * it starts is still alive at the next turn-off. The circuit, primary side, in the frame of the
 * half driven (switch a on from the half's start to the gate's turn-off):
 *  - each half: its loop resistance Rp, then its leakage Llk with the damping resistance R
 *    across it (`LEAKAGE_DAMPING_RATIO` times √(Llk/C)), the half winding and the drain, whose
 *    capacitance C (one switch's) is pinned at zero while its switch is on, held at zero by the
 *    body diode and at Vin + Vc by the clamp (an ideal level) while off;
 *  - the half current i = (R·iL + Vin − v ∓ e)/(R + Rp) (iL the leakage's own current, v the
 *    drain, e the winding of half a: + for a, − for b), Llk·diL/dt = Vin − v ∓ e − Rp·i,
 *    C·dv/dt = i while free;
 *  - an ideal transformer with Lm across half a and the outputs' inductors as a current source,
 *    their currents referred to the primary and summed (the engine's own inductor waveforms, so
 *    the half carries the steady state's load): ia − ib = Im ± IL while a rectifier side
 *    conducts, e = 0 while both freewheel. With R across each leakage that relation gives e
 *    itself: e = (R + Rp)·(x − s·IL)/2, x = (R·(iLa − iLb) + vb − va)/(R + Rp) − Im the
 *    transformer's current at e = 0, s = +1 (rectifier a) where x > IL, −1 where x < −IL, and
 *    e = 0 (freewheel) between: the conduction modes follow from the state, continuously.
 * Stepped by RK4 at 64 steps a period of one leakage's ring with one drain (the fastest of its
 * rings; the winding's settling through R, (R + Rp)/(2·Llk), some 5·ω at R = 10·Z, lies well
 * inside the method's stability; the scan's spec 6 read the same peaks within 0.01 % at 128); the drains' diodes at the steps. The half is run from a start
 * and mirrored (a ↔ b, Im → −Im) until its turn-on state repeats (the damping makes the map
 * contract; the magnetizing current's start is the mean of its start and its mirrored end, the
 * fixed point of a map whose multiplier is −1). Read over the on-time from the winding's release
 * on: the driven switch's highest current and the off drain's highest voltage.
 * ref: the circuit's own equations (as `push-pull-leaky-half.ts`, with the deck's resistor across
 * each leakage); RK4 (common practice); checked against ngspice (Debian) in
 * `push-pull-short-dead-time-netlist.test.ts`.
 */

/** What {@link pushPullShortDeadTime} needs (SI units, primary side). */
export interface PushPullShortDeadTimeValues {
  inputV: number;
  /** Each half's leakage, H. */
  leakageH: number;
  /** One switch's drain capacitance, F. */
  capacitanceF: number;
  /** Each half's series resistance (switch and winding half), Ω. */
  loopOhm: number;
  /** The resistance across each leakage, Ω. */
  dampingOhm: number;
  magnetizingH: number;
  /** The magnetizing current as switch a turns on (a start; it is solved for), A. */
  magnetizingStartA: number;
  /** The clamp's level above the rail, V. */
  clampV: number;
  halfS: number;
  /** The gate's turn-off, from the half's start, s. */
  onS: number;
  /** Where the winding is released (the turn-on commutation's end), from the half's start, s. */
  releaseS: number;
  /** The outputs' inductor currents referred to the primary and summed, at time t of the half, A. */
  referredInductorA: (timeS: number) => number;
}

/** The periodic half of {@link pushPullShortDeadTime}. */
export interface PushPullShortDeadTime {
  /** The driven switch's highest current from the winding's release to its turn-off, A. */
  switchPeakA: number;
  /** The off drain's highest voltage over the same stretch, V. */
  drainPeakV: number;
  /** The off drain as the winding is released (the turn-on ring's start), V. */
  releaseDrainV: number;
  /** The drain that opened, as the other switch turns on (before it is pinned), V. */
  turnOnDrainV: number;
  /** Halves run. */
  halves: number;
}

const STEPS_PER_RING = 64;
const HALVES_MAX = 80;
const TOLERANCE = 1e-7;

/** iLa, iLb, va, vb, Im. */
const SIZE = 5;

type Drain = 'on' | 'free' | 'low' | 'high';

interface Circuit {
  vin: number;
  llk: number;
  c: number;
  rp: number;
  rd: number;
  lm: number;
  top: number;
}

/** The winding voltage of half a at state s with the referred inductor current il. */
function windingV(k: Circuit, s: Float64Array, il: number): number {
  const sum = k.rd + k.rp;
  const x =
    (k.rd * ((s[0] as number) - (s[1] as number)) + (s[3] as number) - (s[2] as number)) / sum;
  const xm = x - (s[4] as number);
  if (xm > il) return (sum * (xm - il)) / 2;
  if (xm < -il) return (sum * (xm + il)) / 2;
  return 0;
}

/** The half currents (into each drain) at state s, winding e. */
function halfCurrents(k: Circuit, s: Float64Array, e: number, out: Float64Array): void {
  const sum = k.rd + k.rp;
  out[0] = (k.rd * (s[0] as number) + k.vin - (s[2] as number) - e) / sum;
  out[1] = (k.rd * (s[1] as number) + k.vin - (s[3] as number) + e) / sum;
}

const CURRENTS = new Float64Array(2);

function rate(
  k: Circuit,
  s: Float64Array,
  il: number,
  a: Drain,
  b: Drain,
  out: Float64Array,
): void {
  const e = windingV(k, s, il);
  halfCurrents(k, s, e, CURRENTS);
  const ia = CURRENTS[0] as number;
  const ib = CURRENTS[1] as number;
  out[0] = (k.vin - (s[2] as number) - e - k.rp * ia) / k.llk;
  out[1] = (k.vin - (s[3] as number) + e - k.rp * ib) / k.llk;
  out[2] = a === 'free' ? ia / k.c : 0;
  out[3] = b === 'free' ? ib / k.c : 0;
  out[4] = e / k.lm;
}

/** An off drain's diode after a step: held at zero or at the clamp, or let go. */
function settle(k: Circuit, s: Float64Array, index: 2 | 3, drain: Drain, current: number): Drain {
  if (drain === 'on') return drain;
  const v = s[index] as number;
  if (drain === 'free') {
    if (v < 0) {
      s[index] = 0;
      return 'low';
    }
    if (v > k.top) {
      s[index] = k.top;
      return 'high';
    }
    return drain;
  }
  if (drain === 'low') return current > 0 ? 'free' : drain;
  return current < 0 ? 'free' : drain;
}

interface Scratch {
  k1: Float64Array;
  k2: Float64Array;
  k3: Float64Array;
  k4: Float64Array;
  y: Float64Array;
}

interface Peaks {
  switchPeakA: number;
  drainPeakV: number;
}

/**
 * Steps s from t0 over `span` in `steps` equal steps with drain a and b in their states; where
 * `record` is given, reads the driven switch's current and the off drain's voltage at each step.
 * Returns drain a's and b's states at the end.
 */
function run(
  k: Circuit,
  s: Float64Array,
  il: (timeS: number) => number,
  t0: number,
  span: number,
  steps: number,
  drains: [Drain, Drain],
  w: Scratch,
  record?: Peaks,
): void {
  if (!(span > 0) || steps <= 0) return;
  const h = span / steps;
  const { k1, k2, k3, k4, y } = w;
  for (let n = 0; n < steps; n++) {
    const t = t0 + n * h;
    const [a, b] = drains;
    const il0 = il(t);
    const ilMid = il(t + h / 2);
    const il1 = il(t + h);
    rate(k, s, il0, a, b, k1);
    for (let i = 0; i < SIZE; i++) y[i] = (s[i] as number) + (h / 2) * (k1[i] as number);
    rate(k, y, ilMid, a, b, k2);
    for (let i = 0; i < SIZE; i++) y[i] = (s[i] as number) + (h / 2) * (k2[i] as number);
    rate(k, y, ilMid, a, b, k3);
    for (let i = 0; i < SIZE; i++) y[i] = (s[i] as number) + h * (k3[i] as number);
    rate(k, y, il1, a, b, k4);
    for (let i = 0; i < SIZE; i++) {
      s[i] =
        (s[i] as number) +
        (h / 6) *
          ((k1[i] as number) + 2 * (k2[i] as number) + 2 * (k3[i] as number) + (k4[i] as number));
    }
    const e = windingV(k, s, il1);
    halfCurrents(k, s, e, CURRENTS);
    drains[0] = settle(k, s, 2, a, CURRENTS[0] as number);
    drains[1] = settle(k, s, 3, b, CURRENTS[1] as number);
    if (record !== undefined) {
      record.switchPeakA = Math.max(record.switchPeakA, CURRENTS[0] as number);
      record.drainPeakV = Math.max(record.drainPeakV, s[3] as number);
    }
  }
}

/**
 * Returns the periodic half ({@link PushPullShortDeadTime}), or undefined where the values do
 * not describe one (no leakage, capacitance or damping; the gate's turn-off not within the half)
 * or the half does not repeat within 80 halves.
 */
export function pushPullShortDeadTime(
  v: PushPullShortDeadTimeValues,
): PushPullShortDeadTime | undefined {
  const { leakageH: llk, capacitanceF: c, halfS, onS } = v;
  if (!(llk > 0 && c > 0 && v.dampingOhm > 0 && v.magnetizingH > 0)) return undefined;
  if (!(onS > 0 && onS < halfS)) return undefined;
  const k: Circuit = {
    vin: v.inputV,
    llk,
    c,
    rp: Math.max(0, v.loopOhm),
    rd: v.dampingOhm,
    lm: v.magnetizingH,
    top: v.inputV + v.clampV,
  };
  const releaseS = Math.min(Math.max(0, v.releaseS), onS);
  const h = (2 * Math.PI * Math.sqrt(llk * c)) / STEPS_PER_RING;
  const stepsOf = (span: number) => Math.max(1, Math.ceil(span / h));
  const w: Scratch = {
    k1: new Float64Array(SIZE),
    k2: new Float64Array(SIZE),
    k3: new Float64Array(SIZE),
    k4: new Float64Array(SIZE),
    y: new Float64Array(SIZE),
  };
  // The start: the winding freewheeling, the off drain at the rail.
  const start = new Float64Array(SIZE);
  start[3] = k.vin;
  start[4] = v.magnetizingStartA;
  const s = new Float64Array(SIZE);
  const scale = Math.max(Math.abs(v.referredInductorA(0)), Math.abs(v.magnetizingStartA), 1e-3);
  for (let half = 1; half <= HALVES_MAX; half++) {
    s.set(start);
    s[2] = 0;
    const drains: [Drain, Drain] = ['on', 'free'];
    const record: Peaks = { switchPeakA: -Infinity, drainPeakV: -Infinity };
    run(k, s, v.referredInductorA, 0, releaseS, releaseS > 0 ? stepsOf(releaseS) : 0, drains, w);
    const releaseDrainV = s[3] as number;
    record.drainPeakV = releaseDrainV;
    run(
      k,
      s,
      v.referredInductorA,
      releaseS,
      onS - releaseS,
      stepsOf(onS - releaseS),
      drains,
      w,
      record,
    );
    drains[0] = 'free';
    run(k, s, v.referredInductorA, onS, halfS - onS, stepsOf(halfS - onS), drains, w);
    // Mirrored into the next half's frame; its driven drain is pinned at the turn-on.
    const turnOnDrainV = s[2] as number;
    const next0 = s[1] as number;
    const next1 = s[0] as number;
    const next3 = s[2] as number;
    const next4: number = ((start[4] as number) - (s[4] as number)) / 2;
    const miss = Math.max(
      Math.abs(next0 - (start[0] as number)) / scale,
      Math.abs(next1 - (start[1] as number)) / scale,
      Math.abs(next3 - (start[3] as number)) / k.vin,
      Math.abs(-(s[4] as number) - (start[4] as number)) / scale,
    );
    start[0] = next0;
    start[1] = next1;
    start[3] = next3;
    start[4] = next4;
    if (miss <= TOLERANCE) {
      return {
        switchPeakA: record.switchPeakA,
        drainPeakV: record.drainPeakV,
        releaseDrainV,
        turnOnDrainV,
        halves: half,
      };
    }
  }
  return undefined;
}
