import type { FlybackCircuit } from './flyback-circuit.js';

/**
 * The state of the discontinuous-conduction idle ring a time τ after the secondary current
 * reaches zero: the magnetizing inductance plus the leakage, L = Lm + Llk, rings with the drain
 * node capacitance C from a drain at Vin + V0 (V0 the reflected voltage at zero secondary
 * current) and zero current. Unclamped, i(τ) = −(V0/Z)·sin ωτ and vd(τ) = Vin + V0·cos ωτ with
 * ω = 1/√(LC) and Z = √(L/C) (lossless series LC; common practice, the quasi-resonant flyback's
 * valley). When V0 > Vin the drain reaches 0 at ωτc = arccos(−Vin/V0) and the switch's body diode
 * clamps it there: the current rises at Vin/L from −√(V0² − Vin²)/Z to zero, after which the
 * ring restarts from 0 V with amplitude Vin, vd = Vin·(1 − cos ωτ'), i = (Vin/Z)·sin ωτ'. The
 * secondary rectifier would clamp the drain above Vin + V0, but a lossless ring that starts there
 * at zero current never returns above it (the LC energy ½·C·V0² only falls when the body diode
 * returns part of it to the input, after which the swing is Vin < V0), so that clamp is never
 * reached here. C = 0 means no ring: zero current and the drain at Vin, as before this model.
 */
export interface IdleRingState {
  /** Magnetizing current (into the drain while positive), A. */
  currentA: number;
  /** Drain-source voltage, V. */
  drainV: number;
  /** di/dτ, A/s. */
  slopeAps: number;
}

/** The ring's constants for one circuit, computed once per corner. */
export interface IdleRing {
  inputV: number;
  /** Reflected voltage at zero secondary current, V0, V. */
  reflectedV: number;
  /** L = Lm + Llk, H. */
  inductanceH: number;
  /** ω, rad/s (0 without capacitance). */
  angularFrequency: number;
  /** Z = √(L/C), Ω (Infinity without capacitance). */
  impedanceOhm: number;
  /** Time the body diode starts to clamp, s (Infinity when V0 ≤ Vin). */
  clampStartS: number;
  /** Time the body diode stops conducting, s (Infinity when V0 ≤ Vin). */
  clampEndS: number;
  /** Current when the clamp starts, A (≤ 0). */
  clampCurrentA: number;
  /** Largest |i| the ring reaches, V0/Z, A. */
  currentBoundA: number;
}

/** The ring constants of `c` (drain capacitance c.drainCapacitanceF). */
export function idleRing(c: FlybackCircuit): IdleRing {
  const inductanceH = c.magnetizingInductanceH + c.leakageInductanceH;
  const capacitanceF = c.drainCapacitanceF;
  const vin = c.inputVoltageV;
  const v0 = Math.max(0, c.reflectedOffsetV);
  if (!(capacitanceF > 0)) {
    return {
      inputV: vin,
      reflectedV: v0,
      inductanceH,
      angularFrequency: 0,
      impedanceOhm: Infinity,
      clampStartS: Infinity,
      clampEndS: Infinity,
      clampCurrentA: 0,
      currentBoundA: 0,
    };
  }
  const angularFrequency = 1 / Math.sqrt(inductanceH * capacitanceF);
  const impedanceOhm = Math.sqrt(inductanceH / capacitanceF);
  let clampStartS = Infinity;
  let clampEndS = Infinity;
  let clampCurrentA = 0;
  if (v0 > vin) {
    clampStartS = Math.acos(-vin / v0) / angularFrequency;
    clampCurrentA = -Math.sqrt(v0 * v0 - vin * vin) / impedanceOhm;
    clampEndS = clampStartS + (inductanceH * -clampCurrentA) / vin;
  }
  return {
    inputV: vin,
    reflectedV: v0,
    inductanceH,
    angularFrequency,
    impedanceOhm,
    clampStartS,
    clampEndS,
    clampCurrentA,
    currentBoundA: v0 / impedanceOhm,
  };
}

/** Fills `out` with the ring's state τ ≥ 0 after the secondary current reached zero. */
export function idleRingAt(ring: IdleRing, tauS: number, out: IdleRingState): void {
  const vin = ring.inputV;
  if (ring.angularFrequency === 0) {
    out.currentA = 0;
    out.drainV = vin;
    out.slopeAps = 0;
    return;
  }
  const l = ring.inductanceH;
  if (tauS <= ring.clampStartS) {
    const phase = ring.angularFrequency * tauS;
    const v0 = ring.reflectedV;
    const cos = Math.cos(phase);
    out.currentA = (-v0 / ring.impedanceOhm) * Math.sin(phase);
    out.drainV = vin + v0 * cos;
    out.slopeAps = (-v0 / l) * cos;
    return;
  }
  if (tauS <= ring.clampEndS) {
    out.currentA = ring.clampCurrentA + (vin * (tauS - ring.clampStartS)) / l;
    out.drainV = 0;
    out.slopeAps = vin / l;
    return;
  }
  const phase = ring.angularFrequency * (tauS - ring.clampEndS);
  const cos = Math.cos(phase);
  out.currentA = (vin / ring.impedanceOhm) * Math.sin(phase);
  out.drainV = vin - vin * cos;
  out.slopeAps = (vin / l) * cos;
}

/** Largest phase step (rad) between the waveform points drawn along the ring. */
const RING_PHASE_STEP = Math.PI / 12;
/** Cap on the points drawn along the ring before the step widens (never beyond π/2). */
const RING_POINTS_CAP = 96;

/**
 * Times (s, from the end of secondary conduction) at which the waveforms sample the ring over an
 * idle interval of `idleS`: a phase grid aligned on the ring's peaks and zero crossings (so the
 * extremes are exact even at the widest step, π/2), plus the clamp's start and end, and idleS.
 */
export function idleRingSampleTimes(ring: IdleRing, idleS: number): number[] {
  const times: number[] = [0];
  if (!(idleS > 0)) return times;
  const w = ring.angularFrequency;
  if (w === 0) {
    times.push(idleS);
    return times;
  }
  const cycles = (w * idleS) / (2 * Math.PI);
  const perQuarter = Math.max(
    1,
    Math.min((Math.PI / 2 / RING_PHASE_STEP) | 0, Math.floor(RING_POINTS_CAP / (4 * cycles + 1))),
  );
  const stepS = Math.PI / 2 / perQuarter / w;
  const clampStartS = Math.min(ring.clampStartS, idleS);
  pushSteps(times, 0, clampStartS, stepS);
  if (clampStartS < idleS) {
    const clampEndS = Math.min(ring.clampEndS, idleS);
    times.push(clampEndS);
    if (clampEndS < idleS) pushSteps(times, clampEndS, idleS, stepS);
  }
  return times;
}

/** Appends the times after `fromS` every `stepS` before `toS`, then `toS` (s). */
function pushSteps(times: number[], fromS: number, toS: number, stepS: number): void {
  for (let k = 1; fromS + k * stepS < toS; k++) times.push(fromS + k * stepS);
  times.push(toS);
}

/** The ring drawn over one idle interval: absolute times (s) with current (A) and drain voltage (V). */
export interface IdleRingTrace {
  timesS: number[];
  currentsA: number[];
  drainV: number[];
  /** Index from which the body diode conducts, and the index after which it stops (-1: never). */
  clampFrom: number;
  clampTo: number;
}

/** The ring of `c` from `endS` (secondary current at zero) to the period's end. */
export function idleRingTrace(c: FlybackCircuit, endS: number): IdleRingTrace {
  const ring = idleRing(c);
  const idleS = Math.max(0, c.periodS - endS);
  const relative = idleRingSampleTimes(ring, idleS);
  const state: IdleRingState = { currentA: 0, drainV: 0, slopeAps: 0 };
  const trace: IdleRingTrace = {
    timesS: [],
    currentsA: [],
    drainV: [],
    clampFrom: -1,
    clampTo: -1,
  };
  for (let k = 0; k < relative.length; k++) {
    const tauS = relative[k] as number;
    idleRingAt(ring, tauS, state);
    if (trace.clampFrom < 0 && tauS >= ring.clampStartS) trace.clampFrom = k;
    if (tauS <= ring.clampEndS) trace.clampTo = k;
    trace.timesS.push(endS + tauS);
    trace.currentsA.push(state.currentA);
    trace.drainV.push(state.drainV);
  }
  if (trace.clampFrom < 0) trace.clampTo = -1;
  return trace;
}

/**
 * The drain's rise at turn-off drawn along its arc (flyback-intervals.ts, drainRise): from the
 * turn-off at `onS` with Ipk to `onS + riseS`, i = A·cos θ and vd = Vin + Z·A·sin θ with θ from
 * −asin(Vin/(Z·A)) to asin(V0/(Z·A)), at most π/12 apart. The first point (the turn-off itself)
 * is left out; without a rise the list is empty.
 */
export function drainRiseTrace(
  c: FlybackCircuit,
  onS: number,
  peakA: number,
  riseS: number,
): IdleRingTrace {
  const trace: IdleRingTrace = {
    timesS: [],
    currentsA: [],
    drainV: [],
    clampFrom: -1,
    clampTo: -1,
  };
  const capacitanceF = c.drainCapacitanceF;
  if (!(riseS > 0) || !(capacitanceF > 0)) return trace;
  const l = c.magnetizingInductanceH + c.leakageInductanceH;
  const vin = c.inputVoltageV;
  const impedanceOhm = Math.sqrt(l / capacitanceF);
  const amplitudeA = Math.sqrt(peakA * peakA + (capacitanceF * vin * vin) / l);
  const amplitudeV = impedanceOhm * amplitudeA;
  const fromPhase = -Math.asin(Math.min(1, vin / amplitudeV));
  const spanPhase = riseS / Math.sqrt(l * capacitanceF);
  const steps = Math.max(1, Math.ceil(spanPhase / RING_PHASE_STEP));
  for (let k = 1; k <= steps; k++) {
    const phase = fromPhase + (spanPhase * k) / steps;
    trace.timesS.push(onS + (riseS * k) / steps);
    trace.currentsA.push(amplitudeA * Math.cos(phase));
    trace.drainV.push(vin + amplitudeV * Math.sin(phase));
  }
  return trace;
}
