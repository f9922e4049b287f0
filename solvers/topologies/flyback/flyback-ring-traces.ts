import type { FlybackCircuit } from './flyback-circuit.js';
import { drainRiseTrace, idleRingTrace, type IdleRingTrace } from './flyback-idle-ring.js';
import type { FlybackSteadyState } from './flyback-steady-state.js';
import { leakageRingArcs } from './flyback-leakage-arcs.js';

/** The arcs of one corner that the current and voltage waveforms both draw. */
export interface FlybackRingTraces {
  /** The drain's rise at turn-off, from 0 to Vin + V0 (flyback-idle-ring.ts, drainRiseTrace). */
  rise: IdleRingTrace;
  /**
   * The leakage ring after the rise (flyback-turn-off.ts): the leakage current and the drain
   * from Vin + V0 up to the clamp or the ring's peak; its first point (the rise's end) left out.
   */
  leakageRise: IdleRingTrace;
  /**
   * The ring's return from the clamp's end (or the peak) towards its centre Vin + Vr: the
   * leakage current (negative) and the drain; its first point left out, empty without a ring.
   */
  leakageReturn: IdleRingTrace;
  /** The DCM idle ring from the end of secondary conduction to T; undefined in CCM. */
  idle: IdleRingTrace | undefined;
}

/**
 * Returns the arcs of the corner's steady state, drawn once per corner: the current and the
 * voltage waveforms read the same points (times in s, currents in A, drain voltages in V).
 */
export function flybackRingTraces(
  circuit: FlybackCircuit,
  state: FlybackSteadyState,
): FlybackRingTraces {
  const onS = state.dutyCycle * circuit.periodS;
  const isContinuous = state.mode !== 'dcm' && state.valleyCurrentA > 0;
  return {
    rise: drainRiseTrace(circuit, onS, state.peakCurrentA, state.turnOffTransitionS),
    leakageRise: leakageRiseTrace(circuit, state, onS + state.turnOffTransitionS),
    leakageReturn: leakageReturnTrace(
      circuit,
      state,
      onS + state.turnOffTransitionS + state.leakageRingS + state.turnOffCommutationS,
    ),
    idle: isContinuous ? undefined : idleRingTrace(circuit, state.conductionEndS),
  };
}

/**
 * The leakage ring from `fromS` over tb (flyback-leakage-arcs.ts, leakageRingArcs), its inner
 * currents scaled so that the chords carry the arc's charge.
 */
function leakageRiseTrace(c: FlybackCircuit, state: FlybackSteadyState, fromS: number) {
  const trace = emptyTrace();
  const ringS = state.leakageRingS;
  if (!(ringS > 0)) return trace;
  const arcs = leakageRingArcs(c, state);
  const centreV = c.inputVoltageV + state.turnOffReflectedV;
  const peakA = arcs.amplitudeV / arcs.impedanceOhm;
  const steps = arcs.riseSteps;
  for (let k = 1; k <= steps; k++) {
    const phase = arcs.fromPhase + (arcs.riseSpan * k) / steps;
    trace.timesS.push(fromS + (ringS * k) / steps);
    trace.currentsA.push(peakA * Math.cos(phase));
    trace.drainV.push(centreV + arcs.amplitudeV * Math.sin(phase));
  }
  // The arc starts at the drain's rise's end current I1 (its first point, left out).
  matchChargeInside(trace.currentsA, state.transitionEndCurrentA, ringS / steps, arcs.riseChargeAS);
  return trace;
}

/** The ring's return from `fromS` (flyback-leakage-arcs.ts, leakageRingArcs), scaled likewise. */
function leakageReturnTrace(c: FlybackCircuit, state: FlybackSteadyState, fromS: number) {
  const trace = emptyTrace();
  const returnS = state.leakageRingReturnS;
  if (!(returnS > 0) || !(state.leakageRingS > 0)) return trace;
  const arcs = leakageRingArcs(c, state);
  const centreV = c.inputVoltageV + state.turnOffReflectedV;
  const peakV = state.leakageRingPeakV;
  const steps = arcs.returnSteps;
  for (let k = 1; k <= steps; k++) {
    const phase = (arcs.returnSpan * k) / steps;
    trace.timesS.push(fromS + (returnS * k) / steps);
    trace.currentsA.push((-peakV / arcs.impedanceOhm) * Math.sin(phase));
    trace.drainV.push(centreV + peakV * Math.cos(phase));
  }
  // The return starts from zero current, at the clamp's end (or the ring's peak).
  matchChargeInside(trace.currentsA, 0, returnS / steps, arcs.returnChargeAS);
  return trace;
}

/**
 * Scales the inner points of `currentsA` (an arc's points after its start `startA`, `stepS`
 * apart, the last one its end) so that the trapezoids under start, points and end hold
 * `chargeAS`: the ends stay on the arc, where the neighbouring intervals meet it. An arc's
 * current keeps one sign, so the factor is near 1 (1 + h²/12 for a step h on a full arc).
 */
function matchChargeInside(
  currentsA: number[],
  startA: number,
  stepS: number,
  chargeAS: number,
): void {
  const last = currentsA.length - 1;
  if (last < 1) return;
  let innerA = 0;
  for (let k = 0; k < last; k++) innerA += currentsA[k] as number;
  const endsA = (startA + (currentsA[last] as number)) / 2;
  const factor = (chargeAS / stepS - endsA) / innerA;
  if (!Number.isFinite(factor) || !(factor > 0)) return;
  for (let k = 0; k < last; k++) currentsA[k] = (currentsA[k] as number) * factor;
}

function emptyTrace(): IdleRingTrace {
  return { timesS: [], currentsA: [], drainV: [], clampFrom: -1, clampTo: -1 };
}
