import type { Issue } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';

/** Where a choice found no steady state that holds the first output at its voltage. */
export interface OutputShortfall {
  /** The input the choice was solving, at full load. */
  input: 'min' | 'nominal' | 'max';
  /**
   * The first output's voltage the converter reaches there, V; NaN where the model gave no
   * physical figure (see `physicalOutputV`).
   */
  reachedV: number;
  /**
   * What the reached voltage is taken at, in symbols, completing "output voltage at …": for
   * example 'dutyCycle min(dutyCycleMax, 0.5)'.
   */
  at: string;
  /** The spec field to change: the turns ratio where the spec fixes it, else the output. */
  path: (string | number)[];
  /** The duty cycle the corner needs without losses, Vo = D·Vin/n and its kin (0..1). */
  losslessDutyCycle: number;
  /** The topology's duty-cycle limit there (0..1). */
  dutyCycleLimit: number;
}

/**
 * The choice's issue where no steady state holds the first output at its voltage (the forward
 * family and the double-ended family; the flyback's names the power it could deliver). Where the
 * converter reaches a physical voltage short of the regulated one: `power_not_deliverable`, the
 * regulated voltage against that voltage (at least 0: the freewheeling rectifier holds a
 * buck-derived output from going negative). Otherwise the shortfall is the engine's, not the
 * spec's: `steady_state_not_found`, the lossless duty cycle the corner needs against its limit.
 */
export function outputShortfallIssue(spec: Spec, shortfall: OutputShortfall): Issue {
  const regulatedV = spec.outputs[0]?.voltageV ?? 0;
  const corner = `${shortfall.input}-input/100pct-load`;
  if (shortfall.reachedV < regulatedV) {
    return {
      code: 'power_not_deliverable',
      path: shortfall.path,
      constraint: `outputVoltageV <= output voltage at ${shortfall.at}`,
      quantity: 'outputVoltageV',
      required: regulatedV,
      limit: Math.max(0, shortfall.reachedV),
      corner,
    };
  }
  return {
    code: 'steady_state_not_found',
    path: shortfall.path,
    constraint: 'a steady state with dutyCycle <= dutyCycleLimit holds outputVoltageV',
    quantity: 'dutyCycle',
    required: shortfall.losslessDutyCycle,
    limit: shortfall.dutyCycleLimit,
    corner,
  };
}

/**
 * `outputV` where it is a physical output voltage for a buck-derived stage fed `secondaryV`
 * (V), else NaN: within ± the secondary's on-voltage, since the stage's output is the mean of a
 * voltage that never exceeds it (ref: Erickson & Maksimović, Fundamentals of Power Electronics,
 * 2nd ed., ch. 2 (from memory): the buck's M(D) = D ≤ 1). Beyond it the steady-state model has
 * left its range (the leakage's commutation longer than the off-time). A small negative figure
 * (the drops larger than the drive) is kept: the issue reports it as 0 V.
 */
export function physicalOutputV(outputV: number, secondaryV: number): number {
  return Math.abs(outputV) <= secondaryV ? outputV : NaN;
}

/**
 * The spec field a choice's shortfall is about: the fixed turns ratio (or the first output's
 * fixed ratio) where the spec gives one, else the first output's voltage.
 */
export function shortfallPath(spec: Spec): (string | number)[] {
  if (spec.transformer.turnsRatio !== undefined) return ['transformer', 'turnsRatio'];
  if (spec.transformer.outputTurnsRatios !== undefined) {
    return ['transformer', 'outputTurnsRatios', 0];
  }
  return ['outputs', 0, 'voltageV'];
}

/**
 * The turns-ratio search's range over the lossless ratio, shared by the forwards, the active
 * clamp and the double-ended family: drops that need less than half of it are not a workable
 * design, and the lossless ratio itself (a little over, for rounding) is the most any reaches.
 */
export const TURNS_SEARCH_FLOOR = 0.5;
export const TURNS_SEARCH_CEILING = 1.001;

/**
 * The choice's issue where no turns ratio in the search's range reaches the first output at the
 * lowest input, full load and `dutyCycleTarget` (`losslessDutyCycle` over the lossless ratio):
 * `reachedV`, the most the range reaches there, against the regulated voltage, and the
 * topology's `dutyCycleLimit` for the `steady_state_not_found` case. `rangeNote` says how the
 * range was widened, where it was.
 */
export function turnsSearchShortfallIssue(
  spec: Spec,
  reachedV: number,
  losslessDutyCycle: number,
  dutyCycleLimit: number,
  rangeNote = '',
): Issue {
  return outputShortfallIssue(spec, {
    input: 'min',
    reachedV,
    at: `dutyCycleTarget, the best turnsRatio in ${TURNS_SEARCH_FLOOR}–${TURNS_SEARCH_CEILING} × lossless${rangeNote}`,
    path: shortfallPath(spec),
    losslessDutyCycle,
    dutyCycleLimit,
  });
}
