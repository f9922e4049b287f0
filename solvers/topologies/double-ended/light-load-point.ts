import { brentRoot } from '../../root-finding/brent-root.js';
import { brentRootNear } from '../../root-finding/brent-root-near.js';
import { secantRoot } from '../../root-finding/secant-root.js';
import { hypotenuse } from './hypotenuse.js';
import {
  outputStagePoint,
  type OutputStage,
  type OutputStagePoint,
} from '../buck-derived/output-stage.js';
import {
  RING_TRAPEZOID_FACTOR,
  refreshRingVoltages,
  ringConstants,
  wholeStepsS,
  simulateRing,
  type RingCircuit,
  type RingConstants,
  type RingSegment,
  type RingState,
} from './node-ring.js';

/**
 * The interval in which one rectifier has stopped and the magnetizing current, referred to the
 * secondary, carries the inductor current (fractions of a half-period, currents referred to the
 * secondary: n·Im, A).
 */
export interface SharedFall {
  /** Referred magnetizing current at the start of the half (its magnitude; it starts negative). */
  magnetizingStartA: number;
  /** Referred magnetizing current at the end of the on-interval. */
  magnetizingEndOfOnA: number;
  /** Inductor (and referred magnetizing) current as the shared fall starts. */
  startA: number;
  /** Inductor current as it ends: the next half's valley, or zero. */
  endA: number;
  startFraction: number;
  endFraction: number;
  /** Magnitude of the secondary winding voltage during the shared fall: Lr·(Vo + Vf)/(L + Lr), V. */
  windingVoltageV: number;
  /**
   * With several outputs (`severalOutputsFall`): this output's part of the referred magnetizing
   * current while every winding sits at zero, A. Omitted: all of it (`magnetizingEndOfOnA`).
   */
  freewheelMagnetizingA?: number;
  /**
   * With several outputs and the node ring: how this output's inductor current follows the
   * ring's (`ring`, the equivalent output's, referred to output 0's secondary) t seconds into
   * the fall, IL = startA + perRingA·(ring IL − ring start IL) + perS·t, and n0/n of this
   * output, the factor of its winding voltage over the ring's.
   */
  followsRing?: {
    perRingA: number;
    perS: number;
    windingFactor: number;
    /**
     * The event model's followers (`several-outputs-events.ts`): the output's current at each
     * of the ring's stretches (`simulateRing`'s segments), from which it follows the ring's
     * change with `perRingA`, at `perS` through a conducting path and `offPerS` freewheeling,
     * and zero where the ring idles; t then counts from the stretch's start.
     */
    segmentStartsA?: readonly number[];
    offPerS?: number;
    /**
     * Each output's own events (`ring.stretches`): per stretch, the output's share of that
     * stretch's equivalent change and its own slope (both zero where it carries no current),
     * in place of `perRingA` and `perS`/`offPerS`.
     */
    segmentSharesA?: readonly number[];
    segmentRatesAPerS?: readonly number[];
  };
  /**
   * With the switch-node capacitance: the ring circuit and the state the shared fall starts from
   * (at `startFraction`); the waveforms sample it with `simulateRing`. Omitted without it.
   */
  ring?: {
    constants: RingConstants;
    start: RingState;
    halfS: number;
    /**
     * The event model's ring (`event-half.ts`): it starts as the switches open (the turn-off
     * swing, through the path just driven: side −1) and is continued to the half's end without
     * settling (`simulateRing`'s `isContinued`).
     */
    isContinued?: boolean;
    /**
     * Each output's own events (`several-outputs-shooting.ts`, `shotDrawing`): the ring's
     * stretches, each with the ring constants of the outputs that carry current through it (the
     * set changes where an output stops or comes in), drawn in place of `simulateRing`'s
     * stretches of `constants` from `start`.
     */
    stretches?: readonly { constants: RingConstants; segment: RingSegment }[];
  };
}

/**
 * The switch-node capacitance as the secondary sees it: the drain capacitance across the winding
 * times n², and the drive voltage over n where the body diodes clamp the winding.
 */
export interface NodeCapacitance {
  capacitanceF: number;
  clampV: number;
}

/** A double-ended stage's steady state over half a period, with the shared fall if it occurs. */
export interface DoubleEndedStagePoint extends OutputStagePoint {
  sharedFall?: SharedFall;
}

/**
 * Returns the stage's steady state over half a period (duty cycle D over the half, secondary
 * open-circuit voltage Vs, half-period Th) when the magnetizing inductance referred to the
 * secondary, Lr = Lm/n², is in play. While the secondary freewheels, its rectifiers carry the
 * inductor current IL plus and minus half the referred magnetizing current n·Im (ampere-turn
 * balance with the primary open); once the falling IL meets n·Im, the rectifier of the half just
 * driven stops, the winding leaves zero, and IL and n·Im fall together at
 * (Vo + Vf)/(L + Lr) (the two inductances in series through the other rectifier) to the
 * half's end (its value there is the next valley and, over n, the next half's magnetizing start)
 * or to zero. Volt-second balance then no longer fixes Vo: charge balance over the half does,
 * solved for Vo by Brent's method; the drops are taken at the load current, as in continuous
 * conduction, so the two meet where the shared fall shrinks to nothing. Without that fall
 * (valley ≥ n·Im,pk) the result is `outputStagePoint`'s, unchanged. If IL ends the on-interval
 * below n·Im, the excess magnetizing current is taken to return to the input at once (through
 * the body diodes, at −Vd) and the shared fall starts at the peak. `turnOffSwingDuty` (over the
 * half), the turn-off swing's volt-seconds (`turnOffSwingS`), is added to the duty cycle where
 * there is no shared fall (`outputStagePoint`'s path); the light-load paths leave it out.
 * ref: Mohan, Undeland, Robbins, 3rd ed. (from memory), §10-5 and §10-4-2 (the magnetizing
 * current through a freewheeling center-tapped rectifier); Erickson & Maksimović, 2nd ed.
 * (from memory), §2.3 (volt-second and charge balance).
 */
export function lightLoadPoint(
  stage: OutputStage,
  dutyCycle: number,
  secondaryVoltageV: number,
  halfS: number,
  referredMagnetizingH: number,
  voltageHintV?: number,
  node?: NodeCapacitance,
  turnOffSwingDuty = 0,
): DoubleEndedStagePoint {
  const onS = dutyCycle * halfS;
  const lr = referredMagnetizingH;
  const riseA = (Math.max(0, secondaryVoltageV) * onS) / lr;
  const io = stage.loadA;
  const l = stage.inductanceH;
  const vf = stage.rectifier.forwardVoltageV;
  const rl = stage.inductorResistanceOhm;
  const { onDropV, offDropV } = loadDropsV(stage);
  // Continuous conduction's volt-second balance: there the shared fall is empty; below the
  // boundary the mean current there exceeds the load, since the valley lies below n·Im,pk.
  const d = dutyCycle;
  const floorV =
    d * (secondaryVoltageV - onDropV + rl * io) - (1 - d) * (offDropV - rl * io) - rl * io;
  const ccmValleyA = io - ((floorV + offDropV) * (1 - d) * halfS) / (2 * l);
  if (!(lr > 0) || !(riseA > 0) || !(secondaryVoltageV - vf > 0) || ccmValleyA >= riseA / 2) {
    return outputStagePoint(stage, dutyCycle + turnOffSwingDuty, secondaryVoltageV, halfS);
  }
  const fall: FallContext = {
    loadA: io,
    inductanceH: l,
    referredMagnetizingH: lr,
    secondaryVoltageV,
    onDropV,
    offDropV,
    riseA,
    halfS,
    onS,
    restS: halfS - onS,
  };
  if (node !== undefined && node.capacitanceF > 0) {
    const ceiling = secondaryVoltageV - onDropV;
    const ringed = ringPoint(
      fall,
      node,
      dutyCycle,
      Math.min(floorV, ceiling),
      ceiling,
      voltageHintV,
    );
    if (ringed !== undefined) return ringed;
  }
  // One closure per call (module-level helpers below): Brent's method evaluates it.
  const excess = excessOf(fall);
  const ceilingV = secondaryVoltageV - onDropV;
  const lowV = Math.min(floorV, ceilingV);
  const rootOptions = { absoluteTolerance: 1e-12 * Math.max(1, Math.abs(ceilingV)) };
  // Warm start: a Vo from a nearby solve (the last fixed-point pass or duty-cycle trial) is
  // bracketed within 1e-6 of the ceiling first; the same tolerance, so the same root to it.
  let voltageV = brentRootNear(excess, lowV, ceilingV, voltageHintV, rootOptions);
  if (!Number.isFinite(voltageV)) voltageV = floorV;
  let s = shapeAt(fall, voltageV);
  if (!(Math.abs(s.mean - io) <= 1e-6 * io)) {
    // The root sits where the clamped fall just spans the rest of the half (ΔIL = g·rest): the
    // whole freewheel is the shared fall, Vo is fixed by volt-seconds and the valley by charge
    // balance, Iv = Io − ΔIL/2, as in continuous conduction.
    s = halfShape(fall, voltageV, Math.max(0, io - riseAt(fall, voltageV) / 2));
  }
  const isContinuous = s.valleyA > 0;
  return {
    mode: isContinuous ? 'ccm' : 'dcm',
    voltageV,
    valleyA: s.valleyA,
    peakA: s.peakA,
    freewheelDutyCycle: (s.firstS + s.sharedS) / halfS,
    onMeanA: (s.valleyA + s.peakA) / 2,
    sharedFall: {
      magnetizingStartA: s.valleyA,
      magnetizingEndOfOnA: riseA - s.valleyA,
      startA: s.startA,
      endA: s.endA,
      startFraction: dutyCycle + s.firstS / halfS,
      endFraction: isContinuous ? 1 : dutyCycle + (s.firstS + s.sharedS) / halfS,
      windingVoltageV: (lr * (voltageV + onDropV)) / (l + lr),
    },
  };
}

/**
 * The share of the turn-off swing `swingDuty` (its volt-seconds as stage duty over the half,
 * t_s/T) that the stage takes as drive: none where duty `dutyCycle` has a shared fall (the
 * light-load paths leave the swing out), else at most half the distance in duty to the shared
 * fall's boundary, so that the swing vanishes there and Vo(D) stays continuous, at the cost of
 * the swing's volt-seconds near the boundary. The freewheel carries the magnetizing current
 * (`lightLoadPoint`'s first path, valley ≥ n·Im,pk) where
 * Io − (Th/2)·(P·x·(1 − x) + Q·x) ≥ 0 at stage duty x, P = (Vs − Von + Voff)/L, Q = Vs/Lr
 * (the drops of `lightLoadPoint`): outside the roots of that quadratic.
 */
export function freewheelSwingDuty(
  stage: OutputStage,
  dutyCycle: number,
  secondaryVoltageV: number,
  halfS: number,
  referredMagnetizingH: number,
  swingDuty: number,
): number {
  const lr = referredMagnetizingH;
  if (!(swingDuty > 0) || !(lr > 0) || !(secondaryVoltageV > 0)) return swingDuty;
  const io = stage.loadA;
  const { forwardVoltageV: vf, resistanceOhm: rd } = stage.rectifier;
  const { forwardVoltageV: offVf, resistanceOhm: offRd } = stage.freewheel ?? stage.rectifier;
  const rl = stage.inductorResistanceOhm;
  const onDropV = vf + (stage.windingResistanceOhm + rd + rl) * io;
  const offDropV = offVf + (offRd + rl) * io;
  const p = (secondaryVoltageV - onDropV + offDropV) / stage.inductanceH;
  const q = secondaryVoltageV / lr;
  const k = halfS / 2;
  const d = dutyCycle;
  if (io - k * (p * d * (1 - d) + q * d) < 0) return 0;
  const discriminant = (p + q) * (p + q) - (4 * p * io) / k;
  if (!(p > 0) || !(discriminant >= 0)) return swingDuty;
  // The condition fails between the roots x1 ≤ x2 (x1·x2 = 2·Io/(Th·P)): below x1 the swing is
  // held to (x1 − D)/2, above x2 to (D − x2)/2, so that it vanishes at either boundary and the
  // stretched duty D + swing still rises with D (at half the rate), keeping Vo(D) increasing.
  const lowRoot = (2 * io) / k / (p + q + Math.sqrt(discriminant));
  const highRoot = lowRoot > 0 ? (2 * io) / (k * p * lowRoot) : Infinity;
  const roomDuty = (d <= lowRoot ? lowRoot - d : d - highRoot) / 2;
  return Math.min(swingDuty, Math.max(0, roomDuty));
}

/** What the shared-fall shape of one `lightLoadPoint` call is built from (SI units). */
interface FallContext {
  loadA: number;
  inductanceH: number;
  referredMagnetizingH: number;
  secondaryVoltageV: number;
  onDropV: number;
  offDropV: number;
  /** Referred magnetizing rise over the on-interval, A. */
  riseA: number;
  halfS: number;
  onS: number;
  restS: number;
}

/** The half-period's current shape at a trial Vo and valley, and its mean (A). */
interface HalfShape {
  valleyA: number;
  peakA: number;
  startA: number;
  endA: number;
  firstS: number;
  sharedS: number;
  mean: number;
}

/** The shared fall runs through the driven path's rectifier and winding: g = Vj/(L + Lr), A/s. */
function slopeAt(c: FallContext, vo: number): number {
  return (vo + c.onDropV) / (c.inductanceH + c.referredMagnetizingH);
}

/** The inductor current's rise over the on-interval at a trial Vo, A. */
function riseAt(c: FallContext, vo: number): number {
  return (Math.max(0, c.secondaryVoltageV - c.onDropV - vo) * c.onS) / c.inductanceH;
}

function halfShape(c: FallContext, vo: number, valleyA: number): HalfShape {
  const l = c.inductanceH;
  const lAtOnA = riseAt(c, vo);
  const offV = vo + c.offDropV;
  const g = slopeAt(c, vo);
  const peakA = valleyA + lAtOnA;
  // Clamped: IL ends the on-time below n·Im; the excess returns through the body diodes.
  const startA = Math.min(c.riseA - valleyA, peakA);
  const firstS = (l * (peakA - startA)) / offV;
  const sharedS = Math.min(Math.max(0, c.restS - firstS), (startA - valleyA) / g);
  const endA = Math.max(valleyA, startA - g * sharedS);
  const chargeAS =
    ((valleyA + peakA) / 2) * c.onS +
    ((peakA + startA) / 2) * firstS +
    ((startA + endA) / 2) * sharedS;
  return { valleyA, peakA, startA, endA, firstS, sharedS, mean: chargeAS / c.halfS };
}

/**
 * For a trial Vo the valley follows from periodicity: Ib − Iv = g·t2 with Ib = rise − Iv,
 * t1 = L·(Iv + ΔIL − Ib)/Voff and t2 = rest − t1 (the shared fall reaching the half's end); a
 * negative value means both reach zero first (valley 0).
 */
function shapeAt(c: FallContext, vo: number): HalfShape {
  const l = c.inductanceH;
  const riseA = c.riseA;
  const lAtOnA = riseAt(c, vo);
  const offV = vo + c.offDropV;
  const g = slopeAt(c, vo);
  const valleyA = Math.max(
    0,
    (riseA - g * c.restS + (g * l * (lAtOnA - riseA)) / offV) / (2 * (1 - (g * l) / offV)),
  );
  return halfShape(c, vo, riseA - valleyA > valleyA + lAtOnA ? 0 : valleyA);
}

/**
 * The half's mean current less the load at a trial Vo. Where no valley makes the half periodic
 * (the clamped fall cannot reach the valley in time) the current would build up: the mean is
 * then taken as above the load.
 */
function excessAt(c: FallContext, vo: number): number {
  const shape = shapeAt(c, vo);
  const isPeriodic = shape.endA <= shape.valleyA + 1e-9 * shape.peakA;
  return isPeriodic ? shape.mean - c.loadA : c.loadA;
}

/*
 * Brent's method's functions are made by the factories below, not as `const f = (vo) => ...`
 * in the caller: under tsx (the service's and the bench's runtime) esbuild's keepNames wraps
 * every such named arrow in an Object.defineProperty call, a measurable cost at the rate
 * `lightLoadPoint` runs (several calls per fixed-point pass, per duty-cycle trial, per corner).
 */

/** The half's mean current less the load as a function of a trial Vo (`excessAt`). */
function excessOf(fall: FallContext): (vo: number) => number {
  return (vo) => excessAt(fall, vo);
}

/**
 * The same with the node ring: current that would build up counts as above the load. The trials
 * share one `RingWork`: only the number leaves a trial, so its shape need not outlive it.
 */
function ringExcessOf(
  fall: FallContext,
  node: NodeCapacitance,
  watch: JumpWatch,
): (vo: number) => number {
  const work = ringWork(fall, node);
  return (vo) => {
    if (
      watch.isOn &&
      Math.abs(watch.aboveV - watch.belowV) <= watch.widthV &&
      watch.aboveA >= watch.jumpA &&
      -watch.belowA >= watch.jumpA
    ) {
      return 0;
    }
    const shape = ringShapeAt(fall, node, vo, work);
    const excessA = shape.isPeriodic ? shape.chargeAS / fall.halfS - fall.loadA : fall.loadA;
    if (watch.isOn) {
      if (excessA > 0) {
        watch.aboveV = vo;
        watch.aboveA = excessA;
      } else if (excessA < 0) {
        watch.belowV = vo;
        watch.belowA = excessA;
      }
    }
    return excessA;
  };
}

/**
 * The sign change Brent's method narrows in `ringPoint` (its bracket's ends are the last trial
 * above the balance and the last below it), to stop it at a jump of the excess: once the two lie
 * within `widthV` of each other with both excesses at least `jumpA` from zero, the excess falls
 * by more than 2·jumpA over widthV, some 1e4 times the steepest slope of a branch in the
 * bench scenarios (about 0.6 A/V at 10 % load), so it is a jump between the ring's cases and not
 * a balance. Brent's method would bisect it down to its tolerance (some 20 more trials, the
 * costliest ring solves of a design) only for `ringPointAt` to reject the point it ends on,
 * whose excess is no balance; the next trial answers 0 instead, Brent's method returns that Vo,
 * and `ringPointAt` rejects it on its own excess: the same outcome, the shared fall without
 * the ring.
 */
interface JumpWatch {
  isOn: boolean;
  widthV: number;
  jumpA: number;
  aboveV: number;
  aboveA: number;
  belowV: number;
  belowA: number;
}

/** A jump's width over max(1, |ceiling|) (`JumpWatch`). */
const RING_JUMP_WIDTH = 1e-7;
/** A jump's least excess on either side over the load current (`JumpWatch`). */
const RING_JUMP_EXCESS = 1e-2;

/**
 * What `ringShapeAt` fills in place at each trial Vo of one solve instead of building it anew:
 * the ring circuit and its constants, the first swing, and the shape of the common case. Each
 * trial built all of them, most of a double-ended design's garbage (about a third of it, some
 * 800 trials a design), and only the excess they give leaves a trial.
 */
interface RingWork {
  constants: RingConstants;
  swing: RestSwing;
  shape: RingShape;
}

/**
 * The last `RingWork` made, reused by the next solve of the same ring circuit (every pass and
 * duty-cycle trial of a corner has the same inductances and node capacitance, only its voltages
 * differ): no solve is nested in another, and nothing of a work outlives its solve's trials.
 */
let lastRingWork: RingWork | undefined;

function ringWork(c: FallContext, node: NodeCapacitance): RingWork {
  const last = lastRingWork;
  if (last !== undefined) {
    const circuit = last.constants.c;
    if (
      circuit.inductanceH === c.inductanceH &&
      circuit.referredMagnetizingH === c.referredMagnetizingH &&
      circuit.capacitanceF === node.capacitanceF
    ) {
      // The constants that follow the inductances and Cr stand; each trial sets the voltages.
      circuit.clampV = node.clampV;
      return last;
    }
  }
  const constants = ringConstants({
    inductanceH: c.inductanceH,
    referredMagnetizingH: c.referredMagnetizingH,
    capacitanceF: node.capacitanceF,
    clampV: node.clampV,
    pathV: NaN,
    freewheelV: NaN,
  });
  lastRingWork = { constants, swing: blankRestSwing(), shape: blankRingShape(constants) };
  return lastRingWork;
}

/** The half-period at a trial Vo with the node ring: currents in A, times in s. */
interface RingShape {
  isPeriodic: boolean;
  /** True where the shape is the one without the ring (no shared fall, or IL ends the on-time below n·Im). */
  isPlain?: boolean;
  valleyA: number;
  peakA: number;
  /** Referred magnetizing current's magnitude as the half starts (it starts at −a). */
  magnetizingStartA: number;
  /** Interval from the end of the on-time to the start of the shared fall. */
  firstS: number;
  /** The state the shared fall starts from. */
  start: RingState;
  chargeAS: number;
  constants: RingConstants;
}

/**
 * `lightLoadPoint` with the switch-node capacitance: the shared fall starts as a ring of Cr with
 * L‖Lr about Vw (the winding swinging from v0, the drops' difference, towards 2·Vw − v0),
 * clamped at the drive voltage by the body diodes, and the inductor current may ring down to
 * zero and idle (Lr ringing with Cr alone) until a rectifier conducts again. The inductor and
 * magnetizing currents no longer meet at the half's end: both are made periodic (the half ends
 * where the next starts, mirrored), and charge balance gives Vo. With a hint (the Vo of the last fixed-point pass or duty-cycle trial)
 * secant steps from it find Vo first; Brent's method over the whole bracket answers where they
 * fail or end on a point that is no balance, and a search by the span at the floor
 * (`floorRingPoint`) where that ends there.
 */
function ringPoint(
  fall: FallContext,
  node: NodeCapacitance,
  dutyCycle: number,
  lowV: number,
  ceilingV: number,
  voltageHintV: number | undefined,
): DoubleEndedStagePoint | undefined {
  const scaleV = Math.max(1, Math.abs(ceilingV));
  const watch: JumpWatch = {
    isOn: false,
    widthV: RING_JUMP_WIDTH * scaleV,
    jumpA: RING_JUMP_EXCESS * fall.loadA,
    aboveV: NaN,
    aboveA: NaN,
    belowV: NaN,
    belowA: NaN,
  };
  const excess = ringExcessOf(fall, node, watch);
  const rootOptions = { absoluteTolerance: 1e-12 * scaleV };
  if (voltageHintV !== undefined && voltageHintV >= lowV && voltageHintV <= ceilingV) {
    // The hint misses the root by up to about a percent at a new duty cycle and by far less in
    // the later passes; the secant's superlinear steps take 3 to 5 trials from there, where a
    // bracket of 1e-6 around the hint missed in half the solves and Brent's method over the
    // whole bracket then took about 10.
    // ref: Press et al., Numerical Recipes, §9.2 (from memory).
    const stepV = RING_HINT_STEP * scaleV;
    const second = voltageHintV + stepV <= ceilingV ? voltageHintV + stepV : voltageHintV - stepV;
    // A literal, not `{ ...rootOptions, maxIterations }`: with the spread every ring solve
    // (a few per fixed-point pass at light load) ran some 40 % slower under V8, the solve's
    // trials included (a replay of one design's calls, same results to the bit).
    const hinted = secantRoot(excess, voltageHintV, second, lowV, ceilingV, {
      absoluteTolerance: rootOptions.absoluteTolerance,
      maxIterations: RING_SECANT_ITERATIONS,
    });
    const point = Number.isFinite(hinted) ? ringPointAt(fall, node, dutyCycle, hinted) : undefined;
    if (point !== undefined) return point;
  }
  // Only Brent's method's trials are watched for a jump: the secant's do not bracket.
  watch.isOn = true;
  const voltageV = brentRoot(excess, lowV, ceilingV, rootOptions);
  const point = Number.isFinite(voltageV)
    ? ringPointAt(fall, node, dutyCycle, voltageV)
    : undefined;
  // lowV is the floor unless the floor lies above the ceiling.
  if (point !== undefined || !(lowV < ceilingV)) return point;
  return floorRingPoint(fall, node, dutyCycle, lowV, ceilingV);
}

/**
 * The balance at the continuous-conduction voltage (the floor, where the span residual at zero
 * span is zero), where the excess, taken as a function of Vo, falls too steeply to solve for Vo.
 * Started at v0 (`ringStartV`), the winding rises as v − v0 = (Vw − v0)·(1 − cos ωt), so the
 * span's residual falls from its value at zero span as t³, the span grows as the cube root of
 * Vo − floor, and the excess falls with it: from the shape without a shared fall (at the floor)
 * by some 5 % of the load within 1e-4 of Vo above it (the bench half bridge at 22.8 % load). Brent's method over Vo then ends on a bracket whose
 * two excesses differ by more than the balance `pointOfRingShape` asks for. Taken by the span t
 * instead (Vo(t) the Vo whose residual at t is zero, smooth in t), the excess is smooth, and the
 * balance is found there. Undefined where the excess does not change sign between zero span and
 * the ring's span just above the floor.
 */
function floorRingPoint(
  fall: FallContext,
  node: NodeCapacitance,
  dutyCycle: number,
  floorV: number,
  ceilingV: number,
): DoubleEndedStagePoint | undefined {
  const scaleV = Math.max(1, Math.abs(ceilingV));
  const io = fall.loadA;
  // The ring's branch just above the floor: its span is the far end of the search.
  const topV = floorV + RING_FLOOR_STEP * scaleV;
  if (!(topV < ceilingV)) return undefined;
  const top = ringShapeAt(fall, node, topV);
  if (top.isPlain === true || !top.isPeriodic || !(top.chargeAS / fall.halfS - io < 0)) {
    return undefined;
  }
  const topSpanS = fall.restS - top.firstS;
  const k = ringConstantsAt(fall, node, floorV);
  const sw = blankRestSwing();
  const shape = blankRingShape(k);
  const lowV = floorV - RING_FLOOR_WIDTH * scaleV;
  const highV = Math.min(ceilingV, floorV + 2 * RING_FLOOR_STEP * scaleV);
  const voltageOptions = { absoluteTolerance: 1e-13 * scaleV };
  let spanVoltageV = NaN;
  const residualAt = (t: number) => (vo: number) => {
    ringConstantsInto(k, fall, vo);
    restSwing(k, sw);
    return spanResidual(fall, k, sw, riseAt(fall, vo), vo + fall.offDropV, t);
  };
  // The excess at span t (`shape`, `k` and `sw` left at that point).
  const excessAtSpan = (t: number) => {
    // Above the far end's Vo the residual at every span up to the far end's is positive.
    spanVoltageV = brentRoot(residualAt(t), lowV, highV, voltageOptions);
    if (!Number.isFinite(spanVoltageV)) return NaN;
    ringConstantsInto(k, fall, spanVoltageV);
    restSwing(k, sw);
    if (!fillRestRingShape(fall, k, sw, riseAt(fall, spanVoltageV), t, shape)) return NaN;
    return shape.chargeAS / fall.halfS - io;
  };
  if (!(excessAtSpan(0) > 0)) return undefined;
  const spanS = brentRoot(excessAtSpan, 0, topSpanS, { absoluteTolerance: 1e-15 * fall.restS });
  if (!Number.isFinite(spanS) || !Number.isFinite(excessAtSpan(spanS))) return undefined;
  return pointOfRingShape(fall, dutyCycle, spanVoltageV, shape);
}

/** How far above the floor the ring's branch is read for the search's far end, over the scale. */
const RING_FLOOR_STEP = 1e-6;
/** How far below the floor Vo(t) is sought, over the scale (a margin: it lies above). */
const RING_FLOOR_WIDTH = 1e-3;

/** The secant's second point beside the hint, over max(1, |ceiling|). */
const RING_HINT_STEP = 1e-6;
/** Secant steps from the hint before Brent's method takes over. */
const RING_SECANT_ITERATIONS = 8;

/**
 * The stage's point at a root Vo of the ring's charge balance; undefined where the root lies
 * outside the ring's cases (where the shape without the ring answers) or is a jump between the
 * cases, not a balance.
 */
function ringPointAt(
  fall: FallContext,
  node: NodeCapacitance,
  dutyCycle: number,
  voltageV: number,
): DoubleEndedStagePoint | undefined {
  const s = ringShapeAt(fall, node, voltageV);
  if (s.isPlain === true || !s.isPeriodic) return undefined;
  return pointOfRingShape(fall, dutyCycle, voltageV, s);
}

/** The stage's point of the ring shape `s` at Vo `voltageV`; undefined unless it balances. */
function pointOfRingShape(
  fall: FallContext,
  dutyCycle: number,
  voltageV: number,
  s: RingShape,
): DoubleEndedStagePoint | undefined {
  const io = fall.loadA;
  if (!(Math.abs(s.chargeAS / fall.halfS - io) <= 1e-7 * io)) return undefined;
  const halfS = fall.halfS;
  return {
    mode: s.valleyA > 0 ? 'ccm' : 'dcm',
    voltageV,
    valleyA: s.valleyA,
    peakA: s.peakA,
    freewheelDutyCycle: 1 - dutyCycle,
    onMeanA: (s.valleyA + s.peakA) / 2,
    sharedFall: {
      magnetizingStartA: s.magnetizingStartA,
      magnetizingEndOfOnA: fall.riseA - s.magnetizingStartA,
      startA: s.start.inductorA,
      endA: s.valleyA,
      startFraction: dutyCycle + s.firstS / halfS,
      endFraction: 1,
      windingVoltageV: s.constants.centreV,
      ring: { constants: s.constants, start: s.start, halfS },
    },
  };
}

/** The ring circuit's constants at a trial Vo. */
function ringConstantsAt(c: FallContext, node: NodeCapacitance, vo: number): RingConstants {
  const circuit: RingCircuit = {
    inductanceH: c.inductanceH,
    referredMagnetizingH: c.referredMagnetizingH,
    capacitanceF: node.capacitanceF,
    clampV: node.clampV,
    pathV: vo + c.onDropV,
    freewheelV: vo + c.offDropV,
  };
  return ringConstants(circuit);
}

/**
 * `ringConstantsAt` written into `k`, whose circuit is the fall's with `node` (`ringWork`): only
 * the voltages change from trial to trial.
 */
function ringConstantsInto(k: RingConstants, c: FallContext, vo: number): RingConstants {
  k.c.pathV = vo + c.onDropV;
  k.c.freewheelV = vo + c.offDropV;
  return refreshRingVoltages(k);
}

/**
 * The end of the first swing of the ring from rest (IL = iM, the winding at v0 = Vj − Voff): at
 * the clamp, or at Vw + (Vw − v0) where the clamp is not reached; where clamped, how long the
 * clamp holds and how fast x = iM − IL falls there. Computed once per trial Vo (the span search
 * reads the ring at many t).
 */
interface RestSwing {
  isClamped: boolean;
  endS: number;
  heldS: number;
  rate: number;
  /** x at the swing's end. */
  x: number;
  /** The winding voltage as the fall starts, v0 = Vj − Voff (`ringStartV`), V. */
  startV: number;
  /** The swing's amplitude about the centre, Vw − v0, V. */
  amplitudeV: number;
}

/**
 * The winding voltage a shared fall from rest starts at, v0 = Vj − Voff: the difference between
 * the conducting path's drop and the freewheeling one's (both at the load current), V. The node
 * capacitance keeps the winding voltage continuous, and with it the inductor's: while both
 * rectifiers freewheel, L·dIL/dt = −Voff; once one has stopped, L·dIL/dt = v − Vj; so the fall
 * starts at v = Vj − Voff (the rectifier that is about to stop carries almost nothing, the other
 * almost all of IL, and the winding sits at the difference of their drops). Started at zero
 * instead, IL first fell faster than in the freewheel, the span's residual rose with the span
 * near zero, and the span jumped from zero to some 2 % of a ring period as Vo rose through the
 * continuous-conduction voltage: a jump of the excess of up to a tenth of the load there
 * (DEVELOPERS.md, "Stray states and regulation misses").
 */
function ringStartV(c: RingCircuit): number {
  return c.pathV - c.freewheelV;
}

/** Fills `sw` with the first swing of the ring `k` from rest and returns it. */
function restSwing(k: RingConstants, sw: RestSwing): RestSwing {
  const vw = k.centreV;
  const vs = k.c.clampV;
  const v0 = ringStartV(k.c);
  const amplitudeV = vw - v0;
  sw.startV = v0;
  sw.amplitudeV = amplitudeV;
  const isClamped = amplitudeV > 0 && vw + amplitudeV > vs;
  const endS = isClamped
    ? (Math.PI - Math.acos((vs - vw) / amplitudeV)) / k.omega
    : Math.PI / k.omega;
  const x = swingX(k, sw, endS);
  const rate = (vs - vw) / k.parallelH;
  sw.isClamped = isClamped;
  sw.endS = endS;
  sw.heldS = isClamped ? x / rate : 0;
  sw.rate = rate;
  sw.x = x;
  return sw;
}

/** A `RestSwing` to fill; NaN, so that its numbers are doubles from the start. */
function blankRestSwing(): RestSwing {
  return {
    isClamped: false,
    endS: NaN,
    heldS: NaN,
    rate: NaN,
    x: NaN,
    startV: NaN,
    amplitudeV: NaN,
  };
}

/*
 * The ring from rest t seconds into the shared fall: the winding voltage, x = iM − IL and ∫x dt,
 * each read on its own (the span search needs x and v at every step, ∫x dt only at the end). It
 * swings v = Vw − (Vw − v0)·cos ωt and, where that exceeds the clamp, is held at the clamp until
 * x returns to zero, then rings about Vw with the rest.
 */

/** x = iM − IL of the ring from rest at t, A. */
function restRingX(k: RingConstants, sw: RestSwing, t: number): number {
  if (t <= sw.endS) return swingX(k, sw, t);
  if (!sw.isClamped || t > sw.endS + sw.heldS) return 0;
  return sw.x - sw.rate * Math.min(t - sw.endS, sw.heldS);
}

/** The winding voltage of the ring from rest at t, V. */
function restRingV(k: RingConstants, sw: RestSwing, t: number): number {
  if (t <= sw.endS) return k.centreV - sw.amplitudeV * Math.cos(k.omega * t);
  return sw.isClamped && t <= sw.endS + sw.heldS ? k.c.clampV : k.centreV;
}

/** ∫x dt of the ring from rest over (0, t), given x at t, A·s. */
function restRingXIntegral(k: RingConstants, sw: RestSwing, t: number, x: number): number {
  if (t <= sw.endS) return swingXIntegral(k, sw, t, x);
  // Past the first swing: its whole integral (needed once per trial, so not kept in `sw`).
  const swingIntegral = swingXIntegral(k, sw, sw.endS, sw.x);
  if (!sw.isClamped) return swingIntegral;
  const tau = Math.min(t - sw.endS, sw.heldS);
  return swingIntegral + sw.x * tau - (sw.rate * tau * tau) / 2;
}

/** The first swing from rest: x = ((Vw − v0)/Z)·sin ωt. */
function swingX(k: RingConstants, sw: RestSwing, t: number): number {
  return (sw.amplitudeV / k.impedanceOhm) * Math.sin(k.omega * t);
}

/**
 * The first swing's ∫x dt over the waveforms' samples (`ringAdvance`'s rule: whole steps by the
 * trapezoid factor, the last step as a trapezoid), given x at t; v = Vw − (Vw − v0)·cos ωt.
 */
function swingXIntegral(k: RingConstants, sw: RestSwing, t: number, x: number): number {
  const w = k.omega;
  const wholeS = wholeStepsS(w, t);
  const wholeRiseV = sw.amplitudeV * (1 - Math.cos(w * wholeS));
  const wholeX = (sw.amplitudeV / k.impedanceOhm) * Math.sin(w * wholeS);
  return RING_TRAPEZOID_FACTOR * k.c.capacitanceF * wholeRiseV + ((wholeX + x) / 2) * (t - wholeS);
}

/**
 * The lowest inductor current of a shared fall that starts from rest at `startA` and lasts
 * `spanS`: IL = start − g·t − share·x falls while v < Vo + Vf, so its minima are where v rises
 * through Vo + Vf, and at the end. `xAtSpan` is x at the end, `restRingX(k, sw, spanS)`, which
 * the caller has already.
 */
function restRingLowestA(
  k: RingConstants,
  sw: RestSwing,
  startA: number,
  spanS: number,
  xAtSpan: number,
): number {
  const vw = k.centreV;
  const vj = k.c.pathV;
  const endA = startA - k.slopeAPerS * spanS - k.share * xAtSpan;
  // The first swing's minimum, where v = Vw − (Vw − v0)·cos ωt rises through Vo + Vf (below the
  // clamp; v0 < Vo + Vf, since Voff > 0).
  const a = sw.amplitudeV;
  const dipS = a > 0 && vj < vw + a ? Math.acos((vw - vj) / a) / k.omega : Infinity;
  if (!(dipS < spanS)) return endA;
  return Math.min(endA, startA - k.slopeAPerS * dipS - k.share * restRingX(k, sw, dipS));
}

/** The fast case's residual: rest − t − L·(ΔIL − g·t − share·x(t))/Voff, and its slope. */
function spanResidual(
  c: FallContext,
  k: RingConstants,
  sw: RestSwing,
  deltaA: number,
  offV: number,
  t: number,
): number {
  return (
    c.restS -
    t -
    (c.inductanceH * (deltaA - k.slopeAPerS * t - k.share * restRingX(k, sw, t))) / offV
  );
}

/**
 * The shared fall's span t in (0, rest) where `spanResidual` is zero (positive at 0, negative at
 * rest): Newton's method from the span without the ring, its slope −1 + (Vo + Vf − v(t))/Voff
 * (v at the centre once the ring has settled), kept in the bracket by bisection.
 */
function fallSpan(
  c: FallContext,
  k: RingConstants,
  sw: RestSwing,
  deltaA: number,
  offV: number,
): number {
  const l = c.inductanceH;
  let lo = 0;
  let hi = c.restS;
  const plain = (c.restS - (l * deltaA) / offV) / (1 - (l * k.slopeAPerS) / offV);
  let t = plain > lo && plain < hi ? plain : (lo + hi) / 2;
  for (let iteration = 0; iteration < 60; iteration++) {
    const f =
      c.restS - t - (l * (deltaA - k.slopeAPerS * t - k.share * restRingX(k, sw, t))) / offV;
    if (Math.abs(f) <= 1e-14 * c.restS) return t;
    if (f > 0) lo = t;
    else hi = t;
    const slope = -1 + (k.c.pathV - restRingV(k, sw, t)) / offV;
    let next = slope < 0 ? t - f / slope : (lo + hi) / 2;
    if (!(next > lo && next < hi)) next = (lo + hi) / 2;
    if (Math.abs(next - t) <= 1e-14 * c.restS || hi - lo <= 1e-14 * c.restS) return next;
    t = next;
  }
  return t;
}

/**
 * The periodic half at a trial Vo. The common case in closed form: the shared fall starts from
 * rest (IL ends the on-time above n·Im) and IL stays above zero; its span t solves
 * rest − t = L·(ΔIL − g·t − share·x(t))/Voff (the freewheel before it). Where the inductor
 * alone falls through the whole freewheel (at the continuous-conduction voltage) the shape has no
 * shared fall; where IL would end the on-time below n·Im (towards the ceiling) the fall starts
 * as the on-time ends (`fillLateRingShape`; where IL reaches zero there, one simulated half from
 * the shape without the ring, else that shape). Else (the ring takes IL to zero) the valley and
 * the magnetizing start such that the simulated half ends where it started, by Newton's method.
 */
function ringShapeAt(
  c: FallContext,
  node: NodeCapacitance,
  vo: number,
  work?: RingWork,
): RingShape {
  // With `work`, the common case's shape is written into it (valid until the next trial).
  const k =
    work === undefined ? ringConstantsAt(c, node, vo) : ringConstantsInto(work.constants, c, vo);
  const offV = vo + c.offDropV;
  const deltaA = riseAt(c, vo);
  const sw = restSwing(k, work === undefined ? blankRestSwing() : work.swing);
  if (!(spanResidual(c, k, sw, deltaA, offV, 0) > 0)) return plainRingShape(c, k, vo, work);
  if (!(spanResidual(c, k, sw, deltaA, offV, c.restS) < 0)) {
    // A late fall: IL ends the on-time at or below n·Im, so the fall starts at once, with
    // x = iM − IL ≥ 0 already (the ring carries it; the shape without the ring returns it at once).
    const shape = work === undefined ? blankRingShape(k) : work.shape;
    if (fillLateRingShape(c, k, deltaA, shape)) return shape;
    const general = generalRingShape(c, k, vo, deltaA, offV, RING_LATE_ITERATIONS);
    return general.isPeriodic ? general : plainRingShape(c, k, vo, work);
  }
  const t = fallSpan(c, k, sw, deltaA, offV);
  const shape = work === undefined ? blankRingShape(k) : work.shape;
  if (fillRestRingShape(c, k, sw, deltaA, t, shape)) return shape;
  return generalRingShape(c, k, vo, deltaA, offV);
}

/**
 * Fills `shape` with the half whose shared fall starts from rest and lasts `spanS` (the common
 * case of `ringShapeAt`): the start and valley from periodicity, Ib = (rise + g·t − (1 − share)·x)/2
 * and Iv = Ib − g·t − share·x, and the half's charge. False (and `shape` not a ring shape) where
 * IL would reach zero in the fall (the general case answers then).
 */
function fillRestRingShape(
  c: FallContext,
  k: RingConstants,
  sw: RestSwing,
  deltaA: number,
  spanS: number,
  shape: RingShape,
): boolean {
  const t = spanS;
  const g = k.slopeAPerS;
  const share = k.share;
  const x = restRingX(k, sw, t);
  const startA = (c.riseA + g * t - (1 - share) * x) / 2;
  const valleyA = startA - g * t - share * x;
  if (!(valleyA >= 0 && restRingLowestA(k, sw, startA, t, x) >= 0)) return false;
  const peakA = valleyA + deltaA;
  const firstS = c.restS - t;
  shape.isPlain = false;
  shape.isPeriodic = true;
  shape.valleyA = valleyA;
  shape.peakA = peakA;
  shape.magnetizingStartA = c.riseA - startA;
  shape.firstS = firstS;
  shape.start.inductorA = startA;
  shape.start.magnetizingA = startA;
  shape.start.windingV = sw.startV;
  shape.chargeAS =
    ((valleyA + peakA) / 2) * c.onS +
    ((peakA + startA) / 2) * firstS +
    startA * t -
    (g * t * t) / 2 -
    share * restRingXIntegral(k, sw, t, x);
  return true;
}

/**
 * Fills `shape` with the periodic late fall (the fall starting as the on-time ends, from
 * IL = Iv + ΔIL and iM = rise − a, the winding at v0 = Vj − Voff) in closed form, where IL stays
 * above zero: false (`shape` not a ring shape) where it reaches zero or no such half is
 * periodic (`ringShapeAt` answers then). In every stretch (the ring, the clamp, the
 * settled fall) u = (L·IL + Lr·iM)/(L + Lr) falls at g = Vj/(L + Lr), and IL = u − share·x,
 * iM = u + (1 − share)·x with x = iM − IL; x0 = rise − a − Iv − ΔIL is linear in the valley Iv
 * and the magnetizing start a, and so is the ring's x at a fixed time. Periodicity (Iv and a
 * the half's ending IL and iM) is then a linear solve: a = P0 = ((1 − share)·ΔIL + share·rise −
 * g·rest)/(2·share) and Iv = P0 − x(rest). Where the first swing (and the clamp's hold) ends
 * within the rest, x(rest) = 0; else x(rest) = d = x0·cos ωR − (y0/Z)·sin ωR with
 * x0 = rise − ΔIL − 2·P0 + d, y0 = v0 − Vw, so d = (C·(rise − ΔIL − 2·P0) − (y0/Z)·S)/(1 − C)
 * (C, S the cosine and sine of ω·rest). The charge is u's integral less share·∫x dt, the latter
 * over the waveforms' samples (`ringAdvance`'s rule), so the shape is the one `simulateRing`
 * gives from its start. ref: common practice, a series LC ring about its source voltage (as in
 * `ringAdvance`); the periodic solve is this model's own.
 */
function fillLateRingShape(
  c: FallContext,
  k: RingConstants,
  deltaA: number,
  shape: RingShape,
): boolean {
  const share = k.share;
  const g = k.slopeAPerS;
  const vw = k.centreV;
  const vs = k.c.clampV;
  const v0 = ringStartV(k.c);
  if (!(v0 < vw) || !(vw < vs) || !(share > 0)) return false;
  const p0 = ((1 - share) * deltaA + share * c.riseA - g * c.restS) / (2 * share);
  const swing = lateSwing(k, v0, c.restS, c.riseA - deltaA - 2 * p0);
  if (swing === undefined) return false;
  const valleyA = p0 - swing.endX;
  if (!(valleyA >= 0)) return false;
  const peakA = valleyA + deltaA;
  const u0 = (1 - share) * peakA + share * (c.riseA - p0);
  // IL falls while v < Vj: its lowest is where v rises through Vj within the swing, or the end.
  const { r, alpha } = swing;
  const w = k.omega;
  const z = k.impedanceOhm;
  const vj = k.c.pathV;
  if (vj > vw - r && vj < vw + r) {
    const dipS = (alpha - Math.acos((vj - vw) / r)) / w;
    if (dipS > 0 && dipS < swing.swingS) {
      const dipX = (r * Math.sin(alpha - w * dipS)) / z;
      if (!(u0 - g * dipS - share * dipX >= 0)) return false;
    }
  }
  // ∫x dt: the swing over its samples (`ringAdvance`'s rule), then the clamp's linear fall.
  const y0 = v0 - vw;
  const wholeS = wholeStepsS(w, swing.swingS);
  const wholeY = r * Math.cos(w * wholeS - alpha);
  const wholeX = (r * Math.sin(alpha - w * wholeS)) / z;
  const heldS = swing.heldS;
  const xIntegral =
    RING_TRAPEZOID_FACTOR * k.c.capacitanceF * (wholeY - y0) +
    ((wholeX + swing.swingEndX) / 2) * (swing.swingS - wholeS) +
    swing.swingEndX * heldS -
    (swing.clampRate * heldS * heldS) / 2;
  shape.isPlain = false;
  shape.isPeriodic = true;
  shape.valleyA = valleyA;
  shape.peakA = peakA;
  shape.magnetizingStartA = p0;
  shape.firstS = 0;
  shape.start.inductorA = peakA;
  shape.start.magnetizingA = c.riseA - p0;
  shape.start.windingV = v0;
  shape.chargeAS =
    ((valleyA + peakA) / 2) * c.onS +
    u0 * c.restS -
    (g * c.restS * c.restS) / 2 -
    share * xIntegral;
  return true;
}

/**
 * The first swing of a periodic late fall over the rest `restS` (`fillLateRingShape`), where
 * x0 = `freeX` + x(rest): x0 and the ring's amplitude r and phase α (v − Vw = r·cos(ωt − α),
 * x = (r/Z)·sin(α − ωt)), how long it rings (`swingS`), how long the clamp then holds within the
 * rest (`heldS`, x falling at `clampRate` from `swingEndX`), and x at the rest (`endX`).
 * Undefined where no x0 ≥ 0 makes it periodic.
 */
interface LateSwing {
  r: number;
  alpha: number;
  swingS: number;
  swingEndX: number;
  heldS: number;
  clampRate: number;
  endX: number;
}

function lateSwing(
  k: RingConstants,
  v0: number,
  restS: number,
  freeX: number,
): LateSwing | undefined {
  const w = k.omega;
  const z = k.impedanceOhm;
  const y0 = v0 - k.centreV;
  const out: LateSwing = {
    r: NaN,
    alpha: NaN,
    swingS: NaN,
    swingEndX: NaN,
    heldS: NaN,
    clampRate: (k.c.clampV - k.centreV) / k.parallelH,
    endX: NaN,
  };
  // The swing (and the clamp's hold) ends within the rest: x(rest) = 0, x0 = freeX.
  if (freeX >= 0 && lateSwingAt(k, v0, restS, freeX, out).endX === 0) return out;
  // The swing runs past the rest unclamped: x(rest) = x0·cos ωR − (y0/Z)·sin ωR, linear in x0.
  const cos = Math.cos(w * restS);
  const sin = Math.sin(w * restS);
  if (cos < 1) {
    const endX = (cos * freeX - (y0 / z) * sin) / (1 - cos);
    const x0 = freeX + endX;
    if (x0 >= 0 && lateSwingAt(k, v0, restS, x0, out).heldS === 0 && out.swingS === restS) {
      out.endX = endX;
      return out;
    }
  }
  // The clamp holds past the rest: x(rest) − (x0 − freeX), one unknown, by Brent's method
  // (x(rest) ≥ 0 and below x0, so the root lies in [max(0, −freeX), max(0, −freeX) + x0's span]).
  const clampRate = out.clampRate;
  const lowX = Math.max(0, -freeX);
  const highX = lowX + Math.abs(freeX) + hypotenuse(y0 / z, clampRate * restS) + clampRate * restS;
  const gap = lateGapOf(k, v0, restS, freeX, out);
  if (!(gap(lowX) >= 0) || !(gap(highX) <= 0)) return undefined;
  const endX = brentRoot(gap, lowX, highX, { absoluteTolerance: 1e-15 * highX });
  if (!Number.isFinite(endX)) return undefined;
  lateSwingAt(k, v0, restS, freeX + endX, out);
  out.endX = endX;
  return out;
}

/** The late swing from x0 (`lateSwing`) written into `out`: x at the rest, with its pieces. */
function lateSwingAt(
  k: RingConstants,
  v0: number,
  restS: number,
  x0: number,
  out: LateSwing,
): LateSwing {
  const w = k.omega;
  const z = k.impedanceOhm;
  const vw = k.centreV;
  const vs = k.c.clampV;
  const y0 = v0 - vw;
  const r = hypotenuse(y0, x0 * z);
  const alpha = Math.atan2(x0 * z, y0);
  out.r = r;
  out.alpha = alpha;
  const clampS = vw + r > vs ? (alpha - Math.acos((vs - vw) / r)) / w : Infinity;
  if (clampS < restS) {
    const clampX = Math.sqrt(r * r - (vs - vw) * (vs - vw)) / z;
    out.swingS = clampS;
    out.swingEndX = clampX;
    out.heldS = Math.min(restS - clampS, clampX / out.clampRate);
    out.endX = Math.max(0, clampX - out.clampRate * (restS - clampS));
  } else if (alpha <= w * restS) {
    out.swingS = alpha / w;
    out.swingEndX = 0;
    out.heldS = 0;
    out.endX = 0;
  } else {
    out.swingS = restS;
    out.endX = (r * Math.sin(alpha - w * restS)) / z;
    out.swingEndX = out.endX;
    out.heldS = 0;
  }
  return out;
}

/** x(rest) less x(rest)'s trial value, for Brent's method (a factory: see `excessOf`). */
function lateGapOf(
  k: RingConstants,
  v0: number,
  restS: number,
  freeX: number,
  out: LateSwing,
): (endX: number) => number {
  return (endX) => lateSwingAt(k, v0, restS, freeX + endX, out).endX - endX;
}

/**
 * Newton steps of the simulated late fall (`generalRingShape`) where the closed form fails (IL
 * reaching zero, or no periodic half with IL above zero): one, so a single simulated half from
 * the shape without the ring, kept where it is periodic (IL and iM ending at rest, the deepest
 * loads). With 40 steps, as the fall from rest takes, the trials near the ceiling, where none is
 * periodic, took 120 simulated halves each (most of a design's simulation, making it
 * measurably slower); with 6 the bench designs simulated 41–148 halves, with one 3–19, and the
 * wide scan of DEVELOPERS.md ("Stray states and regulation misses") found no half- or
 * full-bridge miss with either.
 */
const RING_LATE_ITERATIONS = 1;

/** A `RingShape` of the ring `k` to fill (the shared fall from rest). */
function blankRingShape(k: RingConstants): RingShape {
  return {
    isPeriodic: false,
    isPlain: false,
    valleyA: NaN,
    peakA: NaN,
    magnetizingStartA: NaN,
    firstS: NaN,
    start: { inductorA: NaN, magnetizingA: NaN, windingV: 0 },
    chargeAS: NaN,
    constants: k,
  };
}

/**
 * The shape without a shared fall (the continuous-conduction voltage or below); with `work`,
 * written into its shape (valid until the next trial), as the common case is.
 */
function plainRingShape(c: FallContext, k: RingConstants, vo: number, work?: RingWork): RingShape {
  const s = shapeAt(c, vo);
  const shape = work === undefined ? blankRingShape(k) : work.shape;
  shape.isPlain = true;
  shape.isPeriodic = s.endA <= s.valleyA + 1e-9 * s.peakA;
  shape.valleyA = s.valleyA;
  shape.peakA = s.peakA;
  shape.magnetizingStartA = s.valleyA;
  shape.firstS = c.restS;
  shape.start.inductorA = s.startA;
  shape.start.magnetizingA = s.startA;
  shape.start.windingV = 0;
  shape.chargeAS = s.mean * c.halfS;
  return shape;
}

/** One half simulated from a valley and a magnetizing start: where it ends, and its charge. */
function simulatedHalf(
  c: FallContext,
  k: RingConstants,
  deltaA: number,
  offV: number,
  valleyA: number,
  magnetizingStartA: number,
) {
  const l = c.inductanceH;
  const peakA = valleyA + deltaA;
  const endOfOnA = c.riseA - magnetizingStartA;
  // IL above iM at the end of the on-time: both rectifiers freewheel until IL meets iM.
  const firstS = peakA > endOfOnA ? Math.min(c.restS, (l * (peakA - endOfOnA)) / offV) : 0;
  const meetA = peakA - (offV * firstS) / l;
  // The fall starts where the freewheel leaves the winding (`ringStartV`).
  const start: RingState = { inductorA: meetA, magnetizingA: endOfOnA, windingV: ringStartV(k.c) };
  const run = simulateRing(k, start, c.restS - firstS);
  return {
    peakA,
    firstS,
    start,
    end: run.end,
    isComplete: run.isComplete,
    chargeAS: ((valleyA + peakA) / 2) * c.onS + ((peakA + meetA) / 2) * firstS + run.chargeAS,
  };
}

function generalRingShape(
  c: FallContext,
  k: RingConstants,
  vo: number,
  deltaA: number,
  offV: number,
  iterations = 40,
): RingShape {
  // Start from the shape without the ring.
  const plain = shapeAt(c, vo);
  let valleyA = plain.valleyA;
  let startA = plain.valleyA;
  const scaleA = Math.max(c.riseA, deltaA, c.loadA);
  const h = 1e-7 * scaleA;
  const fail: RingShape = {
    isPeriodic: false,
    valleyA,
    peakA: valleyA + deltaA,
    magnetizingStartA: startA,
    firstS: 0,
    start: { inductorA: 0, magnetizingA: 0, windingV: 0 },
    chargeAS: 0,
    constants: k,
  };
  for (let iteration = 0; iteration < iterations; iteration++) {
    const half = simulatedHalf(c, k, deltaA, offV, valleyA, startA);
    if (!half.isComplete) return fail;
    const r1 = half.end.inductorA - valleyA;
    const r2 = half.end.magnetizingA - startA;
    if (Math.abs(r1) <= 1e-11 * scaleA && Math.abs(r2) <= 1e-11 * scaleA) {
      return {
        isPeriodic: true,
        valleyA,
        peakA: half.peakA,
        magnetizingStartA: startA,
        firstS: half.firstS,
        start: half.start,
        chargeAS: half.chargeAS,
        constants: k,
      };
    }
    if (iteration === iterations - 1) break;
    // Forward differences (the valley stays at or above zero).
    const hv = valleyA + h;
    const byValley = simulatedHalf(c, k, deltaA, offV, hv, startA);
    const byStart = simulatedHalf(c, k, deltaA, offV, valleyA, startA + h);
    const a11 = (byValley.end.inductorA - hv - half.end.inductorA + valleyA) / h;
    const a21 = (byValley.end.magnetizingA - half.end.magnetizingA) / h;
    const a12 = (byStart.end.inductorA - half.end.inductorA) / h;
    const a22 = (byStart.end.magnetizingA - startA - h - half.end.magnetizingA + startA) / h;
    const det = a11 * a22 - a12 * a21;
    if (!(Math.abs(det) > 0)) return fail;
    const dv = (-r1 * a22 + r2 * a12) / det;
    const ds = (-r2 * a11 + r1 * a21) / det;
    valleyA = Math.max(0, valleyA + dv);
    startA += ds;
    if (!Number.isFinite(valleyA) || !Number.isFinite(startA)) return fail;
  }
  return fail;
}

/**
 * The secondary's drops at the load current: on the driven path (rectifier, winding, inductor)
 * and on the freewheeling one (freewheel or rectifier, inductor), V.
 */
export function loadDropsV(stage: OutputStage): { onDropV: number; offDropV: number } {
  const io = stage.loadA;
  const { forwardVoltageV: vf, resistanceOhm: rd } = stage.rectifier;
  const { forwardVoltageV: offVf, resistanceOhm: offRd } = stage.freewheel ?? stage.rectifier;
  const rl = stage.inductorResistanceOhm;
  return {
    onDropV: vf + (stage.windingResistanceOhm + rd + rl) * io,
    offDropV: offVf + (offRd + rl) * io,
  };
}
