/**
 * The damping taken across a forward's leakage, in units of √(Llk/Coss) (Coss one switch's
 * capacitance): an assumption about the transformer (a real winding's own losses damp its
 * leakage ring), taken by the engine's spike and the exported circuit alike
 * (`two-switch-forward-netlist.ts`, which has had 3·√(Llk/Coss) across its leakage from the
 * start). A leakage ring's Q of about 3 (2.1 for the two-switch forward, whose node sees the two
 * switches in series).
 */
export const FORWARD_LEAKAGE_DAMPING_RATIO = 3;

/**
 * The leakage's spike on a forward's switch node after the turn-off swing (DEVELOPERS.md, "The
 * forward family", "The leakage's spike"). Times are from the swing's end, s; voltages are the
 * reversed primary terminals' (the node above its idle level, as the magnetizing ring's v), V.
 */
export interface ForwardLeakageSpike {
  /** Largest reversed terminal voltage, V: the clamp's Vr, or the node's peak short of it. */
  topV: number;
  reachesClamp: boolean;
  /** From the swing's end to the top, s. */
  riseS: number;
  /** At the clamp while the leakage's current decays to the magnetizing current, s (0 if not). */
  holdS: number;
  /** The drawn return onto the magnetizing ring's curve: a quarter of the leakage's ring, s. */
  fallS: number;
  /** The current the clamp takes as the node meets it, A (0 short of it or where Lm's arc does). */
  clampEntryA: number;
  /** The terminal current at the swing's end (Im,pk + ΣIpk/n) and the magnetizing current, A. */
  turnOffA: number;
  magnetizingA: number;
  /** Stage A's ring: node capacitance (F), leakage (H), damping across it (Ω), α and ωd (1/s). */
  capacitanceF: number;
  leakageH: number;
  dampingOhm: number;
  alpha: number;
  wd: number;
  /** Stage A's end where the forward rectifier lets go first (Infinity where the clamp comes first), s. */
  releaseS: number;
  /**
   * Where stage A ends, the node's reversed voltage, V: at the release, or the clamp's Vr at the
   * plateau's end. The magnetizing ring goes on from it with Lm at its turn-off current
   * (magnetizing-ring.ts, the spike as the ring's prefix).
   */
  releaseV: number;
  /** From the swing's end to stage A's end (the release, or the plateau's end), s. */
  prefixS: number;
  /** After the release: Lm + Llk with C, amplitude (V), phase at the release, √(L/C), 1/√(L·C). */
  arcV: number;
  arcPhase: number;
  arcZ: number;
  arcW: number;
  clampV: number;
}

/**
 * Returns the leakage's spike after a forward's turn-off swing, or undefined without leakage,
 * capacitance or reflected load current at turn-off. At the swing's end the winding is at zero,
 * held there by both rectifiers (the forward one still carries the reflected load), so Lm keeps
 * its current I1 and the leakage, with `dampingOhm` R across it, rings with the node capacitance
 * C from the terminal current I (stage A): C·dv/dt = iL − v/R, Llk·diL/dt = −v, so
 * v = I/(C·ωd)·e^(−αt)·sin ωd·t, α = 1/(2·R·C), ωd = √(1/(Llk·C) − α²) (R = Infinity: lossless,
 * v = I·√(Llk/C)·sin ωt). Either v reaches the clamp Vr first and the node sits at Vr while the
 * current into it decays into the clamp at Vr/Llk down to I1 (the plateau), or the current into
 * the node falls to I1 first, at v1, the forward rectifier lets go and Lm + Llk ring on with C
 * from (v1, I1), lossless: peak A = √(v1² + (I1·Z)²), at the clamp where A ≥ Vr. The drawn fall
 * is a quarter of the leakage's ring back onto the magnetizing ring's curve (`fallS`).
 * ref: the series RLC's underdamped step response and the energy balance ½·Llk·I² = ½·C·V² of a
 * leakage into a node and its clamp (common practice; Pressman, Billings, Morey, 3rd ed. (from
 * memory), the forward converter's leakage spike at turn-off); Mohan, Undeland, Robbins, 3rd ed.
 * (from memory), §5-3 (a current commutated through a series inductance at a fixed voltage
 * falls linearly, at V/L); ngspice (test/solvers/netlist/forward-leakage-spike-netlist.test.ts).
 */
export function forwardLeakageSpike(
  leakageH: number,
  magnetizingH: number,
  capacitanceF: number,
  dampingOhm: number,
  clampV: number,
  turnOffA: number,
  magnetizingA: number,
): ForwardLeakageSpike | undefined {
  if (!(leakageH > 0) || !(capacitanceF > 0) || !(clampV > 0)) return undefined;
  const i1 = Math.max(magnetizingA, 0);
  if (!(turnOffA > i1)) return undefined;
  const ohm = dampingOhm > 0 ? dampingOhm : Infinity;
  const alpha = 1 / (2 * ohm * capacitanceF);
  const w0Squared = 1 / (leakageH * capacitanceF);
  // Overdamped (R below ½·√(Llk/C)) is not met with the ratio of 3; taken as undamped there.
  const isUnderdamped = alpha * alpha < w0Squared;
  const a = isUnderdamped ? alpha : 0;
  const wd = Math.sqrt(w0Squared - a * a);
  const seriesH = magnetizingH + leakageH;
  const spike: ForwardLeakageSpike = {
    topV: 0,
    reachesClamp: false,
    riseS: 0,
    holdS: 0,
    fallS: Math.PI / (2 * Math.sqrt(w0Squared)),
    clampEntryA: 0,
    turnOffA,
    magnetizingA: i1,
    capacitanceF,
    leakageH,
    dampingOhm: isUnderdamped ? ohm : Infinity,
    alpha: a,
    wd,
    releaseS: Infinity,
    releaseV: 0,
    prefixS: 0,
    arcV: 0,
    arcPhase: 0,
    arcZ: Math.sqrt(seriesH / capacitanceF),
    arcW: 1 / Math.sqrt(seriesH * capacitanceF),
    clampV,
  };
  // The node's current falls from I to zero over [0, its peak] while its voltage rises. The
  // plateau first (one root search): the node reaches the clamp with its current still at I1 or
  // above; else the release where the current meets I1 (the voltage there below the clamp).
  const peakS = Math.atan2(wd, a) / wd;
  if (stageAVoltage(spike, peakS) >= clampV) {
    const riseS = stageARoot(spike, true, clampV, peakS);
    const entryA = stageACurrent(spike, riseS);
    if (entryA >= i1) {
      // The plateau: the node at the clamp while the current into it decays at Vr/Llk to I1.
      spike.topV = clampV;
      spike.reachesClamp = true;
      spike.riseS = riseS;
      spike.holdS = (leakageH * (entryA - i1)) / clampV;
      spike.clampEntryA = entryA;
      spike.arcV = clampV;
      spike.arcPhase = Math.PI / 2;
      spike.releaseV = clampV;
      spike.prefixS = riseS + spike.holdS;
      return spike;
    }
  }
  const releaseS = i1 > 0 ? stageARoot(spike, false, i1, peakS) : peakS;
  const releaseV = stageAVoltage(spike, releaseS);
  const arcV = Math.hypot(releaseV, i1 * spike.arcZ);
  const arcPhase = Math.atan2(releaseV, i1 * spike.arcZ);
  const reachesClamp = arcV >= clampV;
  const topPhase = reachesClamp ? Math.asin(clampV / arcV) : Math.PI / 2;
  spike.topV = reachesClamp ? clampV : arcV;
  spike.reachesClamp = reachesClamp;
  spike.riseS = releaseS + (topPhase - arcPhase) / spike.arcW;
  spike.releaseS = releaseS;
  spike.releaseV = releaseV;
  spike.prefixS = releaseS;
  spike.arcV = arcV;
  spike.arcPhase = arcPhase;
  return spike;
}

/** Stage A's end (`leakageSpikePrefix`): from the swing's end (s), and the node's voltage there (V). */
export interface SpikePrefix {
  prefixS: number;
  prefixV: number;
}

/** Scratch of {@link leakageSpikePrefix}'s stage A (read within the call). */
const STAGE = { turnOffA: NaN, capacitanceF: NaN, alpha: NaN, wd: NaN };

/**
 * {@link forwardLeakageSpike}'s `prefixS` and `releaseV` (0 and 0 where it is undefined), the
 * same operations, written into `out` without the spike object: the magnetizing ring's periodic
 * condition takes them on every trial step of the steady state (magnetizing-ring.ts).
 */
export function leakageSpikePrefix(
  leakageH: number,
  capacitanceF: number,
  dampingOhm: number,
  clampV: number,
  turnOffA: number,
  magnetizingA: number,
  out: SpikePrefix,
): SpikePrefix {
  out.prefixS = 0;
  out.prefixV = 0;
  if (!(leakageH > 0) || !(capacitanceF > 0) || !(clampV > 0)) return out;
  const i1 = Math.max(magnetizingA, 0);
  if (!(turnOffA > i1)) return out;
  const ohm = dampingOhm > 0 ? dampingOhm : Infinity;
  const alpha = 1 / (2 * ohm * capacitanceF);
  const w0Squared = 1 / (leakageH * capacitanceF);
  const a = alpha * alpha < w0Squared ? alpha : 0;
  const stage = STAGE;
  stage.turnOffA = turnOffA;
  stage.capacitanceF = capacitanceF;
  stage.alpha = a;
  stage.wd = Math.sqrt(w0Squared - a * a);
  const peakS = Math.atan2(stage.wd, a) / stage.wd;
  if (stageAVoltage(stage, peakS) >= clampV) {
    const riseS = stageARoot(stage, true, clampV, peakS);
    const entryA = stageACurrent(stage, riseS);
    if (entryA >= i1) {
      out.prefixS = riseS + (leakageH * (entryA - i1)) / clampV;
      out.prefixV = clampV;
      return out;
    }
  }
  const releaseS = i1 > 0 ? stageARoot(stage, false, i1, peakS) : peakS;
  out.prefixS = releaseS;
  out.prefixV = stageAVoltage(stage, releaseS);
  return out;
}

/**
 * Where stage A's voltage rises to `target` (V), or its current into the node falls to `target`
 * (A), over [0, `hiS`] (s; the node's current at zero there, the voltage at its peak): both are
 * monotone there, so Newton's method on the analytic derivative (C·dv/dt = i; di/dt =
 * I·e^(−αt)·((α²/ωd − ωd)·sin ωd·t − 2α·cos ωd·t)) inside a bracket that each step narrows,
 * bisecting where a step would leave it, to 1e-15 of the interval (tight: the steady state's
 * ring iterates on these, magnetizing-ring.ts; and no closure or object, it runs in its solves).
 * ref: Press et al., Numerical Recipes, §9.4 (from memory; Newton's method with bisection).
 */
function stageARoot(
  spike: Pick<ForwardLeakageSpike, 'turnOffA' | 'capacitanceF' | 'alpha' | 'wd'>,
  isVoltage: boolean,
  target: number,
  hiS: number,
): number {
  const { turnOffA, capacitanceF, alpha, wd } = spike;
  let lo = 0;
  let hi = hiS;
  let t = 0;
  for (let step = 0; step < 200; step++) {
    const decay = turnOffA * Math.exp(-alpha * t);
    const sin = Math.sin(wd * t);
    const cos = Math.cos(wd * t);
    const currentA = decay * (cos - (alpha / wd) * sin);
    const gap = isVoltage ? (decay / (capacitanceF * wd)) * sin - target : currentA - target;
    const slope = isVoltage
      ? currentA / capacitanceF
      : decay * ((alpha * alpha) / wd - wd) * sin - 2 * alpha * decay * cos;
    if (gap === 0) return t;
    // The voltage rises and the current falls: below the voltage or above the current, the root
    // lies later.
    if (isVoltage ? gap < 0 : gap > 0) lo = t;
    else hi = t;
    let next = t - gap / slope;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    if (Math.abs(next - t) <= 1e-15 * hiS) return next;
    t = next;
  }
  return t;
}

/** {@link stageA}'s voltage alone (V; no object: it runs inside root searches). */
function stageAVoltage(
  spike: Pick<ForwardLeakageSpike, 'turnOffA' | 'capacitanceF' | 'alpha' | 'wd'>,
  t: number,
): number {
  const { turnOffA, capacitanceF, alpha, wd } = spike;
  return ((turnOffA * Math.exp(-alpha * t)) / (capacitanceF * wd)) * Math.sin(wd * t);
}

/** {@link stageA}'s current into the node alone (A). */
function stageACurrent(
  spike: Pick<ForwardLeakageSpike, 'turnOffA' | 'alpha' | 'wd'>,
  t: number,
): number {
  const { turnOffA, alpha, wd } = spike;
  return turnOffA * Math.exp(-alpha * t) * (Math.cos(wd * t) - (alpha / wd) * Math.sin(wd * t));
}

/**
 * Stage A at `t` (s): the node's reversed voltage (V), the current into the node (A) and the
 * leakage's own current (A, the node's plus v/R through the damping).
 */
export function stageA(
  spike: Pick<ForwardLeakageSpike, 'turnOffA' | 'capacitanceF' | 'dampingOhm' | 'alpha' | 'wd'>,
  t: number,
): { voltageV: number; currentA: number; leakageA: number } {
  const { turnOffA, capacitanceF, alpha, wd } = spike;
  const decay = Math.exp(-alpha * t);
  const sin = Math.sin(wd * t);
  const cos = Math.cos(wd * t);
  const voltageV = ((turnOffA * decay) / (capacitanceF * wd)) * sin;
  const currentA = turnOffA * decay * (cos - (alpha / wd) * sin);
  return { voltageV, currentA, leakageA: currentA + voltageV / spike.dampingOhm };
}

/**
 * The spike's reversed terminal voltage (V) and the current into the node capacitance (A) at `t`
 * (s) after the swing's end: the rise along stage A and Lm's arc, the plateau (no current into
 * the node), then the drawn fall, Vtop·cos over a quarter of the leakage's ring (its current not
 * drawn); 0 past it.
 */
export function spikeAt(
  spike: ForwardLeakageSpike,
  t: number,
): { voltageV: number; currentA: number } {
  if (t <= 0) return { voltageV: 0, currentA: spike.turnOffA };
  if (t < Math.min(spike.releaseS, spike.riseS)) return stageA(spike, t);
  if (t < spike.riseS) {
    const angle = spike.arcW * (t - spike.releaseS) + spike.arcPhase;
    return {
      voltageV: spike.arcV * Math.sin(angle),
      currentA: (spike.arcV / spike.arcZ) * Math.cos(angle),
    };
  }
  const holdEndS = spike.riseS + spike.holdS;
  if (t < holdEndS) return { voltageV: spike.topV, currentA: 0 };
  if (t < holdEndS + spike.fallS) {
    const angle = (Math.PI / 2) * ((t - holdEndS) / spike.fallS);
    return { voltageV: spike.topV * Math.cos(angle), currentA: 0 };
  }
  return { voltageV: 0, currentA: 0 };
}

/** The current the clamp takes at `t` (s) over the plateau (A): from the entry down at Vr/Llk. */
export function plateauClampA(spike: ForwardLeakageSpike, t: number): number {
  return spike.clampEntryA - (spike.clampV * (t - spike.riseS)) / spike.leakageH;
}
