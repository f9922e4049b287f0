import { describe, expect, it } from 'vitest';
import { boundPassFor, boundPassStages } from '../../../solvers/core-search/first-pass-cache.js';
import { unitCoreLossOf } from '../../../solvers/core-search/first-pass.js';
import { leafBounds } from '../../../solvers/core-search/leaf-bounds.js';
import { resolveSearchSpace } from '../../../solvers/core-search/search-space.js';
import {
  fittingLeaves,
  searchNodes,
  smallForwardSearch,
  smallPushPullSearch,
} from './core-search-fixtures.js';

const cases = [
  ['push-pull', () => smallPushPullSearch()],
  ['two-switch forward', () => smallForwardSearch()],
] as const;

// runBlock bounds an ungapped core's node first on its bound pass at the full-load corner of
// the highest input, then at every full-load corner (`boundPassStages`, `boundPassFor` with
// `only`), and solves the whole bound pass only for a node that those bounds do not put out. That rests on three facts, checked here on the engine's own solves for
// every node of small invented searches (the claim checked is the engine's pass at some corners
// against its own whole pass; the loss and rise relations are the engine's, sources named
// there): each corner of the pass at some corners is that corner of the whole pass to the bit
// (every per-corner quantity the bounds read), the pass at some corners fails only where the
// whole pass fails, and the node's bounds on it are at most the whole node's (equal where the
// whole node's loss corner is among them) and no lower than the stage before (so the node
// waits by bounds that only rise), so a node it puts out, the whole node's bound puts out too. (That the search then keeps the same top N and front: core-search.test.ts compares
// the small forward with brute force; with pending nodes put out whatever their bounds it
// fails, tried.)
describe.each(cases)('bound pass at the full-load corners: %s (invented scenario)', (_n, make) => {
  it('is the whole pass at those corners, and bounds the node from below', () => {
    const request = make();
    const space = resolveSearchSpace(request);
    const { settings } = space;
    const margin = 1 - request.lossBoundMargin;
    let nodes = 0;
    let equalLoss = 0;
    for (const node of searchNodes(space)) {
      const { f, passes, geometry, material, primaryTurns } = node;
      const { ideal, pass } = node.passesHere;
      const stages = boundPassStages(f)!;
      // The spec's default load fractions: three loads at each of three inputs.
      expect(stages).toEqual([[8], [2, 5, 8]]);
      const whole = boundPassFor(f, passes, pass, ideal, geometry, material, primaryTurns);
      const { turns } = node;
      const leaves = [...fittingLeaves(node, settings)].map(({ digits, window }) => ({
        wireDigits: digits,
        window,
      }));
      // The node and, as the search splits it, each group (every wire but the last winding's).
      const groups = new Map<string, typeof leaves>();
      for (const leaf of leaves) {
        const key = leaf.wireDigits.slice(0, -1).join(',');
        groups.set(key, [...(groups.get(key) ?? []), leaf]);
      }
      const sets = leaves.length === 0 ? [] : [leaves, ...groups.values()];
      const before = sets.map(() => ({ lossW: 0, riseK: 0 }));
      for (const only of stages) {
        const atSome = boundPassFor(f, passes, pass, ideal, geometry, material, primaryTurns, only);
        if (atSome === undefined) {
          expect(whole).toBeUndefined();
          break;
        }
        if (whole === undefined) break;
        only.forEach((c, i) => {
          expect(atSome.restLossW[i]).toBe(whole.restLossW[c]);
          expect(atSome.leakageLossW[i]).toBe(whole.leakageLossW[c]);
          expect(atSome.cornerFluxLinkagesWb[i]).toBe(whole.cornerFluxLinkagesWb[c]);
          expect(unitCoreLossOf(atSome, material)[i]).toBe(unitCoreLossOf(whole, material)[c]);
          atSome.duty.windings.forEach((_, k) => {
            expect(atSome.currentDcSquaredA2[k]![i]).toBe(whole.currentDcSquaredA2[k]![c]);
            expect(atSome.harmonicSquaresA2[k]![i]).toEqual(whole.harmonicSquaresA2[k]![c]);
            expect(atSome.unsummedAcSquaresA2[k]![i]).toBe(whole.unsummedAcSquaresA2[k]![c]);
          });
        });
        expect(atSome.leakageInductanceH).toBe(whole.leakageInductanceH);
        const onWhole = leafBounds(pass, whole, material, geometry, turns, f, settings, margin);
        const onSome = leafBounds(pass, atSome, material, geometry, turns, f, settings, margin);
        sets.forEach((some, j) => {
          const bound = onWhole.node(some);
          const partial = onSome.node(some);
          nodes += 1;
          expect(partial.lossW).toBeLessThanOrEqual(bound.lossW);
          expect(partial.riseK).toBeLessThanOrEqual(bound.riseK);
          expect(partial.lossW).toBeGreaterThanOrEqual(before[j]!.lossW);
          expect(partial.riseK).toBeGreaterThanOrEqual(before[j]!.riseK);
          before[j] = partial;
          if (only.includes(bound.lossCorner)) {
            expect(partial.lossW).toBe(bound.lossW);
            equalLoss += 1;
          }
        });
      }
    }
    expect(nodes).toBeGreaterThan(20);
    expect(equalLoss).toBeGreaterThan(0);
  });
});
