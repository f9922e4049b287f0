import { describe, expect, it } from 'vitest';
import {
  candidateCoordinates,
  candidateIndex,
} from '../../../solvers/core-search/candidate-numbering.js';
import { resolveSearchSpace } from '../../../solvers/core-search/search-space.js';
import { CORE_SEARCH_COMPUTATION } from '../../../solvers/core-search/core-search-computation.js';
import { smallFlybackSearch } from './core-search-fixtures.js';

describe('core-search numbering', () => {
  const request = smallFlybackSearch({
    space: {
      coreShapes: ['E 25/13/7', 'ETD 29', 'ETD 34'],
      primaryTurns: { min: 10, max: 12 },
      wires: [
        [
          { kind: 'round', awg: 24, parallelCount: 1 },
          { kind: 'round', awg: 24, parallelCount: 2 },
        ],
        [
          { kind: 'round', awg: 20, parallelCount: 1 },
          { kind: 'litz', strandAwg: 30, strandCount: 20 },
          { kind: 'round', awg: 22, parallelCount: 2 },
        ],
      ],
      switchingFrequenciesHz: [130e3, 100e3],
      gaps: { kind: 'inductance-steps', stepCount: 2, factorMin: 0.8, factorMax: 1.25 },
      wireCurrentDensityFactors: [1],
      arrangements: ['stacked', 'interleaved'],
      primaryTurnsCount: 12,
    },
  });
  const space = resolveSearchSpace(request);

  it('counts every combination of every dimension at every frequency', () => {
    // 2 frequencies × 3 shapes × materials × 3 turns × 2 gaps × (2 × 3 wires) × 2 arrangements.
    const perShape = space.frequencies[0]!.materials.length * 3 * 2 * 6 * 2;
    expect(space.frequencies.map((f) => f.frequencyHz)).toEqual([100e3, 130e3]);
    expect(space.total).toBe(
      space.frequencies.reduce((sum, f) => sum + 3 * f.materials.length * 3 * 2 * 6 * 2, 0),
    );
    expect(space.frequencies[0]!.blockSize).toBe(perShape);
    expect(CORE_SEARCH_COMPUTATION.plan(request).total).toBe(space.total);
  });

  it('numbers the candidates one to one: index → coordinates → index', () => {
    const seen = new Set<string>();
    for (let index = 0; index < space.total; index++) {
      const coordinates = candidateCoordinates(space, index);
      expect(candidateIndex(space, coordinates)).toBe(index);
      seen.add(JSON.stringify(coordinates));
    }
    expect(seen.size).toBe(space.total);
  });

  it('refuses numbers and coordinates outside the space', () => {
    expect(() => candidateCoordinates(space, space.total)).toThrow(RangeError);
    expect(() => candidateCoordinates(space, -1)).toThrow(RangeError);
    const inside = candidateCoordinates(space, 5);
    expect(() => candidateIndex(space, { ...inside, turns: 3 })).toThrow(RangeError);
  });

  it('plans whole blocks (one shape at one frequency) in order, covering every candidate', () => {
    const plan = CORE_SEARCH_COMPUTATION.plan(request);
    expect(plan.chunks).toHaveLength(6);
    let next = 0;
    for (const [i, chunk] of plan.chunks.entries()) {
      expect(chunk).toMatchObject({ index: i, start: next });
      next += chunk.count;
    }
    expect(next).toBe(space.total);
  });

  it('refuses a wire list with a different number of windings, naming them', () => {
    const bad = smallFlybackSearch({
      space: { wires: [[{ kind: 'round', awg: 24, parallelCount: 1 }]] },
    });
    expect(() => resolveSearchSpace(bad)).toThrow(/primary, secondary-1/);
  });
});
