import {
  CoreSearchRequestSchema,
  type CoreSearchRequest,
  type CoreSearchRequestInput,
} from '../../../solvers/core-search/core-search-request-schema.js';
import { CORE_SEARCH_COMPUTATION } from '../../../solvers/core-search/core-search-computation.js';
import type { CoreSearchResult } from '../../../solvers/core-search/core-search-candidate.js';
import { runChunkToEnd } from '../../../solvers/jobs/chunked-computation.js';
import { telecomSpec } from '../../helpers/flyback-specs.js';
import { forwardTelecomSpec } from '../../helpers/forward-specs.js';

/**
 * Small core searches over invented scenarios (the test helpers' 36–72 V telecom-style flyback
 * and two-switch forward, not any product), kept small enough to evaluate every candidate.
 */
export function smallFlybackSearch(
  overrides: Partial<Omit<CoreSearchRequestInput, 'spec'>> = {},
): CoreSearchRequest {
  return CoreSearchRequestSchema.parse({
    spec: telecomSpec(),
    space: {
      coreShapes: ['ETD 29', 'ETD 34'],
      materialIds: ['mnzn-power-low-frequency', 'mnzn-power-high-frequency'],
      primaryTurns: { min: 10, max: 12 },
      gaps: { kind: 'inductance-steps', stepCount: 2, factorMin: 0.8, factorMax: 1.25 },
      wireCurrentDensityFactors: [0.7, 1.4],
      arrangements: ['interleaved', 'stacked'],
    },
    topN: 3,
    ...overrides,
  });
}

/** A small two-switch forward search (invented scenario, as above). */
export function smallForwardSearch(
  overrides: Partial<Omit<CoreSearchRequestInput, 'spec'>> = {},
): CoreSearchRequest {
  return CoreSearchRequestSchema.parse({
    spec: forwardTelecomSpec({ magnetics: { mode: 'design' } }),
    space: {
      coreShapes: ['ETD 34', 'E 42/21/15'],
      materialIds: ['mnzn-power-low-frequency'],
      primaryTurnsCount: 4,
      wireCurrentDensityFactors: [0.7, 1.4],
      arrangements: ['interleaved', 'stacked'],
    },
    topN: 3,
    ...overrides,
  });
}

/** Runs a search's plan chunk by chunk and reduces it, as a runner would. */
export function runSearch(request: CoreSearchRequest): CoreSearchResult {
  const computation = CORE_SEARCH_COMPUTATION;
  const plan = computation.plan(request);
  const outputs = plan.chunks.map((chunk) => runChunkToEnd(computation.runChunk(request, chunk)));
  return computation.reduce(request, outputs);
}

/** Every combination of one option per list (the wires' digits), first list slowest. */
export function digitsOf(radices: readonly number[]): number[][] {
  let all: number[][] = [[]];
  for (const radix of radices) {
    all = all.flatMap((prefix) => Array.from({ length: radix }, (_, w) => [...prefix, w]));
  }
  return all;
}
