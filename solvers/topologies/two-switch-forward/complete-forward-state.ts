import type { OutputStagePoint } from '../buck-derived/output-stage.js';
import { FORWARD_LEAKAGE_DAMPING_RATIO } from './leakage-spike.js';
import {
  magnetizingRing,
  ringEnds,
  type MagnetizingRing,
  type RingEnds,
  type RingLeakage,
} from './magnetizing-ring.js';
import type { TwoSwitchForwardCircuit, TwoSwitchForwardState } from './two-switch-forward-state.js';

/**
 * The clamp the reversed winding meets, V: Vin + 2·Vf through both clamp diodes, or
 * (Vin + Vf)·Np/Nr through the reset winding (its own resistance is not modelled).
 */
export function forwardClampV(circuit: TwoSwitchForwardCircuit): number {
  const vin = circuit.inputVoltageV;
  return circuit.reset.kind === 'clamp-diodes'
    ? vin + 2 * circuit.clampDiodeV
    : (vin + circuit.clampDiodeV) / circuit.reset.resetTurnsRatio;
}

/**
 * The damping taken across the leakage (Ω): {@link FORWARD_LEAKAGE_DAMPING_RATIO}·√(Llk/Coss) on
 * one switch's capacitance, as the exported circuit has it.
 */
export function forwardLeakageDampingOhm(circuit: TwoSwitchForwardCircuit): number {
  const switchCapacitanceF =
    circuit.turnOffCapacitanceF * (circuit.reset.kind === 'clamp-diodes' ? 2 : 1);
  return FORWARD_LEAKAGE_DAMPING_RATIO * Math.sqrt(circuit.leakageInductanceH / switchCapacitanceF);
}

/**
 * The leakage's spike ahead of the ring (`magnetizing-ring.ts`, {@link RingLeakage}) for the
 * reflected inductor peaks at turn-off Σ Ipk/n (A), or undefined without leakage.
 */
function forwardRingLeakage(
  circuit: TwoSwitchForwardCircuit,
  reflectedPeakA: number,
): RingLeakage | undefined {
  if (!(circuit.leakageInductanceH > 0) || !(circuit.turnOffCapacitanceF > 0)) return undefined;
  return {
    leakageH: circuit.leakageInductanceH,
    dampingOhm: forwardLeakageDampingOhm(circuit),
    reflectedPeakA,
  };
}

/**
 * The ring of Lm with the capacitance the winding sees from the swing's end (D + ts) to the next
 * turn-on, for an on-ramp of `rampA` (A), behind the leakage's spike of the reflected inductor
 * peaks Σ Ipk/n (A) ({@link magnetizingRing}).
 */
export function forwardRing(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
  swing: number,
  rampA: number,
  reflectedPeakA: number,
): MagnetizingRing {
  return magnetizingRing(
    rampA,
    circuit.magnetizingInductanceH,
    circuit.turnOffCapacitanceF,
    forwardClampV(circuit),
    (1 - dutyCycle - swing) * circuit.periodS,
    forwardRingLeakage(circuit, reflectedPeakA),
  );
}

/**
 * {@link forwardRing}'s start, peak and end written into `out` (the same numbers, no ring
 * object: {@link ringEnds}), for the trial steps of a steady state.
 */
export function forwardRingEnds(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
  swing: number,
  rampA: number,
  reflectedPeakA: number,
  out: RingEnds,
): RingEnds {
  return ringEnds(
    rampA,
    circuit.magnetizingInductanceH,
    circuit.turnOffCapacitanceF,
    forwardClampV(circuit),
    (1 - dutyCycle - swing) * circuit.periodS,
    out,
    forwardRingLeakage(circuit, reflectedPeakA),
  );
}

/**
 * Returns the steady state at duty cycle D from its solved parts (the turn-on commutation and
 * the turn-off swing over the period, the magnetizing ring), completed with the reset: the
 * largest reversed winding voltage (V) and the interval from the gate's turn-off until the
 * magnetizing current is zero (the swing, then the ring's rise and the clamp).
 */
export function completeForwardState(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
  edges: { commutation: number; swing: number },
  primaryVoltageV: number,
  ring: MagnetizingRing,
  points: OutputStagePoint[],
): TwoSwitchForwardState {
  // Two-switch: at the clamp the winding sees −(Vin + 2·Vf + Rp·Im) (Rp at the clamp's mean
  // current). Short of the clamp: the ring's peak I1·Z.
  const resetVoltageV = !ring.reachesClamp
    ? ring.peakWindingV
    : circuit.reset.kind === 'clamp-diodes'
      ? ring.peakWindingV + (circuit.primaryResistanceOhm * ring.clampStartA) / 2
      : ring.peakWindingV;
  return {
    dutyCycle,
    commutationFraction: edges.commutation,
    turnOffSwingFraction: edges.swing,
    stageDutyCycle: Math.max(dutyCycle - edges.commutation + edges.swing / 2, 1e-9),
    primaryVoltageV,
    magnetizingPeakA: ring.turnOffA,
    magnetizingStartA: ring.startA,
    ring,
    resetVoltageV,
    resetDutyCycle: edges.swing + ring.zeroCurrentS / circuit.periodS,
    points,
  };
}
