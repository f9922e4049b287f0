import { evaluateInductor, inductorIssues } from '../inductor/design-inductor.js';
import {
  inductorWindingDuty,
  outputInductorDuties,
  type InductorDuty,
} from '../inductor/inductor-duty.js';
import { failure, success, type Issue, type Result } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';
import type { TransformerEvaluation } from '../transformer/evaluate-transformer.js';
import type { TransformerBuild } from '../transformer/transformer-build.js';
import type { TransformerDuty } from '../transformer/transformer-duty.js';
import { TRANSFORMER_CORE_COMPONENT } from './corner-with-transformer.js';
import { cornerWithWoundCores, type WoundCoreAtCorner } from './corner-with-wound-cores.js';
import type { AnyCorner, Design } from './design-schema.js';
import { designOutputInductors, specWithInductors, type FixedInductor } from './inductor-pass.js';
import {
  fixTransformer,
  originsWithTransformer,
  type AnyTopology,
  type FixedTransformer,
  type SolvedSpec,
  transformerOnCorners,
} from './transformer-pass.js';

/** The designed magnetics fixed into the spec the topology solves with. */
export interface FixedMagnetics {
  /** The spec with the transformer and every output inductor fixed in. */
  spec: Spec;
  transformer?: FixedTransformer;
  inductors: FixedInductor[];
}

/** Corners with the magnetics' losses, and the magnetics evaluated on them. */
export interface MagneticsOnCorners {
  corners: AnyCorner[];
  transformer?: { duty: TransformerDuty; evaluation: TransformerEvaluation };
  inductors: { duty: InductorDuty; build: TransformerBuild; evaluation: TransformerEvaluation }[];
}

/**
 * Designs the transformer and every output inductor for the corners of a first solution and
 * fixes them into the spec; undefined when there is nothing to design (magnetics 'assume').
 * The issues of both when either cannot be built.
 */
export function fixMagnetics(
  topology: AnyTopology,
  spec: Spec,
  first: SolvedSpec,
): Result<FixedMagnetics | undefined> {
  const transformer = fixTransformer(topology, spec, first);
  const inductors = designOutputInductors(spec, first);
  if (!transformer.ok || !inductors.ok) {
    return failure([
      ...(transformer.ok ? [] : transformer.issues),
      ...(inductors.ok ? [] : inductors.issues),
    ]);
  }
  if (transformer.value === undefined && inductors.value.length === 0) return success(undefined);
  const fixedSpec = specWithInductors(transformer.value?.spec ?? spec, inductors.value);
  return success({
    spec: fixedSpec,
    ...(transformer.value === undefined
      ? {}
      : { transformer: { ...transformer.value, spec: fixedSpec } }),
    inductors: inductors.value,
  });
}

/**
 * Returns `corners` (solved with the fixed spec) with the losses of the transformer and of each
 * output inductor at each (every inductor's copper line takes its DC-plus-AC loss, and a core
 * line of its name is added), and the magnetics evaluated on them. Each corner is copied once,
 * with every wound core's losses.
 * @throws Error when a fixed inductor no longer fits its window or its gap (an engine bug).
 */
export function cornersWithMagnetics(
  topology: AnyTopology,
  fixed: FixedMagnetics,
  choices: Design['choices'],
  corners: readonly AnyCorner[],
): MagneticsOnCorners {
  const transformer =
    fixed.transformer === undefined
      ? undefined
      : transformerOnCorners(topology, fixed.transformer, choices, corners);
  const duties =
    fixed.inductors.length === 0
      ? []
      : outputInductorDuties(fixed.spec.ambientTemperatureC, { choices, corners });
  const inductors: MagneticsOnCorners['inductors'] = [];
  // Each inductor as a one-winding wound core, its copper and core lines under its name.
  const inductorCores: {
    duty: TransformerDuty;
    evaluation: TransformerEvaluation;
    name: string;
  }[] = [];
  for (const inductor of fixed.inductors) {
    const duty = duties[inductor.duty.outputIndex];
    const evaluation =
      duty === undefined
        ? undefined
        : evaluateInductor(duty, inductor.build, inductor.settings, inductor.isGapFixed);
    if (duty === undefined || evaluation === undefined) {
      throw new Error(`cornersWithMagnetics: ${inductor.duty.name} no longer fits its core`);
    }
    inductors.push({ duty, build: inductor.build, evaluation });
    inductorCores.push({
      duty: inductorWindingDuty(duty, inductor.isGapFixed),
      evaluation,
      name: duty.name,
    });
  }
  // The transformer's core line first, then each inductor's, in the order of fixed.inductors.
  const withLosses = corners.map((corner, index) => {
    const cores: WoundCoreAtCorner[] = [];
    if (transformer !== undefined) {
      const losses = transformer.evaluation.corners[index];
      if (losses === undefined) {
        throw new Error(`cornersWithMagnetics: no transformer corner ${index}`);
      }
      cores.push({ duty: transformer.duty, losses, coreComponent: TRANSFORMER_CORE_COMPONENT });
    }
    for (const { duty, evaluation, name } of inductorCores) {
      const losses = evaluation.corners[index];
      if (losses === undefined) throw new Error(`cornersWithMagnetics: no corner ${index}`);
      cores.push({ duty, losses, coreComponent: name });
    }
    return cores.length === 0 ? corner : cornerWithWoundCores(corner, cores);
  });
  return { corners: withLosses, ...(transformer === undefined ? {} : { transformer }), inductors };
}

/**
 * The limits the output inductors break on the corners they were evaluated at (at the spec's
 * build of the inductor, when it has one, else at outputs[k].inductanceH).
 */
export function magneticsIssues(fixed: FixedMagnetics, evaluated: MagneticsOnCorners): Issue[] {
  const entries = fixed.spec.magnetics.outputInductors ?? [];
  return evaluated.inductors.flatMap((inductor, k) => {
    const i = entries.findIndex((entry) => entry.outputIndex === inductor.duty.outputIndex);
    return inductorIssues(
      inductor.duty,
      inductor.evaluation,
      fixed.inductors[k]?.settings,
      i < 0 ? undefined : ['magnetics', 'outputInductors', i],
    );
  });
}

/**
 * The choices' origins once the magnetics are fixed in: the transformer's (see
 * originsWithTransformer), and each output inductance keeps the origin it had before the
 * inductors were fixed in (the gap is cut for the topology's own choice).
 */
export function originsWithMagnetics(
  choices: Design['choices'],
  firstChoices: Design['choices'],
  spec: Spec,
  fixed: FixedMagnetics,
): Design['choices'] {
  const withTransformer =
    fixed.transformer === undefined
      ? choices
      : originsWithTransformer(choices, firstChoices, spec, fixed.transformer);
  if (fixed.inductors.length === 0) return withTransformer;
  const before = firstChoices.origins as Record<string, unknown>;
  const beforeInductances = before['outputInductancesH'] as readonly string[] | undefined;
  // A fixed gap's inductance is the build's; a cut gap's is the one chosen before.
  const outputInductancesH = beforeInductances?.map((origin, k) =>
    fixed.inductors.some((inductor) => inductor.duty.outputIndex === k && inductor.isGapFixed)
      ? 'magnetics'
      : origin,
  );
  const origins = { ...withTransformer.origins, outputInductancesH };
  return { ...withTransformer, origins } as Design['choices'];
}
