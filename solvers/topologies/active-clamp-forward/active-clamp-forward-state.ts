import { brentRoot } from '../../root-finding/brent-root.js';
import {
  outputStagePoint,
  type OutputStage,
  type OutputStagePoint,
} from '../buck-derived/output-stage.js';
import type { ActiveClampCircuit } from './active-clamp-forward-circuit.js';
import { SWING_HOLD, turnOffSwingFraction } from '../buck-derived/turn-off-swing.js';
import { deadTimeSwing } from './dead-time-swing.js';
import { heldCurrentAtVinA } from './dead-time-swing-held.js';
import { loadedRamp, type RampStage } from './loaded-ramp.js';
import { discontinuousStageLeadS } from './discontinuous-stage-lead.js';
import { leakageCurrentAtTurnOn } from './leakage-turn-on.js';
import { stageDutyFor } from './stage-inversion.js';

/** The periodic steady state of the active-clamp forward at one duty cycle. */
export interface ActiveClampState {
  /** The main switch's gate duty cycle. */
  dutyCycle: number;
  /**
   * Equivalent interval before the gate turns on, over the period, in which the winding sees the
   * input: the part of the dead time's drain swing below Vin, and any body-diode conduction
   * after it reaches zero. 0 when the output inductors hold the winding at zero.
   */
  leadFraction: number;
  /**
   * Each stage's equivalent lead over the period: {@link leadFraction} for a continuous stage;
   * for a discontinuous one its current at the gate over its on-slope, from the swing below Vin
   * loaded by the conducting stages ({@link loadedRamp}), or the swing's area above its rectifier
   * threshold over its headroom ({@link discontinuousStageLeadS}) where there is no such swing.
   * Stage k's on-interval is its on-voltage's for {@link stageDutyCycle} − leadFraction +
   * stageLeadFractions[k].
   */
  stageLeadFractions: number[];
  /** Body-diode conduction of the main switch before its gate, over the period. */
  bodyDiodeFraction: number;
  /** Drain voltage when the gate turns on, V (0: zero-voltage turn-on). */
  turnOnVoltageV: number;
  /**
   * Turn-on commutation over the period: the leakage current rises from
   * {@link onCommutationStartA} to Im,v + ΣIv/n at Vin while the winding is at zero.
   */
  onCommutationFraction: number;
  /**
   * Leakage current as the gate turns on, A: Im,v, less what the dead time lets Vin take off it
   * once the drain has passed Vin ({@link leakageCurrentAtTurnOn}); 0 without leakage.
   */
  onCommutationStartA: number;
  /**
   * Turn-off swing over the period: after the gate turns off, the primary current carries the
   * switch node towards Vin (winding to zero) over C·Vp/(I·T) ({@link turnOffSwingFraction}),
   * cut short by the auxiliary switch's gate at the dead time.
   */
  offSwingFraction: number;
  /** The swing's area over Vp, over the period: what it adds to the stages' on-interval. */
  offExtensionFraction: number;
  /** Drain voltage at the end of the turn-off swing, V (Vin when it completes in the dead time). */
  offSwingDrainV: number;
  /**
   * Voltage across the auxiliary switch as its gate turns on at the dead time after the main
   * gate's turn-off, V: the clamp's level Vin + Vc less the drain's, 0 when the drain reached the
   * clamp within the dead time (zero-voltage turn-on after its body diode).
   */
  auxiliaryTurnOnVoltageV: number;
  /**
   * Charge the clamp capacitor gives the switch node's capacitance over a period, C: the
   * capacitance times {@link auxiliaryTurnOnVoltageV} (see `auxiliaryTurnOn`).
   */
  auxiliaryTurnOnChargeC: number;
  /** Time the auxiliary switch's body diode conducts before its gate, s. */
  auxiliaryBodyDiodeS: number;
  /**
   * The on-interval the stages and Lm see at the on-voltage: the conduction less the turn-on
   * commutation, plus the swing's area over Vp (half the swing when it completes).
   */
  stageDutyCycle: number;
  /** Turn-off commutation over the period: the leakage current falls into the clamp. */
  offCommutationFraction: number;
  /** Interval over the period in which the clamp voltage resets the magnetizing inductance. */
  resetDutyCycle: number;
  /** Dead time less its equivalent lead and reset parts, over the period: winding at zero. */
  idleFraction: number;
  /** Voltage across the magnetizing inductance during the on-interval, V. */
  primaryVoltageV: number;
  /** Magnitude of the voltage across the magnetizing inductance during the reset, V. */
  resetVoltageV: number;
  /** Mean clamp capacitor voltage over the reset interval, V. */
  clampVoltageV: number;
  magnetizingPeakA: number;
  /** Magnetizing current at the start of the on-time (negative when the reset passes zero), A. */
  magnetizingValleyA: number;
  /** Σ iL,k/nk at the end of the on-interval: the current the leakage hands to the clamp, A. */
  reflectedPeakA: number;
  points: OutputStagePoint[];
}

const PASSES = 60;
const SETTLED = 1e-13;
/** Largest duty cycle plus commutations and dead time; beyond it there is no time to reset. */
export const ACTIVE_CLAMP_CYCLE_MAX = 0.999;

/**
 * Returns the state at gate duty cycle D, or undefined when D leaves no time to reset. With D'
 * the conduction interval (D plus any body-diode interval before the gate), volt-second balance
 * on Lm: Vp·(D' − con) = Vr·Dr with Dr = 1 − D' − coff − idle; charge balance on the clamp
 * capacitor over its conduction (coff + Dr): (Im,pk + ΣIpk/n/2)·coff + (Im,pk − ΔIm/2)·Dr = Qa/T, so
 * the magnetizing current swings about zero, shifted down by the leakage charge and up by the
 * charge Qa the clamp gives the switch node where the auxiliary switch turns on hard
 * ({@link auxiliaryTurnOn}). Vc = Vr·(1 + Llk/Lm) − Rclamp·mean(i), i the magnetizing current
 * into the clamp over the reset: the winding sees the capacitor plus the loop's drop where i
 * charges it, less where it drains it (until 2026-12-05 the drop had the other sign; high-side
 * clamp: Vc = Vin·D/(1 − D) lossless). The primary drops
 * (Rds + Rp at the mean on-current, Llk·di/dt) and the commutation times make it a fixed point.
 */
export function activeClampStateAt(
  circuit: ActiveClampCircuit,
  dutyCycle: number,
): ActiveClampState | undefined {
  return settle(circuit, () => dutyCycle);
}

/**
 * Returns the state whose first output sits at `regulatedV` (V): each pass inverts the first
 * stage for the duty cycle its secondary voltage needs; undefined when no duty cycle reaches it.
 */
export function solveActiveClamp(
  circuit: ActiveClampCircuit,
  regulatedV: number,
): ActiveClampState | undefined {
  const first = circuit.stages[0];
  if (first === undefined) return undefined;
  const n0 = circuit.turnsRatios[0] ?? 1;
  const state = settle(
    circuit,
    (primaryV, onCommutation, firstLead, offExtension) =>
      stageDutyFor(first, primaryV / n0, regulatedV, circuit.periodS) +
      onCommutation -
      offExtension -
      firstLead,
  );
  const isExact =
    state !== undefined &&
    Math.abs((state.points[0]?.voltageV ?? 0) - regulatedV) <= 1e-9 * regulatedV;
  if (isExact) return state;
  // Near the stage's mode boundary the inversion and the stage may disagree: search D instead.
  const error = (d: number) =>
    (activeClampStateAt(circuit, d)?.points[0]?.voltageV ?? -regulatedV) - regulatedV;
  const top = ACTIVE_CLAMP_CYCLE_MAX - circuit.deadTimeFraction - 1e-6;
  if (!(error(top) >= 0)) return undefined;
  const d = brentRoot(error, 1e-9, top, { absoluteTolerance: 1e-13 });
  return Number.isFinite(d) ? activeClampStateAt(circuit, d) : undefined;
}

function settle(
  circuit: ActiveClampCircuit,
  gateDutyOf: (
    primaryV: number,
    onCommutation: number,
    firstLead: number,
    offExtension: number,
  ) => number,
): ActiveClampState | undefined {
  const { inputVoltageV: vin, periodS, magnetizingInductanceH: lm } = circuit;
  const llk = circuit.leakageInductanceH;
  let primaryV = vin;
  let onCommutation = 0;
  let onStartA = 0;
  let offCommutation = 0;
  let offSwing = 0;
  let offExtension = 0;
  let offSwingDrainV = vin;
  let lead = 0;
  // Two buffers, swapped each pass: a pass's arrays cost about a tenth of a microsecond each at
  // every pass of every corner, continuous or not.
  let stageLeads = circuit.stages.map(() => 0);
  let nextStageLeads = circuit.stages.map(() => 0);
  let idle = circuit.deadTimeFraction;
  let swing = deadTimeSwing(vin, vin, -1, -1, 0, 0);
  let auxiliary = auxiliaryTurnOn(circuit, 0, 0, vin, vin);
  let state: ActiveClampState | undefined;
  for (let pass = 0; pass < PASSES; pass++) {
    // The conduction interval: the lead before the gate, then the gate's D (the first stage's
    // own lead where it is discontinuous).
    const d = gateDutyOf(primaryV, onCommutation, stageLeads[0] ?? lead, offExtension);
    const conduction = d + lead;
    // The stages and Lm see the turn-off swing's area; the reset starts after the swing and the
    // turn-off commutation.
    const effectiveDuty = conduction - onCommutation + offExtension;
    const resetDuty = 1 - conduction - offSwing - offCommutation - idle;
    if (!(effectiveDuty > 0) || !(resetDuty > 0) || !(primaryV > 0) || !(d > 0)) return undefined;
    if (conduction + offSwing + offCommutation + idle > ACTIVE_CLAMP_CYCLE_MAX) return undefined;
    // Plain loops, not callbacks: a callback capturing the pass's sums boxed each of them on the
    // heap at every step (as in the double-ended state).
    const points: OutputStagePoint[] = [];
    let onMeanA = 0;
    let valleyA = 0;
    let peakA = 0;
    let slopeAPerS = 0;
    let freewheelSlopeAPerS = 0;
    for (let k = 0; k < circuit.stages.length; k++) {
      const n = circuit.turnsRatios[k] ?? 1;
      const stageDuty = effectiveDuty - lead + (stageLeads[k] ?? lead);
      if (!(stageDuty > 0)) return undefined;
      const point = outputStagePoint(
        circuit.stages[k] as OutputStage,
        stageDuty,
        primaryV / n,
        periodS,
      );
      points.push(point);
      onMeanA += point.onMeanA / n;
      valleyA += point.valleyA / n;
      peakA += point.peakA / n;
      slopeAPerS += (point.peakA - point.valleyA) / (stageDuty * periodS * n);
      if (point.mode === 'ccm' && point.freewheelDutyCycle > 0) {
        freewheelSlopeAPerS +=
          (point.peakA - point.valleyA) / (point.freewheelDutyCycle * periodS * n);
      }
    }
    const swingA = (primaryV * effectiveDuty * periodS) / lm;
    const clampDuty = offCommutation + resetDuty;
    const magnetizingPeakA =
      ((swingA / 2) * resetDuty - (peakA / 2) * offCommutation + auxiliary.chargeC / periodS) /
      clampDuty;
    const magnetizingValleyA = magnetizingPeakA - swingA;
    const resetVoltageV = (lm * swingA) / (resetDuty * periodS);
    const clampVoltageV =
      resetVoltageV * (1 + llk / lm) -
      circuit.clampLoopResistanceOhm * (magnetizingPeakA - swingA / 2);
    // The leakage in series takes Llk·di/dt of the rising primary current (a divider with the
    // reflected output inductances and Lm).
    const nextV =
      vin -
      circuit.onLoopResistanceOhm * (onMeanA + magnetizingPeakA - swingA / 2) -
      llk * (swingA / (effectiveDuty * periodS) + slopeAPerS);
    // Dead time before turn-on: the drain swing (dead-time-swing.ts) splits it into an
    // equivalent lead at Vin, a reset extension at Vc, and the rest with the winding at zero.
    const heldA = valleyA + magnetizingValleyA;
    const deadS = circuit.deadTimeFraction * periodS;
    const passSwing = swing;
    // The stages carry more than their valley where the drain passes Vin (dead-time-swing-held.ts).
    const capacitanceF = circuit.switchNodeCapacitanceF;
    // The net current where the drain passes Vin, once a pass (`deadTimeSwingHeld`'s, which the
    // discontinuous stages' loaded ramp below starts from too).
    const heldAtVinA = heldCurrentAtVinA(
      vin,
      clampVoltageV,
      magnetizingValleyA,
      heldA,
      freewheelSlopeAPerS,
      capacitanceF,
      deadS,
    );
    swing = deadTimeSwing(vin, clampVoltageV, magnetizingValleyA, heldAtVinA, capacitanceF, deadS);
    // A discontinuous stage's rectifier conducts only once the ramping winding passes
    // n·(Vo + Vf) (its threshold), and from there its rising current slows the drain's fall
    // (loaded-ramp.ts): its own lead is its current at the gate over its on-voltage's slope.
    // Taking the whole area over Vin for every stage put the inductors' current at the gate
    // 0.068 A where ngspice's was 0.036 A on the audit's seed 47 spec 14 at 72 V and 3.3 % load,
    // and its outputs 3 % above ngspice's; now 0.042 A, the drain at 22 V at the gate where
    // ngspice's is at 27 V (DEVELOPERS.md, "The active-clamp forward").
    // Continuous stages carry their current through the swing: the area over Vin, as Lm.
    let rampStages: RampStage[] | undefined;
    for (let k = 0; k < points.length; k++) {
      const point = points[k] as OutputStagePoint;
      if (point.mode !== 'dcm') continue;
      const n = circuit.turnsRatios[k] ?? 1;
      const stage = circuit.stages[k] as OutputStage;
      rampStages ??= [];
      rampStages.push({
        thresholdV: n * (point.voltageV + stage.rectifier.forwardVoltageV),
        inductanceH: n * n * stage.inductanceH,
      });
    }
    const restS =
      rampStages !== undefined && magnetizingValleyA < 0
        ? deadS - (capacitanceF * clampVoltageV) / -magnetizingValleyA
        : 0;
    let rampCurrentsA: number[] | undefined;
    if (rampStages !== undefined && restS > 0 && heldAtVinA < 0 && capacitanceF > 0) {
      const ramp = loadedRamp(vin, -heldAtVinA, capacitanceF, restS, rampStages, primaryV);
      swing = {
        negativeVoltSecondsVs: swing.negativeVoltSecondsVs,
        positiveVoltSecondsVs: ramp.positiveVoltSecondsVs,
        turnOnVoltageV: ramp.turnOnVoltageV,
        bodyDiodeS: ramp.bodyDiodeS,
      };
      rampCurrentsA = ramp.stageCurrentsA;
    }
    const nextLead = swing.positiveVoltSecondsVs / (vin * periodS);
    let isLeadSettled = true;
    for (let k = 0, ramped = 0; k < points.length; k++) {
      let next = nextLead;
      if ((points[k] as OutputStagePoint).mode === 'dcm') {
        const { thresholdV, inductanceH } = rampStages?.[ramped] as RampStage;
        const rampA = rampCurrentsA?.[ramped];
        ramped++;
        const headroomV = primaryV - thresholdV;
        // Without a loaded ramp (no swing below Vin, or no capacitance): the area above the
        // threshold over the headroom.
        next =
          rampA === undefined
            ? discontinuousStageLeadS(swing, vin, thresholdV, primaryV) / periodS
            : headroomV > 0
              ? (inductanceH * rampA) / (headroomV * periodS)
              : 0;
      }
      nextStageLeads[k] = next;
      if (Math.abs(next - (stageLeads[k] ?? 0)) > SETTLED) isLeadSettled = false;
    }
    const nextIdle =
      circuit.deadTimeFraction - nextLead - swing.negativeVoltSecondsVs / (clampVoltageV * periodS);
    // Commutations through a series inductance, t = Llk·ΔI/V (Mohan, Undeland, Robbins, 3rd ed.
    // (from memory), §5-3): at turn-on Vin lifts the leakage current to ΣIv/n + Im,v from what
    // it carries as the gate turns on: Im,v as the dead time began, less what Vin took off it
    // once the drain passed Vin (the body diode's conduction; at most up to zero). The engine had
    // taken it from zero: with 1 µH at 18 V ngspice's leakage still carried −4 A of Im,v −6 A
    // as the gate turned on, and the output was 6.7 % below the engine's. At turn-off the clamp
    // voltage takes ΣIpk/n out of it.
    const fallS =
      magnetizingValleyA < 0 ? (capacitanceF * clampVoltageV) / -magnetizingValleyA : Infinity;
    const nextOnStartA =
      llk > 0
        ? leakageCurrentAtTurnOn(
            vin,
            magnetizingValleyA,
            Math.min(0, heldA),
            circuit.switchNodeCapacitanceF,
            llk,
            deadS - fallS,
          )
        : 0;
    const nextOn = Math.min(
      (llk * Math.max(0, heldA - nextOnStartA)) / (vin * periodS),
      0.9 * conduction,
    );
    // The turn-off commutation's loop (primary winding, auxiliary switch, clamp ESR) drops
    // Rclamp·i on top of the clamp, taken at the leakage current's mean over the fall,
    // Im,pk + ΣIpk/n/2, so that the fall stays linear and its charge exact for it. Left out, with
    // 1 µH on an 18 A primary (91 mΩ, a 10 V clamp) the commutation ran 6 % long and the leakage
    // handed the clamp too much charge: the magnetizing current sat 0.7 A below ngspice's
    // (DEVELOPERS.md, "The active-clamp forward").
    const offLoopV =
      clampVoltageV + circuit.clampLoopResistanceOhm * (magnetizingPeakA + Math.max(0, peakA) / 2);
    const nextOff = Math.min(
      (llk * Math.max(0, peakA)) / (Math.max(offLoopV, 1e-9) * periodS),
      0.5 * (1 - conduction - idle),
    );
    // The turn-off swing at the turn-off current Im,pk + ΣIpk/n over both switches' capacitance,
    // until the auxiliary switch's gate closes the clamp onto the drain at the dead time: a
    // swing of t0 cut at td leaves the winding Vp·td·(1 − td/(2·t0)) of area. The drain's further
    // rise to Vin + Vc, and where the dead time cuts it the charge the clamp then gives the switch
    // node, is `auxiliaryTurnOn`'s.
    const fullSwing = turnOffSwingFraction(
      circuit.switchNodeCapacitanceF,
      primaryV,
      magnetizingPeakA + peakA,
      periodS,
      SWING_HOLD * (1 - conduction - idle),
    );
    const nextSwing = Math.min(fullSwing, circuit.deadTimeFraction);
    const nextExtension = fullSwing > 0 ? nextSwing * (1 - nextSwing / (2 * fullSwing)) : 0;
    const passAuxiliary = auxiliary;
    auxiliary = auxiliaryTurnOn(
      circuit,
      fullSwing,
      magnetizingPeakA + (llk > 0 ? peakA : 0),
      fullSwing > 0 ? vin - primaryV * (1 - nextSwing / fullSwing) : vin,
      vin + clampVoltageV,
    );
    const isSettled =
      Math.abs(nextV - primaryV) <= SETTLED * vin &&
      Math.abs(nextOn - onCommutation) <= SETTLED &&
      Math.abs(nextOnStartA - onStartA) <= SETTLED * Math.max(1, Math.abs(heldA)) &&
      Math.abs(nextOff - offCommutation) <= SETTLED &&
      Math.abs(nextSwing - offSwing) <= SETTLED &&
      Math.abs(nextExtension - offExtension) <= SETTLED &&
      Math.abs(nextLead - lead) <= SETTLED &&
      isLeadSettled &&
      Math.abs(nextIdle - idle) <= SETTLED &&
      Math.abs(auxiliary.chargeC - passAuxiliary.chargeC) <=
        SETTLED * circuit.switchNodeCapacitanceF * vin;
    // Only the last pass's state is returned: built once, not at every pass.
    if (isSettled || pass === PASSES - 1) {
      state = {
        dutyCycle: d,
        leadFraction: lead,
        stageLeadFractions: stageLeads.slice(),
        bodyDiodeFraction: passSwing.bodyDiodeS / periodS,
        turnOnVoltageV: passSwing.turnOnVoltageV,
        onCommutationFraction: onCommutation,
        onCommutationStartA: onStartA,
        offSwingFraction: offSwing,
        offExtensionFraction: offExtension,
        offSwingDrainV,
        auxiliaryTurnOnVoltageV: passAuxiliary.voltageV,
        auxiliaryTurnOnChargeC: passAuxiliary.chargeC,
        auxiliaryBodyDiodeS: passAuxiliary.bodyDiodeS,
        stageDutyCycle: effectiveDuty,
        offCommutationFraction: offCommutation,
        resetDutyCycle: resetDuty,
        idleFraction: idle,
        primaryVoltageV: primaryV,
        resetVoltageV,
        clampVoltageV,
        magnetizingPeakA,
        magnetizingValleyA,
        reflectedPeakA: peakA,
        points,
      };
    }
    primaryV = nextV;
    onCommutation = nextOn;
    onStartA = nextOnStartA;
    offCommutation = nextOff;
    offSwing = nextSwing;
    offExtension = nextExtension;
    offSwingDrainV = fullSwing > 0 ? vin - primaryV * (1 - nextSwing / fullSwing) : vin;
    lead = nextLead;
    const spareLeads = stageLeads;
    stageLeads = nextStageLeads;
    nextStageLeads = spareLeads;
    idle = nextIdle;
    if (isSettled) break;
  }
  return state;
}

/** How the auxiliary switch turns on at the dead time after the main gate's turn-off (SI units). */
interface AuxiliaryTurnOn {
  /** Voltage across it as its gate turns on, V. */
  voltageV: number;
  /** Charge the clamp capacitor gives the switch node then, C. */
  chargeC: number;
  /** Its body diode's conduction before the gate, s. */
  bodyDiodeS: number;
}

/**
 * Returns how the auxiliary switch turns on, at the dead time td after the main gate's turn-off.
 * The turn-off swing carries the drain towards Vin over t0 = `fullSwing`·T (cut at td, where it
 * ends at `cutDrainV`); past Vin the winding has reversed and `aboveA` (Im,pk, plus ΣIpk/n held
 * by any leakage) carries the switch node's capacitance C on towards the clamp's level
 * `clampLevelV` = Vin + Vc. If the drain gets there within td, the auxiliary's body diode takes
 * the current for the rest of it and its gate turns on at zero voltage. Otherwise the gate closes
 * the clamp onto the drain at Vx < Vin + Vc: the clamp capacitor charges the main switch's
 * capacitance by ΔV = Vin + Vc − Vx through the auxiliary switch, whose own capacitance
 * discharges within it. Over a period the capacitance C = Cmain + Caux then takes C·ΔV from the
 * clamp capacitor, whatever the order of its pieces (the auxiliary's capacitance gives Caux·Vx
 * back as the drain rises, takes Caux·(Vin + Vc) as it falls in the dead time before turn-on and
 * as the main switch turns on), and ½·C·ΔV² is lost (common practice: charging a capacitance
 * from a stiff source through a switch loses half the energy it stores, as in Erickson &
 * Maksimović, 2nd ed., §4.3.3 (from memory); the switch node's discharge at the main switch's
 * hard turn-on is the same loss).
 */
function auxiliaryTurnOn(
  circuit: ActiveClampCircuit,
  fullSwing: number,
  aboveA: number,
  cutDrainV: number,
  clampLevelV: number,
): AuxiliaryTurnOn {
  const capacitanceF = circuit.switchNodeCapacitanceF;
  const deadS = circuit.deadTimeFraction * circuit.periodS;
  const vin = circuit.inputVoltageV;
  const clampV = clampLevelV - vin;
  if (!(capacitanceF > 0) || !(clampV > 0)) {
    return { voltageV: 0, chargeC: 0, bodyDiodeS: deadS };
  }
  let drainV: number;
  let bodyDiodeS = 0;
  if (fullSwing >= circuit.deadTimeFraction) {
    drainV = cutDrainV;
  } else if (aboveA > 0) {
    const leftS = deadS - fullSwing * circuit.periodS;
    const riseS = (capacitanceF * clampV) / aboveA;
    drainV = riseS <= leftS ? clampLevelV : vin + (aboveA * leftS) / capacitanceF;
    bodyDiodeS = Math.max(0, leftS - riseS);
  } else {
    drainV = vin;
  }
  const voltageV = Math.max(0, clampLevelV - drainV);
  return { voltageV, chargeC: capacitanceF * voltageV, bodyDiodeS };
}
