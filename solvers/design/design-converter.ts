import { success, type Result } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';
import { topologyById } from '../topologies/index.js';
import { assertFiniteNumbers } from './assert-finite-numbers.js';
import type { AnyCorner, Design } from './design-schema.js';
import { designHoldUp } from './design-hold-up.js';
import { designSummary } from './design-summary.js';
import { MODEL_NOTES } from './model-notes.js';
import {
  cornersWithTransformer,
  fixTransformer,
  originsWithTransformer,
  solveEveryCorner,
} from './transformer-pass.js';
import { INLINE_MATERIAL_NOTE, TRANSFORMER_MODEL_NOTES } from './transformer-model-notes.js';
import { transformerDesignView } from './transformer-design-view.js';

/**
 * Designs the converter the spec asks for: the topology's choices, then the steady state at every
 * operating corner (3 inputs × each load fraction); with magnetics.mode 'design', the transformer
 * for those corners, fixed into the spec (whole turns, resistances, leakage) and every corner
 * solved again with it, its losses in each corner's budget; then a summary, the hold-up capacitor
 * when the spec asks for one, and the model's notes. Infeasible specs return every issue of every
 * corner.
 * @throws Error when a result would carry NaN or ±Infinity (an engine bug, named by its path).
 */
export function designConverter(spec: Spec): Result<Design> {
  const result = designOrIssues(spec);
  if (!result.ok) assertFiniteNumbers(result.issues, '$.issues');
  else assertFiniteNumbers(result.value);
  return result;
}

function designOrIssues(spec: Spec): Result<Design> {
  const topology = topologyById(spec.topology);
  const first = solveEveryCorner(topology, spec);
  if (!first.ok) return first;
  const fixed = fixTransformer(topology, spec, first.value);
  if (!fixed.ok) return fixed;
  let { choices, corners } = first.value;
  let solvedSpec = spec;
  let transformer: Design['transformer'];
  let finishCorner = (corner: AnyCorner) => corner;
  if (fixed.value !== undefined) {
    const second = solveEveryCorner(topology, fixed.value.spec);
    if (!second.ok) return second;
    const withLosses = cornersWithTransformer(
      topology,
      fixed.value,
      second.value.choices,
      second.value.corners,
    );
    solvedSpec = fixed.value.spec;
    const fixedTransformer = fixed.value;
    const fixedChoices = second.value.choices;
    finishCorner = (corner) =>
      cornersWithTransformer(topology, fixedTransformer, fixedChoices, [corner]).corners[0] ??
      corner;
    choices = second.value.choices;
    corners = withLosses.corners;
    transformer = transformerDesignView(withLosses.duty, fixed.value.build, withLosses.evaluation);
  }
  // Hold-up solves full-load points between its voltages with the converter as solved; it is
  // sized only for a converter that meets the spec at every corner.
  const holdUp = designHoldUp(solvedSpec, topology, choices, finishCorner);
  if (!holdUp.ok) return holdUp;
  // The registry pairs each id with that topology's own choices and corners, so the parts agree.
  return success({
    topology: topology.id,
    choices:
      fixed.value === undefined
        ? choices
        : originsWithTransformer(choices, first.value.choices, spec, fixed.value),
    corners,
    summary: designSummary(corners, spec.inputVoltageNominalV),
    ...(holdUp.value === undefined ? {} : { holdUp: holdUp.value }),
    ...(transformer === undefined ? {} : { transformer }),
    modelNotes: [
      ...MODEL_NOTES[topology.id],
      ...(transformer === undefined ? [] : TRANSFORMER_MODEL_NOTES),
      ...(transformer === undefined || spec.magnetics.material === undefined
        ? []
        : [INLINE_MATERIAL_NOTE]),
    ],
  } as Design);
}
