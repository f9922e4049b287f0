import type { FlybackCircuit } from './flyback-circuit.js';
import { drainRiseTrace, idleRingTrace, type IdleRingTrace } from './flyback-idle-ring.js';
import type { FlybackSteadyState } from './flyback-steady-state.js';

/** The arcs of one corner that the current and voltage waveforms both draw. */
export interface FlybackRingTraces {
  /** The drain's rise at turn-off, from 0 to Vin + V0 (flyback-idle-ring.ts, drainRiseTrace). */
  rise: IdleRingTrace;
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
    idle: isContinuous ? undefined : idleRingTrace(circuit, state.conductionEndS),
  };
}
