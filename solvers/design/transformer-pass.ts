import { failure, success, type Issue, type Result } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';
import type { Topology } from '../topologies/topology.js';
import { designTransformer } from '../transformer/design-transformer.js';
import {
  evaluateTransformer,
  type TransformerEvaluation,
} from '../transformer/evaluate-transformer.js';
import type { TransformerBuild } from '../transformer/transformer-build.js';
import type { TransformerDuty } from '../transformer/transformer-duty.js';
import type { TransformerEvaluationOptions } from '../transformer/transformer-evaluation-options.js';
import type { AnyCorner, Design } from './design-schema.js';
import { operatingCorners } from './operating-corners.js';
import { specWithTransformer } from './spec-with-transformer.js';
import { transformerRequestFromSpec } from './transformer-request-from-spec.js';

/** Any registered topology, with the union of choices and corners. */
export type AnyTopology = Topology<Design['choices'], AnyCorner>;

/** Choices and every corner of one spec. */
export interface SolvedSpec {
  choices: Design['choices'];
  corners: AnyCorner[];
}

/** A designed transformer fixed into the spec the topology solves with. */
export interface FixedTransformer {
  /** The spec with whole turns, resistances, leakage and (ungapped) Lm of the transformer. */
  spec: Spec;
  build: TransformerBuild;
  settings: TransformerEvaluationOptions;
  /** How the transformer's choices differ in origin from the topology's own. */
  gapRole: TransformerDuty['gapRole'];
}

/** Solves every operating corner of `spec`; every issue of every corner when any fails. */
export function solveEveryCorner(topology: AnyTopology, spec: Spec): Result<SolvedSpec> {
  const chosen = topology.choose(spec);
  if (!chosen.ok) return chosen;
  const corners: AnyCorner[] = [];
  const issues: Issue[] = [];
  for (const corner of operatingCorners(spec)) {
    const solved = topology.solveCorner(spec, chosen.value, corner);
    if (solved.ok) corners.push(solved.value);
    else issues.push(...solved.issues);
  }
  return issues.length > 0 ? failure(issues) : success({ choices: chosen.value, corners });
}

/**
 * Designs the transformer for the corners of a first solution and fixes it into the spec;
 * undefined when the spec assumes its transformer or the topology has no transformer duty yet.
 */
export function fixTransformer(
  topology: AnyTopology,
  spec: Spec,
  first: SolvedSpec,
): Result<FixedTransformer | undefined> {
  const dutyOf = topology.transformerDuty;
  if (spec.magnetics.mode !== 'design' || dutyOf === undefined) return success(undefined);
  const solvedDuty = dutyOf(spec, first.choices, first.corners);
  // A magnetizing inductance the request fixes is met by a gap, whatever the topology's habit.
  const duty: TransformerDuty =
    spec.transformer.magnetizingInductanceH === undefined
      ? solvedDuty
      : { ...solvedDuty, gapRole: 'set-inductance' };
  const requested = transformerRequestFromSpec(spec);
  if (!requested.ok) return requested;
  const request = requested.value;
  const chosen = designTransformer(duty, request);
  if (!chosen.ok) return chosen;
  return success({
    spec: specWithTransformer(spec, duty, chosen.value),
    build: chosen.value.build,
    settings: request.evaluation ?? {},
    gapRole: duty.gapRole,
  });
}

/**
 * The fixed transformer's duty on `corners` (solved with the fixed spec) and its evaluation at
 * every one of them.
 * @throws Error when the chosen transformer no longer fits its window (an engine bug).
 */
export function transformerOnCorners(
  topology: AnyTopology,
  fixed: FixedTransformer,
  choices: Design['choices'],
  corners: readonly AnyCorner[],
): { duty: TransformerDuty; evaluation: TransformerEvaluation } {
  const dutyOf = topology.transformerDuty;
  if (dutyOf === undefined) throw new Error('transformerOnCorners: topology has no duty');
  const duty = dutyOf(fixed.spec, choices, corners);
  const evaluation = evaluateTransformer(duty, fixed.build, fixed.settings);
  if (evaluation === undefined) {
    throw new Error('transformerOnCorners: the chosen transformer no longer fits its window');
  }
  return { duty, evaluation };
}

/**
 * The choices' origins once a transformer is fixed in: the turns ratio is the wound one's, the
 * leakage (unless the request fixes it) and an ungapped core's Lm are the transformer's; a gapped
 * core's Lm keeps the origin it had before the transformer was fixed in.
 */
export function originsWithTransformer(
  choices: Design['choices'],
  firstChoices: Design['choices'],
  spec: Spec,
  fixed: FixedTransformer,
): Design['choices'] {
  const origins = { ...choices.origins } as Record<string, unknown>;
  const before = firstChoices.origins as Record<string, unknown>;
  origins['turnsRatio'] = 'magnetics';
  if (spec.transformer.leakageInductanceH === undefined)
    origins['leakageInductanceH'] = 'magnetics';
  origins['magnetizingInductanceH'] =
    fixed.gapRole === 'ungapped' ? 'magnetics' : before['magnetizingInductanceH'];
  return { ...choices, origins } as Design['choices'];
}
