/**
 * A fixed piece of core-search work for the machine check of `core-search-workers.bench.ts`,
 * run as a process of its own (`node --import tsx test/bench/core-search-probe.ts`): the
 * whole-catalog flyback at 100 kHz (the bench's invented telecom-style flyback, not any product)
 * once to warm up, then once timed. Prints one JSON line: the timed run's CPU and wall time, s.
 */
import { CORE_SEARCH_COMPUTATION } from '../../solvers/core-search/core-search-computation.js';
import { resolveSearchSpace } from '../../solvers/core-search/search-space.js';
import { runCoreSearchChunk } from '../../solvers/core-search/run-core-search-chunk.js';
import { runChunkToEnd } from '../../solvers/jobs/chunked-computation.js';
import { coreSearchBenchRequests } from './core-search.bench.js';

const request = coreSearchBenchRequests().flyback!;

/** Every chunk on a space of its own (nothing cached from an earlier run but the code's own). */
function runOnce(): number {
  const space = resolveSearchSpace(request);
  const plan = CORE_SEARCH_COMPUTATION.plan(request);
  let enumerated = 0;
  for (const chunk of plan.chunks) {
    enumerated += runChunkToEnd(runCoreSearchChunk(request, chunk, space)).counts.enumerated;
  }
  return enumerated;
}

runOnce();
const cpuStart = process.cpuUsage();
const start = process.hrtime.bigint();
const enumerated = runOnce();
const wallS = Number(process.hrtime.bigint() - start) * 1e-9;
const cpu = process.cpuUsage(cpuStart);
process.stdout.write(
  `${JSON.stringify({ enumerated, cpuS: (cpu.user + cpu.system) * 1e-6, wallS })}\n`,
);
