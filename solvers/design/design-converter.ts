import { failure, success, type Issue, type Result } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';
import { topologyById } from '../topologies/index.js';
import { assertFiniteNumbers } from './assert-finite-numbers.js';
import type { AnyCorner, Design } from './design-schema.js';
import { designHoldUp } from './design-hold-up.js';
import { designSummary } from './design-summary.js';
import { MODEL_NOTES } from './model-notes.js';
import { operatingCorners } from './operating-corners.js';

/**
 * Designs the converter the spec asks for: the topology's choices, then the steady state at every
 * operating corner (3 inputs × each load fraction), a summary, the hold-up capacitor when the
 * spec asks for one, and the model's notes. Infeasible specs return every issue of every corner.
 * @throws Error when a result would carry NaN or ±Infinity (an engine bug, named by its path).
 */
export function designConverter(spec: Spec): Result<Design> {
  const topology = topologyById(spec.topology);
  const chosen = topology.choose(spec);
  if (!chosen.ok) {
    assertFiniteNumbers(chosen.issues, '$.issues');
    return chosen;
  }
  const corners: AnyCorner[] = [];
  const issues: Issue[] = [];
  for (const corner of operatingCorners(spec)) {
    const solved = topology.solveCorner(spec, chosen.value, corner);
    if (solved.ok) corners.push(solved.value);
    else issues.push(...solved.issues);
  }
  // Hold-up solves full-load points between its voltages; it is sized only for a converter
  // that meets the spec at every corner (otherwise the corners' issues are the answer).
  const holdUp = issues.length === 0 ? designHoldUp(spec, topology, chosen.value) : undefined;
  if (holdUp !== undefined && !holdUp.ok) issues.push(...holdUp.issues);
  if (issues.length > 0) {
    assertFiniteNumbers(issues, '$.issues');
    return failure(issues);
  }
  // The registry pairs each id with that topology's own choices and corners, so the parts agree.
  const design = {
    topology: topology.id,
    choices: chosen.value,
    corners,
    summary: designSummary(corners, spec.inputVoltageNominalV),
    ...(holdUp?.ok && holdUp.value !== undefined ? { holdUp: holdUp.value } : {}),
    modelNotes: [...MODEL_NOTES[topology.id]],
  } as Design;
  assertFiniteNumbers(design);
  return success(design);
}
