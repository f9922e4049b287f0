import {
  CoreSearchRequestSchema,
  type CoreSearchRequest,
  type CoreSearchRequestInput,
} from '../../../solvers/core-search/core-search-request-schema.js';
import {
  CORE_SEARCH_COMPUTATION,
  coreSearchBlockPlan,
  reduceCoreSearch,
} from '../../../solvers/core-search/core-search-computation.js';
import type { JobPlan } from '../../../solvers/jobs/chunked-computation.js';
import { runCoreSearchChunk } from '../../../solvers/core-search/run-core-search-chunk.js';
import type { CoreSearchResult } from '../../../solvers/core-search/core-search-candidate.js';
import { runChunkToEnd } from '../../../solvers/jobs/chunked-computation.js';
import { candidatePasses, passesOf } from '../../../solvers/core-search/first-pass-cache.js';
import {
  resolveSearchSpace,
  type CoreSearchSpace,
} from '../../../solvers/core-search/search-space.js';
import { coreGeometry } from '../../../solvers/magnetics/core-geometry.js';
import type { CandidateBuild } from '../../../solvers/core-search/evaluate-candidate.js';
import { windowFits, type WindowVerdict } from '../../../solvers/core-search/leaf-bounds.js';
import { turnsFromPrimary } from '../../../solvers/transformer/transformer-turns.js';
import { telecomSpec } from '../../helpers/flyback-specs.js';
import { forwardTelecomSpec, resetWindingSpec } from '../../helpers/forward-specs.js';
import { halfBridgeSpec, pushPullSpec } from '../../helpers/double-ended-specs.js';

/**
 * Small core searches over invented scenarios (the test helpers' 36–72 V telecom-style flyback
 * and two-switch forward, not any product), kept small enough to evaluate every candidate.
 */
export function smallFlybackSearch(
  overrides: Partial<Omit<CoreSearchRequestInput, 'spec'>> = {},
): CoreSearchRequest {
  return smallSearch(
    telecomSpec(),
    {
      coreShapes: ['ETD 29', 'ETD 34'],
      materialIds: ['mnzn-power-low-frequency', 'mnzn-power-high-frequency'],
      primaryTurns: { min: 10, max: 12 },
      gaps: { kind: 'inductance-steps', stepCount: 2, factorMin: 0.8, factorMax: 1.25 },
    },
    overrides,
  );
}

/** A small two-switch forward search (invented scenario, as above). */
export function smallForwardSearch(
  overrides: Partial<Omit<CoreSearchRequestInput, 'spec'>> = {},
): CoreSearchRequest {
  return smallSearch(
    forwardTelecomSpec({ magnetics: { mode: 'design' } }),
    {
      coreShapes: ['ETD 34', 'E 42/21/15'],
      materialIds: ['mnzn-power-low-frequency'],
      primaryTurnsCount: 4,
    },
    overrides,
  );
}

/**
 * A small reset-winding forward search (the test helpers' invented 36–72 V scenario with a 1:1
 * reset winding, not any product): its reset winding has no copper line of its own in the
 * converter's solve; its evaluated copper heats the core and, since solver 0.24.0, is in the
 * total loss too (a line `cornerWithWoundCores` adds).
 */
export function smallResetWindingSearch(
  overrides: Partial<Omit<CoreSearchRequestInput, 'spec'>> = {},
): CoreSearchRequest {
  return smallSearch(
    resetWindingSpec(1, { magnetics: { mode: 'design' } }),
    {
      coreShapes: ['E 25/13/7', 'ETD 29'],
      materialIds: ['mnzn-power-low-frequency'],
      primaryTurnsCount: 4,
    },
    overrides,
  );
}

/**
 * A small push-pull search (the test helpers' invented 18–36 V scenario, not any product): the
 * one whose best build the loss bound once put out (DEVELOPERS.md, "The push-pull's loss bound").
 */
export function smallPushPullSearch(
  overrides: Partial<Omit<CoreSearchRequestInput, 'spec'>> = {},
): CoreSearchRequest {
  return smallSearch(
    pushPullSpec({ magnetics: { mode: 'design' } }),
    {
      coreShapes: ['ETD 34', 'E 42/21/15'],
      materialIds: ['mnzn-power-high-frequency'],
    },
    overrides,
  );
}

/**
 * A small half-bridge search (the test helpers' invented 400 V bus, 24 V 20 A scenario, not any
 * product) on the cores of the whole-catalog search's top 10: the one whose third best build
 * (index 188) the default margin put out while the bridges' bound pass carried the output
 * inductor's assumed 10 mΩ line (4 W at full load; over the whole-catalog half bridge's bound
 * passes the designed inductors lose 1.8 to 8.4 times less; DEVELOPERS.md, "The push-pull's loss
 * bound").
 */
export function smallHalfBridgeSearch(
  overrides: Partial<Omit<CoreSearchRequestInput, 'spec'>> = {},
): CoreSearchRequest {
  return smallSearch(
    halfBridgeSpec({ magnetics: { mode: 'design' } }),
    {
      coreShapes: ['E 65/32/27', 'ETD 49'],
      materialIds: ['mnzn-power-high-frequency'],
    },
    overrides,
  );
}

/**
 * A small search: `spec` over the cores, materials and turns in `space`, two wire current
 * densities (0.7 and 1.4 of the default) and both arrangements, top 3, then `overrides`.
 */
function smallSearch(
  spec: unknown,
  space: Record<string, unknown>,
  overrides: Partial<Omit<CoreSearchRequestInput, 'spec'>>,
): CoreSearchRequest {
  return CoreSearchRequestSchema.parse({
    spec,
    space: {
      ...space,
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

/** Runs `plan`'s chunks on one search space `space` and reduces them. */
export function runPlan(
  request: CoreSearchRequest,
  plan: JobPlan,
  space: CoreSearchSpace,
): CoreSearchResult {
  const outputs = plan.chunks.map((chunk) =>
    runChunkToEnd(runCoreSearchChunk(request, chunk, space)),
  );
  return reduceCoreSearch(request, outputs, space);
}

/** Runs a request with `blocksPerChunk` blocks in each chunk, one search space for all. */
export function runWithBlocks(
  request: CoreSearchRequest,
  blocksPerChunk: number,
): CoreSearchResult {
  const space = resolveSearchSpace(request);
  return runPlan(request, coreSearchBlockPlan(request, blocksPerChunk, space), space);
}

/** Every combination of one option per list (the wires' digits), first list slowest. */
export function digitsOf(radices: readonly number[]): number[][] {
  let all: number[][] = [[]];
  for (const radix of radices) {
    all = all.flatMap((prefix) => Array.from({ length: radix }, (_, w) => [...prefix, w]));
  }
  return all;
}

/**
 * Every node of `space` the search would reach past the passes' own checks, in the search's
 * order (frequency, shape, material, primary turns, gap): what the bound tests walk before
 * checking each fitting leaf (`digitsOf` the frequency's wire options) against the engine.
 */
export function* searchNodes(space: CoreSearchSpace) {
  const { settings } = space;
  for (const f of space.frequencies) {
    const passes = passesOf(f);
    const leafDigits = digitsOf(f.wireOptions.map((options) => options.length));
    for (const shape of f.shapes) {
      const s = f.shapes.indexOf(shape);
      const geometry = coreGeometry(shape);
      const breadthM = geometry.windowBreadthM - 2 * settings.endMarginM;
      for (const material of f.materials) {
        for (let t = 0; t < f.turnsCount; t++) {
          const primaryTurns = f.turnsStart[s]! + t;
          for (let g = 0; g < f.gaps.length; g++) {
            const passesHere = candidatePasses(f, passes, g, geometry, material, primaryTurns);
            if (passesHere === undefined) continue;
            const turns = turnsFromPrimary(passesHere.pass.idealRatios, primaryTurns);
            yield {
              f,
              passes,
              leafDigits,
              s,
              shape,
              geometry,
              breadthM,
              material,
              t,
              primaryTurns,
              turns,
              g,
              passesHere,
            };
          }
        }
      }
    }
  }
}

/** One node of `searchNodes`. */
export type SearchNode = ReturnType<typeof searchNodes> extends Generator<infer N> ? N : never;

/**
 * Every leaf of `node` whose windings fit the window (the frequency's wire digits, then each
 * of `arrangements`, the space's by default), in the search's order, with its window verdict
 * and its build as the search makes it.
 */
export function* fittingLeaves(
  node: SearchNode,
  settings: CoreSearchSpace['settings'],
  arrangements: readonly number[] = node.f.arrangements.map((_, r) => r),
): Generator<{
  digits: number[];
  arrangement: number;
  window: WindowVerdict;
  build: CandidateBuild;
}> {
  const { f, leafDigits, shape, geometry, breadthM, material, primaryTurns, turns } = node;
  const { pass } = node.passesHere;
  for (const digits of leafDigits) {
    for (const r of arrangements) {
      const window = windowFits(shape, pass, geometry, breadthM, turns, digits, f, r, settings);
      if (window === undefined) continue;
      const build: CandidateBuild = {
        index: 0,
        shape,
        material,
        primaryTurns,
        wires: digits.map((w, k) => f.wireOptions[k]![w]!),
        arrangement: f.arrangements[r]!,
      };
      yield { digits, arrangement: r, window, build };
    }
  }
}
