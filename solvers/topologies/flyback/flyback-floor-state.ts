import { brentRoot } from '../../root-finding/brent-root.js';
import { LIGHT_LOAD_MIN_ON_TIME_S } from '../light-load-min-on-time.js';
import type { FlybackCircuit } from './flyback-circuit.js';
import { evaluateDcm, newOperatingPoint, type OperatingPoint } from './flyback-intervals.js';
import {
  dcmOutcome,
  type FlybackSteadyState,
  type FlybackSteadyStateFailure,
  type FlybackSteadyStateOptions,
} from './flyback-steady-state.js';

/** A corner solved at the shortest pulse: its state, circuit and the output it reaches. */
export interface FlybackFloorState {
  state: FlybackSteadyState;
  /** The corner's circuit with the regulated output at the voltage reached. */
  circuit: FlybackCircuit;
  /** The regulated output's voltage reached less its target, V (above zero). */
  outputRiseV: number;
}

/** Halvings of the duty-cycle interval in the search for the shortest delivering pulse. */
const DELIVERY_BISECTION_STEPS = 60;
/**
 * Trials of the output's rise, each RISE_BRACKET_FACTOR times the last, from RISE_BRACKET_FIRST of
 * the reflected voltage referred to the output (about Vo + Vf) up to some 8 times it. Short steps:
 * each trial's start current starts from the last one's, and a long step can land it on the
 * branch that delivers nothing (the 400 V, 400 kHz case of flyback-corner-issues.test.ts, at a
 * doubling from 5.5 V to 11 V of rise).
 */
const RISE_BRACKET_STEPS = 32;
const RISE_BRACKET_FIRST = 2 ** -7;
const RISE_BRACKET_FACTOR = 1.25;

/**
 * The corner's steady state at the shortest pulse, where no duty cycle holds the regulated output
 * (the solve's 'below-minimum-power': the drain capacitance's ring already hands the outputs more
 * charge a period than the load draws): the duty cycle is LIGHT_LOAD_MIN_ON_TIME_S over the
 * period, or the smallest one whose switch current still turns positive and delivers where that is
 * longer (below it the model's switch current never turns positive and the output would fall, so
 * a controller lengthens the pulse to it); the regulated output's voltage is the unknown, found
 * from charge balance at that duty cycle with the load currents held (the forwards' floor does the
 * same); the other outputs follow through the reflected voltage. Undefined where the load draws
 * more than that pulse delivers (not this situation), or where no valid state holds the balance
 * below the clamp voltage (the clamp would then conduct through every demagnetization and take
 * the surplus, which this model leaves out; or the start current leaves the delivering branch):
 * the corner then stays unsolved. `reason` is why the duty-cycle solve found no state:
 * 'below-minimum-power' (the DCM search ended on the jump) or 'no-steady-state' (no root at all:
 * the DCM charge exceeds the load's at every duty cycle that delivers, or an overload, for which
 * no pulse delivers more than the load and this returns undefined); never
 * 'clamp-below-reflected'.
 */
export function solveFlybackFloorState(
  circuit: FlybackCircuit,
  reason: FlybackSteadyStateFailure,
  options: FlybackSteadyStateOptions = {},
): FlybackFloorState | undefined {
  if (reason === 'clamp-below-reflected') return undefined;
  const load = circuit.referredLoadCurrentA;
  const n0 = circuit.outputs[0]?.turnsRatio ?? NaN;
  if (!(load > 0) || !(n0 > 0) || !(circuit.reflectedOffsetV > 0)) return undefined;
  const point = newOperatingPoint();
  const duty = floorDuty(circuit, point);
  if (!Number.isFinite(duty)) return undefined;
  // The rise of the regulated output: the reflected offset moves by n0 per volt.
  const residual = riseResidualOf(circuit, duty, point, n0);
  const scaleV = circuit.reflectedOffsetV / n0;
  let lo = 0;
  let hi = NaN;
  let valueAtLo = NaN;
  let valueAtHi = NaN;
  for (let k = 0; k < RISE_BRACKET_STEPS; k++) {
    const rise = scaleV * RISE_BRACKET_FIRST * RISE_BRACKET_FACTOR ** k;
    // Where the reflected voltage reaches the clamp's, the clamp conducts through the
    // demagnetization and takes the surplus: that is outside this model.
    if (!(circuit.reflectedOffsetV + n0 * rise < circuit.clampVoltageV)) return undefined;
    const value = residual(rise);
    if (!Number.isFinite(value)) return undefined;
    // An invalid trial that still delivers more is passed over (a start current at the edge of
    // the delivering branch just above the floor's duty cycle); the root's own state must be
    // valid (checked below).
    if (value <= 0) {
      if (!point.isValid) {
        // Past the root the start current can leave the delivering branch (nothing delivered,
        // the point invalid): a valid trial at or below zero is sought between.
        const found = validNonPositive(residual, point, lo, rise);
        if (found === undefined) return undefined;
        hi = found.rise;
        valueAtHi = found.value;
        break;
      }
      hi = rise;
      valueAtHi = value;
      break;
    }
    lo = rise;
    valueAtLo = value;
  }
  if (!Number.isFinite(hi)) return undefined;
  const rise = brentRoot(residual, lo, hi, {
    absoluteTolerance: 1e-12 * scaleV,
    valueAtLo,
    valueAtHi,
  });
  if (!(rise > 0)) return undefined;
  const reached = circuitAtRise(circuit, rise, n0);
  const outcome = dcmOutcome(reached, duty, point, options.boundaryTolerance);
  if (!outcome.ok) return undefined;
  const reflectedPeakV =
    reached.reflectedOffsetV +
    reached.reflectedResistanceOhm * outcome.state.afterCommutationCurrentA;
  if (!(reflectedPeakV < reached.clampVoltageV)) return undefined;
  return { state: outcome.state, circuit: reached, outputRiseV: rise };
}

/**
 * LIGHT_LOAD_MIN_ON_TIME_S over the period where the pulse delivers more than the load there at
 * the regulated voltage, else the smallest duty cycle that does (bisection on that predicate
 * between the floor and the first of a doubling series that delivers); NaN where none up to 1/2
 * does.
 */
function floorDuty(circuit: FlybackCircuit, point: OperatingPoint): number {
  const shortest = LIGHT_LOAD_MIN_ON_TIME_S / circuit.periodS;
  if (!(shortest < 0.5)) return NaN;
  if (deliversMore(circuit, shortest, point)) return shortest;
  let lo = shortest;
  let hi = NaN;
  for (let duty = 2 * shortest; duty <= 0.5; duty *= 2) {
    if (deliversMore(circuit, duty, point)) {
      hi = duty;
      break;
    }
    lo = duty;
  }
  if (!Number.isFinite(hi)) return NaN;
  for (let step = 0; step < DELIVERY_BISECTION_STEPS; step++) {
    const middle = 0.5 * (lo + hi);
    if (deliversMore(circuit, middle, point)) hi = middle;
    else lo = middle;
  }
  return hi;
}

/** Whether the DCM point at `duty` is valid and delivers more than the load (residual > 0). */
function deliversMore(circuit: FlybackCircuit, duty: number, point: OperatingPoint): boolean {
  evaluateDcm(circuit, duty, point);
  return point.isValid && point.residualA > 0;
}

/**
 * A rise in (lo, hi) whose point is valid with the residual at or below zero, by bisection (a
 * positive residual moves lo up, an invalid one at or below zero moves hi down); undefined when
 * none is found in DELIVERY_BISECTION_STEPS halvings.
 */
function validNonPositive(
  residual: (riseV: number) => number,
  point: OperatingPoint,
  lo: number,
  hi: number,
): { rise: number; value: number } | undefined {
  let below = lo;
  let above = hi;
  for (let step = 0; step < DELIVERY_BISECTION_STEPS; step++) {
    const middle = 0.5 * (below + above);
    const value = residual(middle);
    if (!Number.isFinite(value)) return undefined;
    if (value > 0) below = middle;
    else if (point.isValid) return { rise: middle, value };
    else above = middle;
  }
  return undefined;
}

/** The circuit with the regulated output `riseV` (V) above its target. */
function circuitAtRise(circuit: FlybackCircuit, riseV: number, n0: number): FlybackCircuit {
  return { ...circuit, reflectedOffsetV: circuit.reflectedOffsetV + n0 * riseV };
}

/** The DCM charge-balance residual at `duty` as a function of the output's rise, A. */
function riseResidualOf(
  circuit: FlybackCircuit,
  duty: number,
  point: OperatingPoint,
  n0: number,
): (riseV: number) => number {
  return (riseV) => {
    evaluateDcm(circuitAtRise(circuit, riseV, n0), duty, point);
    return point.residualA;
  };
}
