/**
 * A whole-catalog core search timed in a process of its own, launched with the node options the
 * workers run with (`WORKER_NODE_ARGS`): `node --max-semi-space-size=64 --import tsx
 * test/bench/core-search-probe.ts [flyback|two-switch-forward]` (flyback by default; the bench's
 * invented telecom-style specs, not any product). It runs the search twice, each time from a
 * fresh request and search space (nothing cached from the first run but the code's own): the
 * first run is a fresh worker's, the second a warmed-up worker's, as a long-running worker runs
 * its jobs. Prints one JSON line: the warmed run's CPU and wall time, s (`cpuS`, `wallS`), the
 * first run's (`coldCpuS`, `coldWallS`), and the result's counts, front size and best loss.
 * The machine check (`core-search-workers.bench.ts`) runs the flyback's.
 */
import { CORE_SEARCH_COMPUTATION } from '../../solvers/core-search/core-search-computation.js';
import { resolveSearchSpace } from '../../solvers/core-search/search-space.js';
import { runCoreSearchChunk } from '../../solvers/core-search/run-core-search-chunk.js';
import type { CoreSearchResult } from '../../solvers/core-search/core-search-candidate.js';
import { runChunkToEnd } from '../../solvers/jobs/chunked-computation.js';
import { coreSearchBenchRequests } from './core-search.bench.js';

const name = process.argv[2] ?? 'flyback';
if (coreSearchBenchRequests()[name] === undefined) {
  throw new Error(
    `no bench search named '${name}' (${Object.keys(coreSearchBenchRequests()).join(', ')})`,
  );
}

/** Plan, every chunk and the reduction, on a request and space of their own; CPU and wall, s. */
function runOnce(): { result: CoreSearchResult; cpuS: number; wallS: number } {
  const request = coreSearchBenchRequests()[name]!;
  const cpuStart = process.cpuUsage();
  const start = process.hrtime.bigint();
  const space = resolveSearchSpace(request);
  const plan = CORE_SEARCH_COMPUTATION.plan(request);
  const outputs = plan.chunks.map((chunk) =>
    runChunkToEnd(runCoreSearchChunk(request, chunk, space)),
  );
  const result = CORE_SEARCH_COMPUTATION.reduce(request, outputs);
  const wallS = Number(process.hrtime.bigint() - start) * 1e-9;
  const cpu = process.cpuUsage(cpuStart);
  return { result, cpuS: (cpu.user + cpu.system) * 1e-6, wallS };
}

const cold = runOnce();
const warm = runOnce();
if (JSON.stringify(cold.result) !== JSON.stringify(warm.result)) {
  throw new Error(`the ${name} search gave a different result the second time`);
}
process.stdout.write(
  `${JSON.stringify({
    name,
    cpuS: warm.cpuS,
    wallS: warm.wallS,
    coldCpuS: cold.cpuS,
    coldWallS: cold.wallS,
    counts: warm.result.counts,
    paretoFront: warm.result.paretoFront.length,
    bestLossW: warm.result.top[0]?.lossWorstCornerW,
  })}\n`,
);
