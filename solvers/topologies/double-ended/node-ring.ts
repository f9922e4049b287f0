import { brentRoot } from '../../root-finding/brent-root.js';
import { hypotenuse } from './hypotenuse.js';

/**
 * The circuit of a double-ended secondary once one rectifier has stopped at light load, referred
 * to the secondary (SI units): the output inductor L through the conducting rectifier to Vo + Vf,
 * the magnetizing inductance Lr = Lm/n² across the winding, and the switch-node capacitance
 * Cr = C·n² across it too (the switches' drain capacitance, as the winding sees it), the body
 * diodes clamping the winding at the drive voltage Vd/n.
 */
export interface RingCircuit {
  inductanceH: number;
  referredMagnetizingH: number;
  /** Referred node capacitance, F (> 0). */
  capacitanceF: number;
  /** Referred drive voltage, where the body diodes clamp the winding, V. */
  clampV: number;
  /** Vo plus the drop of one conducting path, V. */
  pathV: number;
  /** Vo plus the drop of the freewheeling path (both rectifiers conducting), V. */
  freewheelV: number;
}

/**
 * What the secondary does in one stretch: `shared`, one rectifier conducts (side +1: the half
 * about to be driven; −1: the half just driven) and the inductor, Lr and Cr ring; `clamp`, the
 * same with the winding held at ±Vd/n by the body diodes; `off`, both rectifiers freewheel (the
 * winding at zero); `idle`, the inductor current at zero and Lr ringing with Cr alone. The ring
 * is taken as damped after its first swing (where the capacitor current next returns to zero):
 * `settled`, a rectifier conducting with the winding at the ring's centre and IL = iM falling
 * together; `rest`, everything at zero.
 */
export type RingMode = 'shared' | 'clamp' | 'settled' | 'off' | 'idle' | 'rest';

/**
 * Inductor current IL, referred magnetizing current iM (positive in the direction it ended the
 * on-time with) and winding voltage v (positive towards the next half's drive), A and V.
 */
export interface RingState {
  inductorA: number;
  magnetizingA: number;
  windingV: number;
}

/** One stretch of the simulated interval: its mode, side, start time (s) and start state. */
export interface RingSegment {
  mode: RingMode;
  side: 1 | -1;
  startS: number;
  durationS: number;
  start: RingState;
}

/** The result of {@link simulateRing}: the end state and ∫IL dt over the interval (A·s). */
export interface RingRun {
  end: RingState;
  chargeAS: number;
  /** The stretches, when asked for (to sample the waveforms). */
  segments?: RingSegment[] | undefined;
  /** False when the stretch count ran out before the interval did. */
  isComplete: boolean;
}

/** The constants of a ring circuit: slopes, centre voltage, angular frequencies, impedances. */
export interface RingConstants {
  c: RingCircuit;
  /** Fall of the inductances' shared current: (Vo + Vf)/(L + Lr), A/s. */
  slopeAPerS: number;
  /** Lr/(L + Lr). */
  share: number;
  /** L‖Lr, H. */
  parallelH: number;
  /** Centre of the ring with a rectifier conducting: Lr·(Vo + Vf)/(L + Lr), V. */
  centreV: number;
  omega: number;
  /** √(L‖Lr / Cr), Ω. */
  impedanceOhm: number;
  /** Lr with Cr alone (inductor current at zero). */
  idleOmega: number;
  idleImpedanceOhm: number;
}

const MAX_SEGMENTS = 64;
/**
 * The stretches a continued ring may take in one half (`simulateRing`'s `isContinued`): it keeps
 * ringing to the half's end, some 15 turns in the many-turn push-pull of DEVELOPERS.md.
 */
const MAX_CONTINUED_SEGMENTS = 400;

/**
 * A ringing stretch is sampled every π/6 of its phase from its start (the last step shorter),
 * and the waveforms are linear between samples. Charges are taken over the same samples (the
 * trapezoid rule), so a waveform's mean is the solved one: over whole steps of θ the trapezoid
 * rule gives a sinusoid's integral times (θ/2)·cot(θ/2) (common practice: the trapezoid rule on
 * a sampled sinusoid).
 */
export const RING_SAMPLE_RADIANS = Math.PI / 6;
/** (θ/2)·cot(θ/2) at θ = `RING_SAMPLE_RADIANS`. */
export const RING_TRAPEZOID_FACTOR = RING_SAMPLE_RADIANS / 2 / Math.tan(RING_SAMPLE_RADIANS / 2);

/** The duration of a ringing stretch's whole sample steps within `t`, s. */
export function wholeStepsS(omega: number, t: number): number {
  return (Math.floor((omega * t) / RING_SAMPLE_RADIANS + 1e-9) * RING_SAMPLE_RADIANS) / omega;
}

/** Returns the constants of the ring circuit `c`. */
export function ringConstants(c: RingCircuit): RingConstants {
  // NaN, not 0: every field starts as a double, so `refreshRingConstants` writes in place.
  return refreshRingConstants({
    c,
    slopeAPerS: NaN,
    share: NaN,
    parallelH: NaN,
    centreV: NaN,
    omega: NaN,
    impedanceOhm: NaN,
    idleOmega: NaN,
    idleImpedanceOhm: NaN,
  });
}

/** Sets `k`'s constants from its circuit `k.c` and returns `k`. */
function refreshRingConstants(k: RingConstants): RingConstants {
  const c = k.c;
  const l = c.inductanceH;
  const lr = c.referredMagnetizingH;
  const parallelH = (l * lr) / (l + lr);
  k.share = lr / (l + lr);
  k.parallelH = parallelH;
  k.omega = 1 / Math.sqrt(parallelH * c.capacitanceF);
  k.impedanceOhm = Math.sqrt(parallelH / c.capacitanceF);
  k.idleOmega = 1 / Math.sqrt(lr * c.capacitanceF);
  k.idleImpedanceOhm = Math.sqrt(lr / c.capacitanceF);
  return refreshRingVoltages(k);
}

/**
 * Sets the constants of `k` that follow the circuit's voltages (the slope and the centre) after
 * `k.c.pathV` changed in place, and returns `k`: a search over Vo moves only those, so its
 * trials need neither a new object nor the four square roots of the inductances and Cr.
 */
export function refreshRingVoltages(k: RingConstants): RingConstants {
  const c = k.c;
  const l = c.inductanceH;
  const lr = c.referredMagnetizingH;
  k.slopeAPerS = c.pathV / (l + lr);
  k.centreV = (lr * c.pathV) / (l + lr);
  return k;
}

/**
 * Returns the state `t` seconds into a stretch of `mode` and `side` that starts at `s`, and
 * ∫IL dt over it (0 where `withCharge` is false: the waveforms' samples and the search for IL's
 * zero need only the state). Closed forms: with a rectifier conducting, L·dIL/dt = side·v − (Vo + Vf),
 * Lr·diM/dt = −v, Cr·dv/dt = iM − side·IL, so (L·side·IL + Lr·iM) falls linearly and
 * (v − side·Vw, (iM − side·IL)·√(L‖Lr/Cr)) turns at ω = 1/√(L‖Lr·Cr) (common practice: a series
 * LC ring about its source voltage); idle, (v, iM·√(Lr/Cr)) turns at 1/√(Lr·Cr).
 */
export function ringAdvance(
  k: RingConstants,
  mode: RingMode,
  side: 1 | -1,
  s: RingState,
  t: number,
  withCharge = true,
): { state: RingState; chargeAS: number } {
  const { c } = k;
  const l = c.inductanceH;
  const lr = c.referredMagnetizingH;
  if (mode === 'shared') {
    const u0 = (l * side * s.inductorA + lr * s.magnetizingA) / (l + lr);
    const y0 = s.windingV - side * k.centreV;
    const z0 = (s.magnetizingA - side * s.inductorA) * k.impedanceOhm;
    const cos = Math.cos(k.omega * t);
    const sin = Math.sin(k.omega * t);
    const y = y0 * cos + z0 * sin;
    const x = (z0 * cos - y0 * sin) / k.impedanceOhm;
    const u = u0 - side * k.slopeAPerS * t;
    const v = side * k.centreV + y;
    const state: RingState = {
      inductorA: side * (u - k.share * x),
      magnetizingA: u + (1 - k.share) * x,
      windingV: v,
    };
    if (!withCharge) return { state, chargeAS: 0 };
    // ∫x dt over the samples: whole steps by the trapezoid factor, the last step as a trapezoid.
    const wholeS = wholeStepsS(k.omega, t);
    const wCos = Math.cos(k.omega * wholeS);
    const wSin = Math.sin(k.omega * wholeS);
    const wholeV = side * k.centreV + y0 * wCos + z0 * wSin;
    const wholeX = (z0 * wCos - y0 * wSin) / k.impedanceOhm;
    const xIntegral =
      RING_TRAPEZOID_FACTOR * c.capacitanceF * (wholeV - s.windingV) +
      ((wholeX + x) / 2) * (t - wholeS);
    return {
      state,
      chargeAS: side * (u0 * t - (side * k.slopeAPerS * t * t) / 2 - k.share * xIntegral),
    };
  }
  if (mode === 'clamp') {
    const ilRate = (c.clampV - c.pathV) / l;
    const il = s.inductorA + ilRate * t;
    return {
      state: {
        inductorA: il,
        magnetizingA: s.magnetizingA - (side * c.clampV * t) / lr,
        windingV: side * c.clampV,
      },
      chargeAS: ((s.inductorA + il) / 2) * t,
    };
  }
  if (mode === 'settled') {
    const u = s.magnetizingA - side * k.slopeAPerS * t;
    return {
      state: { inductorA: side * u, magnetizingA: u, windingV: side * k.centreV },
      chargeAS: side * (s.magnetizingA * t - (side * k.slopeAPerS * t * t) / 2),
    };
  }
  if (mode === 'rest') {
    return { state: { inductorA: 0, magnetizingA: 0, windingV: 0 }, chargeAS: 0 };
  }
  if (mode === 'off') {
    const il = s.inductorA - (c.freewheelV * t) / l;
    return {
      state: { inductorA: il, magnetizingA: s.magnetizingA, windingV: 0 },
      chargeAS: ((s.inductorA + il) / 2) * t,
    };
  }
  const cos = Math.cos(k.idleOmega * t);
  const sin = Math.sin(k.idleOmega * t);
  const z0 = s.magnetizingA * k.idleImpedanceOhm;
  return {
    state: {
      inductorA: 0,
      magnetizingA: (z0 * cos - s.windingV * sin) / k.idleImpedanceOhm,
      windingV: s.windingV * cos + z0 * sin,
    },
    chargeAS: 0,
  };
}

/**
 * The first time after `from` (s) at which a ring y = y0·cos ωt + z0·sin ωt reaches `level`
 * moving up (`rising`) or down; Infinity if it never does.
 */
function levelTime(
  omega: number,
  y0: number,
  z0: number,
  level: number,
  rising: boolean,
  from: number,
): number {
  const r = hypotenuse(y0, z0);
  if (!(r > Math.abs(level))) return Infinity;
  const alpha = Math.atan2(z0, y0);
  const a = Math.acos(level / r);
  // y = r·cos(ωt − α): rising where sin(ωt − α) < 0.
  let phase = (rising ? 2 * Math.PI - a : a) + alpha;
  const first = omega * from;
  const turns = Math.ceil((first - phase) / (2 * Math.PI));
  phase += turns * 2 * Math.PI;
  if (phase <= first) phase += 2 * Math.PI;
  return phase / omega;
}

/** The first time after `from` at which z = z0·cos ωt − y0·sin ωt returns to zero. */
function swingEndTime(omega: number, y0: number, z0: number, from: number): number {
  // z = −r·sin(ωt − α): zero where ωt − α is a multiple of π.
  const alpha = Math.atan2(z0, y0);
  const first = omega * from;
  let phase = alpha + Math.ceil((first - alpha) / Math.PI) * Math.PI;
  if (phase <= first) phase += Math.PI;
  return phase / omega;
}

/**
 * Simulates the stretch of `durationS` seconds from `start` (mode `shared`, side +1, unless the
 * state says otherwise: a start with IL at zero idles), event by event: the clamp at ±Vd/n, the
 * other rectifier coming in (winding back at zero), the inductor current reaching zero, a
 * rectifier conducting again out of the idle ring. The interval may end anywhere.
 * `isContinued` (the event model, `event-half.ts`): the ring is not taken as damped: no
 * `settled` or `rest` stretch, the clamp hands back to the ring on the same side, and the idle
 * ring keeps turning; `startSide` is the conducting path at the start (−1 from the switches'
 * opening: the turn-off swing runs through the path just driven).
 */
export function simulateRing(
  k: RingConstants,
  start: RingState,
  durationS: number,
  withSegments = false,
  isContinued = false,
  startSide: 1 | -1 = 1,
): RingRun {
  const { c } = k;
  const segments: RingSegment[] | undefined = withSegments ? [] : undefined;
  let mode: RingMode = start.inductorA > 0 ? 'shared' : 'idle';
  let side: 1 | -1 = startSide;
  let state = start;
  let elapsed = 0;
  let charge = 0;
  const tiny = 1e-12 * durationS;
  const maxSegments = isContinued ? MAX_CONTINUED_SEGMENTS : MAX_SEGMENTS;
  for (let count = 0; count < maxSegments; count++) {
    const left = durationS - elapsed;
    let stop = left;
    let next: RingMode = mode;
    let nextSide: 1 | -1 = side;
    if (mode === 'shared') {
      const y0 = state.windingV - side * k.centreV;
      const z0 = (state.magnetizingA - side * state.inductorA) * k.impedanceOhm;
      const clampAt = levelTime(k.omega, y0, z0, side * (c.clampV - k.centreV), side > 0, tiny);
      const offAt = levelTime(k.omega, y0, z0, -side * k.centreV, side < 0, tiny);
      if (clampAt < stop) [stop, next] = [clampAt, 'clamp'];
      if (offAt < stop) [stop, next] = [offAt, 'off'];
      if (!isContinued) {
        const settleAt = swingEndTime(k.omega, y0, z0, tiny);
        if (settleAt < stop) [stop, next] = [settleAt, 'settled'];
      }
      const zeroAt = inductorZeroTime(k, side, state, y0, z0, stop);
      if (zeroAt < stop) [stop, next] = [zeroAt, 'idle'];
    } else if (mode === 'clamp') {
      const xRate =
        -side * (c.clampV / c.referredMagnetizingH + (c.clampV - c.pathV) / c.inductanceH);
      const x0 = state.magnetizingA - side * state.inductorA;
      const releaseAt = -x0 / xRate;
      if (releaseAt < stop) {
        [stop, next] = [Math.max(0, releaseAt), isContinued ? 'shared' : 'settled'];
      }
    } else if (mode === 'settled') {
      const zeroAt = (side * state.magnetizingA) / k.slopeAPerS;
      if (zeroAt < stop) [stop, next] = [Math.max(0, zeroAt), 'rest'];
    } else if (mode === 'rest') {
      stop = left;
    } else if (mode === 'off') {
      const meetAt =
        ((state.inductorA - Math.abs(state.magnetizingA)) * c.inductanceH) / c.freewheelV;
      if (meetAt < stop) {
        stop = Math.max(0, meetAt);
        next = state.magnetizingA === 0 ? 'idle' : 'shared';
        nextSide = state.magnetizingA < 0 ? -1 : 1;
      }
    } else {
      const z0 = state.magnetizingA * k.idleImpedanceOhm;
      const upAt = levelTime(k.idleOmega, state.windingV, z0, c.pathV, true, tiny);
      const downAt = levelTime(k.idleOmega, state.windingV, z0, -c.pathV, false, tiny);
      if (!isContinued) {
        const settleAt = swingEndTime(k.idleOmega, state.windingV, z0, tiny);
        if (settleAt < stop) [stop, next] = [settleAt, 'rest'];
      }
      if (upAt < stop) [stop, next, nextSide] = [upAt, 'shared', 1];
      if (downAt < stop) [stop, next, nextSide] = [downAt, 'shared', -1];
    }
    segments?.push({ mode, side, startS: elapsed, durationS: stop, start: state });
    const step = ringAdvance(k, mode, side, state, stop);
    charge += step.chargeAS;
    state = step.state;
    elapsed += stop;
    // Literals, not spreads: the simulation runs in the solve's inner loop.
    if (next === 'idle') {
      state = { inductorA: 0, magnetizingA: state.magnetizingA, windingV: state.windingV };
    }
    if (next === 'settled') {
      state = {
        inductorA: state.inductorA,
        magnetizingA: side * state.inductorA,
        windingV: state.windingV,
      };
    }
    if (next === 'rest') state = { inductorA: 0, magnetizingA: 0, windingV: 0 };
    if (stop >= left) return { end: state, chargeAS: charge, segments, isComplete: true };
    mode = next;
    side = nextSide;
  }
  return { end: state, chargeAS: charge, segments, isComplete: false };
}

/**
 * The first time within `limitS` at which the inductor current of a conducting stretch reaches
 * zero, else Infinity. IL changes monotonically between the times side·v crosses Vo + Vf
 * (dIL/dt = (side·v − Vo − Vf)/L), so each falling piece is searched for a sign change.
 */
function inductorZeroTime(
  k: RingConstants,
  side: 1 | -1,
  s: RingState,
  y0: number,
  z0: number,
  limitS: number,
): number {
  // A bound first: IL = side·u − side·share·x with u linear in t and |x| at most the ring's
  // amplitude, so IL stays above min(side·u) − share·|x|max over the stretch; where that is
  // positive there is no zero to seek (the common case of a continued ring's many turns).
  const c = k.c;
  const u0 =
    (c.inductanceH * side * s.inductorA + c.referredMagnetizingH * s.magnetizingA) /
    (c.inductanceH + c.referredMagnetizingH);
  const uEnd = u0 - side * k.slopeAPerS * limitS;
  const lowestA =
    Math.min(side * u0, side * uEnd) - (k.share * hypotenuse(y0, z0)) / k.impedanceOhm;
  if (lowestA > 0 && Number.isFinite(limitS)) return Infinity;
  const level = side * (k.c.pathV - k.centreV);
  const ilAt = inductorAt(k, side, s);
  let from = 0;
  let ilFrom = s.inductorA;
  for (let piece = 0; piece < 4 * MAX_SEGMENTS && from < limitS; piece++) {
    // Falling while side·v < Vo + Vf: ends where side·v next rises through it.
    const up = levelTime(k.omega, y0, z0, level, side > 0, from + 1e-15);
    const down = levelTime(k.omega, y0, z0, level, side < 0, from + 1e-15);
    const next = Math.min(up, down, limitS);
    const ilNext = ilAt(next);
    if (ilNext <= 0 && ilFrom > 0) {
      const t = brentRoot(ilAt, from, next, { absoluteTolerance: 1e-15 * Math.max(next, 1e-9) });
      return Number.isFinite(t) ? t : next;
    }
    from = next;
    ilFrom = ilNext;
  }
  return Infinity;
}

/**
 * IL of a conducting stretch as a function of time. A returned arrow, not a named one in the
 * caller: under tsx, esbuild's keepNames wraps each named arrow in an Object.defineProperty call.
 */
function inductorAt(k: RingConstants, side: 1 | -1, s: RingState): (t: number) => number {
  return (t) => ringAdvance(k, 'shared', side, s, t, false).state.inductorA;
}
