import { failure, success, type Issue, type Result } from '../result.js';
import { freezeDesign, solveUnit, type FrozenDesign, type UnitOutcome } from './frozen-design.js';
import { distributionEnds, drawValue, type Distribution } from './tolerance-distribution.js';
import {
  parameterDefinitions,
  unitSpecDraft,
  type ParameterDefinition,
} from './tolerance-parameters.js';
import { toleranceLimits, type ToleranceLimit } from './tolerance-limits.js';
import type { ToleranceRequest } from './tolerance-request-schema.js';
import { sampleStream } from './random-stream.js';

/** One parameter with the distribution the run uses and its band ends (quantity's unit). */
export interface RunParameter extends ParameterDefinition {
  distribution: Distribution;
  origin: 'request' | 'default';
  lower: number;
  upper: number;
  /** Whether it varies at all (its band ends differ). */
  isVaried: boolean;
}

/** Everything a chunk, the worst case and the reducer share; rebuilt from the request alone. */
export interface ToleranceRun {
  request: ToleranceRequest;
  frozen: FrozenDesign;
  parameters: RunParameter[];
  limits: ToleranceLimit[];
  /** The nominal unit: every parameter at its nominal value (a fixed one at its value). */
  nominal: UnitOutcome & { solved: true };
}

/**
 * Designs the request's spec once, freezes it, fills in every parameter's distribution and the
 * limits, and solves the nominal unit. The engine's issues when the nominal design is infeasible,
 * or a `non_physical_value` issue at `tolerances.<id>` when a spread reaches a positive
 * quantity's zero (known only once the design has fixed the nominal value).
 */
export function toleranceRun(request: ToleranceRequest): Result<ToleranceRun> {
  const frozen = freezeDesign(request.spec);
  if (!frozen.ok) return frozen;
  const issues: Issue[] = [];
  const parameters = parameterDefinitions(
    frozen.value.spec,
    frozen.value.magnetizingInductance,
  ).map((definition): RunParameter => {
    const requested = request.tolerances[definition.id];
    const distribution = requested ?? definition.defaultDistribution;
    // A fixed parameter's value is the run's centre (its nominal unit and worst-case base).
    const nominal =
      distribution.kind === 'fixed'
        ? (distribution.value ?? definition.nominal)
        : definition.nominal;
    const { lower, upper } = distributionEnds(distribution, nominal);
    if (definition.id !== 'ambientTemperatureC' && !(lower > 0)) {
      issues.push({
        code: 'non_physical_value',
        path: ['tolerances', definition.id],
        constraint: `lowest value of ${definition.id} > 0`,
        quantity: definition.id,
        required: lower,
        limit: 0,
      });
    }
    return {
      ...definition,
      nominal,
      distribution,
      origin: requested === undefined ? 'default' : 'request',
      lower,
      upper,
      isVaried: lower !== upper,
    };
  });
  if (issues.length > 0) return failure(issues);
  const limits = toleranceLimits(
    request.spec,
    frozen.value.transformer !== undefined,
    request.limits,
  );
  const nominal = evaluateUnit(
    frozen.value,
    parameters,
    parameters.map((p) => p.nominal),
  );
  if (!nominal.solved) return failure(nominal.issues);
  return success({ request, frozen: frozen.value, parameters, limits, nominal });
}

/** Solves the frozen design with `values` (one per parameter, in order) written into its spec. */
export function evaluateUnit(
  frozen: FrozenDesign,
  parameters: readonly ParameterDefinition[],
  values: readonly number[],
): UnitOutcome {
  const draft = unitSpecDraft(frozen.spec);
  // Every parameter writes its value into the draft, in parameter order.
  parameters.forEach((parameter, j) => parameter.apply(draft, values[j] ?? parameter.nominal));
  return solveUnit(frozen, draft);
}

/**
 * The parameter values of Monte Carlo sample `sampleIndex`: parameter j drawn from its own
 * stream (seed, sampleIndex, j), so a sample's values depend on nothing else.
 */
export function sampleValues(run: ToleranceRun, sampleIndex: number): number[] {
  return run.parameters.map((parameter, j) =>
    parameter.isVaried
      ? drawValue(
          parameter.distribution,
          parameter.nominal,
          sampleStream(run.request.seed, sampleIndex, j),
        )
      : parameter.lower,
  );
}
