import { describe, expect, it } from 'vitest';
import { specWithTransformer } from '../../../solvers/design/spec-with-transformer.js';
import { designOnFirstPass } from '../../../solvers/core-search/evaluate-candidate.js';
import { boundPassFor } from '../../../solvers/core-search/first-pass-cache.js';
import {
  completeDesign,
  cornerCeiling,
  designAtHottestCorner,
  type KnownCorners,
} from '../../../solvers/core-search/first-pass-hottest.js';
import { boundPassBuildOf, evaluateOnBoundPass } from '../../../solvers/core-search/leaf-bounds.js';
import { resolveSearchSpace } from '../../../solvers/core-search/search-space.js';
import { TRANSFORMER_EVALUATION_DEFAULTS } from '../../../solvers/transformer/transformer-evaluation-options.js';
import {
  fittingLeaves,
  searchNodes,
  smallFlybackSearch,
  smallForwardSearch,
} from './core-search-fixtures.js';

const cases = [
  ['flyback', () => smallFlybackSearch()],
  ['two-switch forward', () => smallForwardSearch()],
  [
    'two-switch forward, more wires and turns',
    () =>
      smallForwardSearch({
        space: {
          coreShapes: ['ETD 29', 'ETD 34', 'E 42/21/15'],
          materialIds: ['mnzn-power-low-frequency', 'mnzn-power-high-frequency'],
          primaryTurnsCount: 6,
          wireCurrentDensityFactors: [0.5, 1, 2],
          arrangements: ['interleaved', 'stacked'],
        },
      }),
  ],
] as const;

// runBlock takes the second solve's probe before a candidate's first-pass design, on the spec
// that fixes its transformer with the design's hottest corner (`designAtHottestCorner`): only
// the corners that can be the hottest are evaluated, every other one proven no hotter by its
// `CornerCeiling` (a bound from above of the temperature the evaluation settles at). Checked on
// the engine's own models, against the design itself, for every fitting build of the small
// invented searches: each corner's ceiling at or above the corner's settled temperature (and the
// copper-loss bound above its copper loss there), for every corner of every build the design
// accepts; the ceiling within 2 K of the temperature somewhere (so a bound broken by 2
// K fails); and the spec fixed from the partial design the design's own to the bit.
describe.each(cases)('hottest first-pass corner: %s (invented scenario)', (_name, makeRequest) => {
  it("bounds every corner from above and fixes the design's own spec", () => {
    const request = makeRequest();
    const space = resolveSearchSpace(request);
    const { settings } = space;
    let corners = 0;
    let designs = 0;
    let partials = 0;
    let evaluatedCorners = 0;
    let closestK = Infinity;
    let provenClose = 0;
    for (const node of searchNodes(space)) {
      const { f, passes, shape, geometry, material, primaryTurns, passesHere, turns } = node;
      const { ideal, pass } = passesHere;
      const boundPass = boundPassFor(f, passes, pass, ideal, geometry, material, primaryTurns);
      for (const { window, build } of fittingLeaves(node, settings)) {
        const designed = designOnFirstPass(pass, build);
        // A gapped core's first pass is its bound pass: runBlock hands over the corners
        // its test before the design evaluated there (two here).
        const onBoundPass =
          boundPass === undefined ? undefined : boundPassBuildOf(pass, boundPass, turns);
        let known: KnownCorners | undefined;
        if (boundPass === pass && onBoundPass !== undefined) {
          known = { cornerIndices: [0, 1], corners: [], settings };
          for (const c of known.cornerIndices) {
            const one = evaluateOnBoundPass(
              onBoundPass,
              shape,
              material,
              build.wires,
              build.arrangement,
              settings,
              [c],
            );
            known.corners.push(one!.corners[0]!);
          }
        }
        const partial = designAtHottestCorner(pass, build, window, geometry, known, onBoundPass);
        if (!designed.ok) {
          // Not claimed of a build the design rejects (none slips through here): an
          // evaluated corner breaks a limit, and completed it fails as the design does.
          if (partial !== undefined) {
            expect(partial.isRejected).toBe(true);
            expect(JSON.stringify(completeDesign(pass, partial))).toBe(JSON.stringify(designed));
          }
          continue;
        }
        expect(partial?.isRejected ?? false).toBe(false);
        designs += 1;
        const { chosen } = designed.value;
        const designSettings = {
          ...TRANSFORMER_EVALUATION_DEFAULTS,
          ...designed.value.requested.evaluation,
        };
        const ceilingAt = (c: number) =>
          cornerCeiling(
            pass,
            c,
            material,
            geometry,
            primaryTurns,
            window,
            chosen.evaluation.resistancesAt20COhm,
            designSettings,
          )!;
        chosen.evaluation.corners.forEach((corner, c) => {
          const ceiling = ceilingAt(c);
          ceiling.isAtOrUnder(-Infinity);
          const upperC = ceiling.temperatureC;
          expect(corner.temperatureC).toBeLessThanOrEqual(upperC);
          expect(corner.copperLossW).toBeLessThanOrEqual(ceiling.copperW(corner.temperatureC));
          closestK = Math.min(closestK, upperC - corner.temperatureC);
          // The exclusion from [a, U] with a just under the corner's own temperature
          // (factors taken at a, not at the ambient) never claims it under a.
          for (const underK of [0.02, 0.3, 1]) {
            expect(ceilingAt(c).isAtOrUnder(corner.temperatureC - underK)).toBe(false);
          }
          if (ceilingAt(c).isAtOrUnder(corner.temperatureC + 0.5)) provenClose += 1;
          corners += 1;
        });
        if (partial === undefined) continue;
        partials += 1;
        evaluatedCorners += partial.chosen.evaluation.corners.length;
        // Every corner it evaluated is the design's own to the bit.
        for (const corner of partial.chosen.evaluation.corners) {
          const same = chosen.evaluation.corners.find((c) => c.label === corner.label);
          expect(JSON.stringify(corner)).toBe(JSON.stringify(same));
        }
        expect(JSON.stringify(partial.chosen.build)).toBe(JSON.stringify(chosen.build));
        // Completed, it is the design itself to the bit.
        expect(JSON.stringify(completeDesign(pass, partial))).toBe(JSON.stringify(designed));
        expect(JSON.stringify(specWithTransformer(partial.spec, pass.duty, partial.chosen))).toBe(
          JSON.stringify(specWithTransformer(designed.value.spec, pass.duty, chosen)),
        );
      }
    }
    // Not vacuous: builds and corners checked, partial designs made on fewer corners than the
    // design evaluates, and the ceiling within 2 K of a settled temperature somewhere.
    expect(designs).toBeGreaterThanOrEqual(20);
    expect(partials).toBeGreaterThanOrEqual(designs / 2);
    expect(evaluatedCorners).toBeLessThan(corners / 2);
    expect(closestK).toBeLessThan(2);
    // And the exclusion from just above a corner's temperature proves it under that somewhere.
    expect(provenClose).toBeGreaterThan(corners / 4);
  });
});
