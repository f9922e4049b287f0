import { brentRoot } from '../../root-finding/brent-root.js';
import type { FlybackCircuit } from './flyback-circuit.js';
import {
  evaluateCcm,
  evaluateDcm,
  newOperatingPoint,
  type OperatingPoint,
} from './flyback-intervals.js';

/** Options of {@link solveFlybackSteadyState}. */
export interface FlybackSteadyStateOptions {
  /**
   * Absolute tolerance on the duty cycle.
   * @defaultValue 1e-12
   */
  dutyCycleTolerance?: number;
  /**
   * Iteration cap of each root search on the duty cycle.
   * @defaultValue 100
   */
  maxIterations?: number;
  /**
   * Iteration cap of the fixed point on the two leakage-commutation times.
   * @defaultValue 30
   */
  commutationIterations?: number;
  /**
   * Boundary conduction is reported when the valley current is within this fraction of the
   * peak (continuous side) or D + D2 within this of 1 (discontinuous side).
   * @defaultValue 1e-6
   */
  boundaryTolerance?: number;
}

const DEFAULTS = {
  dutyCycleTolerance: 1e-12,
  maxIterations: 100,
  commutationIterations: 30,
  boundaryTolerance: 1e-6,
} satisfies Required<FlybackSteadyStateOptions>;

/** The periodic steady state of one corner: conduction mode, duty cycle and the breakpoints. */
export interface FlybackSteadyState extends OperatingPoint {
  mode: 'ccm' | 'bcm' | 'dcm';
  dutyCycle: number;
  /** Secondary conduction time over the period (includes both commutation intervals). */
  demagnetizingDutyCycle: number;
}

/**
 * Why no steady state exists. 'below-minimum-power': the load draws less than the converter
 * delivers at its shortest pulse in DCM (the ring of Lm with the drain capacitance already hands
 * the outputs more charge a period), so no duty cycle holds the output: the corner's solve then
 * takes the shortest pulse and lets the output rise (flyback-floor-state.ts).
 */
export type FlybackSteadyStateFailure =
  'no-steady-state' | 'clamp-below-reflected' | 'below-minimum-power';

/**
 * The DCM root's charge-balance residual may be at most this fraction of the load's referred
 * current: the residual is continuous in D wherever a start current delivers, so a larger one is
 * no root but the jump where the delivering start ends (below it the switch current never turns
 * positive and nothing is delivered).
 */
const DCM_ROOT_RESIDUAL = 1e-3;

/** The steady state, or why there is none. */
export type FlybackSteadyStateOutcome =
  { ok: true; state: FlybackSteadyState } | { ok: false; reason: FlybackSteadyStateFailure };

/** Number of geometric steps the bracket search takes towards D = 0 or D = 1. */
const BRACKET_STEPS = 40;
/**
 * Steps the bracket search takes before its first halving of the distance to D = 1 (or D = 0),
 * from 1/64 of that distance, each twice the last: the root is mostly within a few percent of
 * the lossless duty cycle, so its bracket is found near it, where each evaluation starts from
 * the last one's commutation (flyback-intervals.ts) and Brent's search starts narrow.
 */
const BRACKET_FINE_STEPS = 5;

/** The bracket search's duty cycle at `step` (1, 2, …) from `start` towards D = 1 or D = 0. */
function bracketDuty(start: number, step: number, isUp: boolean): number {
  const span = isUp ? 1 - start : start;
  const distance =
    step <= BRACKET_FINE_STEPS
      ? span * 2 ** (step - BRACKET_FINE_STEPS - 2)
      : span * (1 - 2 ** -(step - BRACKET_FINE_STEPS));
  return isUp ? start + distance : start - distance;
}

/**
 * Solves the periodic steady state of the lumped flyback: the duty cycle at which the
 * magnetizing inductance is in volt-second balance and the output capacitors in charge balance,
 * with the conduction drops and both leakage commutations. CCM is tried first; a valley current
 * at or below zero hands over to DCM (Erickson & Maksimović, 2nd ed. (from memory), §5.1 mode
 * boundary).
 */
export function solveFlybackSteadyState(
  circuit: FlybackCircuit,
  options: FlybackSteadyStateOptions = {},
): FlybackSteadyStateOutcome {
  const settings = { ...DEFAULTS, ...options };
  if (!(circuit.clampVoltageV > circuit.reflectedOffsetV) && circuit.leakageInductanceH > 0) {
    return { ok: false, reason: 'clamp-below-reflected' };
  }
  const point = newOperatingPoint();
  const ccmDuty = solveCcmDuty(circuit, point, settings);
  // The root search may end on an earlier iterate: re-evaluate at the root itself.
  if (Number.isFinite(ccmDuty))
    evaluateCcm(circuit, ccmDuty, point, settings.commutationIterations);
  if (Number.isFinite(ccmDuty) && point.valleyCurrentA > 0) {
    if (!point.isValid) return { ok: false, reason: failureOf(point) };
    const isBoundary = point.valleyCurrentA <= settings.boundaryTolerance * point.peakCurrentA;
    return {
      ok: true,
      state: steadyStateOf(
        point,
        isBoundary ? 'bcm' : 'ccm',
        ccmDuty,
        // The secondary conducts through the off-time and on through the turn-on commutation.
        // The drain's rise at turn-off precedes it.
        1 - ccmDuty + (point.turnOnCommutationS - point.turnOffTransitionS) / circuit.periodS,
      ),
    };
  }
  const dcmDuty = solveDcmDuty(circuit, point, settings, Number.isFinite(ccmDuty) ? ccmDuty : 1);
  if (!Number.isFinite(dcmDuty)) return { ok: false, reason: 'no-steady-state' };
  return dcmOutcome(circuit, dcmDuty, point, settings.boundaryTolerance);
}

/**
 * The DCM steady state at duty cycle `dcmDuty` (evaluated into `point`), or why it is none: an
 * invalid point, a charge-balance residual beyond DCM_ROOT_RESIDUAL of the load's referred
 * current ('below-minimum-power': no root but the jump where the delivering start ends), or a
 * secondary conduction past the period's end. `boundaryTolerance` as in
 * {@link FlybackSteadyStateOptions}.
 */
export function dcmOutcome(
  circuit: FlybackCircuit,
  dcmDuty: number,
  point: OperatingPoint,
  boundaryTolerance: number = DEFAULTS.boundaryTolerance,
): FlybackSteadyStateOutcome {
  const settings = { boundaryTolerance };
  evaluateDcm(circuit, dcmDuty, point);
  if (!point.isValid) return { ok: false, reason: failureOf(point) };
  if (!(Math.abs(point.residualA) <= DCM_ROOT_RESIDUAL * circuit.referredLoadCurrentA)) {
    return { ok: false, reason: 'below-minimum-power' };
  }
  const periodS = circuit.periodS;
  // D + D2: the secondary conduction ends at (D + D2)·T; beyond T the corner is not DCM.
  const total = point.conductionEndS / periodS;
  if (total > 1 + settings.boundaryTolerance) return { ok: false, reason: 'no-steady-state' };
  // The drain's rise at turn-off precedes the secondary's conduction.
  const demagnetizingDutyCycle = Math.min(total, 1) - dcmDuty - point.turnOffTransitionS / periodS;
  point.conductionEndS = Math.min(point.conductionEndS, periodS);
  return {
    ok: true,
    state: steadyStateOf(
      point,
      total >= 1 - settings.boundaryTolerance ? 'bcm' : 'dcm',
      dcmDuty,
      demagnetizingDutyCycle,
    ),
  };
}

/**
 * The steady state: a copy of `point` (its keys in their order) and then the mode, duty cycle
 * and demagnetizing duty cycle. One object literal, not Object.assign({}, point, {…}), which
 * this V8 (Node 20) builds field by field, growing the copy's property store as it goes (about
 * a third of the copy's bytes; the steady states were 4 % of what a flyback design allocated).
 */
function steadyStateOf(
  point: OperatingPoint,
  mode: FlybackSteadyState['mode'],
  dutyCycle: number,
  demagnetizingDutyCycle: number,
): FlybackSteadyState {
  return {
    residualA: point.residualA,
    valleyCurrentA: point.valleyCurrentA,
    turnOnDrainV: point.turnOnDrainV,
    turnOffTransitionS: point.turnOffTransitionS,
    transitionEndCurrentA: point.transitionEndCurrentA,
    leakageRingS: point.leakageRingS,
    clampOnsetCurrentA: point.clampOnsetCurrentA,
    leakageRingPeakV: point.leakageRingPeakV,
    leakageRingReturnS: point.leakageRingReturnS,
    onsetCurrentA: point.onsetCurrentA,
    peakCurrentA: point.peakCurrentA,
    afterCommutationCurrentA: point.afterCommutationCurrentA,
    turnOnCommutationS: point.turnOnCommutationS,
    turnOffCommutationS: point.turnOffCommutationS,
    conductionEndS: point.conductionEndS,
    turnOffReflectedV: point.turnOffReflectedV,
    isValid: point.isValid,
    isClampBelowReflected: point.isClampBelowReflected,
    mode,
    dutyCycle,
    demagnetizingDutyCycle,
  };
}

function failureOf(point: OperatingPoint): FlybackSteadyStateFailure {
  return point.isClampBelowReflected ? 'clamp-below-reflected' : 'no-steady-state';
}

/**
 * The first root in D of the CCM periodicity residual, NaN when there is none. With conduction
 * losses the conversion ratio has a maximum (Erickson & Maksimović, 2nd ed. (from memory), §3.3,
 * lossy boost):
 * the residual rises from D = 0, peaks and may fall again, so the search starts at the lossless
 * duty cycle and walks up until it turns positive, giving up once it turns back down.
 */
function solveCcmDuty(
  circuit: FlybackCircuit,
  point: OperatingPoint,
  settings: Required<FlybackSteadyStateOptions>,
): number {
  const residual = ccmResidualOf(circuit, point, settings.commutationIterations);
  const lossless = circuit.reflectedOffsetV / (circuit.inputVoltageV + circuit.reflectedOffsetV);
  const start = Math.min(Math.max(lossless, 1e-6), 1 - 1e-6);
  const startResidual = residual(start);
  if (!Number.isFinite(startResidual)) return NaN;
  let lo = start;
  let hi = start;
  if (startResidual < 0) {
    let previous = startResidual;
    for (let step = 1; step <= BRACKET_STEPS + BRACKET_FINE_STEPS; step++) {
      const duty = bracketDuty(start, step, true);
      const value = residual(duty);
      if (!Number.isFinite(value)) return NaN;
      if (value >= 0) {
        hi = duty;
        break;
      }
      if (value < previous) return NaN;
      previous = value;
      lo = duty;
    }
    if (hi === start) return NaN;
  } else {
    for (let step = 1; step <= BRACKET_STEPS + BRACKET_FINE_STEPS; step++) {
      const duty = bracketDuty(start, step, false);
      const value = residual(duty);
      if (!Number.isFinite(value)) return NaN;
      if (value < 0) {
        lo = duty;
        break;
      }
      hi = duty;
    }
    if (lo === start) return NaN;
  }
  return brentRoot(residual, lo, hi, {
    absoluteTolerance: settings.dutyCycleTolerance,
    maxIterations: settings.maxIterations,
  });
}

/** The root in D of the DCM charge-balance residual on (0, hi], NaN when there is none. */
function solveDcmDuty(
  circuit: FlybackCircuit,
  point: OperatingPoint,
  settings: Required<FlybackSteadyStateOptions>,
  hi: number,
): number {
  const residual = dcmResidualOf(circuit, point);
  const options = {
    absoluteTolerance: settings.dutyCycleTolerance,
    maxIterations: settings.maxIterations,
  };
  const upper = Math.min(hi * (1 + 1e-9), 1 - 1e-12);
  const near = dcmBracketNear(circuit, residual, upper);
  if (near !== undefined) {
    const duty = brentRoot(residual, near.lo, near.hi, {
      ...options,
      valueAtLo: near.valueAtLo,
      valueAtHi: near.valueAtHi,
    });
    if (Number.isFinite(duty)) return duty;
  }
  const duty = brentRoot(residual, 0, upper, options);
  if (Number.isFinite(duty) || upper >= 1 - 1e-12) return duty;
  return brentRoot(residual, 0, 1 - 1e-12, options);
}

/** Trials the DCM bracket search takes past its first two before it leaves (0, upper] to Brent. */
const DCM_BRACKET_STEPS = 8;

/** How much farther than the secant's root each outward trial of the DCM bracket goes. */
const DCM_BRACKET_REACH = 1.25;

/**
 * A bracket of the DCM root near where the lossless discontinuous flyback puts it, with the
 * residual at its ends; undefined when none is found there (the caller then searches all of
 * (0, upper]). Without losses the secondary delivers ½·Ipk·td per period with Ipk = Vin·D·T/Lm
 * and td = Lm·Ipk/V0, so the load's referred current Iref needs D0 = √(2·Lm·V0·T·Iref)/(Vin·T)
 * (Erickson & Maksimović, 2nd ed., §5.2, DCM of the buck-boost family, from memory). The charge
 * delivered grows about as D², so from the residual r0 at D0 the second trial is
 * D1 = D0·√(Iref/(r0 + Iref)). When r0 and r1 differ in sign they are the bracket; else each next
 * trial goes {@link DCM_BRACKET_REACH} times as far as the secant through the last two puts the
 * root, until the sign changes. Brent's search over the whole of (0, upper] took about 17
 * evaluations a corner, each with a start-current search from farther away (flyback-intervals.ts).
 */
function dcmBracketNear(
  circuit: FlybackCircuit,
  residual: (duty: number) => number,
  upper: number,
): { lo: number; hi: number; valueAtLo: number; valueAtHi: number } | undefined {
  const load = circuit.referredLoadCurrentA;
  const v0 = circuit.reflectedOffsetV;
  const periodS = circuit.periodS;
  if (!(load > 0) || !(v0 > 0) || !(upper > 0)) return undefined;
  const lossless =
    Math.sqrt(2 * circuit.magnetizingInductanceH * v0 * periodS * load) /
    (circuit.inputVoltageV * periodS);
  let previous = Math.min(lossless, 0.5 * upper);
  if (!(previous > 0)) return undefined;
  let previousValue = residual(previous);
  if (!Number.isFinite(previousValue)) return undefined;
  const delivered = previousValue + load;
  let duty = delivered > 0 ? Math.min(previous * Math.sqrt(load / delivered), upper) : upper;
  for (let k = 0; ; k++) {
    if (duty === previous) return undefined;
    const value = residual(duty);
    if (!Number.isFinite(value)) return undefined;
    if (value === 0 || value < 0 !== previousValue < 0) {
      return duty > previous
        ? { lo: previous, hi: duty, valueAtLo: previousValue, valueAtHi: value }
        : { lo: duty, hi: previous, valueAtLo: value, valueAtHi: previousValue };
    }
    if (k >= DCM_BRACKET_STEPS || duty >= upper || duty <= 0) return undefined;
    // The residual rises with D: up while it is negative. Past the secant's root through the
    // last two trials when that lies that way, else twice the last step.
    const secant = duty - (value * (duty - previous)) / (value - previousValue);
    const towards = value < 0 ? 1 : -1;
    const reach =
      Number.isFinite(secant) && (secant - duty) * towards > 0
        ? DCM_BRACKET_REACH * (secant - duty)
        : towards * 2 * Math.abs(duty - previous);
    previous = duty;
    previousValue = value;
    duty = Math.min(Math.max(duty + reach, 0), upper);
  }
}

/*
 * The residuals are made by the factories below, not as `const residual = (duty) => ...` in the
 * solvers: under tsx (the service's and the bench's runtime) esbuild's keepNames wraps every
 * named arrow in an Object.defineProperty call, a cost paid at every corner.
 */

/**
 * The CCM periodicity residual as a function of D, evaluated into `point` (A). The last two duty
 * cycles evaluated are answered from memory: Brent's search starts with the bracket's ends, which
 * the bracket search has just evaluated, and `point` then keeps the nearer one's commutation.
 */
function ccmResidualOf(
  circuit: FlybackCircuit,
  point: OperatingPoint,
  iterations: number,
): (duty: number) => number {
  const memory = { duty: NaN, residualA: NaN, earlierDuty: NaN, earlierResidualA: NaN };
  return (duty) => {
    if (duty === memory.duty) return memory.residualA;
    if (duty === memory.earlierDuty) return memory.earlierResidualA;
    evaluateCcm(circuit, duty, point, iterations);
    memory.earlierDuty = memory.duty;
    memory.earlierResidualA = memory.residualA;
    memory.duty = duty;
    memory.residualA = point.residualA;
    return point.residualA;
  };
}

/** The DCM charge-balance residual as a function of D, evaluated into `point` (A). */
function dcmResidualOf(circuit: FlybackCircuit, point: OperatingPoint): (duty: number) => number {
  return (duty) => {
    evaluateDcm(circuit, duty, point);
    return point.residualA;
  };
}
