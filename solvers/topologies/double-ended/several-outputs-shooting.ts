import { brentRoot } from '../../root-finding/brent-root.js';
import { solveLinear } from '../../root-finding/linear-unknowns.js';
import { hypotenuse } from './hypotenuse.js';
import {
  firstLinearSineRoot,
  polarLevelTime,
  ringAdvance,
  ringConstants,
  type RingConstants,
  type RingMode,
  type RingSegment,
  type RingState,
} from './node-ring.js';

/** The freewheel's radius and angle, handed to both sides' root searches (one object). */
const OFF_POLAR = { radius: NaN, alpha: NaN };

/**
 * Several outputs at light load with each output's own events (issue 3; DEVELOPERS.md, "Light
 * load with several outputs: the event model", own events): the
 * turn-on commutation (the primary's leakage taking the current at Vd, every output
 * freewheeling), then the on-time forces the winding (output 0's secondary) to v = Vp/n0, each
 * output rising at (c_k·v − Vo_k − Von_k)/L_k (c_k = n0/n_k); then the switches open and the node rings with the set S of outputs whose
 * path conducts: with S conducting the ring is one output's with the referred inductances of S
 * in parallel, L_S = 1/Σ c_k²/L_k, and E_S = L_S·Σ c_k·(Vo_k + Von_k)/L_k (the equivalent of S,
 * as `referredOutputs` builds it for every output), and output k in S follows it,
 * I_k(t) = I_k(0) + (c_k·L_S/L_k)·(I_S(t) − I_S(0)) + ((c_k·E_S − Vo_k − Von_k)/L_k)·t. S changes
 * where an output's current reaches zero (it leaves) or side·c_j·v rises through Vo_j + Von_j (it
 * comes in); with S empty the magnetizing inductance rings with the node alone; where the winding
 * reaches zero every output with current freewheels, falling at (Vo_k + Voff_k)/L_k, until the
 * currents referred to the winding no longer carry the magnetizing current; the body diodes clamp
 * at ±Vd/n0. Newton's method on 2N + 1 unknowns (the stage duty, the magnetizing current at
 * turn-on, every output's turn-on current and the cross-regulated outputs' voltages) against
 * periodicity (each output's current and the mirrored magnetizing current) and each output's
 * charge balance. With the bridges' leakage in the ring (`ShotCircuit.ringLeakageH`, the same
 * physics as `simulateLeakyRing`): the node rings with L_S‖Lr + Llk and the winding follows at
 * (L_S‖Lr)/(L_S‖Lr + Llk) of its swing about the centre (so each output's threshold and the
 * winding's zero are node levels divided by that share); with the winding at zero the node rings
 * with Llk alone, every output freewheeling, until Σ c_k·I_k meets ±(m − j) (the rectifiers of
 * that side carry the outputs alone) or the node clamps (the leakage current then returns to
 * zero at ∓Vd/(n0·Llk)); idle, m = j rings with Lr + Llk; a 2N + 2nd unknown and residual, the
 * current the turn-on commutation picks up (Σ c_k·I_k0 + m0 − j0, as `solveLeakyEventHalf`'s).
 * ref: the circuit's own event sequence; superposition of a linear circuit's
 * stretches and Newton's method for a periodic orbit (shooting), common practice.
 */

/** One output as the shooting takes it (SI units). */
export interface ShotOutput {
  inductanceH: number;
  loadA: number;
  /** n0/n_k. */
  factor: number;
  /** The driven path's drop and the freewheel's at the load current, V. */
  onDropV: number;
  offDropV: number;
}

/** The circuit on output 0's secondary, no leakage. */
export interface ShotCircuit {
  outputs: readonly ShotOutput[];
  referredMagnetizingH: number;
  capacitanceF: number;
  clampV: number;
  halfS: number;
  driveV: number;
  turnsRatio: number;
  loopResistanceOhm: number;
  /**
   * The primary's leakage, H: the turn-on commutation (Llk·I/Vd, every output freewheeling)
   * and its drop over the on-time, as `commutationOf` and `onVoltageOf` take them; none in the
   * ring unless `ringLeakageH` is given.
   */
  leakageInductanceH: number;
  /**
   * The leakage in the off-time ring, referred to output 0's secondary (Llk/n0², H; the half and
   * full bridge, as `RingCircuit.leakageH`): absent or 0, the node is the winding (the
   * push-pull's ring, whose leakage at turn-off is its clamp's).
   */
  ringLeakageH?: number;
}

/** The unknowns and what the half gives at them. */
export interface ShotHalf {
  stageDuty: number;
  magnetizingStartA: number;
  startsA: number[];
  voltagesV: number[];
  peaksA: number[];
  magnetizingPeakA: number;
  onV: number;
  /** Whether an output's current is zero somewhere in the half. */
  idles: boolean[];
  /** With leakage in the ring: the current the turn-on commutation picks up, A (else NaN). */
  pickUpA: number;
}

interface Run {
  residuals: number[];
  peaksA: number[];
  magnetizingPeakA: number;
  onV: number;
  idles: boolean[];
}

const MAX_STRETCHES = 600;

/** What {@link freewheelOf} finds (module scratch: the shooting runs one half at a time). */
const FREEWHEEL = { sumA: 0, rateAPerS: 0, leaveS: Infinity, leaveJ: -1 };

/**
 * Every output with current freewheeling, falling at (Vo_k + Voff_k)/L_k: Σ c_k·I_k, Σ c_k·fall_k
 * and the first output to reach zero (the lowest index among equal times) and when, into
 * {@link FREEWHEEL}.
 */
function freewheelOf(
  outs: readonly ShotOutput[],
  current: readonly number[],
  fallV: readonly number[],
): void {
  FREEWHEEL.sumA = 0;
  FREEWHEEL.rateAPerS = 0;
  FREEWHEEL.leaveS = Infinity;
  FREEWHEEL.leaveJ = -1;
  for (let j = 0; j < outs.length; j++) {
    const o = outs[j] as ShotOutput;
    const i = current[j] as number;
    if (!(i > 0)) continue;
    const fall = (fallV[j] as number) / o.inductanceH;
    FREEWHEEL.sumA += o.factor * i;
    FREEWHEEL.rateAPerS += o.factor * fall;
    const at = i / fall;
    if (at < FREEWHEEL.leaveS) {
      FREEWHEEL.leaveS = at;
      FREEWHEEL.leaveJ = j;
    }
  }
}

/** Every output with current freewheels for `stopS`: its charge and current advance. */
function advanceFreewheel(
  outs: readonly ShotOutput[],
  current: number[],
  charge: number[],
  fallV: readonly number[],
  stopS: number,
): void {
  for (let j = 0; j < outs.length; j++) {
    const o = outs[j] as ShotOutput;
    const i = current[j] as number;
    if (!(i > 0)) continue;
    const fall = (fallV[j] as number) / o.inductanceH;
    charge[j] = (charge[j] as number) + i * stopS - (fall * stopS * stopS) / 2;
    current[j] = Math.max(0, i - fall * stopS);
  }
}

/**
 * One stretch of an own-events half, drawn as the ring of its own equivalent (the outputs that
 * carry current through it in parallel, as `referredOutputs` builds it for all): its ring
 * constants and `RingSegment` (the equivalent's current, the magnetizing current and the
 * winding, and with leakage the node and the leakage current, at its start), and each output's
 * current at its start, its share of the equivalent's change and its own slope, so that output k
 * is startsA[k] + sharesA[k]·(I − I(0)) + ratesAPerS[k]·t through the stretch (zero where it
 * carries none): `SharedFall.ring.stretches` and `followsRing.segmentSharesA`.
 */
export interface ShotStretch {
  constants: RingConstants;
  segment: RingSegment;
  startsA: number[];
  sharesA: number[];
  ratesAPerS: number[];
}

/** An own-events half as drawn (`shotDrawing`): the commutation, the on-time and the ring. */
export interface HalfRecord {
  commutationS: number;
  onS: number;
  /** Each output's current as the on-time starts (after the commutation), A. */
  onStartsA: number[];
  /** The ring's stretches from the switches' opening to the half's end. */
  stretches: ShotStretch[];
}

/** Where a stretch of `runHalf` starts: its mode and side, the state and the set S. */
interface StretchFrom {
  mode: RingMode;
  side: 1 | -1;
  m: number;
  v: number;
  vn: number;
  jl: number;
  currentsA: number[];
  set: boolean[];
}

/**
 * The stretch of `runHalf` from `from`, `startS` into the ring and `durationS` long, as its own
 * equivalent's ring (`ShotStretch`): through a `shared` or `clamp` stretch the outputs of S with
 * E_S from their paths (the constants `runHalf` rings with); freewheeling, the outputs with
 * current, E from their freewheel drops (so the equivalent falls at Σ c_k·(Vo_k + Voff_k)/L_k);
 * idle, every output (only Lr, the leakage and the node ring then).
 */
function recordedStretch(
  c: ShotCircuit,
  pathV: readonly number[],
  fallV: readonly number[],
  from: StretchFrom,
  startS: number,
  durationS: number,
): ShotStretch {
  const outs = c.outputs;
  const n = outs.length;
  const isOff = from.mode === 'off' || from.mode === 'offClamp';
  const isIdle = from.mode === 'idle';
  const members = outs.map((_, j) =>
    isIdle ? false : isOff ? (from.currentsA[j] as number) > 0 : from.set[j] === true,
  );
  const hasMembers = members.some((b) => b);
  let inv = 0;
  let e = 0;
  let eOff = 0;
  let is = 0;
  for (let j = 0; j < n; j++) {
    if (hasMembers && !members[j]) continue;
    const o = outs[j] as ShotOutput;
    inv += (o.factor * o.factor) / o.inductanceH;
    e += (o.factor * (pathV[j] as number)) / o.inductanceH;
    eOff += (o.factor * (fallV[j] as number)) / o.inductanceH;
    if (members[j]) is += o.factor * (from.currentsA[j] as number);
  }
  const ls = 1 / inv;
  const es = ls * e;
  const esOff = ls * eOff;
  const lk = c.ringLeakageH ?? 0;
  const isLeaky = lk > 0;
  const constants = ringConstants({
    inductanceH: ls,
    referredMagnetizingH: c.referredMagnetizingH,
    capacitanceF: c.capacitanceF,
    clampV: c.clampV,
    pathV: es,
    freewheelV: isOff ? esOff : es,
    ...(isLeaky ? { leakageH: lk } : {}),
  });
  const start: RingState = { inductorA: is, magnetizingA: from.m, windingV: from.v };
  if (isLeaky) {
    start.leakageA = isIdle ? from.m : isOff ? from.jl : from.m - from.side * is;
    start.nodeV = from.vn;
  }
  const sharesA = new Array<number>(n).fill(0);
  const ratesAPerS = new Array<number>(n).fill(0);
  for (let j = 0; j < n; j++) {
    if (!members[j]) continue;
    const o = outs[j] as ShotOutput;
    sharesA[j] = (o.factor * ls) / o.inductanceH;
    ratesAPerS[j] = isOff
      ? (o.factor * esOff - (fallV[j] as number)) / o.inductanceH
      : (o.factor * es - (pathV[j] as number)) / o.inductanceH;
  }
  return {
    constants,
    segment: { mode: from.mode, side: from.side, startS, durationS, start },
    startsA: from.currentsA.map((i, j) => (members[j] ? i : 0)),
    sharesA,
    ratesAPerS,
  };
}

/**
 * The converged own-events half `shot` of circuit `c` (`shootSeveralOutputs`) run once more,
 * recording its commutation, on-time and ring stretches for the waveforms; undefined where the
 * run fails (it converged there, so it does not).
 */
export function shotDrawing(c: ShotCircuit, shot: ShotHalf): HalfRecord | undefined {
  const record: HalfRecord = { commutationS: NaN, onS: NaN, onStartsA: [], stretches: [] };
  const run = runHalf(
    c,
    shot.stageDuty,
    shot.magnetizingStartA,
    shot.startsA.map((i) => Math.max(0, i)),
    shot.voltagesV,
    shot.pickUpA,
    record,
  );
  return run === undefined ? undefined : record;
}

/** The two rectifiers' sides, +1 then −1. */
const BOTH_SIDES = [1, -1] as const;

/** One half at stage duty `x` from (m0, I_k0) with the outputs at `vo`; undefined on failure. */
function runHalf(
  c: ShotCircuit,
  x: number,
  m0: number,
  starts: readonly number[],
  vo: readonly number[],
  pickUp: number,
  record?: HalfRecord,
): Run | undefined {
  const outs = c.outputs;
  const n = outs.length;
  const lr = c.referredMagnetizingH;
  const onS = x * c.halfS;
  const pathV = outs.map((o, k) => (vo[k] as number) + o.onDropV);
  const fallV = outs.map((o, k) => (vo[k] as number) + o.offDropV);
  const nr = c.turnsRatio;
  const llk = c.leakageInductanceH;
  const lk = c.ringLeakageH ?? 0;
  const isLeaky = lk > 0;
  // The turn-on commutation: the leakage takes the primary current, (Σ c_k·I_k + m)/n0 at the
  // on-time's start, at Vd, while every output freewheels: tc = perA·(Σ c_k·I_k(tc) + m0),
  // linear in tc while each I_k(tc) = I_k0 − f_k·tc stays positive (an output that reaches zero
  // first is left out and tc found again); held below nine times the on-time.
  let tcS = 0;
  const perA = llk / (nr * c.driveV);
  if (perA > 0) {
    const left = starts.map((i) => i > 0);
    for (let pass = 0; pass <= n; pass++) {
      // With leakage in the ring the leakage current starts where the ring left it: the current
      // to pick up is `pickUp` (Σ c_k·I_k0 + m0 − j0) less what the outputs lose meanwhile.
      let sumA = isLeaky ? pickUp : m0;
      let sumRate = 0;
      for (let k = 0; k < n; k++) {
        const o = outs[k] as ShotOutput;
        if (!left[k]) {
          if (isLeaky) sumA -= o.factor * (starts[k] as number);
          continue;
        }
        if (!isLeaky) sumA += o.factor * (starts[k] as number);
        sumRate += (o.factor * (fallV[k] as number)) / o.inductanceH;
      }
      tcS = Math.max(0, (perA * sumA) / (1 + perA * sumRate));
      let changed = false;
      for (let k = 0; k < n; k++) {
        const o = outs[k] as ShotOutput;
        if (left[k] && (starts[k] as number) - ((fallV[k] as number) / o.inductanceH) * tcS < 0) {
          left[k] = false;
          changed = true;
        }
      }
      if (!changed) break;
    }
    tcS = Math.min(tcS, 9 * onS);
  }
  const ringS = c.halfS - tcS - onS;
  if (!(onS > 0) || !(ringS > 0)) return undefined;
  const current = new Array<number>(n);
  const charge = new Array<number>(n);
  const idles = new Array<boolean>(n).fill(false);
  for (let k = 0; k < n; k++) {
    const o = outs[k] as ShotOutput;
    const i0 = starts[k] as number;
    const fall = (fallV[k] as number) / o.inductanceH;
    const iOn = Math.max(0, i0 - fall * tcS);
    current[k] = iOn;
    charge[k] = iOn > 0 ? ((i0 + iOn) / 2) * tcS : i0 > 0 ? (i0 * i0) / (2 * fall) : 0;
    if (!(i0 > 0) || !(iOn > 0)) idles[k] = true;
  }
  // The on-time's winding voltage with the loop's resistance at the mean primary current and
  // the leakage at its slope (linear in v, as `onVoltageOf`).
  let sumL = 1 / lr;
  let sumE = 0;
  let sumI0 = m0;
  for (let k = 0; k < n; k++) {
    const o = outs[k] as ShotOutput;
    sumL += (o.factor * o.factor) / o.inductanceH;
    sumE += (o.factor * (pathV[k] as number)) / o.inductanceH;
    sumI0 += o.factor * (current[k] as number);
  }
  const peakStart = current.slice();
  const r = c.loopResistanceOhm;
  const slopeOhmS = (r * onS) / (2 * nr) + llk / nr;
  const onV = (c.driveV - (r / nr) * sumI0 + slopeOhmS * sumE) / (nr + slopeOhmS * sumL);
  for (let k = 0; k < n; k++) {
    const o = outs[k] as ShotOutput;
    const iOn = current[k] as number;
    const i1 = Math.max(0, iOn + ((o.factor * onV - (pathV[k] as number)) / o.inductanceH) * onS);
    current[k] = i1;
    charge[k] = (charge[k] as number) + ((iOn + i1) / 2) * onS;
  }
  const peaksA = current.slice();
  const m1 = m0 + (onV / lr) * onS;
  if (record !== undefined) {
    record.commutationS = tcS;
    record.onS = onS;
    record.onStartsA = peakStart.slice();
  }
  let m = m1;
  let v = -onV;
  // With leakage in the ring: the node voltage and the leakage current j (winding into node,
  // positive towards the next half's drive); while outputs conduct j = m − side·I_S, idle j = m.
  // The node starts above the winding by the leakage's drop over the on-time, as `event-half.ts`.
  let sumOn = m1 - m0;
  for (let k = 0; k < n; k++) {
    const o = outs[k] as ShotOutput;
    sumOn += o.factor * ((current[k] as number) - (peakStart[k] as number));
  }
  let vn = isLeaky ? -onV - (lk * sumOn) / onS : v;
  let jl = 0;
  let side: 1 | -1 = -1;
  let mode: 'shared' | 'clamp' | 'off' | 'offClamp' | 'idle' = 'shared';
  let set = current.map((i) => i > 0);
  const shares = new Array<number>(n).fill(0);
  const drifts = new Array<number>(n).fill(0);
  if (!set.some((b) => b)) {
    mode = 'idle';
    jl = m;
  }
  const offOmega = isLeaky ? 1 / Math.sqrt(lk * c.capacitanceF) : NaN;
  const offImpedance = isLeaky ? Math.sqrt(lk / c.capacitanceF) : NaN;
  const sharedJ = (): number => {
    let is = 0;
    for (let j = 0; j < n; j++) if (set[j]) is += (outs[j] as ShotOutput).factor * current[j]!;
    return m - side * is;
  };
  const constantsOf = new Map<number, { k: RingConstants; ls: number; es: number }>();
  const setConstants = (): { k: RingConstants; ls: number; es: number } => {
    let key = 0;
    for (let j = 0; j < n; j++) if (set[j]) key |= 1 << j;
    const cached = constantsOf.get(key);
    if (cached !== undefined) return cached;
    let inv = 0;
    let e = 0;
    for (let j = 0; j < n; j++) {
      if (!set[j]) continue;
      const o = outs[j] as ShotOutput;
      inv += (o.factor * o.factor) / o.inductanceH;
      e += (o.factor * (pathV[j] as number)) / o.inductanceH;
    }
    const ls = 1 / inv;
    const es = ls * e;
    const k = ringConstants({
      inductanceH: ls,
      referredMagnetizingH: lr,
      capacitanceF: c.capacitanceF,
      clampV: c.clampV,
      pathV: es,
      freewheelV: es,
      ...(isLeaky ? { leakageH: lk } : {}),
    });
    const made = { k, ls, es };
    constantsOf.set(key, made);
    return made;
  };
  let elapsed = 0;
  const tiny = 1e-12 * ringS;
  for (let count = 0; count < MAX_STRETCHES; count++) {
    const stretchFrom =
      record === undefined
        ? undefined
        : { mode, side, m, v, vn, jl, currentsA: current.slice(), set: set.slice() };
    const left = ringS - elapsed;
    let stop = left;
    let event: { kind: 'clamp' | 'off' | 'join' | 'leave' | 'release' | 'none'; j: number } = {
      kind: 'none',
      j: -1,
    };
    if (mode === 'shared') {
      const { k, ls, es } = setConstants();
      let is = 0;
      for (let j = 0; j < n; j++) {
        if (!set[j]) continue;
        const o = outs[j] as ShotOutput;
        is += o.factor * current[j]!;
        // Each conducting output's current is its start plus `share` of the equivalent's change
        // plus `drift`·t (its own path drop against the equivalent's).
        shares[j] = (o.factor * ls) / o.inductanceH;
        drifts[j] = (o.factor * es - (pathV[j] as number)) / o.inductanceH;
      }
      // With leakage the node rings (L_S‖Lr + Llk) and the winding is `windingShare` of its
      // swing about the centre: the winding's levels are the node's divided by that share.
      const s0 = isLeaky
        ? { inductorA: is, magnetizingA: m, windingV: v, leakageA: m - side * is, nodeV: vn }
        : { inductorA: is, magnetizingA: m, windingV: v };
      const ws = isLeaky ? k.windingShare : 1;
      const y0 = (isLeaky ? vn : v) - side * k.centreV;
      const z0 = (m - side * is) * k.impedanceOhm;
      const radius = hypotenuse(y0, z0);
      const alpha = Math.atan2(z0, y0);
      const level = (threshold: number): number => side * (threshold - k.centreV);
      const windingLevel = (threshold: number): number => level(threshold) / ws;
      const clampAt = polarLevelTime(k.omega, radius, alpha, level(c.clampV), side > 0, tiny);
      if (clampAt < stop) {
        stop = clampAt;
        event = { kind: 'clamp', j: -1 };
      }
      const offAt = polarLevelTime(
        k.omega,
        radius,
        alpha,
        (-side * k.centreV) / ws,
        side < 0,
        tiny,
      );
      if (offAt < stop) {
        stop = offAt;
        event = { kind: 'off', j: -1 };
      }
      for (let j = 0; j < n; j++) {
        if (set[j]) continue;
        const o = outs[j] as ShotOutput;
        const thresholdV = (pathV[j] as number) / o.factor;
        if (!(thresholdV < c.clampV)) continue;
        const at = polarLevelTime(k.omega, radius, alpha, windingLevel(thresholdV), side > 0, tiny);
        if (at < stop) {
          stop = at;
          event = { kind: 'join', j };
        }
      }
      // Each conducting output's zero: monotonic between the crossings of its own threshold.
      for (let j = 0; j < n; j++) {
        if (!set[j]) continue;
        const o = outs[j] as ShotOutput;
        const share = shares[j] as number;
        const drift = drifts[j] as number;
        const ij0 = current[j] as number;
        const at = (t: number): number =>
          ij0 +
          share * (ringAdvance(k, 'shared', side, s0, t, false).state.inductorA - is) +
          drift * t;
        const thresholdLevel = windingLevel((pathV[j] as number) / o.factor);
        let from = 0;
        let valueFrom = ij0;
        for (let piece = 0; piece < 64 && from < stop; piece++) {
          const up = polarLevelTime(k.omega, radius, alpha, thresholdLevel, true, from + 1e-15);
          const down = polarLevelTime(k.omega, radius, alpha, thresholdLevel, false, from + 1e-15);
          const next = Math.min(up, down, stop);
          const valueNext = at(next);
          if (valueNext <= 0 && valueFrom > 0) {
            const t = brentRoot(at, from, next, {
              absoluteTolerance: 1e-15 * Math.max(next, 1e-9),
              valueAtLo: valueFrom,
              valueAtHi: valueNext,
            });
            const root = Number.isFinite(t) ? t : next;
            if (root < stop) {
              stop = root;
              event = { kind: 'leave', j };
            }
            break;
          }
          from = next;
          valueFrom = valueNext;
        }
      }
      const step = ringAdvance(k, 'shared', side, s0, stop);
      const dIs = step.state.inductorA - is;
      for (let j = 0; j < n; j++) {
        if (!set[j]) continue;
        const share = shares[j] as number;
        const drift = drifts[j] as number;
        const ij0 = current[j] as number;
        charge[j] =
          (charge[j] as number) +
          ij0 * stop +
          share * (step.chargeAS - is * stop) +
          (drift * stop * stop) / 2;
        current[j] = Math.max(0, ij0 + share * dIs + drift * stop);
      }
      m = step.state.magnetizingA;
      v = step.state.windingV;
      vn = step.state.nodeV ?? v;
    } else if (mode === 'clamp') {
      // The node at ±Vd/n0; with leakage the winding at its share of the way from the centre.
      const vc = isLeaky
        ? (() => {
            const { k } = setConstants();
            return k.centreV + k.windingShare * (c.clampV - k.centreV);
          })()
        : c.clampV;
      let xRate = -side * (vc / lr);
      let x0 = m;
      for (let j = 0; j < n; j++) {
        if (!set[j]) continue;
        const o = outs[j] as ShotOutput;
        const rate = (o.factor * vc - (pathV[j] as number)) / o.inductanceH;
        xRate -= side * o.factor * rate;
        x0 -= side * o.factor * (current[j] as number);
        if (rate < 0) {
          const at = -(current[j] as number) / rate;
          if (at < stop) {
            stop = Math.max(0, at);
            event = { kind: 'leave', j };
          }
        }
      }
      const releaseAt = -x0 / xRate;
      if (releaseAt < stop) {
        stop = Math.max(0, releaseAt);
        event = { kind: 'release', j: -1 };
      }
      for (let j = 0; j < n; j++) {
        if (!set[j]) continue;
        const o = outs[j] as ShotOutput;
        const rate = (o.factor * vc - (pathV[j] as number)) / o.inductanceH;
        const ij0 = current[j] as number;
        charge[j] = (charge[j] as number) + ij0 * stop + (rate * stop * stop) / 2;
        current[j] = Math.max(0, ij0 + rate * stop);
      }
      m -= (side * vc * stop) / lr;
      v = side * vc;
      vn = side * c.clampV;
    } else if (mode === 'off' && isLeaky) {
      // Every output with current freewheels, the winding at zero, the node ringing with the
      // leakage alone; the rectifiers of side r carry the outputs alone once Σ c_k·I_k meets
      // r·(m − j) (`simulateLeakyRing`'s freewheel with the outputs' sum), or the node clamps.
      freewheelOf(outs, current, fallV);
      const { sumA: sum, rateAPerS: rate } = FREEWHEEL;
      if (FREEWHEEL.leaveS < stop) {
        stop = FREEWHEEL.leaveS;
        event = { kind: 'leave', j: FREEWHEEL.leaveJ };
      }
      const z0 = jl * offImpedance;
      const radius = hypotenuse(vn, z0);
      const alpha = Math.atan2(z0, vn);
      OFF_POLAR.radius = radius;
      OFF_POLAR.alpha = alpha;
      const upAt = polarLevelTime(offOmega, radius, alpha, c.clampV, true, tiny);
      const downAt = polarLevelTime(offOmega, radius, alpha, -c.clampV, false, tiny);
      if (upAt < stop) {
        stop = upAt;
        event = { kind: 'clamp', j: 1 };
      }
      if (downAt < stop) {
        stop = downAt;
        event = { kind: 'clamp', j: -1 };
      }
      for (const r of BOTH_SIDES) {
        const meetAt = firstLinearSineRoot(
          sum - r * m,
          -rate,
          r,
          vn,
          z0,
          offOmega,
          offImpedance,
          stop,
          OFF_POLAR,
        );
        if (meetAt < stop) {
          stop = meetAt;
          event = { kind: 'release', j: r };
        }
      }
      advanceFreewheel(outs, current, charge, fallV, stop);
      if (event.kind === 'leave') current[event.j] = 0;
      const cos = Math.cos(offOmega * stop);
      const sin = Math.sin(offOmega * stop);
      jl = (z0 * cos - vn * sin) / offImpedance;
      vn = vn * cos + z0 * sin;
      v = 0;
    } else if (mode === 'offClamp') {
      // The node clamped at side·Vd/n0, the winding at zero: j returns towards zero at
      // −side·Vd/(n0·Llk) (back to the freewheel's ring there), or the rectifiers of side r
      // carry the outputs alone (the clamp's ring on side r, or the ring on the other side).
      const jRate = (-side * c.clampV) / lk;
      freewheelOf(outs, current, fallV);
      const { sumA: sum, rateAPerS: rate } = FREEWHEEL;
      if (FREEWHEEL.leaveS < stop) {
        stop = FREEWHEEL.leaveS;
        event = { kind: 'leave', j: FREEWHEEL.leaveJ };
      }
      const releaseAt = -jl / jRate;
      if (releaseAt < stop) {
        stop = Math.max(0, releaseAt);
        event = { kind: 'release', j: 0 };
      }
      for (const r of BOTH_SIDES) {
        const gapRate = -rate + r * jRate;
        if (gapRate < 0) {
          const meetAt = (sum - r * (m - jl)) / -gapRate;
          if (meetAt < stop) {
            stop = Math.max(0, meetAt);
            event = { kind: 'join', j: r };
          }
        }
      }
      advanceFreewheel(outs, current, charge, fallV, stop);
      if (event.kind === 'leave') current[event.j] = 0;
      jl += jRate * stop;
      vn = side * c.clampV;
      v = 0;
    } else if (mode === 'off') {
      // Every output with current freewheels; the winding at zero carries m until the referred
      // currents fall to |m|.
      freewheelOf(outs, current, fallV);
      const { sumA: sum, rateAPerS: rate } = FREEWHEEL;
      if (FREEWHEEL.leaveS < stop) {
        stop = FREEWHEEL.leaveS;
        event = { kind: 'leave', j: FREEWHEEL.leaveJ };
      }
      const meetAt = (sum - Math.abs(m)) / rate;
      if (!(meetAt > 0)) stop = 0;
      else if (meetAt < stop) stop = meetAt;
      if (stop === 0 || stop === meetAt) event = { kind: 'release', j: -1 };
      advanceFreewheel(outs, current, charge, fallV, stop);
      if (event.kind === 'leave') current[event.j] = 0;
      v = 0;
    } else {
      // Idle: Lr (with the leakage, Lr + Llk, the winding Lr/(Lr + Llk) of the node) rings
      // with the node alone.
      const idleShare = lr / (lr + lk);
      const zi = Math.sqrt((lr + lk) / c.capacitanceF);
      const omega = 1 / Math.sqrt((lr + lk) * c.capacitanceF);
      const z0 = m * zi;
      const ringV = isLeaky ? vn : v;
      const radius = hypotenuse(ringV, z0);
      const alpha = Math.atan2(z0, ringV);
      for (let j = 0; j < n; j++) {
        const o = outs[j] as ShotOutput;
        const thresholdV = (pathV[j] as number) / o.factor / idleShare;
        const upAt = polarLevelTime(omega, radius, alpha, thresholdV, true, tiny);
        const downAt = polarLevelTime(omega, radius, alpha, -thresholdV, false, tiny);
        if (upAt < stop) {
          stop = upAt;
          event = { kind: 'join', j };
          side = 1;
        }
        if (downAt < stop) {
          stop = downAt;
          event = { kind: 'join', j };
          side = -1;
        }
      }
      const cos = Math.cos(omega * stop);
      const sin = Math.sin(omega * stop);
      const vNext = ringV * cos + z0 * sin;
      m = (z0 * cos - ringV * sin) / zi;
      vn = vNext;
      v = idleShare * vNext;
      jl = m;
    }
    if (stretchFrom !== undefined && stop > 0) {
      (record as HalfRecord).stretches.push(
        recordedStretch(c, pathV, fallV, stretchFrom, elapsed, stop),
      );
    }
    elapsed += stop;
    if (stop >= left) break;
    // The transition.
    if (mode === 'off' && isLeaky && event.kind === 'clamp') {
      mode = 'offClamp';
      side = event.j > 0 ? 1 : -1;
    } else if (mode === 'offClamp' && event.kind === 'release') {
      // The diodes stop with j at zero.
      jl = 0;
      mode = 'off';
    } else if (mode === 'offClamp' && event.kind === 'join') {
      const r: 1 | -1 = event.j > 0 ? 1 : -1;
      mode = r === side ? 'clamp' : 'shared';
      side = r;
      set = current.map((i) => i > 0);
      if (!set.some((b) => b)) {
        mode = 'idle';
        jl = m;
      }
    } else if (mode === 'off' && isLeaky && event.kind === 'release') {
      side = event.j > 0 ? 1 : -1;
      set = current.map((i) => i > 0);
      mode = set.some((b) => b) ? 'shared' : 'idle';
      if (mode === 'idle') jl = m;
    } else if (event.kind === 'clamp') mode = 'clamp';
    else if (event.kind === 'release' && mode === 'clamp') mode = 'shared';
    else if (event.kind === 'off') {
      jl = sharedJ();
      mode = 'off';
      for (let j = 0; j < n; j++) set[j] = false;
    } else if (mode === 'off' && event.kind === 'release') {
      side = m < 0 ? -1 : 1;
      set = current.map((i) => i > 0);
      mode = set.some((b) => b) ? 'shared' : 'idle';
    } else if ((mode === 'off' || mode === 'offClamp') && event.kind === 'leave') {
      current[event.j] = 0;
      idles[event.j] = true;
      if (!current.some((i) => i > 0)) {
        mode = 'idle';
        jl = m;
      }
    } else if (event.kind === 'leave') {
      current[event.j] = 0;
      set[event.j] = false;
      idles[event.j] = true;
      if (!set.some((b) => b)) {
        mode = 'idle';
        jl = m;
      }
    } else if (event.kind === 'join') {
      set[event.j] = true;
      // Outputs at the same threshold come in together.
      for (let j = 0; j < n; j++) {
        const o = outs[j] as ShotOutput;
        if (!set[j] && side * o.factor * v >= (pathV[j] as number) * (1 - 1e-12)) set[j] = true;
      }
      mode = 'shared';
    }
    if (count === MAX_STRETCHES - 1) return undefined;
  }
  const residuals: number[] = [];
  for (let k = 0; k < n; k++) residuals.push((current[k] as number) - (starts[k] as number));
  residuals.push(-m - m0);
  for (let k = 0; k < n; k++) {
    residuals.push((charge[k] as number) / c.halfS - (outs[k] as ShotOutput).loadA);
  }
  if (isLeaky) {
    // The current the next turn-on picks up, Σ c_k·I_k less the rectifiers' difference m − j
    // (mirrored), against this half's.
    const jEnd = mode === 'shared' || mode === 'clamp' ? sharedJ() : mode === 'idle' ? m : jl;
    let sumEnd = 0;
    for (let k = 0; k < n; k++) sumEnd += (outs[k] as ShotOutput).factor * (current[k] as number);
    residuals.push(sumEnd - (m - jEnd) - pickUp);
  }
  return { residuals, peaksA, magnetizingPeakA: m1, onV, idles };
}

/** Newton steps of {@link shootSeveralOutputs}. */
const SHOT_STEPS = 40;

/**
 * The periodic half of several outputs with their own events, output 0 at `regulatedV`, from
 * `guess` (the equivalent's half and the outputs that followed it); undefined where Newton's
 * method does not converge or leaves the duty cycles or the currents' signs.
 */
export function shootSeveralOutputs(
  c: ShotCircuit,
  regulatedV: number,
  guess: {
    stageDuty: number;
    magnetizingStartA: number;
    startsA: readonly number[];
    voltagesV: readonly number[];
    /** With leakage in the ring: the equivalent's current picked up at turn-on, A. */
    pickUpA?: number;
  },
): ShotHalf | undefined {
  const n = c.outputs.length;
  const isLeaky = (c.ringLeakageH ?? 0) > 0;
  // u = [x, m0, I_0..I_{n−1}, Vo_1..Vo_{n−1}] and, with leakage in the ring, the current the
  // turn-on commutation picks up (`solveLeakyEventHalf`'s d0; from Σ c_k·I_k0 + m0, j0 = 0).
  const u = [
    guess.stageDuty,
    guess.magnetizingStartA,
    ...guess.startsA.map((i) => Math.max(0, i)),
    ...guess.voltagesV.slice(1),
  ];
  if (isLeaky) {
    let sumA = guess.magnetizingStartA;
    c.outputs.forEach((o, k) => (sumA += o.factor * Math.max(0, guess.startsA[k] ?? 0)));
    u.push(guess.pickUpA ?? Math.max(0, sumA));
  }
  const size = u.length;
  let scaleA = 0;
  for (const o of c.outputs) scaleA = Math.max(scaleA, o.loadA);
  const evaluate = (w: readonly number[]): Run | undefined =>
    runHalf(
      c,
      w[0] as number,
      w[1] as number,
      w.slice(2, 2 + n).map((i) => Math.max(0, i)),
      [regulatedV, ...w.slice(2 + n, 2 * n + 1)],
      isLeaky ? (w[2 * n + 1] as number) : NaN,
    );
  let f = evaluate(u);
  for (let step = 0; step < SHOT_STEPS; step++) {
    if (f === undefined) return undefined;
    let norm = 0;
    for (const r of f.residuals) norm = Math.max(norm, Math.abs(r));
    if (norm <= 1e-10 * scaleA) {
      return {
        stageDuty: u[0] as number,
        magnetizingStartA: u[1] as number,
        startsA: u.slice(2, 2 + n),
        voltagesV: [regulatedV, ...u.slice(2 + n, 2 * n + 1)],
        peaksA: f.peaksA,
        magnetizingPeakA: f.magnetizingPeakA,
        onV: f.onV,
        idles: f.idles,
        pickUpA: isLeaky ? (u[2 * n + 1] as number) : NaN,
      };
    }
    const jacobian = new Array<number>(size * size).fill(0);
    for (let col = 0; col < size; col++) {
      const w = u.slice();
      const h =
        col === 0
          ? 1e-7 * (u[0] as number)
          : col < 2 + n || col > 2 * n
            ? 1e-7 * scaleA
            : 1e-7 * regulatedV;
      w[col] = (w[col] as number) + h;
      const g = evaluate(w);
      if (g === undefined) return undefined;
      for (let row = 0; row < size; row++) {
        jacobian[row * size + col] =
          ((g.residuals[row] as number) - (f.residuals[row] as number)) / h;
      }
    }
    const delta = solveLinear(
      jacobian,
      f.residuals.map((r) => -r),
    );
    if (delta === undefined) return undefined;
    // Damped: the duty within a fifth of itself, then halved while the residuals grow.
    let shrink = Math.min(1, (0.2 * (u[0] as number)) / Math.abs(delta[0] as number));
    let next: Run | undefined;
    let trial = u;
    for (let back = 0; back < 8; back++) {
      trial = u.map((x, i) => x + shrink * (delta[i] as number));
      for (let i = 2; i < 2 + n; i++) trial[i] = Math.max(0, trial[i] as number);
      next = evaluate(trial);
      let nextNorm = Infinity;
      if (next !== undefined) {
        nextNorm = 0;
        for (const r of next.residuals) nextNorm = Math.max(nextNorm, Math.abs(r));
      }
      if (nextNorm < norm) break;
      shrink /= 2;
    }
    for (let i = 0; i < size; i++) u[i] = trial[i] as number;
    if (!((u[0] as number) > 0 && (u[0] as number) < 1)) return undefined;
    f = next;
  }
  return undefined;
}
