import { describe, expect, it } from 'vitest';
import { canonicalJson } from '../../../solvers/versioning/canonical-json.js';
import {
  FREQUENCY_CHUNK_CANDIDATES_MAX,
  coreSearchBlockPlan,
  coreSearchPlan,
} from '../../../solvers/core-search/core-search-computation.js';
import type { CoreSearchCandidate } from '../../../solvers/core-search/core-search-candidate.js';
import {
  CoreSearchRequestSchema,
  type CoreSearchRequest,
} from '../../../solvers/core-search/core-search-request-schema.js';
import { dominates } from '../../../solvers/core-search/pareto-front.js';
import { resolveSearchSpace } from '../../../solvers/core-search/search-space.js';
import { designConverter } from '../../../solvers/design/design-converter.js';
import { SpecSchema } from '../../../solvers/spec/spec-schema.js';
import { expectClose } from '../../helpers/expect-close.js';
import {
  runPlan,
  runSearch,
  runWithBlocks,
  smallFlybackSearch,
  smallForwardSearch,
} from './core-search-fixtures.js';

/** The searched figures of a result, without the (large) specs. */
function figures(candidates: readonly CoreSearchCandidate[]) {
  return candidates.map(({ spec: _spec, ...rest }) => rest);
}

const cases = [
  ['flyback', smallFlybackSearch],
  ['two-switch forward', smallForwardSearch],
] as const;

describe.each(cases)('core search: %s (invented scenario)', (_name, makeRequest) => {
  const request = makeRequest();
  const bounded = runSearch(request);
  // Brute force: the loss bound off, every candidate past the saturation and window checks
  // evaluated in full, and the 100 accepted with the least loss kept (a candidate with more loss
  // than all of them dominates none of them, so the front check below holds over them).
  const everything = runSearch(makeRequest({ lossBoundMargin: 1, topN: 100 }));

  it('accounts for every enumerated candidate exactly once', () => {
    const { counts } = bounded;
    expect(counts.enumerated).toBe(resolveSearchSpace(request).total);
    expect(everything.counts.enumerated).toBe(counts.enumerated);
    expect(everything.counts.boundedOut).toBe(0);
    expect(counts.accepted).toBeGreaterThan(0);
    // The bound does skip candidates here, so the comparison below tests it.
    expect(counts.boundedOut).toBeGreaterThan(0);
    // The bound only skips: the cheap checks count the same with or without it.
    expect(counts.saturation).toBe(everything.counts.saturation);
    expect(counts.inductanceUnreachable).toBe(everything.counts.inductanceUnreachable);
    expect(counts.windowFill).toBe(everything.counts.windowFill);
  });

  it('finds the same top N and Pareto front as brute force', () => {
    // The brute force keeps its 100 least-loss accepted candidates (ties by number), which hold
    // the search's top N whatever the number accepted; the front is kept over all of them.
    expect(everything.counts.accepted).toBeGreaterThan(request.topN);
    const all = everything.top;
    const bruteTop = [...all]
      .sort((a, b) => a.lossWorstCornerW - b.lossWorstCornerW || a.index - b.index)
      .slice(0, request.topN);
    expect(figures(bounded.top)).toEqual(figures(bruteTop));
    expect(figures(bounded.paretoFront)).toEqual(figures(everything.paretoFront));
  });

  it('returns a Pareto front that no accepted candidate dominates, and every non-member dominated', () => {
    // ref: Pareto dominance as in Deb, "Multi-objective optimization using evolutionary
    // algorithms", Wiley 2001, def. 2.5 (from memory): no worse in every objective, better in one.
    const front = new Set(everything.paretoFront.map((c) => c.index));
    for (const candidate of everything.top) {
      const dominated = everything.top.some((other) => dominates(other, candidate));
      expect(front.has(candidate.index)).toBe(!dominated);
    }
    for (const a of bounded.paretoFront) {
      for (const b of bounded.paretoFront) expect(dominates(a, b)).toBe(false);
    }
  });

  it('gives byte-identical results whatever the chunk size', () => {
    const blockCount = coreSearchBlockPlan(request, 1).chunks.length;
    expect(blockCount).toBeGreaterThan(1);
    const single = canonicalJson(runWithBlocks(request, blockCount));
    expect(canonicalJson(runWithBlocks(request, 1))).toBe(single);
    expect(canonicalJson(bounded)).toBe(single);
  });

  it('returns members that pass every constraint when designed again with designConverter', () => {
    const limits = request.spec.magnetics;
    for (const member of [...bounded.paretoFront, ...bounded.top]) {
      const design = designConverter(SpecSchema.parse(member.spec));
      if (!design.ok) throw new Error(JSON.stringify(design.issues));
      const transformer = design.value.transformer;
      if (transformer === undefined) throw new Error('no transformer in the design');
      expect(transformer.coreShape).toBe(member.coreShape);
      expect(transformer.materialId).toBe(member.materialId);
      expect(transformer.windings.map((w) => w.turns)).toEqual(member.turns);
      expect(transformer.windings.map((w) => w.wire)).toEqual(member.wires);
      expect(transformer.arrangement).toBe(member.arrangement);
      expectClose(transformer.gapLengthM, member.gapLengthM, { abs: 1e-12 });
      expectClose(design.value.summary.lossTotalMaxW, member.lossWorstCornerW, { rel: 1e-9 });
      // The spec's magnetics limits (the search's constraints), at every corner.
      expect(transformer.windowFill).toBeLessThanOrEqual(limits.windowFillMax);
      for (const corner of transformer.corners) {
        expect(corner.fluxDensityUtilization).toBeLessThanOrEqual(limits.fluxDensityUtilizationMax);
        expect(corner.temperatureRiseK).toBeLessThanOrEqual(limits.temperatureRiseMaxK);
      }
    }
  });
});

describe('coreSearchPlan (the job plan)', () => {
  // The small flyback search (invented scenario) at four switching frequencies: 2 shapes each.
  const base = smallFlybackSearch({ topN: 3 });
  const multi: CoreSearchRequest = {
    ...base,
    space: { ...base.space, switchingFrequenciesHz: [80e3, 90e3, 100e3, 110e3] },
  };

  it('coreSearchPlan(request) takes a whole frequency a chunk, and the last two block by block', () => {
    const space = resolveSearchSpace(multi);
    const [f0, f1, f2, f3] = space.frequencies;
    if (f0 === undefined || f1 === undefined || f2 === undefined || f3 === undefined) {
      throw new Error('expected four frequencies');
    }
    const block = (f: typeof f0, s: number) => [f.offset + s * f.blockSize, f.blockSize];
    expect(
      coreSearchPlan(multi, space).chunks.map((chunk) => [chunk.index, chunk.start, chunk.count]),
    ).toEqual(
      [
        [f0.offset, f0.count],
        [f1.offset, f1.count],
        block(f2, 0),
        block(f2, 1),
        block(f3, 0),
        block(f3, 1),
      ].map(([start, count], index) => [index, start, count]),
    );
    // One or two frequencies (the usual search): block by block, as before.
    expect(coreSearchPlan(base).chunks).toEqual(coreSearchBlockPlan(base, 1).chunks);
  });

  it('coreSearchPlan(request) plans a frequency over FREQUENCY_CHUNK_CANDIDATES_MAX block by block', () => {
    // The whole catalog with 12 gap steps: 362,880 candidates at 100 kHz (its space only).
    const large = CoreSearchRequestSchema.parse({
      spec: base.spec,
      space: {
        gaps: { kind: 'inductance-steps', stepCount: 12, factorMin: 0.7, factorMax: 1.4 },
        switchingFrequenciesHz: [100e3, 110e3, 120e3],
      },
    });
    const space = resolveSearchSpace(large);
    const first = space.frequencies[0]!;
    expect(first.count).toBeGreaterThan(FREQUENCY_CHUNK_CANDIDATES_MAX);
    const plan = coreSearchPlan(large, space);
    expect(plan).toEqual(coreSearchBlockPlan(large, 1, space));
  });

  it('gives the byte-identical result of one block a chunk and of one chunk for all', () => {
    const space = resolveSearchSpace(multi);
    const planned = canonicalJson(runPlan(multi, coreSearchPlan(multi, space), space));
    expect(planned).toBe(canonicalJson(runWithBlocks(multi, 1)));
    const blockCount = coreSearchBlockPlan(multi, 1).chunks.length;
    expect(planned).toBe(canonicalJson(runWithBlocks(multi, blockCount)));
  });
});
