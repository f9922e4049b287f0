import { describe, expect, it } from 'vitest';
import { canonicalJson } from '../../../solvers/versioning/canonical-json.js';
import {
  coreSearchPlan,
  reduceCoreSearch,
} from '../../../solvers/core-search/core-search-computation.js';
import type {
  CoreSearchCandidate,
  CoreSearchResult,
} from '../../../solvers/core-search/core-search-candidate.js';
import type { CoreSearchRequest } from '../../../solvers/core-search/core-search-request-schema.js';
import { dominates } from '../../../solvers/core-search/pareto-front.js';
import { runCoreSearchChunk } from '../../../solvers/core-search/run-core-search-chunk.js';
import { resolveSearchSpace } from '../../../solvers/core-search/search-space.js';
import { designConverter } from '../../../solvers/design/design-converter.js';
import { runChunkToEnd } from '../../../solvers/jobs/chunked-computation.js';
import { SpecSchema } from '../../../solvers/spec/spec-schema.js';
import { expectClose } from '../../helpers/expect-close.js';
import { runSearch, smallFlybackSearch, smallForwardSearch } from './core-search-fixtures.js';

/** The searched figures of a result, without the (large) specs. */
function figures(candidates: readonly CoreSearchCandidate[]) {
  return candidates.map(({ spec: _spec, ...rest }) => rest);
}

/** Runs a request with `blocksPerChunk` blocks in each chunk. */
function runWithBlocks(request: CoreSearchRequest, blocksPerChunk: number): CoreSearchResult {
  const space = resolveSearchSpace(request);
  const plan = coreSearchPlan(request, blocksPerChunk, space);
  const outputs = plan.chunks.map((chunk) =>
    runChunkToEnd(runCoreSearchChunk(request, chunk, space)),
  );
  return reduceCoreSearch(request, outputs, space);
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
    const blockCount = coreSearchPlan(request).chunks.length;
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
