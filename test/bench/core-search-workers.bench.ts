import { randomUUID } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
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
 * A warm-up job's spec for {@link coreSearchWorkersRequest}: the same invented flyback with its
 * output current `currentFactor` times as high (1 % higher by default), so its search is as large
 * and reaches the same code but shares no cached space, scouts or first passes with the timed
 * job's (nor, with another factor, with another warm-up job's).
 */
export function coreSearchWorkersWarmUpSpec(currentFactor = 1.01): Spec {
  const spec = telecomSpec();
  return telecomSpec({
    outputs: spec.outputs.map((output) => ({
      ...output,
      currentA: output.currentA * currentFactor,
    })),
  });
}

/**
 * The bench's full warm-up: `jobsPerWorker` jobs a worker (3 unless `BENCH_CORE_SEARCH_WARM_UP_JOBS`
 * says otherwise), each {@link coreSearchWorkersRequest} of `candidateCount` for the invented
 * flyback with its output current 1 %, 2 %, 3 %… higher, so each is as large as the timed job
 * and shares no cached space with it or with another.
 */
export function coreSearchWorkersWarmUpRequests(
  candidateCount: number,
  jobsPerWorker = Number(process.env.BENCH_CORE_SEARCH_WARM_UP_JOBS ?? 3),
): (workerCount: number) => CoreSearchRequest[] {
  return (workerCount) =>
    Array.from({ length: workerCount * jobsPerWorker }, (_, j) =>
      coreSearchWorkersRequest(candidateCount, coreSearchWorkersWarmUpSpec(1.01 + 0.01 * j)),
    );
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
  /**
   * Each worker's main-thread CPU time over the run (its JavaScript; the rest of workerCpuSEach
   * is V8's collector and compiler threads and libuv's), s.
   */
  workerMainCpuSEach: (number | undefined)[];
  /** Each worker's context switches over the run: waits (voluntary) and preemptions. */
  workerSwitchesEach: ({ voluntary: number; involuntary: number } | undefined)[];
  /** Each worker's CPU over the run by thread name ('main' the JavaScript thread), s. */
  workerThreadCpuSEach: Record<string, number>[];
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

  /** Wall time of the warm-up jobs that ran before, s (undefined: none). */
  warmUpWallS: number | undefined;
  /** Every worker's CPU time over the warm-up jobs, s (undefined: none, or /proc unreadable). */
  warmUpCpuS: number | undefined;
  /** Candidates of the warm-up jobs together (undefined: none). */
  warmUpEnumerated: number | undefined;
  enumerated: number;
  fullyEvaluated: number;
  /** Canonical JSON of the job's result (meta and output). */
  resultJson: string;
  /**
   * Submission to the job's completion as stamped by the worker that reduced it (its
   * `finishedAt`, same host clock), s: the wall time without the poll's delay (up to 200 ms).
   */
  completedS: number | undefined;
  /** Submission to the last chunk's completion (the workers' logged times), s. */
  lastChunkS: number | undefined;
  /** Time inside the parent's run (reading the chunks' outputs, reducing, saving), s. */
  reduceS: number | undefined;
  /** CPU time of the bench's own Redis over the run (INFO cpu, user + sys), s. */
  redisCpuS: number;
  /** CPU time of this process (producer, runner and poller) over the run, s. */
  producerCpuS: number;
  /** Redis commands over the run (INFO commandstats), by command, most called first. */
  redisCommands: Record<string, number>;
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
function processCpuS(pid: number, path = `/proc/${pid}/stat`): number | undefined {
  try {
    const stat = readFileSync(path, 'utf8');
    // Fields after the command name (which may hold spaces) start after the last ')'.
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    const ticks = Number(fields[11]) + Number(fields[12]);
    return Number.isFinite(ticks) ? ticks / 100 : undefined;
  } catch {
    return undefined;
  }
}

/** CPU time of a process's main (JavaScript) thread alone, s (undefined when unreadable). */
function mainThreadCpuS(pid: number): number | undefined {
  return processCpuS(pid, `/proc/${pid}/task/${pid}/stat`);
}

/**
 * Times a process has given up its core so far, waiting (voluntary) and preempted
 * (involuntary), from /proc/<pid>/status; undefined when unreadable.
 */
function contextSwitches(pid: number): { voluntary: number; involuntary: number } | undefined {
  try {
    const status = readFileSync(`/proc/${pid}/status`, 'utf8');
    const field = (name: string) =>
      Number(new RegExp(`^${name}:\\s*(\\d+)`, 'm').exec(status)?.[1]);
    return {
      voluntary: field('voluntary_ctxt_switches'),
      involuntary: field('nonvoluntary_ctxt_switches'),
    };
  } catch {
    return undefined;
  }
}

/** CPU time of each of a process's threads so far, summed by thread name (Linux /proc), s. */
function threadCpuSByName(pid: number): Record<string, number> {
  const byName: Record<string, number> = {};
  try {
    for (const tid of readdirSync(`/proc/${pid}/task`)) {
      const name =
        tid === String(pid) ? 'main' : readFileSync(`/proc/${pid}/task/${tid}/comm`, 'utf8').trim();
      byName[name] = (byName[name] ?? 0) + (processCpuS(pid, `/proc/${pid}/task/${tid}/stat`) ?? 0);
    }
  } catch {
    // A thread that ended between the listing and the read: counted as far as it was read.
  }
  return byName;
}

/** Redis's own CPU time so far (INFO cpu: used_cpu_user + used_cpu_sys), s. */
async function redisCpuS(admin: Redis): Promise<number> {
  const info = await admin.info('cpu');
  const field = (name: string) => Number(new RegExp(`^${name}:([\\d.]+)`, 'm').exec(info)?.[1]);
  return field('used_cpu_user') + field('used_cpu_sys');
}

/** Calls per Redis command since the last CONFIG RESETSTAT (INFO commandstats), most first. */
async function redisCommandCounts(admin: Redis): Promise<Record<string, number>> {
  const info = await admin.info('commandstats');
  const counts = [...info.matchAll(/^cmdstat_([^:]+):calls=(\d+)/gm)].map(
    ([, name, calls]) => [name!, Number(calls)] as const,
  );
  return Object.fromEntries(counts.sort((a, b) => b[1] - a[1]));
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
   * Whether each set of workers first runs warm-up jobs, as long-running workers have done
   * before any job: the timed job then pays what each job costs, not what each process costs
   * once (compiling and optimizing the code, filling the engine's tables). @defaultValue true
   */
  warmUp?: boolean;
  /**
   * The warm-up jobs of a set of `workerCount` workers, run one after another: each of its own
   * (a request whose space, scouts and first passes are cached nowhere else), and `workerCount`
   * times as many as for one worker, so that each worker of a set runs about as much of them as
   * a lone worker does. One job is not enough: after one as large as the timed job, a worker's
   * V8 compiler threads still took 0.65–0.8 s of CPU during the timed job, after three
   * 0.12–0.35 s (DEVELOPERS.md, "Where the 2-worker CPU goes"). @defaultValue the whole-catalog
   * flyback at 100 kHz (`coreSearchBenchRequests().flyback`) once per worker
   */
  warmUpRequests?: (workerCount: number) => readonly CoreSearchRequest[];
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
    warmUpRequests = (count: number) =>
      Array.from({ length: count }, () => coreSearchBenchRequests().flyback!),
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
          const warmRequests = warmUpRequests(workerCount);
          for (const warmRequest of warmRequests) {
            const warm = await runner.submit('core-search', warmRequest);
            const warmRecord = await waitForJob(
              runner,
              warm.id,
              (job) => ['completed', 'failed', 'cancelled'].includes(job.state),
              { timeoutMs: 3_600_000, pollMs: 200 },
            );
            if (warmRecord.state !== 'completed') {
              throw new Error(`warm-up job ${warmRecord.state}: ${warmRecord.failureReason ?? ''}`);
            }
          }
          warmUpWallS = Number(process.hrtime.bigint() - warmStart) * 1e-9;
          const warmCpuAfter = sumOrUndefined(workers.map((worker) => processCpuS(worker.pid)));
          warmUpCpuS =
            warmCpuBefore === undefined || warmCpuAfter === undefined
              ? undefined
              : warmCpuAfter - warmCpuBefore;
          warmUpEnumerated = warmRequests.reduce(
            (sum, warmRequest) => sum + resolveSearchSpace(warmRequest).total,
            0,
          );
        }
        await admin.config('RESETSTAT');
        const redisCpuBefore = await redisCpuS(admin);
        const producerCpuBefore = process.cpuUsage();
        const cpuBefore = workers.map((worker) => processCpuS(worker.pid));
        const mainCpuBefore = workers.map((worker) => mainThreadCpuS(worker.pid));
        const switchesBefore = workers.map((worker) => contextSwitches(worker.pid));
        const threadsBefore = workers.map((worker) => threadCpuSByName(worker.pid));
        const start = process.hrtime.bigint();
        const startEpochMs = Date.now();
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
        const mainCpuAfter = workers.map((worker) => mainThreadCpuS(worker.pid));
        const switchesAfter = workers.map((worker) => contextSwitches(worker.pid));
        const threadsAfter = workers.map((worker) => threadCpuSByName(worker.pid));
        const producerCpu = process.cpuUsage(producerCpuBefore);
        const redisCpuAfter = await redisCpuS(admin);
        const redisCommands = await redisCommandCounts(admin);
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
        const chunkEndsMs = chunkEventsEach.flat().map((event) => Date.parse(String(event.time)));
        const parentEvent = workers
          .flatMap((worker) => worker.events)
          .find((event) => event.event === 'completed' && event.jobId === id);
        const finishedMs = record.finishedAt === undefined ? NaN : Date.parse(record.finishedAt);
        const secondsOrUndefined = (ms: number) => (Number.isFinite(ms) ? ms / 1000 : undefined);
        runs.push({
          workerCount,
          wallS,
          completedS: secondsOrUndefined(finishedMs - startEpochMs),
          lastChunkS: secondsOrUndefined(Math.max(...chunkEndsMs) - startEpochMs),
          reduceS: secondsOrUndefined(Number(parentEvent?.durationMs)),
          workerCpuS: before === undefined || after === undefined ? undefined : after - before,
          workerCpuSEach: workers.map((_, i) => {
            const [b, a] = [cpuBefore[i], cpuAfter[i]];
            return b === undefined || a === undefined ? undefined : a - b;
          }),
          workerMainCpuSEach: workers.map((_, i) => {
            const [b, a] = [mainCpuBefore[i], mainCpuAfter[i]];
            return b === undefined || a === undefined ? undefined : a - b;
          }),
          workerSwitchesEach: workers.map((_, i) => {
            const [b, a] = [switchesBefore[i], switchesAfter[i]];
            return b === undefined || a === undefined
              ? undefined
              : {
                  voluntary: a.voluntary - b.voluntary,
                  involuntary: a.involuntary - b.involuntary,
                };
          }),
          workerThreadCpuSEach: threadsAfter.map((after, i) =>
            Object.fromEntries(
              Object.entries(after).map(([name, cpuS]) => [
                name,
                cpuS - (threadsBefore[i]?.[name] ?? 0),
              ]),
            ),
          ),
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
          redisCpuS: redisCpuAfter - redisCpuBefore,
          producerCpuS: (producerCpu.user + producerCpu.system) / 1e6,
          redisCommands,
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
