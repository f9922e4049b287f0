/**
 * A whole-catalog core search timed in a process of its own, launched with the node options the
 * workers run with (`WORKER_NODE_ARGS`): `node --max-semi-space-size=64 --import tsx
 * test/bench/core-search-probe.ts [flyback|two-switch-forward]` (flyback by default; the bench's
 * invented telecom-style specs, not any product). It runs the search eleven times, each time
 * from a fresh request and search space (nothing cached from the first run but the code's own):
 * the first run is a fresh worker's, the last five a warmed-up worker's, as a long-running
 * worker runs its jobs. Prints one JSON line: the median timed run's CPU and wall time, s
 * (`cpuS`, `wallS`), every timed run's CPU (`warmCpuS`) and every warm-up run's
 * (`warmUpCpuS`), the first run's (`coldCpuS`, `coldWallS`), and the result's counts, front size
 * and best loss. `PROBE_WARM_UP_RUNS` and `PROBE_TIMED_RUNS` change the five and five.
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

/**
 * Runs after the first before the timed ones, and the timed runs. The search reaches V8's steady
 * state only after several runs (the whole-catalog flyback on a 2-core VM, 2026-12-04, CPU per
 * run: 1.52 s first, then 0.71, 0.54, 0.40, 0.31, 0.22, 0.23, 0.19, 0.19, 0.51 (a major
 * collection), 0.25, 0.22, 0.20 s), so five runs warm up and the figure is the median of the
 * next five (the middle one).
 */
const WARM_UP_RUNS = Number(process.env.PROBE_WARM_UP_RUNS ?? 5);
const TIMED_RUNS = Number(process.env.PROBE_TIMED_RUNS ?? 5);

const cold = runOnce();
const coldJson = JSON.stringify(cold.result);
const check = (run: ReturnType<typeof runOnce>) => {
  if (JSON.stringify(run.result) !== coldJson) {
    throw new Error(`the ${name} search gave a different result on a later run`);
  }
  return run;
};
const warmUpRuns = Array.from({ length: WARM_UP_RUNS }, () => check(runOnce()));
const timedRuns = Array.from({ length: TIMED_RUNS }, () => check(runOnce()));
const warm = [...timedRuns].sort((a, b) => a.cpuS - b.cpuS)[TIMED_RUNS >> 1]!;
process.stdout.write(
  `${JSON.stringify({
    name,
    cpuS: warm.cpuS,
    wallS: warm.wallS,
    warmCpuS: timedRuns.map((run) => run.cpuS),
    warmUpCpuS: warmUpRuns.map((run) => run.cpuS),
    coldCpuS: cold.cpuS,
    coldWallS: cold.wallS,
    counts: warm.result.counts,
    paretoFront: warm.result.paretoFront.length,
    bestLossW: warm.result.top[0]?.lossWorstCornerW,
  })}\n`,
);
