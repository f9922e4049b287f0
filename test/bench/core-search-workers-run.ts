/**
 * The bench's 1M flyback search on worker processes alone, without the rest of `npm run bench`
 * (no designs, no HTTP load, no machine check): `npx tsx test/bench/core-search-workers-run.ts
 * [worker counts, default 1,2]`, e.g. `... 2` for 2 workers only. The same function, request,
 * warm-up (the full one: `BENCH_CORE_SEARCH_WARM_UP_JOBS` jobs a worker, 3 by default, each the
 * same search for 1 %, 2 %… more output current) and worker options as the bench
 * (`BENCH_CORE_SEARCH_CANDIDATES`, `BENCH_WORKER_NODE_ARGS` as there, e.g.
 * `--cpu-prof --cpu-prof-dir=/tmp/prof`). Prints per run the wall time, each worker's CPU, chunks
 * and time inside chunks, the CPU of the bench's Redis and of this (producing) process, the Redis
 * commands by count, and a hash of the result; the last line is every figure as JSON (with each
 * worker's CPU by thread and its context switches), for scripts that alternate trees.
 */
import { createHash } from 'node:crypto';
import { loadavg } from 'node:os';
import {
  benchCoreSearchWorkers,
  coreSearchWorkersRequest,
  coreSearchWorkersWarmUpRequests,
} from './core-search-workers.bench.js';

const candidateCount = Number(process.env.BENCH_CORE_SEARCH_CANDIDATES ?? 1_000_000);
const workerCounts = (process.argv[2] ?? '1,2').split(',').map(Number);
const workerNodeArgs = (process.env.BENCH_WORKER_NODE_ARGS ?? '').split(' ').filter(Boolean);
const loadBefore = loadavg()[0]!;

/**
 * The 1-worker run's completion stamp over the 2-worker run's (either order of `workerCounts`);
 * null where the runs asked do not include both.
 */
function completedSpeedUp(
  runs: readonly { workerCount: number; completedS?: number | undefined }[],
): number | null {
  const one = runs.find((run) => run.workerCount === 1)?.completedS;
  const two = runs.find((run) => run.workerCount === 2)?.completedS;
  return one === undefined || two === undefined ? null : one / two;
}
const bench = await benchCoreSearchWorkers(coreSearchWorkersRequest(candidateCount), {
  workerCounts,
  warmUpRequests: coreSearchWorkersWarmUpRequests(candidateCount),
  workerNodeArgs,
});
const runs = bench.runs.map((run) => {
  const commandCount = Object.values(run.redisCommands).reduce((sum, n) => sum + n, 0);
  const figures = {
    workers: run.workerCount,
    wallS: run.wallS,
    completedS: run.completedS,
    lastChunkS: run.lastChunkS,
    reduceS: run.reduceS,
    workerCpuS: run.workerCpuS,
    workerCpuSEach: run.workerCpuSEach,
    workerMainCpuSEach: run.workerMainCpuSEach,
    workerSwitchesEach: run.workerSwitchesEach,
    workerThreadCpuSEach: run.workerThreadCpuSEach,
    chunksEach: run.chunksEach,
    chunkBusySEach: run.chunkBusySEach,
    chunkOrderEach: run.chunkTimesEach.map((times) => times.map((t) => t.chunk)),
    redisCpuS: run.redisCpuS,
    producerCpuS: run.producerCpuS,
    redisCommandCount: commandCount,
    redisCommands: Object.fromEntries(Object.entries(run.redisCommands).slice(0, 12)),
    resultSha256: createHash('sha256').update(run.resultJson).digest('hex').slice(0, 16),
    resultBytes: run.resultJson.length,
  };
  console.log(
    `${run.workerCount} worker(s): wall ${run.wallS.toFixed(2)} s (completed at ${run.completedS?.toFixed(2) ?? '?'} s, last chunk at ${run.lastChunkS?.toFixed(2) ?? '?'} s, reduce ${run.reduceS?.toFixed(3) ?? '?'} s); workers' CPU ${run.workerCpuS?.toFixed(2) ?? '?'} s (${run.workerCpuSEach.map((s) => s?.toFixed(2) ?? '?').join(' + ')}; main threads ${run.workerMainCpuSEach.map((s) => s?.toFixed(2) ?? '?').join(' + ')}), chunks ${run.chunksEach.join(' + ')}, in chunks ${run.chunkBusySEach.map((s) => s.toFixed(2)).join(' + ')} s; Redis CPU ${run.redisCpuS.toFixed(2)} s, ${commandCount} commands; producer CPU ${run.producerCpuS.toFixed(2)} s; result ${figures.resultSha256}`,
  );
  return figures;
});
console.log(
  JSON.stringify({
    loadBefore,
    loadAfter: loadavg()[0],
    speedUp: bench.speedUp,
    speedUpCompleted: completedSpeedUp(bench.runs),
    isIdentical: bench.isIdentical,
    runs,
  }),
);
