import { withScopedMemos } from '../object-memo.js';
import { failure, success, type Result } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';
import { topologyById } from '../topologies/index.js';
import { assertFiniteNumbers } from './assert-finite-numbers.js';
import type { AnyCorner, Design } from './design-schema.js';
import { designHoldUp } from './design-hold-up.js';
import { designSummary } from './design-summary.js';
import { MODEL_NOTES } from './model-notes.js';
import { outputInductorDesignView } from '../inductor/output-inductor-design-view.js';
import {
  cornersWithMagnetics,
  fixMagnetics,
  magneticsIssues,
  type FixedMagnetics,
  originsWithMagnetics,
} from './magnetics-pass.js';
import { solveEveryCorner } from './transformer-pass.js';
import {
  ASSUMED_OUTPUT_INDUCTOR_MODEL_NOTE,
  ASSUMED_TRANSFORMER_MODEL_NOTE,
  INLINE_MATERIAL_NOTE,
  OUTPUT_INDUCTOR_MODEL_NOTES,
  transformerModelNotes,
} from './transformer-model-notes.js';
import { transformerDesignView } from './transformer-design-view.js';

/**
 * Designs the converter the spec asks for: the topology's choices, then the steady state at every
 * operating corner (3 inputs × each load fraction); with magnetics.mode 'design', the transformer
 * for those corners, fixed into the spec (whole turns, resistances, leakage) and every corner
 * solved again with it, its losses in each corner's budget (and likewise, for a buck-derived
 * topology, each output inductor: a gapped core for the topology's inductance, its hot DC
 * resistance in the second solve, its core and copper losses in every corner's budget); then a summary, the hold-up capacitor
 * when the spec asks for one, and the model's notes. Infeasible specs return every issue of every
 * corner.
 * @throws Error when a result would carry NaN or ±Infinity (an engine bug, named by its path).
 */
export function designConverter(spec: Spec): Result<Design> {
  // One design's memo entries die with it (see object-memo.ts: kept in the lasting tables, they
  // were copied by every scavenge and most were promoted).
  const result = withScopedMemos(() => designOrIssues(spec));
  if (!result.ok) assertFiniteNumbers(result.issues, '$.issues');
  else assertFiniteNumbers(result.value);
  return result;
}

/**
 * The first solution's choices, and its corners only where no magnetics were fixed from them
 * (they are the design's corners then); with the magnetics fixed in, the magnetics. The first
 * corners are not kept past this call when the magnetics replace them: held through the second
 * solve and the evaluations, they were about half of what each young-generation collection
 * copied (half-bridge evaluation with the magnetics given: 1.6 MB a scavenge, 0.7 MB without).
 */
function firstPass(
  topology: ReturnType<typeof topologyById>,
  spec: Spec,
): Result<{
  choices: Design['choices'];
  corners: AnyCorner[];
  fixed: FixedMagnetics | undefined;
}> {
  const first = solveEveryCorner(topology, spec);
  if (!first.ok) return first;
  const fixed = fixMagnetics(topology, spec, first.value);
  if (!fixed.ok) return fixed;
  return success({
    choices: first.value.choices,
    corners: fixed.value === undefined ? first.value.corners : [],
    fixed: fixed.value,
  });
}

function designOrIssues(spec: Spec): Result<Design> {
  const topology = topologyById(spec.topology);
  const firstPassed = firstPass(topology, spec);
  if (!firstPassed.ok) return firstPassed;
  const { choices: firstChoices, fixed } = firstPassed.value;
  let choices = firstChoices;
  let corners = firstPassed.value.corners;
  let solvedSpec = spec;
  let transformer: Design['transformer'];
  let outputInductors: Design['outputInductors'];
  // Undefined: hold-up takes a solved corner as it is.
  let finishCorner: ((corner: AnyCorner) => AnyCorner) | undefined;
  if (fixed !== undefined) {
    const magnetics = fixed;
    const second = solveEveryCorner(topology, magnetics.spec);
    if (!second.ok) return second;
    const fixedChoices = second.value.choices;
    const withLosses = cornersWithMagnetics(
      topology,
      magnetics,
      fixedChoices,
      second.value.corners,
    );
    // The inductors were designed on the first solution; their limits hold on the final one too.
    const issues = magneticsIssues(magnetics, withLosses);
    if (issues.length > 0) return failure(issues);
    solvedSpec = magnetics.spec;
    finishCorner = magneticsFinisher(topology, magnetics, fixedChoices);
    choices = fixedChoices;
    corners = withLosses.corners;
    if (withLosses.transformer !== undefined && magnetics.transformer !== undefined) {
      const { duty, evaluation } = withLosses.transformer;
      transformer = transformerDesignView(duty, magnetics.transformer.build, evaluation);
    }
    if (withLosses.inductors.length > 0) {
      outputInductors = withLosses.inductors.map((inductor) =>
        outputInductorDesignView(inductor.duty, inductor.build, inductor.evaluation),
      );
    }
  }
  // Hold-up solves full-load points between its voltages with the converter as solved (a point
  // at a corner's voltage is that corner); it is sized only for a converter that meets the spec
  // at every corner.
  const holdUp = designHoldUp(solvedSpec, topology, choices, finishCorner, corners);
  if (!holdUp.ok) return holdUp;
  // The registry pairs each id with that topology's own choices and corners, so the parts agree.
  return success({
    topology: topology.id,
    choices:
      fixed === undefined ? choices : originsWithMagnetics(choices, firstChoices, spec, fixed),
    corners,
    summary: designSummary(corners, spec.inputVoltageNominalV, spec.outputs[0]?.voltageV ?? 0),
    ...(holdUp.value === undefined ? {} : { holdUp: holdUp.value }),
    ...(transformer === undefined ? {} : { transformer }),
    ...(outputInductors === undefined ? {} : { outputInductors }),
    modelNotes: [
      ...MODEL_NOTES[topology.id],
      ...(transformer === undefined
        ? [ASSUMED_TRANSFORMER_MODEL_NOTE]
        : transformerModelNotes(spec.magnetics)),
      ...(outputInductors !== undefined
        ? OUTPUT_INDUCTOR_MODEL_NOTES
        : topology.id === 'flyback'
          ? []
          : [ASSUMED_OUTPUT_INDUCTOR_MODEL_NOTE]),
      ...(transformer === undefined || spec.magnetics.material === undefined
        ? []
        : [INLINE_MATERIAL_NOTE]),
    ],
  } as Design);
}

/**
 * A solved corner with the fixed magnetics' losses in its budget, for hold-up's extra points.
 * Made by a factory, not as a named arrow in the caller: under tsx (the service's and the
 * bench's runtime) esbuild's keepNames gives each named closure an Object.defineProperty call.
 */
function magneticsFinisher(
  topology: ReturnType<typeof topologyById>,
  magnetics: FixedMagnetics,
  choices: Design['choices'],
): (corner: AnyCorner) => AnyCorner {
  return (corner) =>
    cornersWithMagnetics(topology, magnetics, choices, [corner]).corners[0] ?? corner;
}
