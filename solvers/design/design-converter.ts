import { success, type Result } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';
import { topologyById } from '../topologies/index.js';
import { assertFiniteNumbers } from './assert-finite-numbers.js';
import type { Design } from './design-schema.js';
import { designSummary } from './design-summary.js';
import { MODEL_NOTES } from './model-notes.js';
import {
  cornersWithTransformer,
  fixTransformer,
  originsWithTransformer,
  solveEveryCorner,
} from './transformer-pass.js';
import { TRANSFORMER_MODEL_NOTES } from './transformer-model-notes.js';
import { transformerDesignView } from './transformer-design-view.js';

/**
 * Designs the converter the spec asks for: the topology's choices, then the steady state at every
 * operating corner (3 inputs × each load fraction); with magnetics.mode 'design', the transformer
 * for those corners, fixed into the spec (whole turns, resistances, leakage) and every corner
 * solved again with it, its losses in each corner's budget; then a summary and the model's notes.
 * Infeasible specs return every issue of every corner.
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
  let transformer: Design['transformer'];
  if (fixed.value !== undefined) {
    const second = solveEveryCorner(topology, fixed.value.spec);
    if (!second.ok) return second;
    const withLosses = cornersWithTransformer(
      topology,
      fixed.value,
      second.value.choices,
      second.value.corners,
    );
    choices = originsWithTransformer(second.value.choices, spec, fixed.value);
    corners = withLosses.corners;
    transformer = transformerDesignView(withLosses.duty, fixed.value.build, withLosses.evaluation);
  }
  // The registry pairs each id with that topology's own choices and corners, so the parts agree.
  return success({
    topology: topology.id,
    choices,
    corners,
    summary: designSummary(corners, spec.inputVoltageNominalV),
    ...(transformer === undefined ? {} : { transformer }),
    modelNotes: [
      ...MODEL_NOTES[topology.id],
      ...(transformer === undefined ? [] : TRANSFORMER_MODEL_NOTES),
    ],
  } as Design);
}
