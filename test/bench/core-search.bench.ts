import { CORE_SEARCH_COMPUTATION } from '../../solvers/core-search/core-search-computation.js';
import {
  CoreSearchRequestSchema,
  type CoreSearchRequest,
} from '../../solvers/core-search/core-search-request-schema.js';
import type { CoreSearchResult } from '../../solvers/core-search/core-search-candidate.js';
import { runChunkToEnd } from '../../solvers/jobs/chunked-computation.js';
import { telecomSpec } from '../helpers/flyback-specs.js';
import { forwardTelecomSpec } from '../helpers/forward-specs.js';

/** Issue 5's target: enumerated candidates per second per worker core, end to end. */
export const CORE_SEARCH_TARGET_PER_S = 200_000;

/**
 * The whole-catalog searches the benchmark runs: the design bench's invented telecom-style
 * flyback and two-switch forward (36–72 V to 12 V, 100 kHz; not any product) with every
 * default of the search space (every catalog shape, the materials for 100 kHz, 12 turn counts
 * per shape, three gap steps for the flyback, five wires per winding, both arrangements).
 */
export function coreSearchBenchRequests(): Record<string, CoreSearchRequest> {
  return {
    flyback: CoreSearchRequestSchema.parse({ spec: telecomSpec() }),
    'two-switch-forward': CoreSearchRequestSchema.parse({
      spec: forwardTelecomSpec({ magnetics: { mode: 'design' } }),
    }),
  };
}

/** Figures of one search run in this process, chunk after chunk, as one worker would. */
export interface CoreSearchBench {
  label: string;
  enumerated: number;
  fullyEvaluated: number;
  /** Process CPU time of plan, every chunk and the reduction, s. */
  cpuS: number;
  wallS: number;
  enumeratedPerCpuS: number;
  fullyEvaluatedPerCpuS: number;
  /** fullyEvaluated / enumerated. */
  survivorRatio: number;
  result: CoreSearchResult;
}

/** Runs `request` end to end (plan, every chunk, reduce) and times it. */
export function benchCoreSearch(name: string, request: CoreSearchRequest): CoreSearchBench {
  const computation = CORE_SEARCH_COMPUTATION;
  const cpuStart = process.cpuUsage();
  const start = process.hrtime.bigint();
  const plan = computation.plan(request);
  const outputs = plan.chunks.map((chunk) => runChunkToEnd(computation.runChunk(request, chunk)));
  const result = computation.reduce(request, outputs);
  const wallS = Number(process.hrtime.bigint() - start) * 1e-9;
  const cpu = process.cpuUsage(cpuStart);
  const cpuS = (cpu.user + cpu.system) * 1e-6;
  const { enumerated, fullyEvaluated } = result.counts;
  return {
    label: `core search, ${name}, whole catalog`,
    enumerated,
    fullyEvaluated,
    cpuS,
    wallS,
    enumeratedPerCpuS: enumerated / cpuS,
    fullyEvaluatedPerCpuS: fullyEvaluated / cpuS,
    survivorRatio: fullyEvaluated / enumerated,
    result,
  };
}
