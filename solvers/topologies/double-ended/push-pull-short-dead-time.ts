import {
  FREE,
  ON,
  SIZE,
  stepStretch,
  steppedStretch,
  type Peaks,
  type SteppedCircuit,
} from './push-pull-stepped-stretch.js';

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
 * inside the method's stability; the scan's spec 6 read the same peaks within 0.01 % at 128;
 * at 32 they moved by up to 0.08 % and the turn-on drain by 0.14 %, so 64 stays); the drains'
 * diodes at the steps. Each step is RK4's affine map for its mode, read off once per stretch
 * (`push-pull-stepped-stretch.ts`; RK4 itself where the winding changes mode within a step),
 * and the outputs' inductor current is sampled once for all halves. The half is run from a start
 * and mirrored (a ↔ b, Im → −Im) until its turn-on state repeats to 1e-5 (of the larger of the
 * referred load and Im on the currents, of Vin on the off drain; the damping makes the map
 * contract by some 0.1 a half here; the magnetizing current's start is the mean of its start
 * and its mirrored end, the fixed point of a map whose multiplier is −1). 1e-5 reads the peaks
 * within 5e-6 of 1e-7's with two halves fewer (7 against 9 on the netlist test's 200 V corner;
 * 1e-4 within 4e-5, one more fewer). Tried and dropped: Anderson's mixing of the last two or
 * three halves (one or two halves fewer at 1e-7, at most one at 1e-4) and the first halves at
 * 16 or 32 steps a ring (their own fixed point lies too far off to save fine halves). Read over the on-time from the winding's
 * release on: the driven switch's highest current and the off drain's highest voltage. Cost: that
 * corner's design (two such corners, magnetics assumed) at least 0.48–0.56 ms against 2.4–2.8
 * before (DEVELOPERS.md, "The push-pull's short dead time").
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
const TOLERANCE = 1e-5;

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
  const rp = Math.max(0, v.loopOhm);
  const k: SteppedCircuit = {
    vin: v.inputV,
    llk,
    c,
    rp,
    rd: v.dampingOhm,
    lm: v.magnetizingH,
    top: v.inputV + v.clampV,
    perSum: 1 / (v.dampingOhm + rp),
    halfSum: (v.dampingOhm + rp) / 2,
  };
  const releaseS = Math.min(Math.max(0, v.releaseS), onS);
  const h = (2 * Math.PI * Math.sqrt(llk * c)) / STEPS_PER_RING;
  const stepsOf = (span: number) => Math.max(1, Math.ceil(span / h));
  const il = v.referredInductorA;
  const commutation = steppedStretch(il, 0, releaseS, releaseS > 0 ? stepsOf(releaseS) : 0);
  const driven = steppedStretch(il, releaseS, onS - releaseS, stepsOf(onS - releaseS));
  const dead = steppedStretch(il, onS, halfS - onS, stepsOf(halfS - onS));
  const drains = new Int8Array(2);
  // The start: the winding freewheeling, the off drain at the rail.
  const start = new Float64Array(SIZE);
  start[3] = k.vin;
  start[4] = v.magnetizingStartA;
  const s = new Float64Array(SIZE);
  const scale = Math.max(Math.abs(il(0)), Math.abs(v.magnetizingStartA), 1e-3);
  for (let half = 1; half <= HALVES_MAX; half++) {
    s.set(start);
    s[2] = 0;
    drains[0] = ON;
    drains[1] = FREE;
    const record: Peaks = { switchPeakA: -Infinity, drainPeakV: -Infinity };
    stepStretch(k, s, commutation, drains);
    const releaseDrainV = s[3] as number;
    record.drainPeakV = releaseDrainV;
    stepStretch(k, s, driven, drains, record);
    drains[0] = FREE;
    stepStretch(k, s, dead, drains);
    // Mirrored into the next half's frame; its driven drain is pinned at the turn-on.
    const turnOnDrainV = s[2] as number;
    const next0 = s[1] as number;
    const next1 = s[0] as number;
    const next4: number = ((start[4] as number) - (s[4] as number)) / 2;
    const miss = Math.max(
      Math.abs(next0 - (start[0] as number)) / scale,
      Math.abs(next1 - (start[1] as number)) / scale,
      Math.abs(turnOnDrainV - (start[3] as number)) / k.vin,
      Math.abs(-(s[4] as number) - (start[4] as number)) / scale,
    );
    start[0] = next0;
    start[1] = next1;
    start[3] = turnOnDrainV;
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
