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

/**
 * Returns the least output power, W, the design holds at the corner's input voltage, every output
 * scaled together, for a corner whose load is below it (the steady state's 'below-minimum-power'):
 * the load scale at which a steady state first exists, found by bisection between the corner's
 * load and full load (the load itself where even full load has none, or a steady state exists).
 */
export function flybackMinimumPowerW(
  spec: Spec,
  choices: FlybackDesign['choices'],
  corner: OperatingCorner,
  options: FlybackSteadyStateOptions = {},
): number {
  const powerW = spec.outputs.reduce(
    (sum, output) => sum + output.voltageV * output.currentA * corner.loadFraction,
    0,
  );
  const isHeld = (scale: number): boolean => {
    const circuit = flybackCircuit(spec, choices, {
      ...corner,
      loadFraction: corner.loadFraction * scale,
    });
    return solveFlybackSteadyState(circuit, options).ok;
  };
  const fullScale = 1 / corner.loadFraction;
  if (isHeld(1) || !(fullScale > 1) || !isHeld(fullScale)) return powerW;
  let lo = 1;
  let hi = fullScale;
  for (let step = 0; step < BISECTION_STEPS; step++) {
    const middle = 0.5 * (lo + hi);
    if (isHeld(middle)) hi = middle;
    else lo = middle;
  }
  return hi * powerW;
}
