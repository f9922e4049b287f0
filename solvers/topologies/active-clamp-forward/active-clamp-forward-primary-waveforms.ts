import type { Waveform } from '../../waveform/waveform.js';
import {
  insertDistinctAscending,
  intervalBreaks,
  intervalWaveform,
  type IntervalBreaks,
} from '../buck-derived/interval-waveform.js';
import { rotateWaveform } from './rotate-waveform.js';
import type { ActiveClampCircuit } from './active-clamp-forward-circuit.js';
import type { ActiveClampState } from './active-clamp-forward-state.js';

/** The primary-side waveforms of one corner, A and V. */
export interface ActiveClampPrimaryWaveforms {
  magnetizingA: Waveform;
  /** Main switch current, which is also the current drawn from the input, A. */
  switchA: Waveform;
  /** Auxiliary switch current, which is the clamp capacitor current (positive charging it), A. */
  clampA: Waveform;
  /** Primary winding (leakage) current, A. */
  windingA: Waveform;
  switchV: Waveform;
  auxiliaryV: Waveform;
  capacitorV: Waveform;
  /**
   * Drain voltage just after the gate turns off (the clamp's side of the jump), V: the value the
   * turn-off overlap sees. Given here because the waveforms are advanced by the lead, so their
   * jump sits at (D + lead)·T − lead·T, which round-off may put on either side of D·T: reading
   * `switchV` at D·T gave the on-state drop instead about every other time.
   */
  turnOffDrainV: number;
  /** Clamp (auxiliary switch) current just after the gate turns off, A; same reason. */
  clampStartA: number;
  /** Main switch current as its gate turns off (its peak), A. */
  turnOffSwitchA: number;
}

/** Samples of the clamp capacitor's parabolic voltage per interval, so its polyline stays close. */
const CAPACITOR_SAMPLES = 6;

/**
 * Shortest time over which the auxiliary switch's hard turn-on charge is drawn, s: a polyline
 * cannot hold an impulse, so a switch given no rise time draws it over this.
 */
const TURN_ON_PULSE_MIN_S = 1e-9;

/** The parts the waveforms are read from: the state, the switches' resistances and the clamp. */
export interface ActiveClampParts {
  mainOnResistanceOhm: number;
  auxiliaryOnResistanceOhm: number;
  /** The auxiliary switch's turn-on time, s: its hard turn-on's charge is drawn over it. */
  auxiliaryRiseTimeS: number;
  clampCapacitanceF: number;
  clampCapacitorEsrOhm: number;
}

/**
 * Returns the primary waveforms. On: Im ramps Im,v → Im,pk after the turn-on commutation and the
 * main switch carries Im + Σ iL,k/nk, then, held at its value as the gate turns off, carries its drain (and the
 * auxiliary's capacitance) from the on-drop to Vin over the turn-off swing (the stages' ramps end
 * halfway through it, their equivalent on-interval). Off: the leakage current falls from Im,pk + ΣIpk/n to Im,pk
 * into the clamp (turn-off commutation), then the clamp capacitor drives Im back to Im,v; the
 * capacitor voltage is V0 + q(t)/Cc with q the charge taken since turn-off and V0 set so that its
 * mean over the reset is the state's clamp voltage. Idle before conduction: the drain sits at Vin
 * (winding at zero) and Im rests at Im,v; with a body-diode interval the main switch conducts
 * (negative current) before its gate. Drain: Rds·i on; Vin + vc + (Raux + ESR)·ic off. Where the
 * auxiliary switch turns on hard (the swing cut by its gate below the clamp), the clamp capacitor
 * gives the switch node its charge C·ΔV over the auxiliary's rise time as it turns on: a
 * rectangular pulse in the auxiliary switch's (and the clamp capacitor's) current, not in the
 * winding's, while the drain rises and the auxiliary's voltage falls linearly by ΔV.
 */
export function activeClampPrimaryWaveforms(
  circuit: ActiveClampCircuit,
  state: ActiveClampState,
  parts: ActiveClampParts,
): ActiveClampPrimaryWaveforms {
  // Built from the start of conduction (the body diode's, before the gate), then advanced so
  // that time 0 is the gate's turn-on.
  const d = state.dutyCycle + state.leadFraction;
  const c1 = state.onCommutationFraction;
  const swingEnd = d + state.offSwingFraction;
  const stageEnd = d + state.offExtensionFraction;
  const r0 = swingEnd + state.offCommutationFraction;
  const r1 = r0 + state.resetDutyCycle;
  const { periodS } = circuit;
  const vin = circuit.inputVoltageV;
  const swingA = state.magnetizingPeakA - state.magnetizingValleyA;
  // The hard turn-on's pulse, at most half the clamp's conduction long.
  const hasPulse = state.auxiliaryTurnOnChargeC > 0;
  const pulseS = Math.min(
    Math.max(parts.auxiliaryRiseTimeS, TURN_ON_PULSE_MIN_S),
    ((r1 - swingEnd) * periodS) / 2,
  );
  const pulseEnd = hasPulse ? swingEnd + pulseS / periodS : swingEnd;
  // Plain loops, not forEach callbacks: switchCurrentAt runs for every point of four waveforms.
  const { points } = state;
  let reflectedValleyA = 0;
  for (let k = 0; k < points.length; k++) {
    reflectedValleyA +=
      (points[k] as (typeof points)[number]).valleyA / (circuit.turnsRatios[k] ?? 1);
  }
  // The value functions live at module level over this context and are handed over as
  // anonymous arrows: under tsx (the service's and the bench's runtime) esbuild's keepNames gave
  // each named closure an Object.defineProperty call, five a corner.
  const c: PrimaryShape = {
    circuit,
    state,
    d,
    c1,
    swingEnd,
    stageEnd,
    r0,
    r1,
    swingA,
    // Lm sees Vp up to the gate's turn-off, then the swing's fall to zero.
    atGateOffA: state.magnetizingValleyA + (swingA * (d - c1)) / (stageEnd - c1),
    // Over the swing the current is held at its value as the gate turns off (the swing's
    // constant-current model; set below, once the shape can evaluate the on-ramp).
    turnOffA: NaN,
    reflectedValleyA,
    pulseEnd,
    pulseA: hasPulse ? -state.auxiliaryTurnOnChargeC / pulseS : 0,
    ordered: [],
    charges: [0],
    restV: NaN,
    clampCapacitanceF: parts.clampCapacitanceF,
  };
  // The channel's current as the gate turns off, the on-ramp's end at d (the ramps themselves
  // run on to stageEnd, the swing's equivalent on-interval): what the switch carries at most, and
  // what its turn-off overlap sees. Over the swing the winding's current goes on into the switch
  // node's capacitance, held here at this value.
  c.turnOffA =
    d > c1 ? switchCurrentAt(c, d, (c1 + d) / 2) : state.magnetizingPeakA + state.reflectedPeakA;
  // Breaks: the intervals, the zero crossing of the reset ramp, and samples for the parabola.
  const breaks = [c1, d, stageEnd, swingEnd, r0, r1];
  if (hasPulse) breaks.push(pulseEnd);
  const crossing = r0 + (state.magnetizingPeakA / swingA) * state.resetDutyCycle;
  if (crossing > r0 && crossing < r1) breaks.push(crossing);
  // The currents are linear between those; the capacitor's parabola takes samples as well.
  const sampled = [...breaks];
  for (let i = 1; i < CAPACITOR_SAMPLES; i++) {
    sampled.push(r0 + (state.resetDutyCycle * i) / CAPACITOR_SAMPLES);
    if (r0 > swingEnd) sampled.push(swingEnd + ((r0 - swingEnd) * i) / CAPACITOR_SAMPLES);
  }
  const ordered = distinctAscending(sampled, d, r1);
  c.ordered = ordered;
  // Charge q(f) since turn-off at each break (exact: the current is linear between breaks), and
  // its integral over the reset for the mean; charges[i] is the charge at ordered[i] (ordered[0]
  // is d, where it is zero).
  let charge = 0;
  let resetIntegral = 0;
  for (let i = 1; i < ordered.length; i++) {
    const a = ordered[i - 1] as number;
    const b = ordered[i] as number;
    const mid = (a + b) / 2;
    const ia = clampCurrentAt(c, a, mid);
    const ib = clampCurrentAt(c, b, mid);
    const dt = (b - a) * periodS;
    if (a >= r0) resetIntegral += charge * dt + (ia * dt * dt) / 2 + ((ib - ia) * dt * dt) / 6;
    charge += ((ia + ib) / 2) * dt;
    c.charges.push(charge);
  }
  const cc = parts.clampCapacitanceF;
  const restV = state.clampVoltageV - resetIntegral / (state.resetDutyCycle * periodS) / cc;
  c.restV = restV;
  const onEndV = parts.mainOnResistanceOhm * switchCurrentAt(c, d, (c1 + d) / 2);
  const clampDropOhm = parts.auxiliaryOnResistanceOhm + parts.clampCapacitorEsrOhm;
  // The first interval of the clamp's conduction (after the swing), named by its midpoint as the
  // waveforms name it.
  let afterSwing = r1;
  for (const f of ordered) {
    if (f > swingEnd) {
      afterSwing = f;
      break;
    }
  }
  const afterOff = (swingEnd + afterSwing) / 2;
  const clampStartA = heldClampAt(c, swingEnd, afterOff);
  // Each break set put in order once for the waveforms that share it.
  const intervals = intervalBreaks(breaks);
  const sampledIntervals = intervalBreaks(ordered.concat(breaks));
  const leadS = state.leadFraction * periodS;
  const offSwingV = state.offSwingDrainV - onEndV;
  const jumpV = state.auxiliaryTurnOnVoltageV;
  // What is left of the hard turn-on's ΔV at f within the pulse.
  const pulseLeftV = (f: number) => (jumpV * (pulseEnd - f)) / (pulseEnd - swingEnd);
  return {
    magnetizingA: advancedWaveform(periodS, leadS, intervals, (f, mid) => magnetizingAt(c, f, mid)),
    switchA: advancedWaveform(periodS, leadS, intervals, (f, mid) => switchCurrentAt(c, f, mid)),
    clampA: advancedWaveform(periodS, leadS, intervals, (f, mid) => clampCurrentAt(c, f, mid)),
    windingA: advancedWaveform(
      periodS,
      leadS,
      intervals,
      (f, mid) => switchCurrentAt(c, f, mid) + heldClampAt(c, f, mid),
    ),
    switchV: advancedWaveform(periodS, leadS, sampledIntervals, (f, mid) => {
      if (mid < d) return parts.mainOnResistanceOhm * switchCurrentAt(c, f, mid);
      if (mid < swingEnd) return onEndV + (offSwingV * (f - d)) / (swingEnd - d);
      if (mid < r1) {
        const clampV = vin + capacitorAt(c, f, mid) + clampDropOhm * heldClampAt(c, f, mid);
        return mid < pulseEnd ? clampV - pulseLeftV(f) : clampV;
      }
      return vin;
    }),
    auxiliaryV: advancedWaveform(periodS, leadS, intervals, (f, mid) => {
      if (mid < d) return vin + restV - parts.mainOnResistanceOhm * switchCurrentAt(c, f, mid);
      if (mid < swingEnd) return vin + restV - onEndV - (offSwingV * (f - d)) / (swingEnd - d);
      if (mid < r1) {
        const onV = -parts.auxiliaryOnResistanceOhm * heldClampAt(c, f, mid);
        return mid < pulseEnd ? onV + pulseLeftV(f) : onV;
      }
      return restV;
    }),
    capacitorV: advancedWaveform(periodS, leadS, sampledIntervals, (f, mid) =>
      capacitorAt(c, f, mid),
    ),
    turnOffDrainV: vin + capacitorAt(c, swingEnd, afterOff) + clampDropOhm * clampStartA,
    clampStartA,
    turnOffSwitchA: c.turnOffA,
  };
}

/** What the primary's value functions read (fractions of the period from the start). */
interface PrimaryShape {
  circuit: ActiveClampCircuit;
  state: ActiveClampState;
  /** End of the on-interval (D + lead). */
  d: number;
  /** End of the turn-on commutation. */
  c1: number;
  /** End of the turn-off swing (the winding at zero). */
  swingEnd: number;
  /** End of the stages' equivalent on-interval, inside the swing. */
  stageEnd: number;
  /** Start of the reset. */
  r0: number;
  /** End of the reset. */
  r1: number;
  /** Magnetizing peak less valley, A. */
  swingA: number;
  /** Magnetizing current as the gate turns off, A. */
  atGateOffA: number;
  /** Switch current as the gate turns off, held over the swing, A. */
  turnOffA: number;
  /** Σ Iv/n, A. */
  reflectedValleyA: number;
  /** End of the auxiliary switch's hard turn-on pulse (swingEnd where there is none). */
  pulseEnd: number;
  /** The pulse's current (negative: out of the clamp capacitor), A. */
  pulseA: number;
  /** The capacitor's sample fractions from d to r1, ascending. */
  ordered: number[];
  /** Charge since turn-off at each of `ordered`, C. */
  charges: number[];
  /** Capacitor voltage at rest, V. */
  restV: number;
  clampCapacitanceF: number;
}

/** The waveform of `value` over the break set, advanced by the lead (time 0 at the gate). */
function advancedWaveform(
  periodS: number,
  leadS: number,
  at: IntervalBreaks,
  value: (f: number, mid: number) => number,
): Waveform {
  return rotateWaveform(intervalWaveform(periodS, at, value), leadS);
}

function magnetizingAt(c: PrimaryShape, f: number, mid: number): number {
  const { state, d, c1, r0, swingEnd } = c;
  if (mid < c1 || mid >= c.r1) return state.magnetizingValleyA;
  if (mid < d) return state.magnetizingValleyA + (c.swingA * (f - c1)) / (c.stageEnd - c1);
  if (mid < swingEnd) {
    return c.atGateOffA + ((state.magnetizingPeakA - c.atGateOffA) * (f - d)) / (swingEnd - d);
  }
  if (mid < r0) return state.magnetizingPeakA;
  return state.magnetizingPeakA - (c.swingA * (f - r0)) / state.resetDutyCycle;
}

function switchCurrentAt(c: PrimaryShape, f: number, mid: number): number {
  const { state, d, c1 } = c;
  if (mid >= c.swingEnd) return 0;
  if (mid >= d) return c.turnOffA;
  // Through the leakage the current rises from its value at the gate to Im,v + ΣIv/n while the
  // winding is held.
  if (mid < c1) {
    const startA = state.onCommutationStartA;
    return startA + ((state.magnetizingValleyA + c.reflectedValleyA - startA) * f) / c1;
  }
  const { points } = state;
  let reflectedA = 0;
  for (let k = 0; k < points.length; k++) {
    const point = points[k] as (typeof points)[number];
    // A stage with a shorter lead than Lm's (discontinuous) starts that much later.
    const startF = c1 + state.leadFraction - (state.stageLeadFractions[k] ?? state.leadFraction);
    const iL =
      f <= startF
        ? point.valleyA
        : point.valleyA + ((point.peakA - point.valleyA) * (f - startF)) / (c.stageEnd - startF);
    reflectedA += iL / (c.circuit.turnsRatios[k] ?? 1);
  }
  return magnetizingAt(c, f, mid) + reflectedA;
}

/** The clamp capacitor's (and auxiliary switch's) current: the winding's and the pulse. */
function clampCurrentAt(c: PrimaryShape, f: number, mid: number): number {
  const heldA = heldClampAt(c, f, mid);
  return mid >= c.swingEnd && mid < c.pulseEnd ? heldA + c.pulseA : heldA;
}

/** The winding's current through the clamp: the leakage hand-over, then the magnetizing ramp. */
function heldClampAt(c: PrimaryShape, f: number, mid: number): number {
  const { state, swingEnd, r0 } = c;
  if (mid < swingEnd || mid >= c.r1) return 0;
  if (mid < r0) {
    return state.magnetizingPeakA + (state.reflectedPeakA * (r0 - f)) / (r0 - swingEnd);
  }
  return magnetizingAt(c, f, mid);
}

function capacitorAt(c: PrimaryShape, f: number, mid: number): number {
  if (mid < c.d || mid >= c.r1) return c.restV;
  const i = c.ordered.indexOf(f);
  return c.restV + (i < 0 ? 0 : (c.charges[i] as number)) / c.clampCapacitanceF;
}

/**
 * The distinct fractions of `fractions` within [low, high], in ascending order: each inserted in
 * place (a Set, its spread and a sort with a comparator were about half of this module's own
 * time in a profile of an active-clamp evaluation).
 */
function distinctAscending(fractions: readonly number[], low: number, high: number): number[] {
  const out: number[] = [];
  for (const f of fractions) if (f >= low && f <= high) insertDistinctAscending(out, f);
  return out;
}
