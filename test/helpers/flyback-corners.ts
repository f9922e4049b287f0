import type { Corner, FlybackDesign } from '../../solvers/design/design-schema.js';
import { operatingCorners } from '../../solvers/design/operating-corners.js';
import type { Issue } from '../../solvers/result.js';
import type { Spec } from '../../solvers/spec/spec-schema.js';
import { flyback } from '../../solvers/topologies/flyback.js';

/** The flyback's choices and every solved corner of `spec`; throws when any is infeasible. */
export function solveFlyback(spec: Spec): {
  choices: FlybackDesign['choices'];
  corners: Corner[];
} {
  const chosen = flyback.choose(spec);
  if (!chosen.ok) throw new Error(`choose failed: ${JSON.stringify(chosen.issues)}`);
  const corners = operatingCorners(spec).map((corner) => {
    const solved = flyback.solveCorner(spec, chosen.value, corner);
    if (!solved.ok) throw new Error(`${corner.label} failed: ${JSON.stringify(solved.issues)}`);
    return solved.value;
  });
  return { choices: chosen.value, corners };
}

/** Every issue of `spec`: the choices' issues, or else those of every corner. */
export function flybackIssues(spec: Spec): Issue[] {
  const chosen = flyback.choose(spec);
  if (!chosen.ok) return chosen.issues;
  return operatingCorners(spec).flatMap((corner) => {
    const solved = flyback.solveCorner(spec, chosen.value, corner);
    return solved.ok ? [] : solved.issues;
  });
}

/** The corner labelled `label`; throws when there is none. */
export function cornerAt(corners: readonly Corner[], label: string): Corner {
  const found = corners.find((corner) => corner.label === label);
  if (found === undefined) throw new Error(`no corner ${label}`);
  return found;
}
