import { coreGeometry } from '../magnetics/core-geometry.js';
import { gapLengthForInductance } from '../magnetics/gap-length-for-inductance.js';
import type { Issue } from '../result.js';
import type { TransformerBuild } from './transformer-build.js';
import type { TransformerDuty } from './transformer-duty.js';
import type { TransformerEvaluationOptions } from './transformer-evaluation-options.js';
import { transformerStack } from './transformer-stack.js';
import { wireDimensions } from './winding-wire.js';

/**
 * Returns why a build cannot be evaluated at all, as issues with numbers: a winding whose one
 * turn is longer than the window's breadth, or a gap that cannot give the magnetizing
 * inductance with these turns (the core too weak even ungapped, or the gap past its limit).
 * Empty when the build can be evaluated.
 */
export function transformerFitIssues(
  duty: TransformerDuty,
  build: TransformerBuild,
  settings: Required<TransformerEvaluationOptions>,
): Issue[] {
  const geometry = coreGeometry(build.shape);
  const breadthM = geometry.windowBreadthM - 2 * settings.endMarginM;
  const stack = transformerStack(
    duty,
    build,
    breadthM,
    settings.sectionInsulationM,
    geometry.meanTurnLengthM,
  );
  if (stack === undefined) {
    return [
      {
        code: 'window_fill_limit',
        path: ['magnetics'],
        constraint: 'windingPitchM <= windowBreadthM',
        quantity: 'windingPitchM',
        required: Math.max(...build.wires.map((wire) => wireDimensions(wire, breadthM).pitchM)),
        limit: breadthM,
      },
    ];
  }
  if (duty.gapRole !== 'set-inductance') return [];
  const gap = gapLengthForInductance(
    {
      turns: build.turns[0] as number,
      effectiveLengthM: geometry.effectiveLengthM,
      effectiveAreaM2: geometry.effectiveAreaM2,
      relativePermeability: build.material.initialPermeability,
      windowHeightM: geometry.windowBreadthM,
      fringing: 'mclyman',
    },
    duty.magnetizingInductanceH,
  );
  if (gap.ok) return [];
  return gap.issues.map((issue) => ({
    ...issue,
    path: ['magnetics'],
    quantity: 'magnetizingInductanceH',
    constraint: issue.constraint.replaceAll('targetInductanceH', 'magnetizingInductanceH'),
  }));
}
