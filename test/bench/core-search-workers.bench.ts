import { randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { Queue } from 'bullmq';
import { Redis } from 'ioredis';
import {
  CoreSearchRequestSchema,
  type CoreSearchRequest,
} from '../../solvers/core-search/core-search-request-schema.js';
import { resolveSearchSpace } from '../../solvers/core-search/search-space.js';
import type { CoreSearchResult } from '../../solvers/core-search/core-search-candidate.js';
import type { JobResult } from '../../solvers/jobs/job-result.js';
import { canonicalJson } from '../../solvers/versioning/canonical-json.js';
import { createBullmqRunner } from '../../workers/runners/bullmq.js';
import { startRedisServer } from '../helpers/redis-server.js';
import { waitForJob } from '../helpers/wait-for-job.js';
import { startWorkerProcess, type TestWorkerProcess } from '../helpers/worker-process.js';
import { telecomSpec } from '../helpers/flyback-specs.js';
import { runCoreSearchProbe } from './core-search.bench.js';
import type { Spec } from '../../solvers/spec/spec-schema.js';
import { coreSearchBenchRequests } from './core-search.bench.js';

/** Switching frequencies added, in this order, until the search holds the candidates asked for. */
const FREQUENCIES_HZ = [
  100e3, 90e3, 110e3, 80e3, 120e3, 70e3, 135e3, 60e3, 150e3, 165e3, 180e3, 200e3, 50e3, 220e3,
  240e3,
];

/**
 * A whole-catalog flyback search (the design bench's invented 36–72 V to 12 V telecom-style
 * flyback, not any product; every default of the space) over as many switching frequencies as
 * it takes to hold at least `candidateCount` candidates (about 73,000 per frequency with three
 * gap steps); past the listed frequencies' 1.1 million, with more gap steps (6, then 12) over
 * the same range.
 * @throws RangeError when even every listed frequency at 12 gap steps holds fewer.
 */
export function coreSearchWorkersRequest(
  candidateCount: number,
  spec: Spec = telecomSpec(),
): CoreSearchRequest {
  for (const stepCount of [3, 6, 12]) {
    const frequencies: number[] = [];
    for (const frequencyHz of FREQUENCIES_HZ) {
      frequencies.push(frequencyHz);
      const request = CoreSearchRequestSchema.parse({
        spec,
        space: {
          primaryTurnsCount: 12,
          gaps: { kind: 'inductance-steps', stepCount, factorMin: 0.7, factorMax: 1.4 },
          wireCurrentDensityFactors: [0.5, 0.7, 1, 1.4, 2],
          arrangements: ['interleaved', 'stacked'],
          switchingFrequenciesHz: [...frequencies],
        },
      });
      if (resolveSearchSpace(request).total >= candidateCount) return request;
    }
  }
  throw new RangeError(`coreSearchWorkersRequest: no listed space reaches ${candidateCount}`);
}

/**
 * The warm-up job's spec for {@link coreSearchWorkersRequest}: the same invented flyback with
 * its output current 1 % higher, so its search is as large and reaches the same code but
 * shares no cached space, scouts or first passes with the timed job's.
 */
export function coreSearchWorkersWarmUpSpec(): Spec {
  const spec = telecomSpec();
  return telecomSpec({
    outputs: spec.outputs.map((output) => ({ ...output, currentA: output.currentA * 1.01 })),
  });
}

/** One run of a core-search job on real worker processes. */
export interface CoreSearchWorkersRun {
  workerCount: number;
  /** Submission to completion as the runner saw it, s. */
  wallS: number;
  /** CPU time of every worker process over the run (Linux /proc), s; undefined elsewhere. */
  workerCpuS: number | undefined;
  /** Each worker's CPU time over the run, s (undefined where /proc is unreadable). */
  workerCpuSEach: (number | undefined)[];
  /** Chunks of the job each worker completed. */
  chunksEach: number[];
  /**
   * Each worker's time inside the job's chunks (BullMQ's processing time of each, summed), s:
   * against the run's wall time, what it spent between chunks (picking one up, saving one) or
   * idle at the end waiting for the other's last chunk and the parent's reduction.
   */
  chunkBusySEach: number[];
  /** Each worker's chunks in the order it completed them: chunk number and time inside, s. */
  chunkTimesEach: { chunk: number; busyS: number }[][];

  /** Wall time of the warm-up job that ran before, s (undefined: none). */
  warmUpWallS: number | undefined;
  /** Every worker's CPU time over the warm-up job, s (undefined: none, or /proc unreadable). */
  warmUpCpuS: number | undefined;
  /** Candidates of the warm-up job (undefined: none). */
  warmUpEnumerated: number | undefined;
  enumerated: number;
  fullyEvaluated: number;
  /** Canonical JSON of the job's result (meta and output). */
  resultJson: string;
}

/** Figures of the same search with 1 and with 2 worker processes. */
export interface CoreSearchWorkersBench {
  label: string;
  enumerated: number;
  runs: CoreSearchWorkersRun[];
  /** Wall time with 1 worker over wall time with 2. */
  speedUp: number;
  /** Whether every run gave the same result bytes. */
  isIdentical: boolean;
}

/** utime + stime of a process from /proc/<pid>/stat, s (undefined when unreadable). */
function processCpuS(pid: number): number | undefined {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    // Fields after the command name (which may hold spaces) start after the last ')'.
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    const ticks = Number(fields[11]) + Number(fields[12]);
    return Number.isFinite(ticks) ? ticks / 100 : undefined;
  } catch {
    return undefined;
  }
}

function sumOrUndefined(values: readonly (number | undefined)[]): number | undefined {
  let sum = 0;
  for (const value of values) {
    if (value === undefined) return undefined;
    sum += value;
  }
  return sum;
}

/** Options of {@link benchCoreSearchWorkers}. */
export interface CoreSearchWorkersOptions {
  workerCounts?: readonly number[];
  /**
   * Whether each set of workers first runs a warm-up job, as long-running workers have done
   * before any job: the timed job then pays what each job costs, not what each process costs
   * once (compiling and optimizing the code, filling the engine's tables). @defaultValue true
   */
  warmUp?: boolean;
  /**
   * The warm-up job's request: one of its own, so that nothing cached for the timed job's
   * request (its space, scouts, first passes) is there before it. @defaultValue the
   * whole-catalog flyback at 100 kHz (`coreSearchBenchRequests().flyback`)
   */
  warmUpRequest?: CoreSearchRequest;
  /**
   * Node options of every worker process (e.g. `--single-threaded-gc`), after the ones every
   * worker is launched with (`WORKER_NODE_ARGS`; a later option wins). @defaultValue none
   */
  workerNodeArgs?: readonly string[];
}

/**
 * Runs `request` as a `core-search` job through BullMQ on a Redis of its own (a free port,
 * persistence off) with 1 and then 2 worker processes (`workers/worker.ts`, concurrency 1,
 * each on a fresh queue, started and ready before the job is submitted, and warmed up unless
 * told not to), and times each from submission to completion. Stops every process it started,
 * by its PID.
 */
export async function benchCoreSearchWorkers(
  request: CoreSearchRequest,
  options: CoreSearchWorkersOptions = {},
): Promise<CoreSearchWorkersBench> {
  const {
    workerCounts = [1, 2],
    warmUp = true,
    warmUpRequest = coreSearchBenchRequests().flyback!,
    workerNodeArgs = [],
  } = options;
  const redis = await startRedisServer();
  const admin = new Redis(redis.url, { maxRetriesPerRequest: null });
  const runs: CoreSearchWorkersRun[] = [];
  try {
    for (const workerCount of workerCounts) {
      const queueName = `bench-core-search-${randomUUID()}`;
      const env = { REDIS_URL: redis.url, QUEUE_NAME: queueName, WORKER_CONCURRENCY: '1' };
      const workers: TestWorkerProcess[] = [];
      const runner = createBullmqRunner({ redisUrl: redis.url, queueName, timeoutMs: 10_000 });
      try {
        for (let i = 0; i < workerCount; i++) {
          workers.push(await startWorkerProcess(env, { nodeArgs: workerNodeArgs }));
        }
        let warmUpWallS: number | undefined;
        let warmUpCpuS: number | undefined;
        let warmUpEnumerated: number | undefined;
        if (warmUp) {
          const warmCpuBefore = sumOrUndefined(workers.map((worker) => processCpuS(worker.pid)));
          const warmStart = process.hrtime.bigint();
          const warm = await runner.submit('core-search', warmUpRequest);
          const warmRecord = await waitForJob(
            runner,
            warm.id,
            (job) => ['completed', 'failed', 'cancelled'].includes(job.state),
            { timeoutMs: 3_600_000, pollMs: 200 },
          );
          if (warmRecord.state !== 'completed') {
            throw new Error(`warm-up job ${warmRecord.state}: ${warmRecord.failureReason ?? ''}`);
          }
          warmUpWallS = Number(process.hrtime.bigint() - warmStart) * 1e-9;
          const warmCpuAfter = sumOrUndefined(workers.map((worker) => processCpuS(worker.pid)));
          warmUpCpuS =
            warmCpuBefore === undefined || warmCpuAfter === undefined
              ? undefined
              : warmCpuAfter - warmCpuBefore;
          warmUpEnumerated = resolveSearchSpace(warmUpRequest).total;
        }
        const cpuBefore = workers.map((worker) => processCpuS(worker.pid));
        const start = process.hrtime.bigint();
        const { id } = await runner.submit('core-search', request);
        const record = await waitForJob(
          runner,
          id,
          (job) => ['completed', 'failed', 'cancelled'].includes(job.state),
          // Polled 5 times a second: this process shares the cores with the workers it times.
          { timeoutMs: 3_600_000, pollMs: 200 },
        );
        const wallS = Number(process.hrtime.bigint() - start) * 1e-9;
        const cpuAfter = workers.map((worker) => processCpuS(worker.pid));
        if (record.state !== 'completed') {
          throw new Error(`core-search job ${record.state}: ${record.failureReason ?? ''}`);
        }
        const result = record.result as JobResult<CoreSearchResult>;
        const before = sumOrUndefined(cpuBefore);
        const after = sumOrUndefined(cpuAfter);
        const chunkPrefix = `${id}-chunk-`;
        // Each worker's completed chunks of this job.
        const chunkEventsEach = workers.map((worker) =>
          worker.events.filter(
            (event) => event.event === 'completed' && String(event.jobId).startsWith(chunkPrefix),
          ),
        );
        runs.push({
          workerCount,
          wallS,
          workerCpuS: before === undefined || after === undefined ? undefined : after - before,
          workerCpuSEach: workers.map((_, i) => {
            const [b, a] = [cpuBefore[i], cpuAfter[i]];
            return b === undefined || a === undefined ? undefined : a - b;
          }),
          chunksEach: chunkEventsEach.map((events) => events.length),
          chunkBusySEach: chunkEventsEach.map(
            (events) =>
              events.reduce((sum, event) => sum + Number(event.durationMs ?? 0), 0) / 1000,
          ),
          chunkTimesEach: chunkEventsEach.map((events) =>
            events.map((event) => ({
              chunk: Number(String(event.jobId).slice(chunkPrefix.length)),
              busyS: Number(event.durationMs ?? 0) / 1000,
            })),
          ),
          warmUpWallS,
          warmUpCpuS,
          warmUpEnumerated,
          enumerated: result.output.counts.enumerated,
          fullyEvaluated: result.output.counts.fullyEvaluated,
          resultJson: canonicalJson(result),
        });
      } finally {
        await runner.close();
        await Promise.all(workers.map((worker) => worker.stop()));
        const queue = new Queue(queueName, { connection: admin });
        await queue.obliterate({ force: true });
        await queue.close();
      }
    }
  } finally {
    await admin.quit();
    await redis.stop();
  }
  const frequencyCount = request.space.switchingFrequenciesHz?.length ?? 1;
  const one = runs.find((run) => run.workerCount === 1);
  const two = runs.find((run) => run.workerCount === 2);
  return {
    label: `core search, flyback, whole catalog at ${frequencyCount} switching frequenc${frequencyCount === 1 ? 'y' : 'ies'}, on worker processes`,
    enumerated: runs[0]?.enumerated ?? 0,
    runs,
    speedUp: one !== undefined && two !== undefined ? one.wallS / two.wallS : NaN,
    isIdentical: runs.every((run) => run.resultJson === runs[0]?.resultJson),
  };
}

/** One run of the probe (`core-search-probe.ts`, the flyback's) as a process of its own: its warmed-up run. */
interface ProbeRun {
  cpuS: number;
  wallS: number;
}

/** What this machine gives two processes at once on the core search's own work. */
export interface MachineCheck {
  /** The probe alone. */
  alone: ProbeRun;
  /** Two probes started together. */
  pair: ProbeRun[];
  /**
   * Work done by the two at once per work done by one alone in the same time:
   * 2 × alone wall / the slower of the pair's walls (2 on two idle cores of their own).
   */
  pairThroughput: number;
  /** CPU time per probe in the pair over the probe alone's (1 when the cores do not interfere). */
  cpuInflation: number;
}

async function runProbe(): Promise<ProbeRun> {
  const { cpuS, wallS } = await runCoreSearchProbe('flyback');
  return { cpuS, wallS };
}

/**
 * The same fixed core-search work (the probe: a whole-catalog search, warmed up, then timed in
 * its own process) once alone and then twice at once: how much of a second core this machine
 * gives the search's own code at this moment, against which the workers' speed-up is read. A
 * virtual machine whose two cores share one physical core (or a host that is busy) runs each of
 * two busy processes slower than one alone, which no division of the work can win back.
 */
export async function checkMachine(): Promise<MachineCheck> {
  const alone = await runProbe();
  const pair = await Promise.all([runProbe(), runProbe()]);
  const slowestS = Math.max(...pair.map((run) => run.wallS));
  const pairCpuS = pair.reduce((sum, run) => sum + run.cpuS, 0) / pair.length;
  return {
    alone,
    pair,
    pairThroughput: (2 * alone.wallS) / slowestS,
    cpuInflation: pairCpuS / alone.cpuS,
  };
}
