import type { DoubleEndedDesign } from '../../design/design-schema.js';
import { rectifierModel } from '../../devices/rectifier-model.js';
import { brentRoot } from '../../root-finding/brent-root.js';
import { secantRoot } from '../../root-finding/secant-root.js';
import type { Spec } from '../../spec/spec-schema.js';
import { outputStagePoint, type OutputStage } from '../buck-derived/output-stage.js';
import type { OperatingCorner } from '../topology.js';
import {
  freewheelSwingDuty,
  lightLoadPoint,
  loadDropsV,
  type DoubleEndedStagePoint,
  type NodeCapacitance,
} from './light-load-point.js';
import {
  settledHalfAtGate,
  solveEventHalf,
  solveEventHalfBracketed,
  type EventContext,
  type EventHalf,
  type EventHalfGuess,
  type EventMemory,
} from './event-half.js';
import { LIGHT_LOAD_MIN_ON_TIME_S } from '../light-load-min-on-time.js';
import { solvePushPullLeakyRegulated, type PushPullLeakyOutput } from './push-pull-leaky-half.js';
import { ringConstants, simulateRing } from './node-ring.js';
import { bridgeOffTiming, leakageRingA } from './bridge-turn-on-ring.js';
import { DOUBLE_ENDED_DUTY_CYCLE_MAX, type PrimaryBridge } from './primary-bridge.js';
import { pushPullRingLeakageH } from './push-pull-ring-leakage.js';
import { referredOutputs, stageDrops, type StageDrops } from './referred-outputs.js';
import {
  shootSeveralOutputs,
  shotDrawing,
  type ShotCircuit,
  type ShotHalf,
} from './several-outputs-shooting.js';
import {
  followOutput,
  type EquivalentHalf,
  type FollowedOutput,
} from './several-outputs-events.js';
import { secondaryStage, type SecondaryArrangement } from './secondary-stage.js';
import { severalOutputsFall } from './several-outputs-fall.js';

/** What a push-pull or bridge design chose. */
export type DoubleEndedChoices = DoubleEndedDesign['choices'];

/** A double-ended converter at one corner, as the steady state sees it (SI units). */
export interface DoubleEndedCircuit {
  bridge: PrimaryBridge;
  inputVoltageV: number;
  /** Voltage the switches apply to the winding: Vin, or Vin/2 for the half bridge, V. */
  driveVoltageV: number;
  periodS: number;
  magnetizingInductanceH: number;
  /** Primary-referred leakage inductance, H. */
  leakageInductanceH: number;
  /** The on-resistance of the switches in the path plus the primary winding resistance, Ω. */
  primaryLoopResistanceOhm: number;
  primaryResistanceOhm: number;
  /** Drain capacitance across the winding: the bridge's factor times one switch's, F. */
  nodeCapacitanceF: number;
  /** One switch's body-diode drop (the spec's `bodyDiodeForwardVoltageV`), V. */
  bodyDiodeVoltageV: number;
  turnsRatios: readonly number[];
  arrangements: readonly SecondaryArrangement[];
  /** Each output's buck-derived stage, seen over half a switching period. */
  stages: readonly OutputStage[];
  /** The push-pull's clamp level above the input rail (`choices.clampVoltageV`), V. */
  clampVoltageV?: number | undefined;
}

/** The periodic steady state at one duty cycle (each switch's on-time over the period). */
export interface DoubleEndedState {
  dutyCycle: number;
  /**
   * Turn-on commutation over the period: the primary current rises through the leakage while
   * every rectifier conducts and the winding is held at zero.
   */
  commutationFraction: number;
  /**
   * The turn-off swing over the period, t_s/T: as the switches open, the primary current
   * charges the node capacitance and the winding falls from the drive voltage to zero over t_s
   * (`turnOffSwingS`). Its volt-seconds, those of t_s/2 of drive, are taken as a stretch of the
   * on-time: every stage sees duty 2·(D − commutation) + t_s/T. Zero where the stage has a
   * shared fall (light load: the ring's own fall models that stretch) or without node
   * capacitance.
   */
  turnOffSwingFraction: number;
  /** Voltage across the magnetizing inductance while driven, V. */
  primaryVoltageV: number;
  /** Peak of the magnetizing current, reached as the on-interval ends, A. */
  magnetizingPeakA: number;
  /**
   * Magnetizing current as the positive half starts, A: −peak while the rectifiers carry it
   * through the freewheeling interval; else the next valley over n (or 0) after the shared fall.
   */
  magnetizingStartA: number;
  /** Each stage's steady state over half a period, at duty 2·(D − commutation) + t_s/T. */
  points: DoubleEndedStagePoint[];
  /**
   * Whether the stages took less than the whole turn-off swing (`freewheelSwingDuty`: near the
   * shared fall's boundary), so that the one-output event model should take the corner.
   */
  isSwingHeld?: boolean;
  /** Whether the state is the event model's (`eventState`). */
  isEvent?: boolean;
  /**
   * The push-pull's leaky light-load half (`push-pull-leaky-half.ts`) gave the state: the power
   * its clamp takes (both switches, W), which replaces the turn-off spike's and the turn-on
   * ring's (the half holds both rings), the drain the switch turns on into, V, and the driven
   * switch's highest current while on (its leakage's, the turn-on ring's current in it), A, and
   * the highest drain voltage over the half, V.
   */
  leakyHalf?: { clampW: number; turnOnDrainV: number; switchPeakA: number; drainPeakV: number };
  /**
   * Where the event model was tried for this corner and not taken (`EventMiss`), so the older
   * light-load model was kept: why, for the corner's `modelFallback`.
   */
  modelFallback?: string;
  /**
   * Where the corner is solved at the shortest on-time (`floorEventState`: no duty cycle holds
   * the regulated output, the drain capacitance's energy alone exceeding the load's), how far
   * the first output rose above its target there, V (above zero); the state's first output is at
   * target + this. Absent where the output is regulated.
   */
  floorRiseV?: number;
  /**
   * The bridges' leakage current still flowing, from the half just ended, as the next switches
   * turn on, A (`leakageCarryA`): the turn-off decay through the opposite switches' body diodes
   * outlasted the off-time, so the turn-on commutation sweeps from it through zero. Zero or
   * absent where the decay ends within the off-time (and for the push-pull, whose leakage goes to
   * its clamp, and at light load).
   */
  leakageCarryA?: number;
  /**
   * Where a bridge's leakage decay ends within the off-time: the current the leakage's ring with
   * the node capacitance has built towards the next half by its turn-on, A (`leakageRingA`), from
   * which the turn-on commutation starts. Zero or absent elsewhere.
   */
  leakageRingA?: number;
}

/** Default copper resistance of an output inductor at 20 °C, Ω, when the spec gives none. */
export const INDUCTOR_RESISTANCE_DEFAULT_OHM = 0.01;

/** Returns the circuit of `corner`: the spec's devices, the chosen parts, the corner's load. */
export function doubleEndedCircuit(
  spec: Spec,
  bridge: PrimaryBridge,
  choices: DoubleEndedChoices,
  corner: OperatingCorner,
): DoubleEndedCircuit {
  return {
    bridge,
    inputVoltageV: corner.inputVoltageV,
    driveVoltageV: bridge.driveFraction * corner.inputVoltageV,
    periodS: 1 / spec.switchingFrequencyHz,
    magnetizingInductanceH: choices.magnetizingInductanceH,
    leakageInductanceH: choices.leakageInductanceH,
    primaryLoopResistanceOhm:
      bridge.switchesInPath * spec.primarySwitch.onResistanceOhm + choices.primaryResistanceOhm,
    primaryResistanceOhm: choices.primaryResistanceOhm,
    nodeCapacitanceF: bridge.nodeCapacitanceFactor * spec.primarySwitch.outputCapacitanceF,
    bodyDiodeVoltageV: spec.primarySwitch.bodyDiodeForwardVoltageV,
    turnsRatios: choices.outputTurnsRatios,
    arrangements: choices.secondaryArrangements,
    stages: spec.outputs.map((output, k) =>
      secondaryStage(choices.secondaryArrangements[k] ?? 'center-tapped', {
        loadA: output.currentA * corner.loadFraction,
        inductanceH: choices.outputInductancesH[k] ?? 0,
        inductorResistanceOhm: choices.outputInductorResistancesOhm[k] ?? 0,
        windingResistanceOhm: choices.outputWindingResistancesOhm[k] ?? 0,
        rectifier: rectifierModel(output.rectifier),
      }),
    ),
    clampVoltageV: bridge.kind === 'push-pull' ? choices.clampVoltageV : undefined,
  };
}

/**
 * `circuit` with other turns ratios, as a literal with `doubleEndedCircuit`'s fields in its
 * order, not `{ ...circuit, turnsRatios }`: the spread gave the turns-ratio search's circuits
 * (some 60 trial states a design) an object shape of their own, so the fixed point read two
 * shapes of circuit; with one shape a double-ended design took about 3 % less CPU (same
 * results to the bit).
 */
export function withTurnsRatios(
  circuit: DoubleEndedCircuit,
  turnsRatios: readonly number[],
): DoubleEndedCircuit {
  return sameShapeCircuit(circuit, turnsRatios, circuit.nodeCapacitanceF);
}

/** `circuit` with the given turns ratios and node capacitance, in its one object shape. */
function sameShapeCircuit(
  circuit: DoubleEndedCircuit,
  turnsRatios: readonly number[],
  nodeCapacitanceF: number,
): DoubleEndedCircuit {
  return {
    bridge: circuit.bridge,
    inputVoltageV: circuit.inputVoltageV,
    driveVoltageV: circuit.driveVoltageV,
    periodS: circuit.periodS,
    magnetizingInductanceH: circuit.magnetizingInductanceH,
    leakageInductanceH: circuit.leakageInductanceH,
    primaryLoopResistanceOhm: circuit.primaryLoopResistanceOhm,
    primaryResistanceOhm: circuit.primaryResistanceOhm,
    nodeCapacitanceF,
    bodyDiodeVoltageV: circuit.bodyDiodeVoltageV,
    turnsRatios,
    arrangements: circuit.arrangements,
    stages: circuit.stages,
    clampVoltageV: circuit.clampVoltageV,
  };
}

/** Options of {@link doubleEndedStateAt}. */
export interface DoubleEndedStateOptions {
  /**
   * The fixed point settles when a pass moves the primary voltage by at most this times Vd and
   * the commutation fraction by at most this.
   * @defaultValue 1e-13
   */
  relativeTolerance?: number;
}

const STATE_DEFAULTS = { relativeTolerance: 1e-13 } satisfies Required<DoubleEndedStateOptions>;

/**
 * Returns the steady state at duty cycle D. Each half-period drives the winding at ±Vd (Vin or
 * Vin/2) for D·T, then leaves it at zero while the secondary freewheels, so every output stage is
 * a buck at twice the switching frequency and duty 2·D: Vo = 2·D·Vd/n less the drops (Mohan,
 * Undeland, Robbins, 3rd ed. (from memory), §10-5). The winding voltage is Vd less the loop
 * resistance at the mean on-current Σ ILon,k/nk (the magnetizing current's mean over the
 * on-time is zero) and the leakage's Llk·di/dt; the magnetizing current swings symmetrically,
 * Im,pk = Vp·D·T/(2·Lm) (volt-second balance over the two halves: no DC), as long as the
 * freewheeling rectifiers can carry it. Below that (light load) the shared fall sets the
 * magnetizing current's start and end (`lightLoadPoint` for one output, `severalOutputsFall` for
 * several), and the primary's
 * mean on-current and slope include the magnetizing current's. A fixed point, since the stages
 * depend on Vp.
 */
export function doubleEndedStateAt(
  circuit: DoubleEndedCircuit,
  dutyCycle: number,
  start?: DoubleEndedState,
  options: DoubleEndedStateOptions = {},
): DoubleEndedState {
  const relativeTolerance = options.relativeTolerance ?? STATE_DEFAULTS.relativeTolerance;
  const { driveVoltageV: vd, periodS, magnetizingInductanceH: lm } = circuit;
  // A warm start (a nearby duty cycle or turns ratio's state) shortens the passes, which stop
  // to the same tolerance; at light load it can also lead them to another of the ring's states
  // than a fresh start would (DEVELOPERS.md, "Stray states and regulation misses").
  const isWarm =
    start !== undefined &&
    Number.isFinite(start.primaryVoltageV) &&
    Number.isFinite(start.commutationFraction);
  let primaryV = isWarm ? start.primaryVoltageV : vd;
  let points: DoubleEndedStagePoint[] = isWarm ? start.points : [];
  let magnetizingPeakA = 0;
  let magnetizingStartA = 0;
  // Built once, not at every pass: it depends on the circuit alone.
  const node = firstNodeCapacitance(circuit);
  let commutation = isWarm ? Math.min(start.commutationFraction, 0.9 * dutyCycle) : 0;
  // The swing follows the last pass's turn-off current (a plain fixed-point step: it moves the
  // duty by some 1e-3 of itself, and the pass's residuals stay those of (Vp, commutation)).
  let swing = isWarm ? (start.turnOffSwingFraction ?? 0) : 0;
  let appliedSwing = 0;
  let lastResidualV = 0;
  let lastResidualC = 0;
  let lastNextV = 0;
  let lastNextC = 0;
  let carryA = 0;
  let ringA = 0;
  // The passes' points go into one array of this state's (never the warm start's).
  const passPoints: DoubleEndedStagePoint[] = [];
  for (let pass = 0; pass < 100; pass++) {
    const effectiveDuty = Math.max(dutyCycle - commutation, 1e-9);
    const stageSwing = freewheelSwing(circuit, 2 * effectiveDuty, primaryV, swing);
    points = stagePoints(
      circuit,
      2 * effectiveDuty,
      stageSwing,
      primaryV,
      points,
      node,
      passPoints,
    );
    // The swing stretches the drive where the stages took it (no shared fall).
    const fall = points[0]?.sharedFall;
    appliedSwing = fall === undefined ? stageSwing : 0;
    const onS = (effectiveDuty + appliedSwing / 2) * periodS;
    magnetizingPeakA = (Math.max(0, primaryV) * onS) / (2 * lm);
    magnetizingStartA = -magnetizingPeakA;
    let reflectedA = 0;
    let reflectedValleyA = 0;
    let reflectedPeakA = 0;
    let reflectedSlopeAPerS = (2 * magnetizingPeakA) / onS;
    // With several outputs, each output's shared fall carries the magnetizing current referred
    // to its own secondary (`severalOutputsFall`): output 0's reads as one output's does.
    if (fall !== undefined) {
      const n = circuit.turnsRatios[0] ?? 1;
      magnetizingPeakA = fall.magnetizingEndOfOnA / n;
      magnetizingStartA = -fall.magnetizingStartA / n;
      reflectedA = (magnetizingStartA + magnetizingPeakA) / 2;
      reflectedSlopeAPerS = (magnetizingPeakA - magnetizingStartA) / onS;
    }
    // Plain loops, not callbacks, in this and the other passes: a callback capturing the pass's
    // numbers boxed each of them on the heap, most of the garbage of a double-ended design.
    for (let k = 0; k < points.length; k++) {
      const point = points[k] as DoubleEndedStagePoint;
      const n = circuit.turnsRatios[k] ?? 1;
      reflectedA += point.onMeanA / n;
      reflectedValleyA += point.valleyA / n;
      reflectedPeakA += point.peakA / n;
      reflectedSlopeAPerS += (point.peakA - point.valleyA) / (onS * n);
    }
    const nextV =
      vd -
      circuit.primaryLoopResistanceOhm * reflectedA -
      circuit.leakageInductanceH * reflectedSlopeAPerS;
    const turnOffA = reflectedPeakA + magnetizingPeakA;
    const nextSwing = turnOffSwingS(circuit, dutyCycle, turnOffA) / periodS;
    // The primary current rises from zero to Σ Iv/n − Im,pk through the leakage at the drive
    // voltage: tc = Llk·(Σ Iv/n − Im,pk)/Vd (Mohan, Undeland, Robbins, 3rd ed. (from memory),
    // §5-3, commutation through a series inductance), held below the on-time. In a bridge whose
    // last turn-off current has not decayed by the turn-on (`leakageCarryA`), the sweep starts
    // from that rest, on the other side of zero: Llk·(I_rest + Σ Iv/n − Im,pk)/Vd. Where the
    // decay ends within the off-time, the leakage's ring with the node has carried its current
    // part of the way by the turn-on (`leakageRingA`): Llk·(Σ Iv/n − Im,pk − I_ring)/Vd.
    carryA = fall === undefined ? leakageCarryA(circuit, dutyCycle, turnOffA, swing) : 0;
    ringA =
      fall === undefined && carryA === 0 ? leakageRingA(circuit, dutyCycle, turnOffA, swing) : 0;
    const nextCommutation = Math.min(
      (circuit.leakageInductanceH *
        Math.max(0, turnOnCurrentA(reflectedValleyA, magnetizingStartA) + carryA - ringA)) /
        (vd * periodS),
      0.9 * dutyCycle,
    );
    const isSettled =
      Math.abs(nextV - primaryV) <= relativeTolerance * vd &&
      Math.abs(nextCommutation - commutation) <= relativeTolerance &&
      Math.abs(nextSwing - swing) <= relativeTolerance;
    // The plain passes shrink the step some 25 times each, alternating in sign; one-step
    // Anderson mixing (the secant through the last two passes, per unit of Vd) takes most of
    // that at once. Only the next trial point changes: a pass still settles on g(x) = x within
    // the same tolerance, and a step that grew the residual falls back to the plain pass.
    // ref: D. G. Anderson, J. ACM 12 (1965) 547 (from memory); Walker & Ni, SIAM J. Numer.
    // Anal. 49 (2011) 1715, depth m = 1 (from memory).
    const residualV = (nextV - primaryV) / vd;
    const residualC = nextCommutation - commutation;
    let mixedV = nextV;
    let mixedC = nextCommutation;
    if (!isSettled && pass > 0) {
      const dV = residualV - lastResidualV;
      const dC = residualC - lastResidualC;
      const squared = dV * dV + dC * dC;
      const isShrinking =
        residualV * residualV + residualC * residualC <
        lastResidualV * lastResidualV + lastResidualC * lastResidualC;
      if (isShrinking && squared > 0) {
        const gamma = (residualV * dV + residualC * dC) / squared;
        mixedV = nextV - gamma * (nextV - lastNextV);
        mixedC = Math.min(
          Math.max(0, nextCommutation - gamma * (nextCommutation - lastNextC)),
          0.9 * dutyCycle,
        );
      }
    }
    lastResidualV = residualV;
    lastResidualC = residualC;
    lastNextV = nextV;
    lastNextC = nextCommutation;
    primaryV = isSettled ? nextV : mixedV;
    commutation = isSettled ? nextCommutation : mixedC;
    if (isSettled) break;
    swing = nextSwing;
  }
  return {
    dutyCycle,
    commutationFraction: commutation,
    turnOffSwingFraction: appliedSwing,
    primaryVoltageV: primaryV,
    magnetizingPeakA,
    magnetizingStartA,
    points,
    isSwingHeld: appliedSwing < swing * (1 - 1e-9) && points[0]?.sharedFall === undefined,
    leakageCarryA: carryA,
    leakageRingA: ringA,
  };
}

/**
 * The duty cycle at which a bridge's leakage decay (`leakageCarryA`) just fills the off-time,
 * for a turn-off current `turnOffA` (A): above it the next turn-on meets the rest of the last
 * half's current, the commutation grows with D as fast as the off-time shrinks, and the output
 * hardly rises with D any more (the drive after the commutation stays at
 * 1/2 − Llk·(Ip + Iv/n − Im,pk)/(Vd·T) of the period). Infinity for the push-pull and without
 * leakage. The turn-off swing is taken at its full length C·Vd/Ip (`turnOffSwingS` at D = 0).
 */
export function leakageKneeDuty(circuit: DoubleEndedCircuit, turnOffA: number): number {
  const llk = circuit.leakageInductanceH;
  const { bridge } = circuit;
  if (bridge.kind === 'push-pull' || !(llk > 0) || !(turnOffA > 0)) return Infinity;
  const swingS = turnOffSwingS(circuit, 0, turnOffA);
  const fallV =
    circuit.driveVoltageV +
    bridge.switchesInPath * circuit.bodyDiodeVoltageV +
    (circuit.primaryLoopResistanceOhm * turnOffA) / 2;
  // The decay's time at full voltage, and the off-time that gives it (`leakageCarryA`).
  const decayS = (llk * turnOffA) / fallV;
  const offS = decayS >= swingS / 2 ? decayS + swingS / 2 : Math.sqrt(2 * decayS * swingS);
  return 0.5 - (offS + swingS) / circuit.periodS;
}

/**
 * The leakage current of a bridge still flowing as the next switches turn on, A: at turn-off
 * the leakage carries the primary current Ip = Σ IL,pk/n + Im,pk on; once the winding is at
 * zero (the secondary freewheels) it drives the node on to the far rail and the opposite
 * switches' body diodes return it to the input, so it falls at (Vd + m·Vbd + R·i)/Llk (m body
 * diodes in its path at `bodyDiodeVoltageV` each, R the primary loop's resistance) and would last
 * about Llk·Ip/Vd. The time it has is the off-time after the turn-off swing t_s,
 * t_off = (1/2 − D)·T − t_s, less half of the node's second stretch (to the far rail, taken as
 * long as t_s: the current held, the leakage's voltage ramping up over it). Where it outlasts
 * that, the rest I flows on through the switch that turns on, and the turn-on commutation starts
 * from it: I = Ip − (Vd + m·Vbd + R·(Ip + I)/2)·τ/Llk, τ the decay's time at full voltage,
 * solved for I. The push-pull's leakage goes to its clamp instead (each half's own leakage; the
 * other half's switch does not take it): zero there, and without leakage. `swingFraction` is
 * the turn-off swing over the period.
 * ref: Mohan, Undeland, Robbins, 3rd ed. (from memory), §5-3 (a current commutated through a
 * series inductance at a fixed voltage falls linearly, at V/L).
 */
export function leakageCarryA(
  circuit: DoubleEndedCircuit,
  dutyCycle: number,
  turnOffA: number,
  swingFraction: number,
): number {
  const llk = circuit.leakageInductanceH;
  if (circuit.bridge.kind === 'push-pull' || !(llk > 0) || !(turnOffA > 0)) return 0;
  const { swingS, offS, fallV } = bridgeOffTiming(circuit, dutyCycle, turnOffA, swingFraction);
  // The node's second stretch takes about t_s; a turn-on within it meets the leakage voltage
  // still ramping (t_off²/(2·t_s) of full-voltage time).
  const decayS = offS >= swingS ? offS - swingS / 2 : (offS * offS) / (2 * swingS);
  const r = circuit.primaryLoopResistanceOhm;
  const restA = (turnOffA - (fallV * decayS) / llk) / (1 + (r * decayS) / (2 * llk));
  return restA > 1e-12 * turnOffA ? restA : 0;
}

/**
 * The drive the stages see over the period: the on-time after the turn-on commutation plus
 * half the turn-off swing (its volt-seconds), D − tc + t_s/(2·T).
 */
export function drivenDuty(state: DoubleEndedState): number {
  return state.dutyCycle - state.commutationFraction + state.turnOffSwingFraction / 2;
}

/**
 * Whether `state` is a steady state at all, for the choice to take its inductances and ratios
 * from and a corner to draw: a primary voltage above zero and below twice the drive voltage (the
 * drops only take from the drive; the margin leaves the light-load states, whose reflected
 * current can run backwards, well inside), some drive left after the turn-on commutation, and
 * finite outputs. With the turns ratio fixed far below what the lowest input needs, the largest
 * duty cycle's fixed point can fail to settle (the leakage's commutation taking nearly the whole
 * half; a half bridge of 18–36 V with the ratio fixed at 0.65 and 2 µH of leakage read 2·10^20 V
 * on the choice's second pass): the choices taken from it ran to NaN, and a corner drawn from
 * such a state put its grid's edges out of order.
 */
export function isPhysicalState(circuit: DoubleEndedCircuit, state: DoubleEndedState): boolean {
  const primaryV = state.primaryVoltageV;
  return (
    Number.isFinite(primaryV) &&
    primaryV > 0 &&
    primaryV < 2 * circuit.driveVoltageV &&
    drivenDuty(state) > 0 &&
    state.points.every((point) => Number.isFinite(point.voltageV))
  );
}

/**
 * The turn-off swing's duration, s: the winding falls from the drive voltage Vd to zero while
 * the primary current at turn-off Ip = Σ IL,pk/n + Im,pk charges the node capacitance C
 * (`nodeCapacitanceF`), t_s = C·Vd/Ip, the same as Cr·(Vd/n)/(IL + n·Im) on the secondary
 * (Cr = C·n²). First order: the current is taken as constant through the swing (the inductors
 * carry it; the output inductor conducts throughout in continuous conduction), and the swing is
 * held to the rest of the half, (1/2 − D)·T. Zero without node capacitance or current.
 * ref: Mohan, Undeland, Robbins, 3rd ed. (from memory), §9-2 (a capacitor across a switch
 * charged at the current it commutates: a linear voltage ramp at turn-off).
 */
export function turnOffSwingS(
  circuit: DoubleEndedCircuit,
  dutyCycle: number,
  turnOffCurrentA: number,
): number {
  const chargeC = circuit.nodeCapacitanceF * circuit.driveVoltageV;
  if (!(chargeC > 0) || !(turnOffCurrentA > 0)) return 0;
  return Math.min(chargeC / turnOffCurrentA, Math.max(0, 0.5 - dutyCycle) * circuit.periodS);
}

/**
 * The primary current the leakage must reach at turn-on, Σ Iv/n less the magnetizing start's
 * magnitude (A, ≥ 0). After a shared fall it is zero (valley/n = start) but for rounding, some
 * 1e-16 of the currents either way; that rest is taken as zero, else it gave the grid an
 * interval of 1e-22 s and losses of 1e-18 W that came and went with the solve's last bit.
 */
export function turnOnCurrentA(reflectedValleyA: number, magnetizingStartA: number): number {
  const turnOnA = reflectedValleyA + magnetizingStartA;
  const roundingA = 1e-12 * (Math.abs(reflectedValleyA) + Math.abs(magnetizingStartA));
  return turnOnA > roundingA ? turnOnA : 0;
}

/**
 * Each stage's point for one fixed-point pass at stage duty cycle `stageDuty` and primary voltage
 * `primaryV`: with one output the light-load point (the shared fall and the switch-node ring,
 * `node`), seeded with the last pass's Vo (or the warm start's) where it had a shared fall, and
 * written into `into` (read `previous` first: it may be `into`); with several, their shared fall
 * (`severalOutputsFall`, seeded the same way) where it occurs, else the plain stages.
 */
function stagePoints(
  circuit: DoubleEndedCircuit,
  stageDuty: number,
  swing: number,
  primaryV: number,
  previous: readonly DoubleEndedStagePoint[],
  node: NodeCapacitance,
  into: DoubleEndedStagePoint[],
): DoubleEndedStagePoint[] {
  const halfS = circuit.periodS / 2;
  const stages = circuit.stages;
  if (stages.length !== 1) {
    const several = severalOutputsFall(
      {
        stages,
        turnsRatios: circuit.turnsRatios,
        magnetizingInductanceH: circuit.magnetizingInductanceH,
      },
      stageDuty,
      primaryV,
      halfS,
      previous,
      node,
    );
    if (several !== undefined) return several;
    return stages.map((stage, k) =>
      outputStagePoint(stage, stageDuty + swing, primaryV / (circuit.turnsRatios[k] ?? 1), halfS),
    );
  }
  const n = circuit.turnsRatios[0] ?? 1;
  const last = previous[0];
  into[0] = lightLoadPoint(
    stages[0] as OutputStage,
    stageDuty,
    primaryV / n,
    halfS,
    circuit.magnetizingInductanceH / (n * n),
    last?.sharedFall === undefined ? undefined : last.voltageV,
    node,
    swing,
  );
  return into;
}

/**
 * The turn-off swing the stages take at stage duty `stageDuty` (`freewheelSwingDuty`): for one
 * output its own, for several their equivalent's (`referredOutputs`, as `severalOutputsFall`
 * decides on it).
 */
function freewheelSwing(
  circuit: DoubleEndedCircuit,
  stageDuty: number,
  primaryV: number,
  swing: number,
): number {
  if (!(swing > 0)) return swing;
  const n0 = circuit.turnsRatios[0] ?? 1;
  const stage =
    circuit.stages.length === 1
      ? circuit.stages[0]
      : referredOutputs(circuit.stages, circuit.turnsRatios, n0)?.stage;
  if (stage === undefined) return swing;
  const halfS = circuit.periodS / 2;
  const lr = circuit.magnetizingInductanceH / (n0 * n0);
  return freewheelSwingDuty(stage, stageDuty, primaryV / n0, halfS, lr, swing);
}

/**
 * The most differential leakage rings a push-pull's half may hold for its light-load ring to take
 * the leakage (`ringLeakage`). Cost, not physics: the bench's push-pull with its transformer
 * designed (18 nH, 100 pF, 100 kHz: some 590 rings a half) took 16 ms an evaluation against 1.8
 * without it, and its whole-catalog core search 46 s of CPU against 20 (the same result); there
 * the ring without leakage is kept, with its miss (DEVELOPERS.md, "The push-pull's off-time with
 * its leakage").
 */
const PUSH_PULL_RING_LEAKAGE_HALVES_MAX = 200;

/**
 * The leakage the event model's ring takes (`RingCircuit.leakageH`), referred to the secondary of
 * turns ratio `n`: Llk for the half and full bridge; for the push-pull the drains' differential
 * mode, Llk/2 (`pushPullRingLeakageH`), where the common mode's swing from the turn-off current
 * (`guess`'s: its magnetizing peak and each output's peak referred) stays clear of the drains'
 * body diodes, else none (the push-pull's leakage at turn-off is then its RCD clamp's alone,
 * `push-pull-clamp.ts`, and stays outside the ring, as before 2026-12-05).
 */
function ringLeakage(
  circuit: DoubleEndedCircuit,
  n: number,
  guess: DoubleEndedState,
): { leakageH?: number } {
  const llk = circuit.leakageInductanceH;
  if (!(llk > 0)) return {};
  if (circuit.bridge.kind !== 'push-pull') return { leakageH: llk / (n * n) };
  let turnOffA = guess.magnetizingPeakA;
  for (let k = 0; k < guess.points.length; k++) {
    turnOffA += (guess.points[k]?.peakA ?? 0) / (circuit.turnsRatios[k] ?? 1);
  }
  const switchCapacitanceF = circuit.nodeCapacitanceF / circuit.bridge.nodeCapacitanceFactor;
  // The differential ring, 2π·√((Llk/2)·2C), walked stretch by stretch over the whole half:
  // where it is faster than a 200th of the half (a designed transformer's tens of nanohenries)
  // that is hundreds of stretches a half, and the ring without leakage is kept, as before.
  const ringS = 2 * Math.PI * Math.sqrt(llk * switchCapacitanceF);
  if (ringS < circuit.periodS / 2 / PUSH_PULL_RING_LEAKAGE_HALVES_MAX) return {};
  const leakageH = pushPullRingLeakageH({
    leakageH: llk,
    switchCapacitanceF,
    turnOffA,
    inputV: circuit.driveVoltageV,
  });
  return leakageH === undefined ? {} : { leakageH: leakageH / (n * n) };
}

/** The first output's switch-node capacitance as its secondary sees it (`lightLoadPoint`). */
function firstNodeCapacitance(circuit: DoubleEndedCircuit): NodeCapacitance {
  const n = circuit.turnsRatios[0] ?? 1;
  return { capacitanceF: circuit.nodeCapacitanceF * n * n, clampV: circuit.driveVoltageV / n };
}

/**
 * Returns the steady state whose first output sits at `regulatedV` (V), the duty cycle found by
 * the secant method or, failing that, Brent's method up to 0.5; undefined when even D = 0.5
 * falls short. `start`, a state of a nearby circuit (the last choice pass's), gives the first
 * duty cycle and starts its fixed point; each trial's fixed point starts from the last trial's
 * state, unless `isCold`: then every one starts afresh (no `start` either), which costs passes
 * but makes the trial's state a function of its duty cycle alone (at light load a fixed point
 * started elsewhere can settle on another of the ring's states).
 */
export function solveDoubleEnded(
  circuit: DoubleEndedCircuit,
  regulatedV: number,
  start?: DoubleEndedState,
  isCold = false,
): DoubleEndedState | undefined {
  const why: EventWhy = {};
  const state = solveDoubleEndedOnce(circuit, regulatedV, start, isCold, why);
  // The push-pull's lumped event solve, whose ring has at most the drains' differential mode
  // behind the leakage (`ringLeakage`, no common mode): where it did not converge,
  // the leaky half (each drain behind its leakage; any number of outputs) takes the corner where
  // it converges. Where it did converge but the leakage's ring is slow enough to shape the half
  // (`isLeakyRingSlow`), the leaky half would be right too (DEVELOPERS.md, "The push-pull's leaky
  // light-load half") but costs up to some 0.1 s a corner (the invented telecom push-pull's
  // design, magnetics assumed, 21.5 → 138 ms warm, and half the scan's such corners do not close;
  // the lead's decision, 2026-12-05, after `ppmulti`'s A/B): the lumped state is kept there,
  // flagged (`LEAKY_RING_SLOW_FALLBACK`).
  if (
    state !== undefined &&
    state.isEvent !== true &&
    (why.miss === 'not-converged' || why.miss === 'no-regulated-half') &&
    circuit.bridge.kind === 'push-pull'
  ) {
    const leaky = pushPullLeakyState(circuit, regulatedV, state);
    if (leaky !== undefined) return leaky;
  } else if (state?.isEvent === true && state.leakyHalf === undefined && isLeakyRingSlow(circuit)) {
    return { ...state, modelFallback: LEAKY_RING_SLOW_FALLBACK };
  }
  if (state === undefined || state.isEvent === true || why.miss === undefined) return state;
  // No duty cycle of the event model holds the output: the corner at the shortest on-time, the
  // output risen. Not on a push-pull whose drains ring slowly behind its leakage: the lumped
  // half delivers more than that circuit there (spec 126 of `model-fallback-scan.ts --seed 11
  // --count 150 --outputs 1`, 400 V, 7.6 % load: ngspice at the floor's duty cycle settled at
  // 11.55 V, below the 12 V target, where the floor state rose to 14.98 V), so a duty cycle may
  // well hold the output there; the older model stays, flagged.
  if (why.miss === 'no-regulated-half' && !isLeakyRingSlow(circuit)) {
    const floor = floorEventState(circuit, regulatedV, state);
    if (floor !== undefined) return floor;
  }
  // An event attempt failed and the state is the older model's: it says so.
  return { ...state, modelFallback: EVENT_FALLBACKS[why.miss] };
}

/**
 * Why an event solve (`eventState`) did not give a state: its Newton solve or fixed point did not
 * converge (or ended outside the duty cycles), no duty cycle delivers as little as the load (the
 * half settled at the lowest stage duty delivers more: `solveEventHalfBracketed`), or, with
 * several outputs, the outputs would stop at times too far apart for their equivalent
 * (`FOLLOW_TOLERANCE`) and the solve with each output's own stop did not converge.
 */
export type EventMiss = 'not-converged' | 'no-regulated-half' | 'outputs-stop-apart';

/** The last event attempt's miss, where one failed (`eventState`'s out-parameter). */
export interface EventWhy {
  miss?: EventMiss | undefined;
}

/**
 * The corner's `modelFallback` where the event solve was tried and not taken, by `EventMiss`.
 * The error figures: ngspice (Debian) on the eight flagged corners in DEVELOPERS.md ("Light
 * load with several outputs: the event model", fallbacks flagged), outputs held. A
 * `no-regulated-half` corner with one output is solved at the shortest on-time instead
 * (`floorEventState`); the flag stays where that fails and with several outputs.
 */
export const EVENT_FALLBACKS: Readonly<Record<EventMiss, string>> = {
  'not-converged':
    'The light-load event solve did not converge at this corner, so the older light-load model was kept: the shared fall of the inductor and magnetizing currents with the switch-node ring taken as damped after its first swing, or near that fall’s boundary the freewheel with part of the turn-off swing left out. On three such corners simulated in ngspice (2026-12-04; one to three outputs, 6–27 % load) the simulated outputs came out from 6 % below to 8 % above this model’s (where the event solve converged since from a second or third start, this model had been 8–26 % below ngspice on the regulated output, up to 50 % on a cross-regulated one); a push-pull with microhenries of leakage, whose drains ring behind the leakage in a way this model does not follow, came out 35 % above it on one such corner (a push-pull with one output is taken by a model with that ring where it converges); take its numbers as rough.',
  'no-regulated-half':
    'At this load the light-load event model finds no duty cycle that delivers as little as the load: the half it settles on at its lowest stage duty (0.02) already delivers more, because the energy each turn-on puts into the drain capacitance (about fs·C·Vin²) is of the order of the load’s power and rings on into the output, undamped in that model. A controller here runs at its shortest on-time or skips pulses, and the output rises: a corner with one output is solved so (at a 100 ns on-time, for the output it reaches, listed in summary.regulationMisses), but this one was not (it has several outputs, or it is a push-pull whose drains ring slowly behind its leakage, where the lumped half delivers more than the circuit, or that solve did not settle), so the older light-load model was kept and its numbers claim a regulation the circuit may not have: on four such corners simulated in ngspice (2026-12-04; 200–400 V full bridges and a push-pull at 400 V, 2–8 % load) the regulated output settled 21–38 % above this model’s (on one still 23 % above at a duty cycle of 0.01), and at 300 V within 1 % on the regulated output but 83 % above on a cross-regulated one. Take this corner’s numbers as rough.',
  'outputs-stop-apart':
    'The outputs’ currents reach zero at times too far apart for the light-load event model’s equivalent output (it would cut an output’s current by more than 2 % of its peak), and the solve with each output’s own stop did not converge, so the older light-load model was kept: the shared fall of the inductor and magnetizing currents with the switch-node ring taken as damped after its first swing, or, where an output would stop on its own, that fall without the ring or the plain freewheel. On four corners where this model was kept before (2026-12-04; two outputs, 2–5 % load) ngspice put the regulated output 1.3–4.0 % below this model’s and the other outputs 17–27 % above it (one extrapolated); where each output’s own stop converged since (17 such corners, 2026-12-05) ngspice came within 2 % of it on every output at 15 of them and within 2.7 % at the other two; take this corner’s numbers as rough.',
};

/** {@link solveDoubleEnded}, recording in `why` the last event attempt that failed. */
function solveDoubleEndedOnce(
  circuit: DoubleEndedCircuit,
  regulatedV: number,
  start: DoubleEndedState | undefined,
  isCold: boolean,
  why: EventWhy,
): DoubleEndedState | undefined {
  const hasEvents = isEventCircuit(circuit);
  if (hasEvents && !isCold && start?.isEvent === true) {
    const evented = eventState(circuit, regulatedV, start, why);
    if (evented !== undefined) return evented;
    // A nearby circuit's event state as the start says nothing of this corner's region: a miss
    // counts where the attempts below, from this corner's own states, fail.
    why.miss = undefined;
  }
  // Deep in the shared fall's region a cheap start: the plain solve without the node capacitance
  // (the shared fall's closed forms, no ring), then the event solve from it.
  if (hasEvents && !isCold && isSharedFallLikely(circuit, regulatedV)) {
    const rough = solveDoubleEndedPlain(withoutNodeCapacitance(circuit), regulatedV, start, false);
    // With several outputs the old shared fall is left where an output would stop on its own
    // (`severalOutputsFall`: the plain freewheel, discontinuous), which the event solve may
    // still take from the plain state.
    const isSeveralStopped =
      circuit.stages.length > 1 && rough?.points.some((p) => p.mode === 'dcm') === true;
    if (rough !== undefined && (rough.points[0]?.sharedFall !== undefined || isSeveralStopped)) {
      const evented = eventState(circuit, regulatedV, rough, why);
      if (evented !== undefined) return evented;
    }
  }
  const state = solveDoubleEndedPlain(circuit, regulatedV, start, isCold);
  // The plain solve finds the region: where it has a shared fall, or holds the swing back near
  // the fall's boundary, the event model takes the corner from its state (the old light-load
  // model stays where the event solve fails).
  if (
    hasEvents &&
    state !== undefined &&
    (state.points[0]?.sharedFall !== undefined || state.isSwingHeld === true)
  ) {
    const evented = eventState(circuit, regulatedV, state, why);
    if (evented !== undefined) return evented;
  }
  // Past a bridge's leakage knee the output falls slowly with D (`leakageKneeDuty`), so a
  // regulated output met there is met below the knee too, where the output rises with D: a
  // controller settles there, not on the flat side (whose loop gain has the wrong sign).
  if (state !== undefined && (state.leakageCarryA ?? 0) > 0) {
    return solveBelowKnee(circuit, regulatedV, state) ?? state;
  }
  return state;
}

/** Σ IL,pk/n + Im,pk: the primary current at turn-off of `state`, A. */
export function stateTurnOffA(circuit: DoubleEndedCircuit, state: DoubleEndedState): number {
  let currentA = state.magnetizingPeakA;
  for (let k = 0; k < state.points.length; k++) {
    currentA += (state.points[k]?.peakA ?? 0) / (circuit.turnsRatios[k] ?? 1);
  }
  return currentA;
}

/**
 * The state with the first output at `regulatedV` below the leakage's knee, from `past` (a
 * state at that output past the knee): the knee follows the turn-off current there (a few
 * passes), and Brent's method runs between half the knee and the knee where the knee's output
 * reaches the regulated one. Undefined where it does not (the output is then met past the knee
 * only, or not at all).
 */
function solveBelowKnee(
  circuit: DoubleEndedCircuit,
  regulatedV: number,
  past: DoubleEndedState,
): DoubleEndedState | undefined {
  let knee = leakageKneeDuty(circuit, stateTurnOffA(circuit, past));
  let atKnee: DoubleEndedState | undefined;
  for (let pass = 0; pass < 4; pass++) {
    if (!(knee > 0 && knee < past.dutyCycle)) return undefined;
    atKnee = doubleEndedStateAt(circuit, knee, atKnee ?? past);
    const next = leakageKneeDuty(circuit, stateTurnOffA(circuit, atKnee));
    if (Math.abs(next - knee) <= 1e-9) break;
    knee = next;
  }
  if (atKnee === undefined || !(knee > 0 && knee < past.dutyCycle)) return undefined;
  const kneeError = (atKnee.points[0]?.voltageV ?? -Infinity) - regulatedV;
  if (!(kneeError >= 0)) return undefined;
  const trials: { last: DoubleEndedState } = { last: atKnee };
  const error = belowKneeError(circuit, regulatedV, trials);
  const lo = knee / 2;
  const loError = error(lo);
  if (!(loError < 0)) return undefined;
  const d = brentRoot(error, lo, knee, {
    absoluteTolerance: 1e-13,
    valueAtLo: loError,
    valueAtHi: kneeError,
  });
  return Number.isFinite(d) ? doubleEndedStateAt(circuit, d, trials.last) : undefined;
}

/** The first output's miss (V) at duty cycle d, each trial started from the last one's state. */
function belowKneeError(
  circuit: DoubleEndedCircuit,
  regulatedV: number,
  trials: { last: DoubleEndedState },
): (d: number) => number {
  return (d) => {
    trials.last = doubleEndedStateAt(circuit, d, trials.last);
    return (trials.last.points[0]?.voltageV ?? 0) - regulatedV;
  };
}

/**
 * Whether the first stage has a shared fall at the continuous-conduction duty cycle for
 * `regulatedV` with every drop at the load current (`lightLoadPoint`'s test, valley < n·Im,pk):
 * the regulated corner then lies in the event model's region (its duty cycle is lower still).
 */
function isSharedFallLikely(circuit: DoubleEndedCircuit, regulatedV: number): boolean {
  const n = circuit.turnsRatios[0] ?? 1;
  // Several outputs: their equivalent (`referredOutputs`), at about output 0's voltage (the
  // others' over their turns ratios are near it).
  const stage =
    circuit.stages.length === 1
      ? circuit.stages[0]
      : referredOutputs(circuit.stages, circuit.turnsRatios, n)?.stage;
  if (stage === undefined) return false;
  const vs = circuit.driveVoltageV / n;
  const io = stage.loadA;
  const { onDropV, offDropV } = loadDropsV(stage);
  const x = (regulatedV + offDropV) / (vs - onDropV + offDropV);
  if (!(x > 0 && x < 1)) return false;
  const halfS = circuit.periodS / 2;
  const riseA = (vs * x * halfS * n * n) / circuit.magnetizingInductanceH;
  const valleyA = io - ((regulatedV + offDropV) * (1 - x) * halfS) / (2 * stage.inductanceH);
  return valleyA < riseA / 2;
}

/** `circuit` without the node capacitance (no ring, no swing): a cheap start for light load. */
function withoutNodeCapacitance(circuit: DoubleEndedCircuit): DoubleEndedCircuit {
  return sameShapeCircuit(circuit, circuit.turnsRatios, 0);
}

/**
 * Whether the event model can take `circuit`'s light-load corners: C and Lm > 0, and with several
 * outputs an equivalent output (`referredOutputs`: every inductance positive).
 */
function isEventCircuit(circuit: DoubleEndedCircuit): boolean {
  return (
    circuit.stages.length >= 1 &&
    circuit.nodeCapacitanceF > 0 &&
    circuit.magnetizingInductanceH > 0 &&
    Number.isFinite(circuit.magnetizingInductanceH)
  );
}

/**
 * The light-load state by events (`solveEventHalf`), with the first output at `regulatedV`: the
 * duty cycle and the two turn-on currents from Newton's method, started from `guess` (the plain
 * solve's state, or a nearby event state), the primary voltage (the loop's resistance at the
 * mean on-current and the leakage at its slope) and the turn-on commutation (Llk·I/Vd) following
 * the currents as in `doubleEndedStateAt`. D is the commutation plus the on-time; no separate
 * swing: the ring holds it. Undefined where the solve fails or D leaves (0, 0.5].
 */
export function eventState(
  circuit: DoubleEndedCircuit,
  regulatedV: number,
  guess: DoubleEndedState,
  why: EventWhy = {},
): DoubleEndedState | undefined {
  // Every failure below is the solve's, but the several outputs' tolerance (set there).
  why.miss = 'not-converged';
  if (circuit.stages.length > 1) return severalEventState(circuit, regulatedV, guess, why);
  const context = eventContextAt(circuit, regulatedV, guess);
  if (context === undefined) return undefined;
  const half = solveEventHalfFrom(
    context,
    {
      stageDuty: 2 * Math.max(1e-9, guess.dutyCycle - guess.commutationFraction),
      inductorStartA: guess.points[0]?.valleyA ?? 0,
      magnetizingStartA: (circuit.turnsRatios[0] ?? 1) * guess.magnetizingStartA,
    },
    undefined,
    why,
  );
  if (half === undefined) return undefined;
  return eventStateOfHalf(circuit, regulatedV, context, half);
}

/**
 * The one-output event solve's context (`EventContext`) with the output at `outputV` (V): the
 * ring's constants with the path's and the freewheel's drops at the load current, the primary
 * side the on-time's voltage and the commutation follow, started from `guess`'s primary voltage
 * and commutation. Undefined without a stage.
 */
function eventContextAt(
  circuit: DoubleEndedCircuit,
  outputV: number,
  guess: DoubleEndedState,
): EventContext | undefined {
  const stage = circuit.stages[0];
  if (stage === undefined) return undefined;
  const n = circuit.turnsRatios[0] ?? 1;
  const vd = circuit.driveVoltageV;
  const io = stage.loadA;
  const { forwardVoltageV: vf, resistanceOhm: rd } = stage.rectifier;
  const { forwardVoltageV: offVf, resistanceOhm: offRd } = stage.freewheel ?? stage.rectifier;
  const rl = stage.inductorResistanceOhm;
  const node = firstNodeCapacitance(circuit);
  const constants = ringConstants({
    inductanceH: stage.inductanceH,
    referredMagnetizingH: circuit.magnetizingInductanceH / (n * n),
    capacitanceF: node.capacitanceF,
    clampV: node.clampV,
    pathV: outputV + vf + (stage.windingResistanceOhm + rd + rl) * io,
    freewheelV: outputV + offVf + (offRd + rl) * io,
    ...ringLeakage(circuit, n, guess),
  });
  const primaryV0 = Number.isFinite(guess.primaryVoltageV) ? guess.primaryVoltageV : vd;
  return {
    constants,
    onV: primaryV0 / n,
    halfS: circuit.periodS / 2,
    commutationS: Math.max(0, guess.commutationFraction) * circuit.periodS,
    loadA: io,
    primary: {
      driveV: vd,
      turnsRatio: n,
      loopResistanceOhm: circuit.primaryLoopResistanceOhm,
      leakageInductanceH: circuit.leakageInductanceH,
    },
  };
}

/**
 * The one-output state of a solved event half (`context` as the solve left it: the solution's
 * on-time voltage and commutation) with the output at `outputV` (V). Undefined where D leaves
 * (0, 0.5].
 */
function eventStateOfHalf(
  circuit: DoubleEndedCircuit,
  outputV: number,
  context: EventContext,
  half: EventHalf,
): DoubleEndedState | undefined {
  const n = circuit.turnsRatios[0] ?? 1;
  const { constants, halfS } = context;
  const primaryV = context.onV * n;
  const commutation = half.commutationS / circuit.periodS;
  const dutyCycle = commutation + half.stageDuty / 2;
  if (!(dutyCycle <= DOUBLE_ENDED_DUTY_CYCLE_MAX)) return undefined;
  const point: DoubleEndedStagePoint = {
    mode: half.hasIdle ? 'dcm' : 'ccm',
    voltageV: outputV,
    valleyA: half.inductorOnStartA,
    peakA: half.inductorPeakA,
    freewheelDutyCycle: 1 - 2 * dutyCycle,
    onMeanA: (half.inductorOnStartA + half.inductorPeakA) / 2,
    sharedFall: {
      magnetizingStartA: -half.magnetizingStartA,
      magnetizingEndOfOnA: half.magnetizingPeakA,
      startA: half.inductorPeakA,
      endA: half.inductorStartA,
      startFraction: 2 * dutyCycle,
      endFraction: 1,
      windingVoltageV: constants.centreV,
      ring: {
        constants,
        start:
          half.ringStart.leakageA !== undefined
            ? half.ringStart
            : {
                inductorA: half.inductorPeakA,
                magnetizingA: half.magnetizingPeakA,
                windingV: -primaryV / n,
              },
        halfS,
        isContinued: true,
      },
    },
  };
  return eventStateOf(dutyCycle, commutation, primaryV, half, n, [point]);
}

/**
 * Trials of the regulated output's rise at the shortest on-time (`floorEventState`), each
 * FLOOR_RISE_FACTOR times the last, from FLOOR_RISE_FIRST of the target: up to some 6,000 times
 * the first, past where the output reaches the secondary's drive voltage (the search ends there).
 */
const FLOOR_RISE_STEPS = 40;
const FLOOR_RISE_FIRST = 2 ** -7;
const FLOOR_RISE_FACTOR = 1.25;
/** The highest trial of the floor's output, over the secondary's drive voltage less a drop. */
const FLOOR_TOP = 0.999;

/**
 * The one-output light-load state at the shortest on-time where no duty cycle of the event model
 * holds the output (`no-regulated-half`: the half settled at the lowest stage duty already
 * delivers more than the load, each turn-on's drain-capacitance energy, about fs·C·Vd², ringing
 * on into the output). A controller there runs at its shortest on-time and the output rises, as
 * the forwards' and the flyback's floors take it (`LIGHT_LOAD_MIN_ON_TIME_S`): each switch's gate
 * is on for that time (the turn-on commutation within it, `settledHalfAtGate`), and the regulated
 * output's voltage is the unknown, found from charge balance with the load current held: the
 * half the circuit settles on at that on-time delivers exactly the load. The rise is bracketed
 * upwards in steps of 1.25× from the target (each trial's half settled from zero currents, as
 * the circuit does, so that its excess is a function of the voltage alone), then Brent's method
 * on that excess to 1e-10 of the target; the corner's state is the half settled at the root
 * (periodic to 1e-6 of the load's current), at D = LIGHT_LOAD_MIN_ON_TIME_S/T exactly, reported
 * at the voltage reached (`floorRiseV`; `summary.regulationMisses` lists it). Undefined with
 * several outputs (their equivalent's fixed point holds output 0 at its target), where the
 * on-time at the target already delivers less than the load (a duty between the floor and the
 * lowest stage duty would then hold it; not sought), where the output would reach the
 * secondary's drive voltage less a rectifier's drop, or where a trial does not settle: the corner
 * then keeps the older model, flagged.
 * ref: charge balance on the output capacitor (Erickson & Maksimović, 2nd ed. (from memory),
 * §2.3), common practice; Brent's method (Brent 1973, from memory).
 */
export function floorEventState(
  circuit: DoubleEndedCircuit,
  regulatedV: number,
  guess: DoubleEndedState,
): DoubleEndedState | undefined {
  const stage = circuit.stages[0];
  if (circuit.stages.length !== 1 || stage === undefined || !isEventCircuit(circuit)) {
    return undefined;
  }
  const gateOnS = LIGHT_LOAD_MIN_ON_TIME_S;
  if (!(gateOnS < DOUBLE_ENDED_DUTY_CYCLE_MAX * circuit.periodS)) return undefined;
  const n = circuit.turnsRatios[0] ?? 1;
  // The output cannot rise past the secondary's drive voltage less the path's forward drop.
  const topV = circuit.driveVoltageV / n - stage.rectifier.forwardVoltageV;
  const excess = floorExcessOf(circuit, guess, gateOnS);
  const atTarget = excess(regulatedV);
  if (!(atTarget > 0)) return undefined;
  let lo = regulatedV;
  let valueAtLo = atTarget;
  let hi = NaN;
  let valueAtHi = NaN;
  for (let k = 0; k < FLOOR_RISE_STEPS; k++) {
    // The last trial just below the top (a spec 14 of `model-fallback-scan.ts --seed 7 --count
    // 150 --outputs 1`, a full bridge at 400 V and 2 % load, still delivers more at 24.7 V for
    // 12 V, the top 27.1 V).
    const v = Math.min(
      regulatedV * (1 + FLOOR_RISE_FIRST * FLOOR_RISE_FACTOR ** k),
      topV * FLOOR_TOP,
    );
    if (!(v > lo)) return undefined;
    const value = excess(v);
    if (!Number.isFinite(value)) return undefined;
    if (value <= 0) {
      hi = v;
      valueAtHi = value;
      break;
    }
    lo = v;
    valueAtLo = value;
  }
  if (!Number.isFinite(hi)) return undefined;
  const outputV = brentRoot(excess, lo, hi, {
    absoluteTolerance: 1e-10 * regulatedV,
    valueAtLo,
    valueAtHi,
  });
  if (!(outputV > regulatedV)) return undefined;
  const context = eventContextAt(circuit, outputV, guess);
  if (context === undefined) return undefined;
  const settled = settledHalfAtGate(context, gateOnS);
  if (settled === undefined) return undefined;
  const state = eventStateOfHalf(circuit, outputV, context, settled.half);
  return state === undefined ? undefined : { ...state, floorRiseV: outputV - regulatedV };
}

/**
 * The excess (A) of the half settled at gate on-time `gateOnS` (s) as a function of the output's
 * voltage (`settledHalfAtGate`, from zero currents); NaN where it does not settle. A factory, as
 * `trialError`.
 */
function floorExcessOf(
  circuit: DoubleEndedCircuit,
  guess: DoubleEndedState,
  gateOnS: number,
): (outputV: number) => number {
  return (outputV) => {
    const context = eventContextAt(circuit, outputV, guess);
    if (context === undefined) return NaN;
    return settledHalfAtGate(context, gateOnS)?.excessA ?? NaN;
  };
}

/**
 * {@link solveEventHalf} from `guess`, and where that fails, from a second start at half the
 * guess's stage duty and currents. The guess is the plain solve's state (or the rough one's),
 * whose light-load model can put the duty cycle far above the event model's: the design dump's
 * comparison half bridge (the helpers' invented 36–72 V telecom-style spec) at 36 V and 10 %
 * load starts at a stage duty of 0.712 where the half's is 0.472, and from there the residuals
 * hardly move with the unknowns (0.825 A at every step), so Newton's steps swing between the
 * duty's bounds until one leaves (0, 1]; from half of it the solve converges in 9 steps, and
 * ngspice with the output held settles 0.07 % from the engine's output (26 % above the old
 * light-load model's). A scan of 150 invented one-output specs (`model-fallback-scan.ts --seed
 * 11 --count 150 --outputs 1`) had 12 corners that did not converge, 4 with this second start;
 * a third start at a quarter took none more. Where both fail, the duty is bracketed by the load
 * with the half the circuit settles on at each trial (`solveEventHalfBracketed`), and Newton
 * starts from there: an 18–36 V half bridge with three outputs at 18 V and 4.6 % load, whose
 * Newton steps from 0.81 and 0.41 swing without converging, settles on a half delivering the
 * load at 0.569 (ngspice, every output held: +0.47/+0.08/+1.97 %, against +18.6/+49.9/+34.8 %
 * above the old light-load model's).
 */
function solveEventHalfFrom(
  context: EventContext,
  guess: EventHalfGuess,
  memory: EventMemory | undefined,
  why: EventWhy,
): EventHalf | undefined {
  return (
    solveEventHalf(context, guess, memory) ??
    solveEventHalf(
      context,
      {
        stageDuty: guess.stageDuty / 2,
        inductorStartA: guess.inductorStartA / 2,
        magnetizingStartA: guess.magnetizingStartA / 2,
        ...(guess.pickUpA === undefined ? {} : { pickUpA: guess.pickUpA / 2 }),
      },
      memory,
    ) ??
    solveEventHalfBracketed(context, guess.stageDuty, memory, () => {
      why.miss = 'no-regulated-half';
    })
  );
}

/**
 * The corner's `modelFallback` where a push-pull's lumped light-load event state was kept although
 * the drains' ring behind the leakage is slow against the half (`isLeakyRingSlow`).
 */
export const LEAKY_RING_SLOW_FALLBACK =
  'The drains of this push-pull ring behind its leakage slowly against the half-period (2π·√(2·Llk·C) at least a 50th of it), which the light-load event model follows only in part: it puts the drain capacitance across the winding, behind at most half the leakage (the drains’ differential ring, where the drains’ common ring stays off their body diodes), and leaves out the off drain’s ring with both leakages through the on-time. At one such corner simulated in ngspice before the differential ring was added (2026-12-04; 300 V, 10 µH, 6.1 % load, output and clamp held) the circuit delivered 28 % less than this model at its duty cycle (its output would settle some 10 % low); a model with that ring exists but is too slow yet to run at every such corner. Take this corner’s numbers as rough.';

/**
 * The leaky half's ring period against the half-period from which a push-pull's lumped
 * light-load event state is flagged (`LEAKY_RING_SLOW_FALLBACK`): 1/50 (with tens of nanohenries the ring
 * turns many times a half and the lumped model agrees with ngspice within 1 %; the leaky half's
 * step, a 32nd of the ring, would make a half thousands of steps).
 */
const LEAKY_RING_SHARE = 1 / 50;

/**
 * Whether a push-pull's off-drain ring with both leakages, 2π·√(2·Llk·C), lasts at least
 * `LEAKY_RING_SHARE` of the half-period: then the leakage shapes the light-load half (at 300 V
 * and 6.1 % load with 10 µH, 281 ns against 2.65 µs, ngspice with output and clamp held
 * delivered 28 % less than the lumped event model's half at its duty cycle, the leaky half
 * 0.4 % less than ngspice).
 */
function isLeakyRingSlow(circuit: DoubleEndedCircuit): boolean {
  // Any number of outputs: the lumped model's drain capacitance sits across the winding with
  // several as with one.
  if (circuit.bridge.kind !== 'push-pull') return false;
  const ringS = 2 * Math.PI * Math.sqrt(circuit.leakageInductanceH * circuit.nodeCapacitanceF);
  return ringS >= LEAKY_RING_SHARE * (circuit.periodS / 2);
}

/**
 * The push-pull's light-load state with each drain behind its leakage
 * (`solvePushPullLeakyRegulated`), where the lumped event solve (whose ring has at most the
 * drains' differential mode behind the leakage, `ringLeakage`) did not converge: any number of
 * outputs, a clamp, leakage and drain capacitance. The loop resistance is split between the
 * halves' loops as it is taken (each half carries its own switch and winding half); each
 * output's path and freewheel drops are affine in its IL (both rectifiers sharing IL while
 * freewheeling, each through its winding half). The first output is
 * held at `regulatedV`; the others' voltages follow from their charge balance (their mean
 * inductor current their load), as the lumped several-output model takes them
 * (`severalEventState`), started from `guess`'s. Each output's inductor current is drawn as the
 * half's triangle (from its valley to the half's highest IL over the on-time, down to zero or the
 * next valley) whose mean is its load; the magnetizing current over the flux's whole swing.
 * Undefined where the solve does not
 * converge or its half does not settle.
 */
export function pushPullLeakyState(
  circuit: DoubleEndedCircuit,
  regulatedV: number,
  guess: DoubleEndedState,
): DoubleEndedState | undefined {
  const stage = circuit.stages[0];
  const vc = circuit.clampVoltageV;
  if (
    circuit.bridge.kind !== 'push-pull' ||
    stage === undefined ||
    vc === undefined ||
    !(circuit.leakageInductanceH > 0)
  ) {
    return undefined;
  }
  const n = circuit.turnsRatios[0] ?? 1;
  const io = stage.loadA;
  const { forwardVoltageV: vf, resistanceOhm: rd } = stage.rectifier;
  const { forwardVoltageV: offVf, resistanceOhm: offRd } = stage.freewheel ?? stage.rectifier;
  const rl = stage.inductorResistanceOhm;
  const rw = stage.windingResistanceOhm;
  const halfS = circuit.periodS / 2;
  const others: PushPullLeakyOutput[] = [];
  for (let k = 1; k < circuit.stages.length; k++) {
    const s = circuit.stages[k] as OutputStage;
    const off = s.freewheel ?? s.rectifier;
    const guessV = guess.points[k]?.voltageV ?? NaN;
    if (!Number.isFinite(guessV)) return undefined;
    others.push({
      turnsRatio: circuit.turnsRatios[k] ?? NaN,
      inductanceH: s.inductanceH,
      pathDropV: s.rectifier.forwardVoltageV,
      pathOhm: s.rectifier.resistanceOhm + s.windingResistanceOhm + s.inductorResistanceOhm,
      freewheelDropV: off.forwardVoltageV,
      freewheelOhm: (off.resistanceOhm + s.windingResistanceOhm) / 2 + s.inductorResistanceOhm,
      loadA: s.loadA,
      voltageGuessV: guessV,
    });
  }
  const half = solvePushPullLeakyRegulated(
    {
      inputV: circuit.inputVoltageV,
      leakageH: circuit.leakageInductanceH,
      halfResistanceOhm: circuit.primaryLoopResistanceOhm,
      capacitanceF: circuit.nodeCapacitanceF / 2,
      magnetizingH: circuit.magnetizingInductanceH,
      turnsRatio: n,
      inductanceH: stage.inductanceH,
      halfS,
      clampV: vc,
      pathV: regulatedV + vf,
      pathOhm: rd + rw + rl,
      freewheelV: regulatedV + offVf,
      freewheelOhm: (offRd + rw) / 2 + rl,
      ...(others.length > 0 ? { others } : {}),
    },
    io,
    Math.max(1e-3, guess.dutyCycle),
  );
  if (half === undefined || !(half.dutyCycle <= DOUBLE_ENDED_DUTY_CYCLE_MAX)) return undefined;
  const onFraction = 2 * half.dutyCycle;
  /** An output's triangle whose mean over the half is its load `loadA`, from its highest IL. */
  const pointOf = (voltageV: number, loadA: number, highestA: number): DoubleEndedStagePoint => {
    const peakA = Math.max(highestA, 1e-12);
    // To zero after d2 (over the half), or, where that outlasts the half, from a valley Iv,
    // (Iv + Ipk)/2 = Io.
    const d2 = (2 * loadA) / peakA - onFraction;
    const isContinuous = d2 > 1 - onFraction;
    const valleyA = isContinuous ? Math.max(0, 2 * loadA - peakA) : 0;
    return {
      mode: isContinuous ? 'ccm' : 'dcm',
      voltageV,
      valleyA,
      peakA,
      freewheelDutyCycle: isContinuous ? 1 - onFraction : Math.max(0, d2),
      onMeanA: (valleyA + peakA) / 2,
    };
  };
  const points = [pointOf(regulatedV, io, half.inductorPeakA)];
  for (let k = 1; k < circuit.stages.length; k++) {
    const other = half.others[k - 1];
    if (other === undefined || !Number.isFinite(other.voltageV) || !(other.voltageV > 0)) {
      return undefined;
    }
    points.push(pointOf(other.voltageV, (circuit.stages[k] as OutputStage).loadA, other.peakA));
  }
  const onS = half.dutyCycle * circuit.periodS;
  // The magnetizing current drawn from −Im,pk to Im,pk over the on-time, Im,pk its largest
  // magnitude over the half: the halves mirror, so that is the flux's whole swing (the ring
  // moves it in the off-time too, which the drawing puts in the on-time); the drive voltage
  // from the on-time's own swing.
  const imPeak = half.magnetizingPeakA;
  const imStart = -imPeak;
  const primaryV =
    (circuit.magnetizingInductanceH * ((half.atTurnOff[5] as number) - (half.start[4] as number))) /
    onS;
  return {
    dutyCycle: half.dutyCycle,
    commutationFraction: 0,
    turnOffSwingFraction: 0,
    primaryVoltageV: primaryV,
    magnetizingPeakA: imPeak,
    magnetizingStartA: imStart,
    points,
    isEvent: true,
    leakyHalf: {
      clampW: half.clampW,
      turnOnDrainV: half.turnOnDrainV,
      switchPeakA: half.switchPeakA,
      drainPeakV: half.drainPeakV,
    },
  };
}

/**
 * The steady state an event solve gives: its stages' points, the magnetizing current of the
 * half (`half`, on the first output's secondary) referred to the primary by `n` (that output's
 * turns ratio), no separate turn-off swing (the events hold it).
 */
function eventStateOf(
  dutyCycle: number,
  commutation: number,
  primaryV: number,
  half: { magnetizingPeakA: number; magnetizingStartA: number },
  n: number,
  points: DoubleEndedStagePoint[],
): DoubleEndedState {
  return {
    dutyCycle,
    commutationFraction: commutation,
    turnOffSwingFraction: 0,
    primaryVoltageV: primaryV,
    magnetizingPeakA: half.magnetizingPeakA / n,
    magnetizingStartA: half.magnetizingStartA / n,
    points,
    isEvent: true,
  };
}

/**
 * Passes of {@link severalEventState}'s fixed point on the cross-regulated outputs' voltages (12
 * before the own-events check: the attempts that ran out of them end at the 2 % bound with 40).
 */
const SEVERAL_EVENT_PASSES = 40;

/**
 * Where an output's current, followed through the equivalent's half, is set to zero where the
 * equivalent idles, or would go below zero at a stretch's end, by more than this share of its
 * peak, the equivalent's state is not taken as it stands: each output's own events decide
 * (`severalEventState`).
 */
const FOLLOW_TOLERANCE = 0.02;

/**
 * The light-load state of several outputs by events (DEVELOPERS.md, "Light load with several
 * outputs: the event model"): the equivalent output (`referredOutputs`, referred to output 0's
 * secondary) runs the event half of one output (`solveEventHalf`), its path and freewheel
 * voltages the Leq-weighted sums of the outputs' Vo_k + drops, and every output follows the half
 * (`followOutput`), its Vo_k and turn-on current from periodicity and charge balance. Output 0 is
 * regulated (`regulatedV`); the others cross-regulate: a fixed point on their voltages, each pass
 * re-solving the equivalent's half from the last (its Newton steps warm, its Jacobian kept,
 * `EventMemory`). With every output conducting through the half each output's Vo is shifted by
 * c_k times output 0's miss (Vo_k = c_k·A − B_k, A the winding's mean, B_k the output's drops over
 * the half), which ends the passes in two; where the equivalent idles (every output set to zero
 * there) each Vo_k is its own charge's, and Aitken's extrapolation shortens the passes. They end
 * when the voltages move by less than 1e-10 of themselves, or where a pass comes back to the
 * voltages of two passes before (a two-cycle across a jump of the snapped outputs, which no
 * fixed point lies between). Where output 0's own Vo misses the target by more than
 * `FOLLOW_TOLERANCE`, or an output would stop before the others by more than that, or the
 * passes cycle, each output's own events (`ownEvents`) decide: the equivalent's state where
 * only the outputs stop apart and they confirm it (`isOwnAgreeing`), else their own half
 * (`ownEventsState`). Undefined where the passes or the own events do not converge.
 */
function severalEventState(
  circuit: DoubleEndedCircuit,
  regulatedV: number,
  guess: DoubleEndedState,
  why: EventWhy,
): DoubleEndedState | undefined {
  const stages = circuit.stages;
  const n0 = circuit.turnsRatios[0] ?? 1;
  const referred = referredOutputs(stages, circuit.turnsRatios, n0);
  if (referred === undefined) return undefined;
  const vd = circuit.driveVoltageV;
  const halfS = circuit.periodS / 2;
  const node = firstNodeCapacitance(circuit);
  const drops = stages.map(stageDrops);
  const voltages = stages.map((_, k) =>
    k === 0 ? regulatedV : (guess.points[k]?.voltageV ?? NaN),
  );
  if (!voltages.every((v) => Number.isFinite(v))) return undefined;
  let equivalentStartA = 0;
  for (let k = 0; k < stages.length; k++) {
    equivalentStartA += (referred.factors[k] as number) * (guess.points[k]?.valleyA ?? 0);
  }
  let start = {
    stageDuty: 2 * Math.max(1e-9, guess.dutyCycle - guess.commutationFraction),
    inductorStartA: equivalentStartA,
    magnetizingStartA: n0 * guess.magnetizingStartA,
  };
  let primaryV = Number.isFinite(guess.primaryVoltageV) ? guess.primaryVoltageV : vd;
  let commutationS = Math.max(0, guess.commutationFraction) * circuit.periodS;
  const lastSteps: number[] = [];
  // The cross-regulated voltages the last pass used: a pass that comes back to them closes a
  // two-cycle (`isCycle` below).
  const lastUsed: number[] = [];
  const memory: EventMemory = {};
  for (let pass = 0; pass < SEVERAL_EVENT_PASSES; pass++) {
    let pathV = 0;
    let freewheelV = 0;
    for (let k = 0; k < stages.length; k++) {
      const w = referred.weights[k] as number;
      const c = referred.factors[k] as number;
      pathV += (w * ((voltages[k] as number) + (drops[k] as StageDrops).onV)) / c;
      freewheelV += (w * ((voltages[k] as number) + (drops[k] as StageDrops).offV)) / c;
    }
    const constants = ringConstants({
      inductanceH: referred.stage.inductanceH,
      referredMagnetizingH: circuit.magnetizingInductanceH / (n0 * n0),
      capacitanceF: node.capacitanceF,
      clampV: node.clampV,
      pathV,
      freewheelV,
      ...ringLeakage(circuit, n0, guess),
    });
    const context: EventContext = {
      constants,
      onV: primaryV / n0,
      halfS,
      commutationS,
      loadA: referred.stage.loadA,
      primary: {
        driveV: vd,
        turnsRatio: n0,
        loopResistanceOhm: circuit.primaryLoopResistanceOhm,
        leakageInductanceH: circuit.leakageInductanceH,
      },
    };
    // The first pass starts from the guess (a second start where that fails); the later ones
    // from the last pass's half.
    const half =
      pass === 0
        ? solveEventHalfFrom(context, start, memory, why)
        : solveEventHalf(context, start, memory);
    if (half === undefined) return undefined;
    primaryV = context.onV * n0;
    commutationS = half.commutationS;
    start = half;
    const onS = half.stageDuty * halfS;
    const run = simulateRing(constants, half.ringStart, halfS - commutationS - onS, true, true, -1);
    if (!run.isComplete || run.segments === undefined) return undefined;
    const equivalent: EquivalentHalf = {
      halfS,
      commutationS,
      onS,
      onV: context.onV,
      constants,
      segments: run.segments,
      endA: half.inductorStartA,
      isOnStartZero: half.inductorOnStartA <= 0,
      isPeakZero: half.inductorPeakA <= 0,
    };
    const followed: FollowedOutput[] = [];
    for (let k = 0; k < stages.length; k++) {
      const f = followOutput(stages[k] as OutputStage, referred.factors[k] as number, equivalent);
      if (f === undefined) return undefined;
      followed.push(f);
    }
    // Where the equivalent idles, every output is set to zero there (`followOutput`): each
    // output's Vo then follows from its own charge, and output 0's differs from the target by
    // that approximation (bounded below), so no shift.
    let hasSnap = false;
    for (const f of followed) if (f.snapA > 0) hasSnap = true;
    const missV = regulatedV - (followed[0] as FollowedOutput).voltageV;
    const shiftV = hasSnap ? 0 : missV;
    let moveV = Math.abs(shiftV);
    // A two-cycle: with outputs snapped to zero where the equivalent idles, its ring can end on
    // a short conducting stretch or on that stretch ending just before the half's end (a short
    // idle one after), and each output's Vo steps across the fixed point with it (seed 11's
    // spec 116: the 5 V output 3.3253 and 3.3281 V, output 0 11.9985 and 12.0015 V, pass after
    // pass). No fixed point lies between: the two sets bracket it, and each output's own events
    // (no snap) decide the corner.
    let isCycle = hasSnap && pass > 1;
    for (let k = 1; k < stages.length; k++) {
      let next =
        (followed[k] as FollowedOutput).voltageV + (referred.factors[k] as number) * shiftV;
      const usedV = voltages[k] as number;
      moveV = Math.max(moveV, Math.abs(next - usedV));
      // The passes contract geometrically (by some 0.04 a pass where the outputs idle): Aitken's
      // extrapolation from the last two steps (ref: Aitken's Δ² process, common practice).
      const lastStepV = lastSteps[k] ?? NaN;
      const stepV = next - usedV;
      const ratio = stepV / lastStepV;
      if (Number.isFinite(ratio) && Math.abs(ratio) < 0.5) next = usedV + stepV / (1 - ratio);
      lastSteps[k] = stepV;
      // Back to two passes before within a thousandth of the step: a sustained alternation
      // (a geometric one would need a ratio within 1e-3 of −1), not a pass near convergence.
      const twoBackV = lastUsed[k] ?? NaN;
      if (!(Math.abs(next - twoBackV) <= 1e-3 * Math.abs(next - usedV))) isCycle = false;
      lastUsed[k] = usedV;
      voltages[k] = next;
    }
    const scaleV = Math.max(1, Math.abs(regulatedV));
    if (!(moveV > 1e-8 * scaleV)) isCycle = false;
    if (moveV > 1e-10 * scaleV && !isCycle) continue;
    const commutation = commutationS / circuit.periodS;
    const dutyCycle = commutation + half.stageDuty / 2;
    if (!(dutyCycle <= DOUBLE_ENDED_DUTY_CYCLE_MAX)) return undefined;
    why.miss = 'outputs-stop-apart';
    const isMissed = !(Math.abs(missV) <= FOLLOW_TOLERANCE * Math.abs(regulatedV));
    let isApart = false;
    for (const f of followed) {
      const limitA = FOLLOW_TOLERANCE * Math.max(f.peakA, 1e-12);
      if (!(f.snapA <= limitA) || !(f.lowestA >= -limitA)) isApart = true;
    }
    // Outputs stopping apart (or output 0 missing its target by the snapped tail): each
    // output's own events, from the equivalent's half. Where they confirm the equivalent's
    // duty cycle and voltages within `FOLLOW_TOLERANCE` the equivalent is taken; where they
    // converge elsewhere, their own half is the state (`ownEventsState`).
    if (isApart || isMissed || isCycle) {
      const own = ownEvents(
        circuit,
        regulatedV,
        referred.factors,
        drops,
        {
          stageDuty: half.stageDuty,
          magnetizingStartA: half.magnetizingStartA,
          startsA: followed.map((f) => f.startA),
          voltagesV: voltages,
          pickUpA: half.pickUpA,
        },
        ringLeakage(circuit, n0, guess).leakageH,
      );
      if (own === undefined) {
        if (isCycle) why.miss = 'not-converged';
        return undefined;
      }
      if (isMissed || isCycle || !isOwnAgreeing(own.shot, half.stageDuty, voltages)) {
        return ownEventsState(circuit, referred.factors, own.circuit, own.shot);
      }
    }
    const ring = { constants, start: half.ringStart, halfS, isContinued: true };
    const points: DoubleEndedStagePoint[] = followed.map((f, k) => {
      const c = referred.factors[k] as number;
      return {
        mode: half.hasIdle || f.hasIdle ? 'dcm' : 'ccm',
        voltageV: k === 0 ? regulatedV : (voltages[k] as number),
        valleyA: f.onStartA,
        peakA: f.peakA,
        freewheelDutyCycle: 1 - 2 * dutyCycle,
        onMeanA: (f.onStartA + f.peakA) / 2,
        sharedFall: {
          magnetizingStartA: -half.magnetizingStartA / c,
          magnetizingEndOfOnA: half.magnetizingPeakA / c,
          startA: f.peakA,
          endA: f.startA,
          startFraction: 2 * dutyCycle,
          endFraction: 1,
          windingVoltageV: c * constants.centreV,
          ring,
          followsRing: {
            perRingA: f.perRingA,
            perS: f.perS,
            windingFactor: c,
            offPerS: f.offPerS,
            segmentStartsA: f.segmentStartsA,
          },
        },
      };
    });
    return eventStateOf(dutyCycle, commutation, primaryV, half, n0, points);
  }
  return undefined;
}

/**
 * Each output's own events (`shootSeveralOutputs`: the set of conducting outputs changing the
 * ring stretch by stretch, the turn-on commutation, the leakage in the ring as
 * `simulateLeakyRing` takes it, `ringLeakageH`: `ringLeakage`'s), started from the equivalent's
 * half `guess` (its stage duty and the outputs' voltages, output 0 at `regulatedV`): the
 * converged half and the circuit it ran on, or undefined where that solve does not converge.
 */
function ownEvents(
  circuit: DoubleEndedCircuit,
  regulatedV: number,
  factors: readonly number[],
  drops: readonly StageDrops[],
  guess: {
    stageDuty: number;
    magnetizingStartA: number;
    startsA: readonly number[];
    voltagesV: readonly number[];
    pickUpA: number;
  },
  ringLeakageH: number | undefined,
): { shot: ShotHalf; circuit: ShotCircuit } | undefined {
  const n0 = circuit.turnsRatios[0] ?? 1;
  const node = firstNodeCapacitance(circuit);
  const shotCircuit: ShotCircuit = {
    outputs: circuit.stages.map((stage, k) => ({
      inductanceH: stage.inductanceH,
      loadA: stage.loadA,
      factor: factors[k] as number,
      onDropV: (drops[k] as StageDrops).onV,
      offDropV: (drops[k] as StageDrops).offV,
    })),
    referredMagnetizingH: circuit.magnetizingInductanceH / (n0 * n0),
    capacitanceF: node.capacitanceF,
    clampV: node.clampV,
    halfS: circuit.periodS / 2,
    driveV: circuit.driveVoltageV,
    turnsRatio: n0,
    loopResistanceOhm: circuit.primaryLoopResistanceOhm,
    leakageInductanceH: circuit.leakageInductanceH,
    ...(ringLeakageH === undefined ? {} : { ringLeakageH }),
  };
  const shot = shootSeveralOutputs(shotCircuit, regulatedV, guess);
  return shot === undefined ? undefined : { shot, circuit: shotCircuit };
}

/**
 * Whether the own-events half `shot` confirms the equivalent's (its stage duty `stageDuty` and
 * the outputs' voltages `voltagesV`) within `FOLLOW_TOLERANCE`: where the outputs stop apart, the
 * equivalent's approximation (every output set to zero where the equivalent's current is) is
 * then taken.
 */
function isOwnAgreeing(shot: ShotHalf, stageDuty: number, voltagesV: readonly number[]): boolean {
  if (!(Math.abs(shot.stageDuty - stageDuty) <= FOLLOW_TOLERANCE * stageDuty)) return false;
  return shot.voltagesV.every((v, k) => {
    const usedV = voltagesV[k] as number;
    return Math.abs(v - usedV) <= FOLLOW_TOLERANCE * Math.abs(usedV);
  });
}

/**
 * The light-load state of several outputs from their own events (`shot`, converged on
 * `shotCircuit`), where the outputs stop apart and the equivalent's half is not confirmed
 * (DEVELOPERS.md, "Light load with several outputs: the event model", each output's own stop):
 * each output's rectifier current ends at its own time and the rest ring on as the equivalent of
 * those still conducting. The half is run once more to record its stretches (`shotDrawing`),
 * each with its own equivalent's ring constants, which the waveforms draw (`ring.stretches`,
 * every output by its own share and slope a stretch). Undefined where that run fails or D
 * leaves (0, 0.5].
 */
function ownEventsState(
  circuit: DoubleEndedCircuit,
  factors: readonly number[],
  shotCircuit: ShotCircuit,
  shot: ShotHalf,
): DoubleEndedState | undefined {
  const drawing = shotDrawing(shotCircuit, shot);
  const first = drawing?.stretches[0];
  if (drawing === undefined || first === undefined) return undefined;
  const n0 = circuit.turnsRatios[0] ?? 1;
  const commutation = drawing.commutationS / circuit.periodS;
  const dutyCycle = commutation + shot.stageDuty / 2;
  if (!(dutyCycle > 0 && dutyCycle <= DOUBLE_ENDED_DUTY_CYCLE_MAX)) return undefined;
  const ring = {
    constants: first.constants,
    start: first.segment.start,
    halfS: circuit.periodS / 2,
    isContinued: true,
    stretches: drawing.stretches.map((st) => ({ constants: st.constants, segment: st.segment })),
  };
  const ringIdles = drawing.stretches.some((st) => st.segment.mode === 'idle');
  // The first conducting stretch's centre: the winding's level as the ring starts.
  const centreV = first.constants.centreV;
  const points: DoubleEndedStagePoint[] = circuit.stages.map((_, k) => {
    const c = factors[k] as number;
    const onStartA = drawing.onStartsA[k] ?? 0;
    const peakA = shot.peaksA[k] ?? 0;
    const startA = Math.max(0, shot.startsA[k] ?? 0);
    return {
      mode: ringIdles || shot.idles[k] === true ? 'dcm' : 'ccm',
      voltageV: shot.voltagesV[k] as number,
      valleyA: onStartA,
      peakA,
      freewheelDutyCycle: 1 - 2 * dutyCycle,
      onMeanA: (onStartA + peakA) / 2,
      sharedFall: {
        magnetizingStartA: -shot.magnetizingStartA / c,
        magnetizingEndOfOnA: shot.magnetizingPeakA / c,
        startA: peakA,
        endA: startA,
        startFraction: 2 * dutyCycle,
        endFraction: 1,
        windingVoltageV: c * centreV,
        ring,
        followsRing: {
          perRingA: first.sharesA[k] ?? 0,
          perS: first.ratesAPerS[k] ?? 0,
          windingFactor: c,
          segmentStartsA: drawing.stretches.map((st) => st.startsA[k] ?? 0),
          segmentSharesA: drawing.stretches.map((st) => st.sharesA[k] ?? 0),
          segmentRatesAPerS: drawing.stretches.map((st) => st.ratesAPerS[k] ?? 0),
        },
      },
    };
  });
  return eventStateOf(dutyCycle, commutation, shot.onV * n0, shot, n0, points);
}

/** {@link solveDoubleEnded} without the event model: the secant on D over the fixed point. */
function solveDoubleEndedPlain(
  circuit: DoubleEndedCircuit,
  regulatedV: number,
  start: DoubleEndedState | undefined,
  isCold: boolean,
): DoubleEndedState | undefined {
  const dMax = DOUBLE_ENDED_DUTY_CYCLE_MAX;
  const isWarm =
    !isCold && start !== undefined && start.dutyCycle > 1e-9 && start.dutyCycle <= dMax;
  const trials: Trials = {
    last: isWarm ? start : undefined,
    isCold,
    isLoose: !isWarm,
    // None yet: a cold start's first trial lies some percent from the root.
    lastErrorV: Infinity,
    belowD: NaN,
    belowV: NaN,
    aboveD: NaN,
    aboveV: NaN,
  };
  const error = trialError(circuit, trials, regulatedV);
  // Fast path: secant steps from the lossless duty cycle n·(Vo + Vf)/(2·Vd), or from the nearby
  // circuit's; Vo(D) is nearly linear in continuous conduction. Brent's method backs it.
  const first = circuit.stages[0];
  const guess = isWarm
    ? start.dutyCycle
    : first === undefined
      ? 0.25
      : Math.min(
          0.45,
          ((circuit.turnsRatios[0] ?? 1) * (regulatedV + first.rectifier.forwardVoltageV)) /
            (2 * circuit.driveVoltageV),
        );
  const firstError = error(guess);
  const fast = secantRoot(
    error,
    guess,
    secondDuty(guess, firstError, regulatedV, isWarm),
    1e-9,
    dMax,
    {
      absoluteTolerance: 1e-13,
      valueAtX0: firstError,
    },
  );
  if (Number.isFinite(fast)) return trialState(circuit, trials, fast, STATE_DEFAULTS);
  // Brent's method over the narrowest bracket the trials found, else up to 0.5.
  if (Number.isNaN(trials.aboveD)) {
    const topError = error(dMax);
    if (topError < 0) return undefined;
    if (topError === 0) return trialState(circuit, trials, dMax, STATE_DEFAULTS);
  }
  // Vo(D) need not rise everywhere at light load: the bracket's ends may come in either order.
  const belowD = Number.isNaN(trials.belowD) ? 1e-9 : trials.belowD;
  const isRising = belowD < trials.aboveD;
  const d = brentRoot(error, isRising ? belowD : trials.aboveD, isRising ? trials.aboveD : belowD, {
    absoluteTolerance: 1e-13,
    valueAtLo: isRising ? trials.belowV : trials.aboveV,
    valueAtHi: isRising ? trials.aboveV : trials.belowV,
  });
  return Number.isFinite(d) ? trialState(circuit, trials, d, STATE_DEFAULTS) : undefined;
}

/**
 * The secant's second duty cycle. From a nearby circuit's duty cycle, a step of 1e-6 beside it
 * (the root moves little from one choice pass to the next). From the lossless guess, the guess
 * scaled by the voltage it missed by, D·Vo,target/Vo(D) (Vo is about proportional to D), which
 * lands within a few percent of the root even where the drops or the light load's shared fall
 * put it far from the guess; a step of 1 % where that scaling fails.
 */
function secondDuty(
  guess: number,
  guessError: number,
  regulatedV: number,
  isWarm: boolean,
): number {
  if (isWarm) return guess * (1 - 1e-6);
  const scaled = (guess * regulatedV) / (regulatedV + guessError);
  const isUsable =
    Number.isFinite(scaled) &&
    scaled > 1e-9 &&
    scaled <= DOUBLE_ENDED_DUTY_CYCLE_MAX &&
    Math.abs(scaled - guess) > 1e-6 * guess;
  return isUsable ? scaled : guess * 1.01;
}

/**
 * The duty-cycle trials of one solve: the last trial's state, which starts the next one's, and
 * the highest duty cycle found below the regulated voltage and the lowest above it, with their
 * errors (V; NaN until found): Brent's method starts from that bracket if the secant fails.
 */
interface Trials {
  last: DoubleEndedState | undefined;
  /** Whether every trial starts its fixed point afresh (`solveDoubleEndedCold`). */
  isCold: boolean;
  /**
   * Whether early trials may settle loosely (`trialTolerance`): not from a warm start, whose
   * trials lie close to the root and whose secant steps 1e-6 to its second trial.
   */
  isLoose: boolean;
  /** The last trial's error, V (Infinity before the first). */
  lastErrorV: number;
  belowD: number;
  belowV: number;
  aboveD: number;
  aboveV: number;
}

/** The state at duty cycle `d`, started from the last trial's (a nearby duty cycle). */
function trialState(
  circuit: DoubleEndedCircuit,
  trials: Trials,
  d: number,
  options: DoubleEndedStateOptions,
): DoubleEndedState {
  trials.last = doubleEndedStateAt(circuit, d, trials.isCold ? undefined : trials.last, options);
  return trials.last;
}

/** The loosest fixed-point tolerance of a duty-cycle trial (`trialTolerance`), over Vd. */
const TRIAL_TOLERANCE_MAX = 1e-8;

/**
 * The fixed-point tolerance of the next duty-cycle trial: a trial whose predecessor missed the
 * regulated voltage by e need only be settled to 1e-4·e/Vo (at most 1e-8), since the search
 * moves on from it by far more than that; trials near the root, and the state returned, settle
 * to the full 1e-13. Saves one or two passes (each a ring solve at light load) of the early
 * trials.
 */
function trialTolerance(trials: Trials, regulatedV: number): DoubleEndedStateOptions {
  const tolerance = (1e-4 * Math.abs(trials.lastErrorV)) / Math.max(1, Math.abs(regulatedV));
  if (!trials.isLoose || !(tolerance > STATE_DEFAULTS.relativeTolerance)) return STATE_DEFAULTS;
  return { relativeTolerance: Math.min(TRIAL_TOLERANCE_MAX, tolerance) };
}

/**
 * The first output's voltage less `regulatedV` (V) as a function of the duty cycle, by
 * `trialState`, kept in the trials' bracket. Made here, not as a named arrow in
 * `solveDoubleEnded`: under tsx (the service's and the bench's runtime) esbuild's keepNames
 * wraps every named arrow in an Object.defineProperty call.
 */
function trialError(
  circuit: DoubleEndedCircuit,
  trials: Trials,
  regulatedV: number,
): (d: number) => number {
  return (d) => {
    const options = trialTolerance(trials, regulatedV);
    const e = (trialState(circuit, trials, d, options).points[0]?.voltageV ?? 0) - regulatedV;
    trials.lastErrorV = e;
    if (e < 0 && !(d <= trials.belowD)) {
      trials.belowD = d;
      trials.belowV = e;
    }
    if (e > 0 && !(d >= trials.aboveD)) {
      trials.aboveD = d;
      trials.aboveV = e;
    }
    return e;
  };
}
