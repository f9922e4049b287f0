import { describe, expect, it } from 'vitest';
import {
  designOnFirstPass,
  secondSolveFailure,
  solveSecond,
} from '../../../solvers/core-search/evaluate-candidate.js';
import { CoreSearchRequestSchema } from '../../../solvers/core-search/core-search-request-schema.js';
import { resolveSearchSpace } from '../../../solvers/core-search/search-space.js';
import { operatingCorners } from '../../../solvers/design/operating-corners.js';
import { halfBridgeSpec } from '../../helpers/double-ended-specs.js';
import { fittingLeaves, searchNodes } from './core-search-fixtures.js';

// runBlock takes a candidate's second-solve failure from the corner its probe could not solve
// (`secondSolveFailure`) instead of solving every corner: the whole solve (`solveSecond`)
// solves each corner on its own from the same spec and choices, so it fails too, with the same
// count. Checked on the engine's own solves for every build of a small invented half-bridge
// search (the test helpers' 400 V scenario, not any product) whose first-pass design passes:
// at each corner alone, a failure there is the whole solve's count; the whole solve failing,
// some corner alone fails; the whole solve passing, no corner fails alone.
describe('second-solve failure at one corner: half bridge (invented scenario)', () => {
  it("gives the whole second solve's count", () => {
    const request = CoreSearchRequestSchema.parse({
      spec: halfBridgeSpec({ magnetics: { mode: 'design' } }),
      space: {
        coreShapes: ['E 55/28/21', 'ETD 49'],
        materialIds: ['mnzn-power-low-frequency'],
        wireCurrentDensityFactors: [0.7, 1.4],
        arrangements: ['interleaved'],
      },
      topN: 3,
    });
    const space = resolveSearchSpace(request);
    const { settings } = space;
    let designs = 0;
    let failing = 0;
    // The search's own walk; gap index 0 only (the half bridge's cores are ungapped).
    for (const node of searchNodes(space)) {
      const { f, g, passesHere } = node;
      if (g !== 0) continue;
      const { pass } = passesHere;
      for (const { build } of fittingLeaves(node, settings, [0])) {
        const designed = designOnFirstPass(pass, build);
        if (!designed.ok) continue;
        designs += 1;
        const whole = solveSecond(f, pass, designed.value);
        const cornerCount = operatingCorners(pass.spec).length;
        let anyFails = false;
        for (let c = 0; c < cornerCount; c++) {
          const alone = secondSolveFailure(f, pass, designed.value, [c]);
          if (alone === undefined) continue;
          anyFails = true;
          expect(whole.ok).toBe(false);
          if (!whole.ok) expect(alone.reason).toBe(whole.reason);
        }
        expect(anyFails).toBe(!whole.ok);
        if (!whole.ok) failing += 1;
      }
    }
    expect(designs).toBeGreaterThan(10);
    // Not vacuous: some designed builds' second solves fail.
    expect(failing).toBeGreaterThan(0);
  });
});
