import type { FlybackDesign } from '../../design/design-schema.js';
import type { Spec } from '../../spec/spec-schema.js';
import { flybackCircuit } from './flyback-circuit.js';
import { solveFlybackSteadyState, type FlybackSteadyStateOptions } from './flyback-steady-state.js';
import type { OperatingCorner } from '../topology.js';

/** Halvings of the load scale; 2^-50 of the corner's power is far below any reported digit. */
const BISECTION_STEPS = 50;

/**
 * Returns the largest output power, W, the design delivers at the corner's input voltage with a
 * duty cycle within limits.dutyCycleMax, every output scaled together (0 when none). The duty
 * cycle rises with load in CCM and DCM alike, so bisection on the load scale finds it.
 */
export function flybackDeliverablePowerW(
  spec: Spec,
  choices: FlybackDesign['choices'],
  corner: OperatingCorner,
  options: FlybackSteadyStateOptions = {},
): number {
  const fullPowerW = spec.outputs.reduce(
    (sum, output) => sum + output.voltageV * output.currentA * corner.loadFraction,
    0,
  );
  const isDeliverable = (scale: number): boolean => {
    const circuit = flybackCircuit(spec, choices, {
      ...corner,
      loadFraction: corner.loadFraction * scale,
    });
    const outcome = solveFlybackSteadyState(circuit, options);
    return outcome.ok && outcome.state.dutyCycle <= spec.limits.dutyCycleMax;
  };
  if (isDeliverable(1)) return fullPowerW;
  let lo = 0;
  let hi = 1;
  for (let step = 0; step < BISECTION_STEPS; step++) {
    const middle = 0.5 * (lo + hi);
    if (isDeliverable(middle)) lo = middle;
    else hi = middle;
  }
  return lo * fullPowerW;
}
