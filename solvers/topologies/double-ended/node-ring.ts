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
  /**
   * Referred leakage inductance between the node and the winding, Llk/n², H (the event model
   * only, `isContinued`; absent or 0: the node is the winding, as before). See
   * {@link simulateRing}.
   */
  leakageH?: number;
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
export type RingMode = 'shared' | 'clamp' | 'settled' | 'off' | 'offClamp' | 'idle' | 'rest';

/**
 * Inductor current IL, referred magnetizing current iM (positive in the direction it ended the
 * on-time with) and winding voltage v (positive towards the next half's drive), A and V.
 */
export interface RingState {
  inductorA: number;
  magnetizingA: number;
  windingV: number;
  /**
   * With leakage (`RingCircuit.leakageH`): the leakage current j from the winding into the node
   * (positive charging the node towards the next half's drive; iM − side·IL while a rectifier
   * conducts, iM while idle), A, and the node voltage, V. Absent without leakage (the node is the
   * winding, its current iM − side·IL).
   */
  leakageA?: number;
  nodeV?: number;
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
  /** Whether an `idle` stretch of positive length was run (segments or not). */
  hasIdle: boolean;
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
  /**
   * With leakage: the winding's share of the node's swing about its centre while a rectifier
   * conducts, (L‖Lr)/(L‖Lr + Llk), and while idle, Lr/(Lr + Llk); the node's ring with the
   * leakage alone while both rectifiers freewheel (the winding at zero). `omega`, `impedanceOhm`,
   * `idleOmega` and `idleImpedanceOhm` then take L‖Lr + Llk and Lr + Llk. NaN without leakage.
   */
  windingShare: number;
  idleWindingShare: number;
  offOmega: number;
  offImpedanceOhm: number;
}

/** Whether both rectifiers freewheel through a stretch of `mode` (the winding at zero). */
export function isFreewheel(mode: RingMode): boolean {
  return mode === 'off' || mode === 'offClamp';
}

/**
 * The angular frequency at which a stretch of `mode` rings (sampled every π/6 of it), or NaN
 * where nothing rings (a clamp, the freewheel without leakage, a settled or resting stretch).
 */
export function ringingOmega(k: RingConstants, mode: RingMode): number {
  if (mode === 'shared') return k.omega;
  if (mode === 'idle') return k.idleOmega;
  if (mode === 'off' && (k.c.leakageH ?? 0) > 0) return k.offOmega;
  return NaN;
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
    windingShare: NaN,
    idleWindingShare: NaN,
    offOmega: NaN,
    offImpedanceOhm: NaN,
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
  const lk = c.leakageH ?? 0;
  if (lk > 0) {
    // The leakage in series with the winding: the node rings with L‖Lr + Llk while a rectifier
    // conducts, Lr + Llk while idle, and Llk alone while the winding is held at zero.
    k.omega = 1 / Math.sqrt((parallelH + lk) * c.capacitanceF);
    k.impedanceOhm = Math.sqrt((parallelH + lk) / c.capacitanceF);
    k.idleOmega = 1 / Math.sqrt((lr + lk) * c.capacitanceF);
    k.idleImpedanceOhm = Math.sqrt((lr + lk) / c.capacitanceF);
    k.windingShare = parallelH / (parallelH + lk);
    k.idleWindingShare = lr / (lr + lk);
    k.offOmega = 1 / Math.sqrt(lk * c.capacitanceF);
    k.offImpedanceOhm = Math.sqrt(lk / c.capacitanceF);
  }
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
  if ((c.leakageH ?? 0) > 0) return leakyAdvance(k, mode, side, s, t, withCharge);
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
    const xIntegral = sampledRingIntegralAS(k, side, y0, z0, s.windingV, x, t);
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
 * moving up (`rising`) or down; Infinity if it never does. From the ring's radius
 * r = |(y0, z0)| (`hypotenuse`) and angle α = atan2(z0, y0), which the searches for the levels
 * of one stretch compute once.
 */
export function polarLevelTime(
  omega: number,
  r: number,
  alpha: number,
  level: number,
  rising: boolean,
  from: number,
): number {
  if (!(r > Math.abs(level))) return Infinity;
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
  if ((c.leakageH ?? 0) > 0) return simulateLeakyRing(k, start, durationS, withSegments, startSide);
  const segments: RingSegment[] | undefined = withSegments ? [] : undefined;
  let side: 1 | -1 = startSide;
  // A start at the clamp level or past it (a winding driven at a hair above Vd/n: at the
  // shortest on-time the primary current can stay negative through the on-time, so the loop's
  // drop adds to the drive) with the current driving it on outwards: the body diodes hold the
  // winding at the clamp from the switches' opening (`floorEventState`; without this the ring
  // swung past the clamp level it started beyond, 3.5 V on a full bridge at 400 V, 2 % load).
  let mode: RingMode =
    start.inductorA > 0
      ? side * start.windingV >= c.clampV &&
        side * (start.magnetizingA - side * start.inductorA) > 0
        ? 'clamp'
        : 'shared'
      : 'idle';
  let state = start;
  let elapsed = 0;
  let charge = 0;
  let hasIdle = false;
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
      const radius = hypotenuse(y0, z0);
      const alpha = Math.atan2(z0, y0);
      const clampAt = polarLevelTime(
        k.omega,
        radius,
        alpha,
        side * (c.clampV - k.centreV),
        side > 0,
        tiny,
      );
      const offAt = polarLevelTime(k.omega, radius, alpha, -side * k.centreV, side < 0, tiny);
      if (clampAt < stop) {
        stop = clampAt;
        next = 'clamp';
      }
      if (offAt < stop) {
        stop = offAt;
        next = 'off';
      }
      if (!isContinued) {
        const settleAt = swingEndTime(k.omega, y0, z0, tiny);
        if (settleAt < stop) {
          stop = settleAt;
          next = 'settled';
        }
      }
      const zeroAt = inductorZeroTime(
        k,
        side,
        state,
        y0,
        z0,
        stop,
        side * (c.pathV - k.centreV),
        radius,
        alpha,
      );
      if (zeroAt < stop) {
        stop = zeroAt;
        next = 'idle';
      }
    } else if (mode === 'clamp') {
      const xRate =
        -side * (c.clampV / c.referredMagnetizingH + (c.clampV - c.pathV) / c.inductanceH);
      const x0 = state.magnetizingA - side * state.inductorA;
      const releaseAt = -x0 / xRate;
      if (releaseAt < stop) {
        {
          stop = Math.max(0, releaseAt);
          next = isContinued ? 'shared' : 'settled';
        }
      }
    } else if (mode === 'settled') {
      const zeroAt = (side * state.magnetizingA) / k.slopeAPerS;
      if (zeroAt < stop) {
        stop = Math.max(0, zeroAt);
        next = 'rest';
      }
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
      const radius = hypotenuse(state.windingV, z0);
      const alpha = Math.atan2(z0, state.windingV);
      const upAt = polarLevelTime(k.idleOmega, radius, alpha, c.pathV, true, tiny);
      const downAt = polarLevelTime(k.idleOmega, radius, alpha, -c.pathV, false, tiny);
      if (!isContinued) {
        const settleAt = swingEndTime(k.idleOmega, state.windingV, z0, tiny);
        if (settleAt < stop) {
          stop = settleAt;
          next = 'rest';
        }
      }
      if (upAt < stop) {
        stop = upAt;
        next = 'shared';
        nextSide = 1;
      }
      if (downAt < stop) {
        stop = downAt;
        next = 'shared';
        nextSide = -1;
      }
    }
    segments?.push({ mode, side, startS: elapsed, durationS: stop, start: state });
    if (mode === 'idle' && stop > 0) hasIdle = true;
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
    if (stop >= left) return { end: state, chargeAS: charge, segments, isComplete: true, hasIdle };
    mode = next;
    side = nextSide;
  }
  return { end: state, chargeAS: charge, segments, isComplete: false, hasIdle };
}

/**
 * The first time within `limitS` at which the inductor current of a conducting stretch reaches
 * zero, else Infinity. IL changes monotonically between the times side·v crosses Vo + Vf
 * (dIL/dt = (side·v − Vo − Vf)/L), so each falling piece is searched for a sign change; `level`
 * is where the ring's y (v − side·Vw, or with leakage the node's) puts side·v at Vo + Vf.
 */
function inductorZeroTime(
  k: RingConstants,
  side: 1 | -1,
  s: RingState,
  y0: number,
  z0: number,
  limitS: number,
  level = side * (k.c.pathV - k.centreV),
  radius = hypotenuse(y0, z0),
  alpha = NaN,
): number {
  // A bound first: IL = side·u − side·share·x with u linear in t and |x| at most the ring's
  // amplitude, so IL stays above min(side·u) − share·|x|max over the stretch; where that is
  // positive there is no zero to seek (the common case of a continued ring's many turns).
  const c = k.c;
  const u0 =
    (c.inductanceH * side * s.inductorA + c.referredMagnetizingH * s.magnetizingA) /
    (c.inductanceH + c.referredMagnetizingH);
  const uEnd = u0 - side * k.slopeAPerS * limitS;
  const lowestA = Math.min(side * u0, side * uEnd) - (k.share * radius) / k.impedanceOhm;
  if (lowestA > 0 && Number.isFinite(limitS)) return Infinity;
  const angle = Number.isNaN(alpha) ? Math.atan2(z0, y0) : alpha;
  const ilAt = inductorAt(k, side, s);
  const options = BRENT_OPTIONS;
  let from = 0;
  let ilFrom = s.inductorA;
  for (let piece = 0; piece < 4 * MAX_SEGMENTS && from < limitS; piece++) {
    // Falling while side·v < Vo + Vf: ends where side·v next rises through it.
    const up = polarLevelTime(k.omega, radius, angle, level, side > 0, from + 1e-15);
    const down = polarLevelTime(k.omega, radius, angle, level, side < 0, from + 1e-15);
    const next = Math.min(up, down, limitS);
    const ilNext = ilAt(next);
    if (ilNext <= 0 && ilFrom > 0) {
      // IL at the bracket's ends as Brent's method would compute them (at the start, the state's
      // own IL need not be ilAt(0) to the bit, so it is evaluated there).
      options.absoluteTolerance = 1e-15 * Math.max(next, 1e-9);
      options.valueAtLo = piece > 0 ? ilFrom : NaN;
      options.valueAtHi = ilNext;
      const t = brentRoot(ilAt, from, next, options);
      return Number.isFinite(t) ? t : next;
    }
    from = next;
    ilFrom = ilNext;
  }
  return Infinity;
}

/**
 * The options of the node ring's Brent searches, written before each (the searches do not nest):
 * one object for the some 500 searches of a design rather than one each.
 */
const BRENT_OPTIONS = { absoluteTolerance: NaN, valueAtLo: NaN, valueAtHi: NaN };

/** The stretch {@link inductorAtTime} follows (set by {@link inductorAt}). */
const IL_STRETCH: { k: RingConstants | undefined; side: 1 | -1; start: RingState | undefined } = {
  k: undefined,
  side: 1,
  start: undefined,
};
/** Scratch state of {@link inductorAtTime} with leakage. */
const IL_STATE: RingState = {
  inductorA: NaN,
  magnetizingA: NaN,
  windingV: NaN,
  leakageA: NaN,
  nodeV: NaN,
};

/** IL of {@link IL_STRETCH}'s conducting stretch `t` seconds in, A. */
const inductorAtTime = (t: number): number => {
  const k = IL_STRETCH.k as RingConstants;
  const s = IL_STRETCH.start as RingState;
  if ((k.c.leakageH ?? 0) > 0) {
    writeLeakyAdvance(k, 'shared', IL_STRETCH.side, s, t, false, IL_STATE);
    return IL_STATE.inductorA;
  }
  return ringAdvance(k, 'shared', IL_STRETCH.side, s, t, false).state.inductorA;
};

/**
 * IL of a conducting stretch as a function of time: one module-level function reading the
 * stretch from {@link IL_STRETCH} (the searches do not nest), so a search makes no closure.
 */
function inductorAt(k: RingConstants, side: 1 | -1, s: RingState): (t: number) => number {
  IL_STRETCH.k = k;
  IL_STRETCH.side = side;
  IL_STRETCH.start = s;
  return inductorAtTime;
}

/*
 * The ring with the leakage (issue 3, known gap (6) at light load; DEVELOPERS.md, "Light load:
 * the event model"). The node capacitance Cr sits on the switches' side of the leakage Llk (both
 * referred to the secondary), the winding (Lr, and through a conducting rectifier L to Vo + Vf)
 * on the other; j is the leakage current from the winding into the node, v the winding voltage,
 * vc the node's. Cr·dvc/dt = j, Llk·dj/dt = v − vc, Lr·diM/dt = −v, and with a rectifier of `side`
 * conducting L·dIL/dt = side·v − (Vo + Vf) and j = iM − side·IL. Then the winding is a source
 * side·Vw behind L‖Lr (Vw = the centre), so the node rings with L‖Lr + Llk about side·Vw and the
 * winding follows at v = side·Vw + s·(vc − side·Vw), s = L‖Lr/(L‖Lr + Llk): the no-leakage ring's
 * closed forms with the node's voltage and the longer inductance (`shared`). As the winding
 * reaches zero both rectifiers freewheel (`off`): v = 0, IL falls at (Vo + Vf')/L, iM holds, and
 * the node rings with Llk alone about zero, the rectifiers' difference carrying iM − j, until
 * |iM − j| meets IL (the rectifier of the side of iM − j conducts alone again: `shared`). The
 * body diodes clamp the node at ±Vd/n: `clamp` with a rectifier conducting (j falls linearly at
 * (side·Vw − vc)/(L‖Lr + Llk)), `offClamp` freewheeling (j at −vc/Llk), each until j returns to
 * zero (the diodes stop) or the rectifiers change. Idle (IL at zero), iM = j rings with
 * Lr + Llk and the winding is Lr/(Lr + Llk) of the node. No damping, as without leakage.
 * ref: the circuit's own equations (Kirchhoff's laws on the ideal elements above); a series LC
 * ring about its source voltage, common practice.
 */

/**
 * ∫ of a ring's current (z0·cos ωτ − y0·sin ωτ)/Z over [0, t] as the sampled waveforms take it,
 * A·s: the whole sample steps by the trapezoid factor (C·Δv of the ring's voltage from `startV`),
 * the last part step as a trapezoid up to `endA`, the current at t. The voltage is the ring's
 * (side·Vc + y0·cos ωτ + z0·sin ωτ): the winding's without leakage, the node's with it.
 */
function sampledRingIntegralAS(
  k: RingConstants,
  side: 1 | -1,
  y0: number,
  z0: number,
  startV: number,
  endA: number,
  t: number,
): number {
  const wholeS = wholeStepsS(k.omega, t);
  const wCos = Math.cos(k.omega * wholeS);
  const wSin = Math.sin(k.omega * wholeS);
  const wholeV = side * k.centreV + y0 * wCos + z0 * wSin;
  const wholeA = (z0 * wCos - y0 * wSin) / k.impedanceOhm;
  return (
    RING_TRAPEZOID_FACTOR * k.c.capacitanceF * (wholeV - startV) +
    ((wholeA + endA) / 2) * (t - wholeS)
  );
}

/** Returns the state `t` seconds into a stretch of the ring with leakage; see `ringAdvance`. */
function leakyAdvance(
  k: RingConstants,
  mode: RingMode,
  side: 1 | -1,
  s: RingState,
  t: number,
  withCharge: boolean,
): { state: RingState; chargeAS: number } {
  const state: RingState = {
    inductorA: NaN,
    magnetizingA: NaN,
    windingV: NaN,
    leakageA: NaN,
    nodeV: NaN,
  };
  const chargeAS = writeLeakyAdvance(k, mode, side, s, t, withCharge, state);
  return { state, chargeAS };
}

/**
 * {@link leakyAdvance} written into `out` (which may be `s` itself: every field is read before
 * any is written), returning ∫IL dt (0 where `withCharge` is false): the same numbers without a
 * new state a stretch, for the ring's own simulation, which runs some 1300 stretches a design.
 */
function writeLeakyAdvance(
  k: RingConstants,
  mode: RingMode,
  side: 1 | -1,
  s: RingState,
  t: number,
  withCharge: boolean,
  out: RingState,
): number {
  const { c } = k;
  const l = c.inductanceH;
  const lr = c.referredMagnetizingH;
  const lk = c.leakageH as number;
  const nodeV = s.nodeV ?? s.windingV;
  if (mode === 'shared' || mode === 'clamp') {
    const u0 = (l * side * s.inductorA + lr * s.magnetizingA) / (l + lr);
    const j0 = s.magnetizingA - side * s.inductorA;
    const u = u0 - side * k.slopeAPerS * t;
    if (mode === 'clamp') {
      const clampNodeV = side * c.clampV;
      const rate = (side * k.centreV - clampNodeV) / (k.parallelH + lk);
      const j = j0 + rate * t;
      out.inductorA = side * (u - k.share * j);
      out.magnetizingA = u + (1 - k.share) * j;
      out.windingV = side * k.centreV + k.windingShare * (clampNodeV - side * k.centreV);
      out.leakageA = j;
      out.nodeV = clampNodeV;
      return withCharge
        ? side *
            (u0 * t - (side * k.slopeAPerS * t * t) / 2 - k.share * (j0 * t + (rate * t * t) / 2))
        : 0;
    }
    const y0 = nodeV - side * k.centreV;
    const z0 = j0 * k.impedanceOhm;
    const cos = Math.cos(k.omega * t);
    const sin = Math.sin(k.omega * t);
    const y = y0 * cos + z0 * sin;
    const j = (z0 * cos - y0 * sin) / k.impedanceOhm;
    out.inductorA = side * (u - k.share * j);
    out.magnetizingA = u + (1 - k.share) * j;
    out.windingV = side * k.centreV + k.windingShare * y;
    out.leakageA = j;
    out.nodeV = side * k.centreV + y;
    if (!withCharge) return 0;
    // ∫j dt = Cr·Δvc, over the samples as without leakage.
    const jIntegral = sampledRingIntegralAS(k, side, y0, z0, nodeV, j, t);
    return side * (u0 * t - (side * k.slopeAPerS * t * t) / 2 - k.share * jIntegral);
  }
  const j0 = s.leakageA ?? 0;
  if (mode === 'off' || mode === 'offClamp') {
    const il = s.inductorA - (c.freewheelV * t) / l;
    const chargeAS = withCharge ? ((s.inductorA + il) / 2) * t : 0;
    const im = s.magnetizingA;
    if (mode === 'offClamp') {
      const clampNodeV = side * c.clampV;
      out.inductorA = il;
      out.magnetizingA = im;
      out.windingV = 0;
      out.leakageA = j0 - (clampNodeV * t) / lk;
      out.nodeV = clampNodeV;
      return chargeAS;
    }
    const z0 = j0 * k.offImpedanceOhm;
    const cos = Math.cos(k.offOmega * t);
    const sin = Math.sin(k.offOmega * t);
    out.inductorA = il;
    out.magnetizingA = im;
    out.windingV = 0;
    out.leakageA = (z0 * cos - nodeV * sin) / k.offImpedanceOhm;
    out.nodeV = nodeV * cos + z0 * sin;
    return chargeAS;
  }
  // Idle: iM = j rings with Lr + Llk; the winding is Lr/(Lr + Llk) of the node.
  const cos = Math.cos(k.idleOmega * t);
  const sin = Math.sin(k.idleOmega * t);
  const z0 = s.magnetizingA * k.idleImpedanceOhm;
  const im = (z0 * cos - nodeV * sin) / k.idleImpedanceOhm;
  const v = nodeV * cos + z0 * sin;
  out.inductorA = 0;
  out.magnetizingA = im;
  out.windingV = k.idleWindingShare * v;
  out.leakageA = im;
  out.nodeV = v;
  return 0;
}

/**
 * The first time in (0, limitS) at which g(t) = a + b·t + e·(z0·cos ωt − y0·sin ωt)/Z falls to
 * zero from above, else Infinity: g is monotone between the times its slope is zero
 * (b − e·ω·R·cos(ωt − α)/Z, R and α of (y0, z0)), so those are walked in order, from the first
 * time the linear part's fall alone could close the gap, and the first piece that ends below
 * zero is searched by Brent's method. Where g starts at zero (the rectifier just left: the
 * freewheel begins where |iM − j| = IL), a root counts only once g has been positive at one of
 * those times. The leakage ring's freewheel ends where |iM − j| meets IL. `polar`, where given,
 * must be hypotenuse(y0, z0) and atan2(z0, y0): the ring's freewheel has them already, and both
 * sides' searches share them.
 */
export function firstLinearSineRoot(
  a: number,
  b: number,
  e: number,
  y0: number,
  z0: number,
  omega: number,
  impedanceOhm: number,
  limitS: number,
  polar?: { radius: number; alpha: number },
): number {
  const g = linearSine(a, b, e, y0, z0, omega, impedanceOhm);
  const options = BRENT_OPTIONS;
  const radius = polar?.radius ?? hypotenuse(y0, z0);
  const amplitude = (Math.abs(e) * radius) / impedanceOhm;
  // g(0) as g computes it, with cos 0 = 1 and sin 0 = 0 written in (the same number to the bit,
  // without the two calls; some seven thousand a bridge design).
  const g0 = a + b * 0 + (e * (z0 * 1 - y0 * 0)) / impedanceOhm;
  let isArmed = g0 > 1e-12 * (Math.abs(a) + amplitude);
  let from = 0;
  // g at `from`, handed to Brent's method with g at the bracket's other end (the same values it
  // would compute: two evaluations fewer per root).
  let gFrom = g0;
  if (isArmed) {
    // g ≥ g(0) + b·t − 2·amplitude: no root before the linear part has fallen that far.
    if (b < 0) {
      const earliest = (g0 - 2 * amplitude) / -b;
      if (earliest > 0) from = earliest;
    } else if (g0 - 2 * amplitude > 0) {
      return Infinity;
    }
    if (!(from < limitS)) return Infinity;
    if (from > 0) gFrom = g(from);
    if (gFrom <= 0) return from;
  }
  const ratio = radius > 0 ? (b * impedanceOhm) / (e * omega * radius) : Infinity;
  if (!(Math.abs(ratio) < 1)) {
    // Monotone: one search over the rest.
    if (!isArmed) return b < 0 ? 0 : Infinity;
    const gLimit = g(limitS);
    if (!(gLimit <= 0)) return Infinity;
    options.absoluteTolerance = 1e-15 * Math.max(limitS, 1e-9);
    options.valueAtLo = gFrom;
    options.valueAtHi = gLimit;
    const r = brentRoot(g, from, limitS, options);
    return Number.isFinite(r) ? r : limitS;
  }
  // Critical phases: ωt − α = ±acos(ratio) (mod 2π).
  const alpha = polar?.alpha ?? Math.atan2(z0, y0);
  const spread = Math.acos(ratio);
  const turn = (2 * Math.PI) / omega;
  let t = from;
  let gT = gFrom;
  for (let count = 0; count < 4 * MAX_CONTINUED_SEGMENTS && t < limitS; count++) {
    // The two critical phases unrolled (no array per piece).
    let next = Infinity;
    const early = criticalAfter(alpha - spread, omega, t, turn);
    if (early < next) next = early;
    const late = criticalAfter(alpha + spread, omega, t, turn);
    if (late < next) next = late;
    next = Math.min(next, limitS);
    const gNext = g(next);
    if (isArmed && gNext <= 0) {
      options.absoluteTolerance = 1e-15 * Math.max(next, 1e-9);
      options.valueAtLo = gT;
      options.valueAtHi = gNext;
      const r = brentRoot(g, t, next, options);
      return Number.isFinite(r) ? r : next;
    }
    if (gNext > 0) isArmed = true;
    t = next;
    gT = gNext;
  }
  return Infinity;
}

/** The first time after `t` (by more than 1e-12 of a turn) at which ωτ ≡ `phase` (mod 2π), s. */
function criticalAfter(phase: number, omega: number, t: number, turn: number): number {
  const turns = Math.ceil((omega * t - phase) / (2 * Math.PI));
  const at = (phase + turns * 2 * Math.PI) / omega;
  return at <= t + 1e-12 * turn ? at + turn : at;
}

/** The constants a, b, e, y0, z0, ω and Z of {@link linearSineAt} (set by {@link linearSine}). */
const LINEAR_SINE = new Float64Array(7);

/** a + b·t + e·(z0·cos ωt − y0·sin ωt)/Z at t, with the constants of {@link LINEAR_SINE}. */
const linearSineAt = (t: number): number => {
  const p = LINEAR_SINE;
  return (
    (p[0] as number) +
    (p[1] as number) * t +
    ((p[2] as number) *
      ((p[4] as number) * Math.cos((p[5] as number) * t) -
        (p[3] as number) * Math.sin((p[5] as number) * t))) /
      (p[6] as number)
  );
};

/**
 * a + b·t + e·(z0·cos ωt − y0·sin ωt)/Z as a function of t: one module-level function reading
 * its constants from {@link LINEAR_SINE} (the searches do not nest), so a search makes no closure.
 */
function linearSine(
  a: number,
  b: number,
  e: number,
  y0: number,
  z0: number,
  omega: number,
  impedanceOhm: number,
): (t: number) => number {
  const p = LINEAR_SINE;
  p[0] = a;
  p[1] = b;
  p[2] = e;
  p[3] = y0;
  p[4] = z0;
  p[5] = omega;
  p[6] = impedanceOhm;
  return linearSineAt;
}

/** The freewheel's radius and angle, handed to both sides' root searches (one object). */
const OFF_POLAR = { radius: NaN, alpha: NaN };

/** The two rectifiers' sides, +1 then −1 (one array, not one a stretch). */
const BOTH_SIDES = [1, -1] as const;

/** A copy of a state of the ring with leakage (every field present). */
function copyLeakyState(s: RingState): RingState {
  return {
    inductorA: s.inductorA,
    magnetizingA: s.magnetizingA,
    windingV: s.windingV,
    leakageA: s.leakageA as number,
    nodeV: s.nodeV as number,
  };
}

/** The leakage ring's `simulateRing` (always continued: no damping, see above). */
function simulateLeakyRing(
  k: RingConstants,
  start: RingState,
  durationS: number,
  withSegments: boolean,
  startSide: 1 | -1,
): RingRun {
  const { c } = k;
  const lk = c.leakageH as number;
  const segments: RingSegment[] | undefined = withSegments ? [] : undefined;
  let mode: RingMode = start.inductorA > 0 ? 'shared' : 'idle';
  let side: 1 | -1 = startSide;
  const state: RingState = {
    inductorA: start.inductorA,
    magnetizingA: start.magnetizingA,
    windingV: start.windingV,
    leakageA:
      start.leakageA ??
      (start.inductorA > 0 ? start.magnetizingA - side * start.inductorA : start.magnetizingA),
    nodeV: start.nodeV ?? start.windingV,
  };
  let elapsed = 0;
  let charge = 0;
  let hasIdle = false;
  const tiny = 1e-12 * durationS;
  const fallAPerS = c.freewheelV / c.inductanceH;
  // The leakage's own ring (with the node capacitance, both rectifiers freewheeling) can run
  // through the whole off-time, a stretch of freewheel and a short one with a rectifier back in
  // conduction each turn, undamped: hundreds of turns where the leakage is small against the
  // half (a full bridge of 18–36 V at 99 kHz with the default leakage, some 300), which the
  // fixed allowance alone cut short, so the half was taken as not converging. Four stretches a
  // turn of that ring over the duration come on top.
  const maxSegments =
    MAX_CONTINUED_SEGMENTS + 4 * Math.ceil((durationS * k.offOmega) / (2 * Math.PI));
  for (let count = 0; count < maxSegments; count++) {
    const left = durationS - elapsed;
    let stop = left;
    let next: RingMode = mode;
    let nextSide: 1 | -1 = side;
    const nodeV = state.nodeV as number;
    const j = state.leakageA as number;
    if (mode === 'shared') {
      const y0 = nodeV - side * k.centreV;
      const z0 = (state.magnetizingA - side * state.inductorA) * k.impedanceOhm;
      const radius = hypotenuse(y0, z0);
      const alpha = Math.atan2(z0, y0);
      const clampAt = polarLevelTime(
        k.omega,
        radius,
        alpha,
        side * (c.clampV - k.centreV),
        side > 0,
        tiny,
      );
      // The winding at zero: side·Vw + s·y = 0.
      const offAt = polarLevelTime(
        k.omega,
        radius,
        alpha,
        (-side * k.centreV) / k.windingShare,
        side < 0,
        tiny,
      );
      if (clampAt < stop) {
        stop = clampAt;
        next = 'clamp';
      }
      if (offAt < stop) {
        stop = offAt;
        next = 'off';
      }
      const zeroAt = inductorZeroTime(
        k,
        side,
        state,
        y0,
        z0,
        stop,
        (side * (c.pathV - k.centreV)) / k.windingShare,
        radius,
        alpha,
      );
      if (zeroAt < stop) {
        stop = zeroAt;
        next = 'idle';
      }
    } else if (mode === 'clamp') {
      const rate = (side * k.centreV - side * c.clampV) / (k.parallelH + lk);
      const releaseAt = -j / rate;
      if (releaseAt < stop) {
        stop = Math.max(0, releaseAt);
        next = 'shared';
      }
      // IL = side·(u − share·j), linear.
      const ilRate = -k.slopeAPerS - side * k.share * rate;
      if (ilRate < 0) {
        const zeroAt = state.inductorA / -ilRate;
        if (zeroAt < stop) {
          stop = Math.max(0, zeroAt);
          next = 'idle';
        }
      }
    } else if (mode === 'off') {
      const offZ0 = j * k.offImpedanceOhm;
      const radius = hypotenuse(nodeV, offZ0);
      const alpha = Math.atan2(offZ0, nodeV);
      const polar = OFF_POLAR;
      polar.radius = radius;
      polar.alpha = alpha;
      const clampUpAt = polarLevelTime(k.offOmega, radius, alpha, c.clampV, true, tiny);
      const clampDownAt = polarLevelTime(k.offOmega, radius, alpha, -c.clampV, false, tiny);
      if (clampUpAt < stop) {
        stop = clampUpAt;
        next = 'offClamp';
        nextSide = 1;
      }
      if (clampDownAt < stop) {
        stop = clampDownAt;
        next = 'offClamp';
        nextSide = -1;
      }
      // The rectifier of side r alone once IL − r·(iM − j) reaches zero.
      for (const r of BOTH_SIDES) {
        const meetAt = firstLinearSineRoot(
          state.inductorA - r * state.magnetizingA,
          -fallAPerS,
          r,
          nodeV,
          offZ0,
          k.offOmega,
          k.offImpedanceOhm,
          stop,
          polar,
        );
        if (meetAt < stop) {
          stop = meetAt;
          next = 'shared';
          nextSide = r;
        }
      }
    } else if (mode === 'offClamp') {
      const jRate = (-side * c.clampV) / lk;
      const releaseAt = -j / jRate;
      if (releaseAt < stop) {
        stop = Math.max(0, releaseAt);
        next = 'off';
      }
      for (const r of BOTH_SIDES) {
        // IL − r·(iM − j), linear: the rectifier of side r alone at its zero (the node clamped).
        const gap = state.inductorA - r * (state.magnetizingA - j);
        const gapRate = -fallAPerS + r * jRate;
        if (gapRate < 0) {
          const meetAt = gap / -gapRate;
          if (meetAt < stop) {
            {
              stop = Math.max(0, meetAt);
              next = r === side ? 'clamp' : 'shared';
              nextSide = r;
            }
          }
        }
      }
    } else {
      const z0 = state.magnetizingA * k.idleImpedanceOhm;
      const level = c.pathV / k.idleWindingShare;
      const radius = hypotenuse(nodeV, z0);
      const alpha = Math.atan2(z0, nodeV);
      const upAt = polarLevelTime(k.idleOmega, radius, alpha, level, true, tiny);
      const downAt = polarLevelTime(k.idleOmega, radius, alpha, -level, false, tiny);
      if (upAt < stop) {
        stop = upAt;
        next = 'shared';
        nextSide = 1;
      }
      if (downAt < stop) {
        stop = downAt;
        next = 'shared';
        nextSide = -1;
      }
    }
    // The segments keep a copy of the start; the state itself is advanced in place (it is this
    // simulation's own object, made above).
    segments?.push({ mode, side, startS: elapsed, durationS: stop, start: copyLeakyState(state) });
    if (mode === 'idle' && stop > 0) hasIdle = true;
    charge += writeLeakyAdvance(k, mode, side, state, stop, true, state);
    elapsed += stop;
    if (next === 'idle') {
      state.inductorA = 0;
      state.leakageA = state.magnetizingA;
    } else if ((mode === 'clamp' || mode === 'offClamp') && (next === 'shared' || next === 'off')) {
      // The diodes stop with j at zero.
      state.leakageA = 0;
    }
    if (stop >= left) return { end: state, chargeAS: charge, segments, isComplete: true, hasIdle };
    mode = next;
    side = nextSide;
  }
  return { end: state, chargeAS: charge, segments, isComplete: false, hasIdle };
}
