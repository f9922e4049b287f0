import { brentRoot } from '../../root-finding/brent-root.js';
import { leakageSpikePrefix, type SpikePrefix } from './leakage-spike.js';

/** Scratch of the spike's prefix (read at once). */
const PREFIX: SpikePrefix = { prefixS: NaN, prefixV: NaN };

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
  /**
   * The leakage's spike ahead of the ring (stage A and the plateau, `leakage-spike.ts`), s: Lm
   * holds its turn-off current through it; 0 without leakage.
   */
  prefixS: number;
  /** The ring's amplitude after the prefix, √(I1² + (v/Z)²), A (I1 without leakage). */
  arcA: number;
  /** The ring's phase at the prefix's end, atan2(v, I1·Z), rad (0 without leakage). */
  arcPhase: number;
}

/**
 * What the ring needs of the leakage's spike ahead of it (`leakage-spike.ts`): the leakage (H),
 * the damping taken across it (Ω) and the reflected inductor peaks at turn-off Σ Ipk/n (A; the
 * terminal current at the swing's end is I1 plus them).
 */
export interface RingLeakage {
  leakageH: number;
  dampingOhm: number;
  reflectedPeakA: number;
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
  leakage?: RingLeakage,
): MagnetizingRing {
  if (hasPrefix(leakage, capacitanceF, rampA, clampV)) {
    return prefixedRing(rampA, inductanceH, capacitanceF, clampV, availableS, leakage);
  }
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
      prefixS: 0,
      arcA: Math.max(rampA, 0),
      arcPhase: 0,
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
      prefixS: 0,
      arcA: u.turnOffA,
      arcPhase: 0,
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
  /**
   * The ring's end; with leakage where the ring surely reaches the clamp before the turn-on, a
   * bound above it (the spike itself is left out there: {@link clampBeforeTurnOn}).
   */
  ringEndS: number;
  reachesClamp: boolean;
  /** The turn-on cuts the ring. */
  isCut: boolean;
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
  leakage?: RingLeakage,
): RingEnds {
  if (hasPrefix(leakage, capacitanceF, rampA, clampV)) {
    if (clampBeforeTurnOn(rampA, inductanceH, capacitanceF, clampV, availableS, leakage, out)) {
      return out;
    }
    const ring = prefixedRing(rampA, inductanceH, capacitanceF, clampV, availableS, leakage);
    out.startA = ring.startA;
    out.turnOffA = ring.turnOffA;
    out.ringEndS = ring.ringEndS;
    out.reachesClamp = ring.reachesClamp;
    out.isCut = !(ring.ringEndS < availableS);
    return out;
  }
  if (!(capacitanceF > 0) || !(rampA > 0) || !(clampV > 0)) {
    out.startA = 0;
    out.turnOffA = Math.max(rampA, 0);
    out.ringEndS = rampA > 0 && clampV > 0 ? (inductanceH * rampA) / clampV : 0;
    out.reachesClamp = true;
    out.isCut = false;
    return out;
  }
  const u = uncutRing(rampA, inductanceH, capacitanceF, clampV);
  if (!(u.ringEndS <= availableS)) {
    const ring = magnetizingRing(rampA, inductanceH, capacitanceF, clampV, availableS);
    out.startA = ring.startA;
    out.turnOffA = ring.turnOffA;
    out.ringEndS = ring.ringEndS;
    out.reachesClamp = ring.reachesClamp;
    out.isCut = true;
    return out;
  }
  out.startA = u.turnOffA - rampA;
  out.turnOffA = u.turnOffA;
  out.ringEndS = u.ringEndS;
  out.reachesClamp = u.reachesClamp;
  out.isCut = false;
  return out;
}

/**
 * {@link ringEnds} behind the spike without the spike, where it cannot matter, else false: where
 * the ring alone from I1 = ramp − Vr/Z reaches the clamp the one behind the spike does too (its
 * amplitude √(I1² + (v/Z)²) is no lower), so the start is −Vr/Z and I1 = ramp − Vr/Z as
 * {@link prefixedRing} has them (the same operations); and it ends before the turn-on if a bound
 * on its end does: stage A within a quarter of the leakage's damped ring (π/(2·ωd)), the plateau
 * within Llk·ΣIpk/n / Vr, the arc to the clamp and the return within π/ω, the clamp within
 * Lm·√(I1² + (Vr/Z)²)/Vr. The trial steps of the steady states need no more (the spike costs two
 * root searches; the final ring takes it whole).
 */
function clampBeforeTurnOn(
  rampA: number,
  inductanceH: number,
  capacitanceF: number,
  clampV: number,
  availableS: number,
  leakage: RingLeakage,
  out: RingEnds,
): boolean {
  const z = Math.sqrt(inductanceH / capacitanceF);
  const w = 1 / Math.sqrt(inductanceH * capacitanceF);
  const limitA = clampV / z;
  const turnOffA = rampA - limitA;
  if (!(turnOffA * z > clampV)) return false;
  const alpha = leakage.dampingOhm > 0 ? 1 / (2 * leakage.dampingOhm * capacitanceF) : 0;
  const w0Squared = 1 / (leakage.leakageH * capacitanceF);
  const wd = Math.sqrt(alpha * alpha < w0Squared ? w0Squared - alpha * alpha : w0Squared);
  const boundS =
    Math.PI / (2 * wd) +
    (leakage.leakageH * leakage.reflectedPeakA) / clampV +
    Math.PI / w +
    (inductanceH * Math.hypot(turnOffA, limitA)) / clampV;
  if (!(boundS <= availableS)) return false;
  out.startA = turnOffA - rampA;
  out.turnOffA = turnOffA;
  out.ringEndS = boundS;
  out.reachesClamp = true;
  out.isCut = false;
  return true;
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
  /** The leakage's spike ahead of the ring (Lm at I1 through it), s; 0 without. */
  prefixS: number;
  /** Amplitude (A) and phase (rad) of the ring at the prefix's end. */
  arcA: number;
  arcPhase: number;
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
      prefixS: 0,
      arcA: turnOffA,
      arcPhase: 0,
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
    prefixS: 0,
    arcA: turnOffA,
    arcPhase: 0,
  };
}

/** What {@link pathAt} reads of a path: all of it but its end. */
type RingPathShape = Omit<RingPath, 'endS'>;

/**
 * Magnetizing current (A) and reversed winding voltage (V) at `t` (s) after the swing's end
 * along the path; past its end the winding is held at zero and the current stays.
 */
export function pathAt(path: RingPathShape, t: number): { currentA: number; voltageV: number } {
  const { turnOffA, z, w, clampV } = path;
  if (path.prefixS > 0) return prefixedPathAt(path, t);
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
  return clampedAt(path, t);
}

/**
 * Along a path that reaches the clamp, from the clamp's start on: the clamp taking the current
 * down at Vr/Lm, then the node ringing back with −Vr/Z over a quarter period (held after it).
 */
function clampedAt(
  path: Pick<
    RingPath,
    'z' | 'w' | 'clampV' | 'inductanceH' | 'clampStartS' | 'clampStartA' | 'clampEndS'
  >,
  t: number,
): { currentA: number; voltageV: number } {
  const { z, w, clampV } = path;
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
      : path.prefixS > 0
        ? endS > path.prefixS
          ? path.arcA *
            z *
            Math.sin(Math.min(path.arcPhase + w * (endS - path.prefixS), Math.PI / 2))
          : 0
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
    prefixS: path.prefixS,
    arcA: path.arcA,
    arcPhase: path.arcPhase,
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

/** Whether the leakage's spike stands ahead of the ring (leakage, capacitance, load current). */
function hasPrefix(
  leakage: RingLeakage | undefined,
  capacitanceF: number,
  rampA: number,
  clampV: number,
): leakage is RingLeakage {
  return (
    leakage !== undefined &&
    leakage.leakageH > 0 &&
    leakage.reflectedPeakA > 0 &&
    capacitanceF > 0 &&
    rampA > 0 &&
    clampV > 0
  );
}

/**
 * The path from the swing's end at I1 with the leakage's spike ahead of it (DEVELOPERS.md, "The
 * forward family", "The leakage's spike"): through stage A (and the plateau, where the node
 * reaches the clamp) the rectifiers hold the winding at zero and Lm keeps I1; from stage A's
 * end, at v (the release's v1, or the clamp's Vr after the plateau), Lm rings on with C from
 * (v, I1): amplitude √(I1² + (v/Z)²) (A), phase atan2(v, I1·Z). At the clamp (v = Vr, or the
 * amplitude reaching Vr/Z) the clamp takes the current to zero at Vr/Lm and the node rings back
 * with −Vr/Z; short of it the winding is back at zero at phase π with −√(I1² + (v/Z)²).
 * ref: lossless LC (common practice) from the spike's end (leakage-spike.ts); ngspice
 * (test/solvers/netlist/forward-leakage-spike-netlist.test.ts).
 */
function prefixedPath(
  turnOffA: number,
  inductanceH: number,
  capacitanceF: number,
  z: number,
  w: number,
  clampV: number,
  leakage: RingLeakage,
): RingPath & { prefixV: number } {
  const i1 = Math.max(turnOffA, 0);
  const prefix = leakageSpikePrefix(
    leakage.leakageH,
    capacitanceF,
    leakage.dampingOhm,
    clampV,
    i1 + leakage.reflectedPeakA,
    i1,
    PREFIX,
  );
  return pathAfter(turnOffA, inductanceH, z, w, clampV, prefix.prefixS, prefix.prefixV);
}

/** {@link prefixedPath} for a given prefix: its length (s) and the node's voltage at its end (V). */
function pathAfter(
  turnOffA: number,
  inductanceH: number,
  z: number,
  w: number,
  clampV: number,
  prefixS: number,
  prefixV: number,
): RingPath & { prefixV: number } {
  const i1 = Math.max(turnOffA, 0);
  const arcA = Math.hypot(i1, prefixV / z);
  const arcPhase = Math.atan2(prefixV, i1 * z);
  const quarterS = Math.PI / (2 * w);
  const path: RingPath & { prefixV: number } = {
    turnOffA,
    z,
    w,
    clampV,
    inductanceH,
    reachesClamp: true,
    clampStartS: prefixS,
    clampStartA: i1,
    clampEndS: prefixS + (inductanceH * i1) / clampV,
    endS: 0,
    prefixS,
    arcA,
    arcPhase,
    prefixV,
  };
  if (prefixV >= clampV) {
    // The plateau: the node at the clamp from stage A's end, Lm still at I1.
    path.endS = path.clampEndS + quarterS;
    return path;
  }
  if (arcA * z > clampV) {
    const clampPhase = Math.asin(clampV / (arcA * z));
    const limitA = clampV / z;
    path.clampStartS = prefixS + Math.max(0, clampPhase - arcPhase) / w;
    path.clampStartA = Math.sqrt(Math.max(0, arcA * arcA - limitA * limitA));
    path.clampEndS = path.clampStartS + (inductanceH * path.clampStartA) / clampV;
    path.endS = path.clampEndS + quarterS;
    return path;
  }
  path.reachesClamp = false;
  path.clampStartS = prefixS + (Math.PI / 2 - arcPhase) / w;
  path.clampStartA = 0;
  path.clampEndS = path.clampStartS;
  path.endS = prefixS + (Math.PI - arcPhase) / w;
  return path;
}

/** {@link pathAt} along a path with the spike ahead of it: I1 (and 0 V: the spike's) until its end. */
function prefixedPathAt(path: RingPathShape, t: number): { currentA: number; voltageV: number } {
  const { z, w, arcA, arcPhase, prefixS } = path;
  if (t < prefixS) return { currentA: Math.max(path.turnOffA, 0), voltageV: 0 };
  if (!path.reachesClamp || t <= path.clampStartS) {
    const angle = Math.min(arcPhase + w * (t - prefixS), Math.PI);
    return { currentA: arcA * Math.cos(angle), voltageV: arcA * z * Math.sin(angle) };
  }
  return clampedAt(path, t);
}

/**
 * {@link magnetizingRing} with the leakage's spike ahead of the ring ({@link prefixedPath}).
 * Periodic, I1 = ramp + start: where the path reaches the clamp the start is −Vr/Z, so
 * I1 = ramp − Vr/Z, taken where the path from it does reach the clamp (the spike carries the
 * node there even where the ring alone stops short); else short of it the start is
 * −√(I1² + (v/Z)²), so I1 = (ramp² − (v/Z)²)/(2·ramp), v moving with I1 (the terminal current
 * I1 + Σ Ipk/n), iterated from ramp/2 (it contracts by about Llk/Lm · ΣIpk/n / ramp). Where the
 * turn-on cuts the path, I1 − ramp = i(I1, t) by Brent's method from the uncut I1 (where the
 * path's end current, its lowest, makes the gap ≤ 0) to the ramp; where even I1 = ramp leaves
 * a positive current at the turn-on the reset does not complete (start zero), as without the
 * spike. Where the spike alone returns more than the ramp (I1 would be negative: a huge node
 * capacitance against a small ramp) I1 is held at zero.
 */
function prefixedRing(
  rampA: number,
  inductanceH: number,
  capacitanceF: number,
  clampV: number,
  availableS: number,
  leakage: RingLeakage,
): MagnetizingRing {
  const z = Math.sqrt(inductanceH / capacitanceF);
  const w = 1 / Math.sqrt(inductanceH * capacitanceF);
  const limitA = clampV / z;
  const atClampA = rampA - limitA;
  let uncut: (RingPath & { prefixV: number }) | undefined;
  if (atClampA > 0) {
    const path = prefixedPath(atClampA, inductanceH, capacitanceF, z, w, clampV, leakage);
    if (path.reachesClamp) uncut = path;
  }
  if (uncut === undefined) {
    // I1 ← F(I1) = (ramp² − (v1/Z)²)/(2·ramp), a secant step on F(I1) − I1 once two passes
    // are known (the direct step where the secant has no slope or leaves [0, ramp/2]).
    let i1 = rampA / 2;
    let path = prefixedPath(i1, inductanceH, capacitanceF, z, w, clampV, leakage);
    let previous = NaN;
    let previousGap = NaN;
    for (let pass = 0; pass < 60; pass++) {
      const vz = path.prefixV / z;
      const direct = Math.max(0, (rampA * rampA - vz * vz) / (2 * rampA));
      const gap = direct - i1;
      const secant = i1 - (gap * (i1 - previous)) / (gap - previousGap);
      const next = secant >= 0 && secant <= rampA / 2 ? secant : direct;
      const isSettled = Math.abs(gap) <= 1e-15 * rampA;
      previous = i1;
      previousGap = gap;
      if (isSettled) break;
      i1 = next;
      path = prefixedPath(i1, inductanceH, capacitanceF, z, w, clampV, leakage);
    }
    uncut = path;
  }
  const cutS = Math.max(availableS, 0);
  if (uncut.endS <= cutS) return ringResult(uncut, rampA, uncut.endS);
  // The cut: the spike's prefix held while Brent's method solves the gap on the path after it
  // (the spike costs two root searches, the path none), then taken again at the new I1, until
  // I1 settles (it moves the prefix little: a few passes).
  const lo = uncut.turnOffA;
  let i1 = lo;
  let prefixS = uncut.prefixS;
  let prefixV = uncut.prefixV;
  for (let pass = 0; pass < 30; pass++) {
    const heldS = prefixS;
    const heldV = prefixV;
    // Anonymous arrow (esbuild's keepNames names a named closure with a call, every pass).
    let next =
      cutGapAfter(rampA, rampA, inductanceH, z, w, clampV, heldS, heldV, cutS) <= 0
        ? rampA
        : brentRoot(
            (x) => cutGapAfter(x, rampA, inductanceH, z, w, clampV, heldS, heldV, cutS),
            lo,
            rampA,
            { absoluteTolerance: 1e-15 * rampA },
          );
    if (!Number.isFinite(next)) next = lo;
    const isSettled = Math.abs(next - i1) <= 1e-15 * rampA && pass > 0;
    i1 = next;
    const path = prefixedPath(i1, inductanceH, capacitanceF, z, w, clampV, leakage);
    if (isSettled || (path.prefixS === prefixS && path.prefixV === prefixV)) {
      return ringResult(path, rampA, cutS);
    }
    prefixS = path.prefixS;
    prefixV = path.prefixV;
  }
  return ringResult(
    prefixedPath(i1, inductanceH, capacitanceF, z, w, clampV, leakage),
    rampA,
    cutS,
  );
}

/** I1 − ramp − i(I1, t) on the path after a held prefix (s, V): the cut's periodic gap. */
function cutGapAfter(
  turnOffA: number,
  rampA: number,
  inductanceH: number,
  z: number,
  w: number,
  clampV: number,
  prefixS: number,
  prefixV: number,
  cutS: number,
): number {
  const path = pathAfter(turnOffA, inductanceH, z, w, clampV, prefixS, prefixV);
  return turnOffA - rampA - prefixedPathAt(path, cutS).currentA;
}
