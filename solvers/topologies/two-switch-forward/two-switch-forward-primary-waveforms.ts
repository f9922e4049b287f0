import type { Waveform } from '../../waveform/waveform.js';
import { intervalBreaks, intervalWaveform } from '../buck-derived/interval-waveform.js';
import type { TwoSwitchForwardCircuit, TwoSwitchForwardState } from './two-switch-forward-state.js';
import { pathAt, type MagnetizingRing } from './magnetizing-ring.js';
import { forwardClampV, forwardLeakageDampingOhm } from './complete-forward-state.js';
import {
  forwardLeakageSpike,
  plateauClampA,
  spikeAt,
  type ForwardLeakageSpike,
} from './leakage-spike.js';

/** The primary-side waveforms of one corner, A and V. */
export interface TwoSwitchForwardPrimaryWaveforms {
  magnetizingA: Waveform;
  /** Current in each switch (both carry the same), A; over the turn-off swing, into its capacitance. */
  switchA: Waveform;
  /**
   * Current in the clamp diodes (Im in reset) or in the reset diode (Im·Np/Nr), A; over the
   * leakage's plateau, the leakage's decaying current.
   */
  clampA: Waveform;
  /**
   * Primary winding current: the switch current, then the magnetizing current in reset
   * (two-switch), A; over the leakage's plateau the leakage's current.
   */
  windingA: Waveform;
  /** Current drawn from the input terminal: switch current less the returned clamp current, A. */
  inputA: Waveform;
  /**
   * Voltage across each switch, V: Rds·i on; rising linearly over the turn-off swing to Vin/2
   * (two-switch) or Vin (the winding at zero); then along the ring of Lm with the node, the
   * reversed winding v added: Vin/2 + v/2 (two equal switches share it, at most Vin + Vf at the
   * clamp) or Vin + v (up to Vin + Vr at the clamp); Vin/2 or Vin once the winding is back at zero.
   * From the swing's end the leakage's spike (leakage-spike.ts) where it stands above the ring.
   */
  switchV: Waveform;
  /** The leakage's spike after the turn-off swing (plain model; undefined without one). */
  leakageSpike: ForwardLeakageSpike | undefined;
}

/**
 * Returns the primary waveforms: Im ramps I0 → Im,pk from the commutation to the end of the
 * turn-off swing (slower over the swing, where the winding falls to zero), then follows the ring
 * (magnetizing-ring.ts: arcs drawn at most π/8 apart, aligned on the peak; the clamp's straight
 * fall; I0 held once the winding is back at zero, carried by the secondary); the switches carry
 * Im plus the reflected inductor currents Σ iL,k/nk while on, as their terminal current held at
 * Im,pk + ΣIpk/n over the swing, and the ring's current into their capacitance while the node
 * moves (not while the clamp holds it).
 */
export function twoSwitchForwardPrimaryWaveforms(
  circuit: TwoSwitchForwardCircuit,
  state: TwoSwitchForwardState,
  onResistanceOhm: number,
): TwoSwitchForwardPrimaryWaveforms {
  const d = state.dutyCycle;
  const start = state.commutationFraction;
  const swingEnd = d + state.turnOffSwingFraction;
  // The stages' equivalent on-interval ends halfway through the swing.
  const stageEnd = d + state.turnOffSwingFraction / 2;
  const { periodS } = circuit;
  const { ring } = state;
  const clampStart = swingEnd + ring.clampStartS / periodS;
  const clampEnd = swingEnd + ring.clampEndS / periodS;
  const ringEnd = swingEnd + ring.ringEndS / periodS;
  // Over the swing the current is held at its turn-off value (the swing's constant-current model).
  let turnOffA = state.magnetizingPeakA;
  const { points } = state;
  for (let k = 0; k < points.length; k++) {
    turnOffA += (points[k] as (typeof points)[number]).peakA / (circuit.turnsRatios[k] ?? 1);
  }
  // The leakage's spike after the swing: the plain model only (the event period's own stretches
  // carry the light-load turn-off).
  // The damping across the leakage is the exported circuit's, on one switch's capacitance.
  const spike =
    state.lightLoad === undefined
      ? forwardLeakageSpike(
          circuit.leakageInductanceH,
          circuit.magnetizingInductanceH,
          circuit.turnOffCapacitanceF,
          forwardLeakageDampingOhm(circuit),
          forwardClampV(circuit),
          turnOffA,
          state.magnetizingPeakA,
        )
      : undefined;
  // Put in order once for the six waveforms.
  const breaks = intervalBreaks([
    start,
    d,
    stageEnd,
    swingEnd,
    clampStart,
    clampEnd,
    ringEnd,
    ...ringArcBreaks(ring, swingEnd, periodS),
    ...(spike === undefined ? [] : spikeBreaks(spike, swingEnd, ringEnd, periodS)),
  ]);
  const isTwoSwitch = circuit.reset.kind === 'clamp-diodes';
  if (state.lightLoad !== undefined) {
    // The event period: the channel's current at the gate's turn-off, not the capacitance's
    // charging current over the long light-load swing (Lm takes over as the winding falls).
    turnOffA = state.lightLoad.magnetizingPeakA / (circuit.turnsRatios[0] ?? 1);
    turnOffA += state.lightLoad.inductorPeakA / (circuit.turnsRatios[0] ?? 1);
  }
  const c: ForwardPrimaryShape = {
    circuit,
    state,
    start,
    stageEnd,
    swingEnd,
    clampStart,
    clampEnd,
    ringEnd,
    // Lm sees Vp up to the gate's turn-off, then the swing's fall to zero.
    atGateOffA:
      state.magnetizingStartA +
      ((state.magnetizingPeakA - state.magnetizingStartA) * (d - start)) / (stageEnd - start),
    turnOffA,
    // The reset winding carries the magnetizing ampere-turns: Im·Np/Nr.
    resetShare: circuit.reset.kind === 'clamp-diodes' ? 1 : 1 / circuit.reset.resetTurnsRatio,
    cutRingA: 0,
    spike,
  };
  if (state.lightLoad !== undefined && ringEnd >= 1) {
    // The event period's ring cut by the next turn-on: the drawn lossless ring ends where the
    // solved period's does not (the forward rectifiers draining Lm are not drawn), so the
    // difference to the start is spread over the ring; else the flux would not close (a 200 V
    // forward at 1 % load ended 1.5 mA off, 40 % of the start, and the iGSE refused it).
    c.cutRingA = state.magnetizingStartA - pathAt(ring, (1 - swingEnd) * periodS).currentA;
  }
  const vin = circuit.inputVoltageV;
  // Where the winding reaches zero over the swing: half the input on each of two switches.
  const swingTopV = isTwoSwitch ? vin / 2 : vin;
  const onEndV = onResistanceOhm * switchCurrentAt(c, d, (start + d) / 2);
  // The value functions live at module level and are handed over as anonymous arrows: under
  // tsx (the service's and the bench's runtime) esbuild's keepNames gave each named closure an
  // Object.defineProperty call, four a corner.
  return {
    magnetizingA: intervalWaveform(periodS, breaks, (f, mid) => magnetizingAt(c, f, mid)),
    switchA: intervalWaveform(periodS, breaks, (f, mid) => switchCurrentAt(c, f, mid)),
    clampA: intervalWaveform(periodS, breaks, (f, mid) => clampAt(c, f, mid)),
    windingA: intervalWaveform(periodS, breaks, (f, mid) => {
      if (isTwoSwitch) return switchCurrentAt(c, f, mid) + clampAt(c, f, mid);
      // The reset winding takes Im's ampere-turns in the reset; over the leakage's plateau the
      // primary still carries the leakage's current, which the reset winding returns.
      const plateauA = plateauAt(c, f, mid);
      return Number.isNaN(plateauA) ? switchCurrentAt(c, f, mid) : plateauA;
    }),
    inputA: intervalWaveform(
      periodS,
      breaks,
      (f, mid) => switchCurrentAt(c, f, mid) - clampAt(c, f, mid),
    ),
    switchV: intervalWaveform(periodS, breaks, (f, mid) => {
      if (mid < d) return onResistanceOhm * switchCurrentAt(c, f, mid);
      if (mid < swingEnd) return onEndV + ((swingTopV - onEndV) * (f - d)) / (swingEnd - d);
      if (mid < ringEnd) {
        const t = (f - swingEnd) * periodS;
        let v = pathAt(ring, t).voltageV;
        if (spike !== undefined) v = Math.max(v, spikeAt(spike, t).voltageV);
        return isTwoSwitch ? Math.min(vin / 2 + v / 2, vin + circuit.clampDiodeV) : vin + v;
      }
      return isTwoSwitch ? vin / 2 : vin;
    }),
    leakageSpike: spike,
  };
}

/** What the primary's value functions read (fractions of the period). */
interface ForwardPrimaryShape {
  circuit: TwoSwitchForwardCircuit;
  state: TwoSwitchForwardState;
  /** End of the turn-on commutation. */
  start: number;
  /** End of the stages' equivalent on-interval, halfway through the turn-off swing. */
  stageEnd: number;
  /** End of the turn-off swing (the winding at zero). */
  swingEnd: number;
  /** The clamp's start and end (equal short of it), and the winding back at zero. */
  clampStart: number;
  clampEnd: number;
  ringEnd: number;
  /** Magnetizing current as the gate turns off, A. */
  atGateOffA: number;
  /** Switch current held over the swing, Im,pk + ΣIpk/n, A. */
  turnOffA: number;
  /** A light-load ring cut by the turn-on: its end's difference to the start, spread over it, A. */
  cutRingA: number;
  /** The clamp's share of the magnetizing current: 1, or Np/Nr for a reset winding. */
  resetShare: number;
  /** The leakage's spike after the swing (times from the swing's end), where there is one. */
  spike: ForwardLeakageSpike | undefined;
}

function magnetizingAt(c: ForwardPrimaryShape, f: number, mid: number): number {
  const { state, start, swingEnd, atGateOffA } = c;
  const d = state.dutyCycle;
  const startA = state.magnetizingStartA;
  if (mid < start) return startA;
  if (mid < d) return startA + ((atGateOffA - startA) * (f - start)) / (d - start);
  if (mid < swingEnd) {
    return atGateOffA + ((state.magnetizingPeakA - atGateOffA) * (f - d)) / (swingEnd - d);
  }
  if (state.lightLoad !== undefined && mid >= c.ringEnd && c.ringEnd < 1) {
    // The event period's drain after the ring's return, drawn as a straight line to the start.
    const endA = pathAt(state.ring, state.ring.ringEndS).currentA;
    return endA + ((state.magnetizingStartA - endA) * (f - c.ringEnd)) / (1 - c.ringEnd);
  }
  const ringA = pathAt(state.ring, (f - swingEnd) * c.circuit.periodS).currentA;
  return c.cutRingA === 0 ? ringA : ringA + (c.cutRingA * (f - swingEnd)) / (1 - swingEnd);
}

function switchCurrentAt(c: ForwardPrimaryShape, f: number, mid: number): number {
  const { state, start, stageEnd } = c;
  const d = state.dutyCycle;
  if (mid >= c.swingEnd) {
    const { spike } = c;
    if (spike !== undefined && mid < c.ringEnd) {
      // The leakage's current carries the node while the spike stands above the ring; none
      // flows into the capacitance while the clamp holds it.
      const t = (f - c.swingEnd) * c.circuit.periodS;
      const tMid = (mid - c.swingEnd) * c.circuit.periodS;
      if (tMid < spike.riseS + spike.holdS && spikeIsAbove(c, tMid)) {
        return tMid < spike.riseS ? spikeAt(spike, t).currentA : 0;
      }
    }
    // The ring's current into the switch capacitance while the node moves.
    const isMoving = mid < c.ringEnd && (mid < c.clampStart || mid >= c.clampEnd);
    return isMoving ? magnetizingAt(c, f, mid) : 0;
  }
  if (mid >= d) return c.turnOffA;
  // Through the leakage the switch current rises from zero to the reflected valley plus the
  // magnetizing start during the commutation.
  let currentA = mid < start ? (state.magnetizingStartA * f) / start : magnetizingAt(c, f, mid);
  // A plain loop, not a forEach callback: this runs for every point of four waveforms.
  const { points } = state;
  for (let k = 0; k < points.length; k++) {
    const point = points[k] as (typeof points)[number];
    // Through the leakage the switch current rises to the reflected valley during the
    // commutation; then the inductor currents ramp as the stages say.
    const iL =
      mid < start
        ? (point.valleyA * f) / start
        : point.valleyA + ((point.peakA - point.valleyA) * (f - start)) / (stageEnd - start);
    currentA += iL / (c.circuit.turnsRatios[k] ?? 1);
  }
  return currentA;
}

/**
 * The current the clamp takes over the leakage's plateau (A): the primary's whole current,
 * decaying to Im (it flows in the primary winding too); NaN outside the plateau.
 */
function plateauAt(c: ForwardPrimaryShape, f: number, mid: number): number {
  const { spike } = c;
  if (spike !== undefined && spike.holdS > 0 && mid > c.swingEnd && mid < c.ringEnd) {
    const tMid = (mid - c.swingEnd) * c.circuit.periodS;
    if (tMid > spike.riseS && tMid < spike.riseS + spike.holdS) {
      return plateauClampA(spike, (f - c.swingEnd) * c.circuit.periodS);
    }
  }
  return NaN;
}

function clampAt(c: ForwardPrimaryShape, f: number, mid: number): number {
  const plateauA = plateauAt(c, f, mid);
  if (!Number.isNaN(plateauA)) return c.resetShare * plateauA;
  return mid >= c.clampStart && mid < c.clampEnd ? c.resetShare * magnetizingAt(c, f, mid) : 0;
}

/** Whether the spike's voltage stands above the ring's at `t` (s after the swing's end). */
function spikeIsAbove(c: ForwardPrimaryShape, t: number): boolean {
  const { spike } = c;
  return spike !== undefined && spikeAt(spike, t).voltageV > pathAt(c.state.ring, t).voltageV;
}

/**
 * Fractions of the period along the leakage's spike (arcs at most {@link ARC_STEP} of phase
 * apart; the plateau's ends; the drawn fall), inside (swingEnd, ringEnd).
 */
function spikeBreaks(
  spike: ForwardLeakageSpike,
  swingEnd: number,
  ringEnd: number,
  periodS: number,
): number[] {
  const times: number[] = [];
  const stageEndS = Math.min(spike.releaseS, spike.riseS);
  pushTimes(times, ARC_STEP / spike.wd, 0, stageEndS);
  times.push(stageEndS);
  if (spike.riseS > stageEndS) pushTimes(times, ARC_STEP / spike.arcW, stageEndS, spike.riseS);
  const holdEndS = spike.riseS + spike.holdS;
  times.push(spike.riseS, holdEndS);
  pushTimes(times, (2 * ARC_STEP * spike.fallS) / Math.PI, holdEndS, holdEndS + spike.fallS);
  times.push(holdEndS + spike.fallS);
  const breaks: number[] = [];
  for (const t of times) {
    const f = swingEnd + t / periodS;
    if (f > swingEnd && f < ringEnd) breaks.push(f);
  }
  return breaks;
}

/** Pushes the times strictly inside (fromS, toS) `stepS` apart. */
function pushTimes(times: number[], stepS: number, fromS: number, toS: number): void {
  for (let t = fromS + stepS; t < toS - 1e-3 * stepS; t += stepS) times.push(t);
}

/** Largest phase step between the points drawn along a ring arc. */
const ARC_STEP = Math.PI / 8;

/**
 * Fractions of the period along the ring's arcs (at most {@link ARC_STEP} of phase apart, so
 * that the peak at a quarter period is a point): the rise from the swing's end to the clamp (or
 * back to zero short of it), and the return from the clamp's end to zero.
 */
function ringArcBreaks(ring: MagnetizingRing, swingEnd: number, periodS: number): number[] {
  const breaks: number[] = [];
  if (!Number.isFinite(ring.w)) return breaks;
  const stepS = ARC_STEP / ring.w;
  // Behind the leakage's spike the arc starts at the spike's end (Lm held at I1 until then).
  if (ring.prefixS > 0) breaks.push(swingEnd + ring.prefixS / periodS);
  pushArc(breaks, swingEnd, periodS, stepS, ring.prefixS, ring.clampStartS);
  pushArc(
    breaks,
    swingEnd,
    periodS,
    stepS,
    ring.reachesClamp ? ring.clampEndS : ring.clampStartS,
    ring.ringEndS,
  );
  return breaks;
}

/** Pushes the fractions strictly inside (fromS, toS) (s after the swing's end) `stepS` apart. */
function pushArc(
  breaks: number[],
  swingEnd: number,
  periodS: number,
  stepS: number,
  fromS: number,
  toS: number,
): void {
  for (let t = fromS + stepS; t < toS - 1e-3 * stepS; t += stepS) {
    breaks.push(swingEnd + t / periodS);
  }
}
