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

/** Switching frequencies added, in this order, until the search holds the candidates asked for. */
const FREQUENCIES_HZ = [
  100e3, 90e3, 110e3, 80e3, 120e3, 70e3, 135e3, 60e3, 150e3, 165e3, 180e3, 200e3, 50e3, 220e3,
  240e3,
];

/**
 * A whole-catalog flyback search (the design bench's invented 36–72 V to 12 V telecom-style
 * flyback, not any product; every default of the space) over as many switching frequencies as
 * it takes to hold at least `candidateCount` candidates (about 112,000 per frequency).
 * @throws RangeError when even every listed frequency holds fewer.
 */
export function coreSearchWorkersRequest(candidateCount: number): CoreSearchRequest {
  const frequencies: number[] = [];
  for (const frequencyHz of FREQUENCIES_HZ) {
    frequencies.push(frequencyHz);
    const request = CoreSearchRequestSchema.parse({
      spec: telecomSpec(),
      space: {
        primaryTurnsCount: 12,
        gaps: { kind: 'inductance-steps', stepCount: 3, factorMin: 0.7, factorMax: 1.4 },
        wireCurrentDensityFactors: [0.5, 0.7, 1, 1.4, 2],
        arrangements: ['interleaved', 'stacked'],
        switchingFrequenciesHz: [...frequencies],
      },
    });
    if (resolveSearchSpace(request).total >= candidateCount) return request;
  }
  throw new RangeError(`coreSearchWorkersRequest: no listed space reaches ${candidateCount}`);
}

/** One run of a core-search job on real worker processes. */
export interface CoreSearchWorkersRun {
  workerCount: number;
  /** Submission to completion as the runner saw it, s. */
  wallS: number;
  /** CPU time of every worker process over the run (Linux /proc), s; undefined elsewhere. */
  workerCpuS: number | undefined;
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

/**
 * Runs `request` as a `core-search` job through BullMQ on a Redis of its own (a free port,
 * persistence off) with 1 and then 2 worker processes (`workers/worker.ts`, concurrency 1,
 * each on a fresh queue, started and ready before the job is submitted), and times each from
 * submission to completion. Stops every process it started, by its PID.
 */
export async function benchCoreSearchWorkers(
  request: CoreSearchRequest,
  workerCounts: readonly number[] = [1, 2],
): Promise<CoreSearchWorkersBench> {
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
        for (let i = 0; i < workerCount; i++) workers.push(await startWorkerProcess(env));
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
        runs.push({
          workerCount,
          wallS,
          workerCpuS: before === undefined || after === undefined ? undefined : after - before,
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
