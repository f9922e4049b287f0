import type { AnyCorner } from '../design/design-schema.js';
import type { Spec } from '../spec/spec-schema.js';
import type { TransformerCorner } from '../transformer/evaluate-transformer.js';

/**
 * The spec limits a tolerance run counts yield against, each as one checked quantity of a solved
 * unit held at most (or at least) at a limit. Which apply depends on the spec and the design:
 * - regulation: the unit reaches its operating point (the engine solves it: duty cycle within
 *   dutyCycleMax and the topology's own limit, power deliverable, reset complete, clamp above the
 *   reflected voltage); its quantity is the duty cycle. An unsolved unit fails it, and the other
 *   limits are not evaluated for it.
 * - outputVoltage: every output's excursion, (|Vo − target| + ripple/2)/target, within the
 *   request's band (the regulated output moves with its set point, the others by
 *   cross-regulation; the ripple from capacitance and ESR).
 * - switchVoltage: the largest switch peak over its rating (the active clamp's auxiliary switch
 *   included), at most limits.switchVoltageDerating.
 * - rectifierVoltage: the largest rectifier peak reverse voltage over its rating, at most
 *   limits.rectifierVoltageDerating; only when some output's rectifier has a rating.
 * - fluxDensity: peak flux density over saturation at the core temperature, the worst of the
 *   wound transformer and output inductors, at most magnetics.fluxDensityUtilizationMax; only
 *   with a designed transformer.
 * - temperatureRise: the worst rise above the ambient of the wound transformer and output
 *   inductors, at most magnetics.temperatureRiseMaxK; only with a designed transformer.
 * - efficiency: at least the request's efficiencyMin; only when the request gives one.
 */

export const LIMIT_IDS = [
  'regulation',
  'outputVoltage',
  'switchVoltage',
  'rectifierVoltage',
  'fluxDensity',
  'temperatureRise',
  'efficiency',
] as const;
export type LimitId = (typeof LIMIT_IDS)[number];

/** A solved unit, as the limits read it. */
export interface SolvedUnit {
  corner: AnyCorner;
  transformer?: TransformerCorner;
  /** Each wound output inductor at the unit. */
  inductors?: readonly TransformerCorner[];
}

/** One limit: its checked quantity, the direction it is held in, and the limit. */
export interface ToleranceLimit {
  id: LimitId;
  /** The checked quantity's name, with its unit suffix as in the design JSON. */
  quantity: string;
  /** What is checked, in words. */
  description: string;
  sense: 'at-most' | 'at-least';
  limit: number;
  /** Reads the checked quantity off a solved unit. */
  read(unit: SolvedUnit): number;
}

/** Whether `value` keeps `limit`. */
export function keepsLimit(limit: ToleranceLimit, value: number): boolean {
  return limit.sense === 'at-most' ? value <= limit.limit : value >= limit.limit;
}

/** The request's own limits (beside the spec's). */
export interface RequestLimits {
  outputVoltageBand: number;
  efficiencyMin?: number | undefined;
}

/** The output index a rectifier's stress entry belongs to (its name carries `rectifier-k`). */
function rectifierOutputIndex(name: string): number {
  const match = /rectifier-(\d+)/.exec(name);
  if (match === null) throw new Error(`tolerance limits: rectifier ${name} names no output`);
  return Number(match[1]) - 1;
}

/**
 * The limits that apply to `spec` (the request's spec: targets and ratings as asked) with or
 * without a designed transformer.
 */
export function toleranceLimits(
  spec: Spec,
  hasTransformer: boolean,
  requestLimits: RequestLimits,
): ToleranceLimit[] {
  const limits: ToleranceLimit[] = [
    {
      id: 'regulation',
      quantity: 'dutyCycle',
      description:
        'the unit reaches its operating point: the engine solves it within dutyCycleMax and every other limit of the steady state',
      sense: 'at-most',
      limit: spec.limits.dutyCycleMax,
      read: ({ corner }) => corner.dutyCycle,
    },
    {
      id: 'outputVoltage',
      quantity: 'outputVoltageDeviation',
      description:
        "largest output excursion (|Vo − target| + ripple/2)/target over the outputs, within the request's band",
      sense: 'at-most',
      limit: requestLimits.outputVoltageBand,
      read: ({ corner }) =>
        corner.outputs.reduce((worst, output, k) => {
          const targetV = spec.outputs[k]?.voltageV ?? output.voltageV;
          const excursion =
            (Math.abs(output.voltageV - targetV) + output.rippleVoltagePeakToPeakV / 2) / targetV;
          return Math.max(worst, excursion);
        }, 0),
    },
    {
      id: 'switchVoltage',
      quantity: 'switchVoltageUtilization',
      description:
        'largest switch peak voltage over its rating, at most limits.switchVoltageDerating',
      sense: 'at-most',
      limit: spec.limits.switchVoltageDerating,
      read: ({ corner }) => {
        const ratingV = spec.primarySwitch.voltageRatingV;
        let worst = corner.switches.reduce((w, s) => Math.max(w, s.voltagePeakV / ratingV), 0);
        if ('activeClamp' in corner) {
          const auxiliaryRatingV = spec.activeClamp?.auxiliarySwitch?.voltageRatingV ?? ratingV;
          worst = Math.max(
            worst,
            corner.activeClamp.auxiliarySwitch.voltagePeakV / auxiliaryRatingV,
          );
        }
        return worst;
      },
    },
  ];
  if (spec.outputs.some((output) => output.rectifier.voltageRatingV !== undefined)) {
    limits.push({
      id: 'rectifierVoltage',
      quantity: 'rectifierVoltageUtilization',
      description:
        'largest rectifier peak reverse voltage over its rating (outputs with a rating), at most limits.rectifierVoltageDerating',
      sense: 'at-most',
      limit: spec.limits.rectifierVoltageDerating,
      read: ({ corner }) =>
        corner.rectifiers.reduce((worst, rectifier) => {
          const ratingV =
            spec.outputs[rectifierOutputIndex(rectifier.name)]?.rectifier.voltageRatingV;
          return ratingV === undefined ? worst : Math.max(worst, rectifier.voltagePeakV / ratingV);
        }, 0),
    });
  }
  if (hasTransformer) {
    limits.push(
      {
        id: 'fluxDensity',
        quantity: 'fluxDensityUtilization',
        description:
          'peak flux density over saturation at the core temperature, the worst of the transformer and output inductors, at most magnetics.fluxDensityUtilizationMax',
        sense: 'at-most',
        limit: spec.magnetics.fluxDensityUtilizationMax,
        read: (unit) => worstOfMagnetics(unit, (core) => core.fluxDensityUtilization),
      },
      {
        id: 'temperatureRise',
        quantity: 'temperatureRiseK',
        description:
          'the worst temperature rise above the ambient of the wound transformer and output inductors, at most magnetics.temperatureRiseMaxK',
        sense: 'at-most',
        limit: spec.magnetics.temperatureRiseMaxK,
        read: (unit) => worstOfMagnetics(unit, (core) => core.temperatureRiseK),
      },
    );
  }
  if (requestLimits.efficiencyMin !== undefined) {
    limits.push({
      id: 'efficiency',
      quantity: 'efficiency',
      description: "efficiency at least the request's efficiencyMin",
      sense: 'at-least',
      limit: requestLimits.efficiencyMin,
      read: ({ corner }) => corner.efficiency,
    });
  }
  return limits;
}

/** The largest `value` of the unit's transformer and output inductors. */
function worstOfMagnetics(unit: SolvedUnit, value: (core: TransformerCorner) => number): number {
  if (unit.transformer === undefined) {
    throw new Error('tolerance limits: the unit has no transformer');
  }
  return (unit.inductors ?? []).reduce(
    (worst, inductor) => Math.max(worst, value(inductor)),
    value(unit.transformer),
  );
}
