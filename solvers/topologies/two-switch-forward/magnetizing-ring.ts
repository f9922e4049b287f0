import { brentRoot } from '../../root-finding/brent-root.js';

/**
 * What the magnetizing inductance does after a forward's turn-off swing (the winding at zero),
 * as a lossless LC with the clamp as a boundary (DEVELOPERS.md, "The forward family").
 * Times are from the swing's end, s; winding voltages are the magnitude of the reversed winding, V.
 */
export interface MagnetizingRing {
  /** Magnetizing current at the next turn-on, A: −I1 short of the clamp, −Vr/Z past it (lossless). */
  startA: number;
  /** Magnetizing current at the swing's end (its peak), A: the start plus the on-ramp. */
  turnOffA: number;
  /** Largest reversed winding voltage, V: I1·Z short of the clamp, else the clamp's Vr. */
  peakWindingV: number;
  /** Reversed winding voltage at the next turn-on, V (0 once the ring is over). */
  turnOnWindingV: number;
  /** The winding reaches the clamp (or, short of it, its peak). */
  clampStartS: number;
  /** The clamp lets go (the magnetizing current at zero); equal to clampStartS short of it. */
  clampEndS: number;
  /** The winding is back at zero (the forward rectifier takes the node), or the turn-on. */
  ringEndS: number;
  /** Magnetizing current at the clamp's start, A (0 short of it). */
  clampStartA: number;
  reachesClamp: boolean;
  /** From the swing's end until the magnetizing current is zero, uncut by the turn-on, s. */
  zeroCurrentS: number;
  /** √(Lm/C), Ω, and 1/√(Lm·C), rad/s; Infinity without capacitance. */
  z: number;
  w: number;
  /** The clamp, V. */
  clampV: number;
  inductanceH: number;
}

/**
 * Returns the magnetizing ring of a forward for an on-ramp of `rampA` (A, Vp·D'·T/Lm): from the
 * swing's end, Lm (H) rings with the capacitance the winding sees (F): i = I1·cos ωt,
 * v = I1·Z·sin ωt (Z = √(Lm/C), ω = 1/√(Lm·C)). If I1·Z ≤ Vr the winding peaks at I1·Z short of
 * the clamp and swings back to zero after π/ω with i = −I1; there the forward rectifier takes
 * the node and holds the winding at zero, so −I1 circulates through the secondary until the
 * next turn-on. Otherwise it reaches the clamp at asin(Vr/(I1·Z))/ω with √(I1² − (Vr/Z)²), the
 * clamp brings that to zero at Vr/Lm, and the ring from Vr at zero current returns the winding to
 * zero a quarter period later with −Vr/Z. Periodic: I1 = start + ramp, so I1 = ramp/2 short of
 * the clamp (ramp ≤ 2·Vr/Z) and ramp − Vr/Z past it; the two meet at ramp = 2·Vr/Z. When the
 * path does not end inside `availableS` (the time from the swing's end to the next turn-on),
 * the turn-on cuts it: I1 − ramp = i(I1, availableS) is solved by Brent's method (its left
 * side less the right grows with I1: each phase's i changes by at most I1's change times
 * cos ωt or i/I1). Without capacitance: the clamp at once, no ring (the earlier model).
 * ref: lossless LC (common practice, a textbook fact: ½·Lm·i² + ½·C·v² is constant).
 */
export function magnetizingRing(
  rampA: number,
  inductanceH: number,
  capacitanceF: number,
  clampV: number,
  availableS: number,
): MagnetizingRing {
  if (!(capacitanceF > 0) || !(rampA > 0) || !(clampV > 0)) {
    const endS = rampA > 0 && clampV > 0 ? (inductanceH * rampA) / clampV : 0;
    return {
      startA: 0,
      turnOffA: Math.max(rampA, 0),
      peakWindingV: clampV,
      turnOnWindingV: 0,
      clampStartS: 0,
      clampEndS: endS,
      ringEndS: endS,
      clampStartA: Math.max(rampA, 0),
      reachesClamp: true,
      zeroCurrentS: endS,
      z: Infinity,
      w: Infinity,
      clampV,
      inductanceH,
    };
  }
  // The uncut path first, returned whole where it ends in time (this runs inside every
  // steady-state solve).
  const u = uncutRing(rampA, inductanceH, capacitanceF, clampV);
  const { z, w } = u;
  if (u.ringEndS <= availableS) {
    // One literal, not a spread of a shared base (a spread cost microseconds a call). Short of
    // the clamp the current is zero at the peak (clampEnd = clampStart = a quarter period).
    return {
      startA: u.turnOffA - rampA,
      turnOffA: u.turnOffA,
      turnOnWindingV: 0,
      z,
      w,
      clampV,
      inductanceH,
      peakWindingV: u.reachesClamp ? clampV : u.turnOffA * z,
      clampStartS: u.clampStartS,
      clampEndS: u.clampEndS,
      ringEndS: u.ringEndS,
      clampStartA: u.clampStartA,
      reachesClamp: u.reachesClamp,
      zeroCurrentS: u.clampEndS,
    };
  }
  // The turn-on cuts the ring: solve g(I1) = I1 − ramp − i(I1, t) = 0 over ramp/2 ≤ I1 ≤ ramp
  // (g ≤ 0 at ramp/2, where |i| ≤ I1). If g(ramp) < 0 the magnetizing current is still positive
  // at the turn-on even when it started at zero: the reset does not complete, and the earlier
  // picture (start at zero) is kept, which the same condition at g = 0 joins continuously.
  const cutS = Math.max(availableS, 0);
  // Anonymous arrow: under tsx (the service's runtime) esbuild's keepNames names each named
  // closure with a call, on every ring.
  const i1 =
    cutGap(rampA, rampA, inductanceH, z, w, clampV, cutS) <= 0
      ? rampA
      : brentRoot((x) => cutGap(x, rampA, inductanceH, z, w, clampV, cutS), rampA / 2, rampA, {
          absoluteTolerance: 1e-15 * rampA,
        });
  const cut = ringPath(i1, inductanceH, z, w, clampV);
  return ringResult(cut, rampA, Math.max(availableS, 0));
}

/** The uncut ring's numbers (module scratch: `uncutRing` fills it, its callers read it at once). */
const UNCUT = {
  z: 0,
  w: 0,
  turnOffA: 0,
  quarterS: 0,
  reachesClamp: false,
  clampStartS: 0,
  clampStartA: 0,
  clampEndS: 0,
  ringEndS: 0,
};

/**
 * The ring of {@link magnetizingRing} as if the turn-on did not cut it (capacitance, ramp and
 * clamp positive): the periodic turn-off current and the clamp's times, written into `UNCUT`.
 * One place for the operations both {@link magnetizingRing} and {@link ringEnds} take, so their
 * numbers agree to the bit.
 */
function uncutRing(
  rampA: number,
  inductanceH: number,
  capacitanceF: number,
  clampV: number,
): typeof UNCUT {
  const u = UNCUT;
  const z = Math.sqrt(inductanceH / capacitanceF);
  const w = 1 / Math.sqrt(inductanceH * capacitanceF);
  const limitA = clampV / z;
  const turnOffA = rampA <= 2 * limitA ? rampA / 2 : rampA - limitA;
  const quarterS = Math.PI / (2 * w);
  u.z = z;
  u.w = w;
  u.turnOffA = turnOffA;
  u.quarterS = quarterS;
  if (turnOffA * z <= clampV) {
    u.reachesClamp = false;
    u.clampStartS = quarterS;
    u.clampStartA = 0;
    u.clampEndS = quarterS;
    u.ringEndS = 2 * quarterS;
  } else {
    const clampStartS = Math.asin(limitA / turnOffA) / w;
    const clampStartA = Math.sqrt(Math.max(0, turnOffA * turnOffA - limitA * limitA));
    const clampEndS = clampStartS + (inductanceH * clampStartA) / clampV;
    u.reachesClamp = true;
    u.clampStartS = clampStartS;
    u.clampStartA = clampStartA;
    u.clampEndS = clampEndS;
    u.ringEndS = clampEndS + quarterS;
  }
  return u;
}

/** What {@link ringEnds} writes: three numbers of a {@link MagnetizingRing}. */
export interface RingEnds {
  startA: number;
  turnOffA: number;
  ringEndS: number;
}

/**
 * `startA`, `turnOffA` and `ringEndS` of `magnetizingRing(rampA, inductanceH, capacitanceF,
 * clampV, availableS)`, written into `out` with the very operations {@link magnetizingRing}
 * does, so the same numbers to the bit, without the ring object: the forward's steady states
 * read only these on their trial steps (the ring summaries were the largest garbage of a
 * two-switch forward core search; the uncut ring from `uncutRing`, as magnetizingRing's). Where
 * the turn-on cuts the ring (or its times are not numbers), magnetizingRing's own are copied.
 */
export function ringEnds(
  rampA: number,
  inductanceH: number,
  capacitanceF: number,
  clampV: number,
  availableS: number,
  out: RingEnds,
): RingEnds {
  if (!(capacitanceF > 0) || !(rampA > 0) || !(clampV > 0)) {
    out.startA = 0;
    out.turnOffA = Math.max(rampA, 0);
    out.ringEndS = rampA > 0 && clampV > 0 ? (inductanceH * rampA) / clampV : 0;
    return out;
  }
  const u = uncutRing(rampA, inductanceH, capacitanceF, clampV);
  if (!(u.ringEndS <= availableS)) {
    const ring = magnetizingRing(rampA, inductanceH, capacitanceF, clampV, availableS);
    out.startA = ring.startA;
    out.turnOffA = ring.turnOffA;
    out.ringEndS = ring.ringEndS;
    return out;
  }
  out.startA = u.turnOffA - rampA;
  out.turnOffA = u.turnOffA;
  out.ringEndS = u.ringEndS;
  return out;
}

/** I1 − ramp − i(I1, t): the periodic condition's gap where the turn-on cuts the path at t. */
function cutGap(
  turnOffA: number,
  rampA: number,
  inductanceH: number,
  z: number,
  w: number,
  clampV: number,
  cutS: number,
): number {
  return turnOffA - rampA - pathAt(ringPath(turnOffA, inductanceH, z, w, clampV), cutS).currentA;
}

/** The lossless path from the swing's end at I1: its phases' times and values. */
interface RingPath {
  turnOffA: number;
  z: number;
  w: number;
  clampV: number;
  inductanceH: number;
  reachesClamp: boolean;
  /** End of the first arc (the clamp, or the peak short of it), s. */
  clampStartS: number;
  clampStartA: number;
  clampEndS: number;
  /** The winding back at zero, s. */
  endS: number;
}

function ringPath(
  turnOffA: number,
  inductanceH: number,
  z: number,
  w: number,
  clampV: number,
): RingPath {
  const reachesClamp = turnOffA * z > clampV;
  if (!reachesClamp) {
    const quarterS = Math.PI / (2 * w);
    return {
      turnOffA,
      z,
      w,
      clampV,
      inductanceH,
      reachesClamp,
      clampStartS: quarterS,
      clampStartA: 0,
      clampEndS: quarterS,
      endS: 2 * quarterS,
    };
  }
  const limitA = clampV / z;
  const clampStartS = Math.asin(limitA / turnOffA) / w;
  const clampStartA = Math.sqrt(Math.max(0, turnOffA * turnOffA - limitA * limitA));
  const clampEndS = clampStartS + (inductanceH * clampStartA) / clampV;
  return {
    turnOffA,
    z,
    w,
    clampV,
    inductanceH,
    reachesClamp,
    clampStartS,
    clampStartA,
    clampEndS,
    endS: clampEndS + Math.PI / (2 * w),
  };
}

/**
 * Magnetizing current (A) and reversed winding voltage (V) at `t` (s) after the swing's end
 * along the path; past its end the winding is held at zero and the current stays.
 */
export function pathAt(
  path: Pick<
    RingPath,
    | 'turnOffA'
    | 'z'
    | 'w'
    | 'clampV'
    | 'inductanceH'
    | 'reachesClamp'
    | 'clampStartS'
    | 'clampStartA'
    | 'clampEndS'
  >,
  t: number,
): { currentA: number; voltageV: number } {
  const { turnOffA, z, w, clampV } = path;
  if (!Number.isFinite(z)) {
    // No capacitance: the clamp at once, then zero current.
    return t < path.clampEndS
      ? { currentA: turnOffA - (clampV * t) / path.inductanceH, voltageV: clampV }
      : { currentA: 0, voltageV: 0 };
  }
  if (!path.reachesClamp) {
    const angle = Math.min(w * Math.max(t, 0), Math.PI);
    return { currentA: turnOffA * Math.cos(angle), voltageV: turnOffA * z * Math.sin(angle) };
  }
  if (t <= path.clampStartS) {
    const angle = w * Math.max(t, 0);
    return { currentA: turnOffA * Math.cos(angle), voltageV: turnOffA * z * Math.sin(angle) };
  }
  if (t <= path.clampEndS) {
    return {
      currentA: path.clampStartA - (clampV * (t - path.clampStartS)) / path.inductanceH,
      voltageV: clampV,
    };
  }
  const angle = Math.min(w * (t - path.clampEndS), Math.PI / 2);
  return { currentA: -(clampV / z) * Math.sin(angle), voltageV: clampV * Math.cos(angle) };
}

/**
 * The ring's summary for a path cut at `endS` (s). Its start is I1 − ramp: the path's current
 * at the cut wherever the periodic condition holds, and zero where the reset does not complete.
 */
function ringResult(path: RingPath, rampA: number, endS: number): MagnetizingRing {
  const { turnOffA, z, w, clampV } = path;
  const atEnd = pathAt(path, endS);
  // Cut before its peak (a turn-on inside the first quarter), the winding peaks at the cut.
  const peakWindingV =
    path.reachesClamp && endS >= path.clampStartS
      ? clampV
      : turnOffA * z * Math.sin(Math.min(w * endS, Math.PI / 2));
  return {
    startA: turnOffA - rampA,
    turnOffA,
    peakWindingV,
    turnOnWindingV: endS >= path.endS ? 0 : atEnd.voltageV,
    clampStartS: Math.min(path.clampStartS, endS),
    clampEndS: Math.min(path.clampEndS, endS),
    ringEndS: Math.min(path.endS, endS),
    clampStartA: path.clampStartA,
    reachesClamp: path.reachesClamp,
    zeroCurrentS: path.clampEndS,
    z,
    w,
    clampV,
    inductanceH: path.inductanceH,
  };
}

/**
 * Returns the ring drawn from a given peak `turnOffA` (A, the magnetizing current at the swing's
 * end) with the next on-time starting from `startA` (A) rather than from the lossless ring's
 * own end: the light-load event period's (`light-load-period.ts`), where the drain after the
 * ring's return moves the magnetizing current before the turn-on.
 */
export function magnetizingRingFrom(
  turnOffA: number,
  startA: number,
  inductanceH: number,
  capacitanceF: number,
  clampV: number,
  availableS: number,
): MagnetizingRing {
  const z = Math.sqrt(inductanceH / capacitanceF);
  const w = 1 / Math.sqrt(inductanceH * capacitanceF);
  const path = ringPath(Math.max(turnOffA, 0), inductanceH, z, w, clampV);
  return ringResult(path, path.turnOffA - startA, Math.max(availableS, 0));
}
