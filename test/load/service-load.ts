import autocannon from 'autocannon';
import { spawn, type ChildProcess } from 'node:child_process';
import { createWriteStream } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import { parseArgs } from 'node:util';
import { issueKey } from '../../api/auth/api-key.js';
import { createKey } from '../../api/auth/create-key.js';
import { createRedisKeyStore } from '../../api/auth/redis-key-store.js';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { freePort, startRedisServer, type TestRedisServer } from '../helpers/redis-server.js';
import { startWorkerProcess, type TestWorkerProcess } from '../helpers/worker-process.js';
import { waitForJobs, type JobCompletion } from './job-completion.js';
import {
  childrenOf,
  cpuSecondsOf,
  minorFaultsOf,
  redisFigures,
  rssMbOf,
  type RedisFigures,
} from './process-figures.js';

// `npm run load`: loads POST /v1/designs (or, with --target jobs, POST /v1/jobs) on loopback and
// prints requests per second, latency, errors, the service's CPU time per request and its memory
// growth (issue 6). It starts the service itself (`api/server.ts`, as `npm start` runs it) and,
// with --redis, a throwaway redis-server (persistence off) on a free port; it stops both by their
// PIDs at the end. It asserts nothing: the figures go to the README. Linux only (CPU and memory
// come from /proc).
//
//   npm run load -- [--target designs|jobs] [--duration 60] [--warmup 5] [--connections 10]
//                   [--processes 1] [--redis | --redis-url redis://…] [--idempotency]
//                   [--include-waveforms] [--rate N] [--cpu-prof DIR] [--node-option OPT] [--service-log FILE]
//                   [--sweep-points 2] [--workers 1] [--drain-s 300]      (jobs only)
//
// --processes sets API_PROCESSES (more than one needs Redis); --redis starts a throwaway Redis,
// --redis-url uses yours (a key of tenant `load-test` is added to it); --idempotency sends a new
// Idempotency-Key with every request; --include-waveforms asks POST /v1/designs for each corner's
// waveforms (`?include=waveforms`; the default answer leaves them out), for comparison; --rate caps the requests per second (all connections
// together; none by default: as fast as the service answers); --cpu-prof writes a V8 CPU profile
// of every API process into DIR (open it in Chrome's DevTools); --node-option passes an option to
// the service's node (repeatable; the cluster's processes inherit it); --service-log appends the
// service's standard output (its log lines, and what a --node-option such as --trace-gc prints)
// to FILE instead of dropping it.
//
// Designs: every request carries a different spec (the output current moves by 0.1 µA per
// request), so a result cache, were one ever added, could not make repeated requests free: each
// request runs the whole design (flyback, transformer designed), stores it and answers it. The
// service's CPU per request splits into the engine's (its own count,
// designservice_design_engine_cpu_seconds_total in /metrics, read before and after the run) and
// the rest.
//
// Jobs: every request submits a sweep of --sweep-points grid points (input voltages spread over
// the spec's range, full load, the spec's frequency) of the same moving spec. On the embedded
// backend the API process computes them (IN_PROCESS_CONCURRENCY, 1); on Redis, --workers worker
// processes (`npm run worker`) do. After the run it waits until the service has counted as many
// finished jobs as it accepted (at most --drain-s seconds; job-completion.ts says why it counts
// rather than reads each job) and reports how many completed.

const { values: args } = parseArgs({
  options: {
    target: { type: 'string', default: 'designs' },
    duration: { type: 'string', default: '60' },
    warmup: { type: 'string', default: '5' },
    connections: { type: 'string', default: '10' },
    processes: { type: 'string', default: '1' },
    redis: { type: 'boolean', default: false },
    'redis-url': { type: 'string' },
    idempotency: { type: 'boolean', default: false },
    'include-waveforms': { type: 'boolean', default: false },
    rate: { type: 'string' },
    'sample-s': { type: 'string', default: '10' },
    'cpu-prof': { type: 'string' },
    'node-option': { type: 'string', multiple: true, default: [] },
    'service-log': { type: 'string' },
    'sweep-points': { type: 'string', default: '2' },
    workers: { type: 'string', default: '1' },
    'drain-s': { type: 'string', default: '300' },
  },
});

const target = args.target;
if (target !== 'designs' && target !== 'jobs') {
  throw new Error(`bad --target: ${target} (designs or jobs)`);
}
const includeWaveforms = args['include-waveforms'];
if (includeWaveforms && target !== 'designs') {
  throw new Error('--include-waveforms loads POST /v1/designs only (--target designs)');
}
const durationS = Number(args.duration);
const warmupS = Number(args.warmup);
const connections = Number(args.connections);
const processes = Number(args.processes);
const sampleS = Number(args['sample-s']);
const rate = args.rate === undefined ? undefined : Number(args.rate);
const sweepPoints = Number(args['sweep-points']);
const workerCount = Number(args.workers);
const drainS = Number(args['drain-s']);
for (const [name, value] of Object.entries({
  durationS,
  warmupS,
  connections,
  processes,
  sampleS,
  rate: rate ?? 1,
  sweepPoints,
  workerCount,
  drainS,
})) {
  if (!Number.isFinite(value) || value < 0) throw new Error(`bad --${name}: ${value}`);
}

// Invented scenario: the documented example, an imagined packaging machine's auxiliary supply.
const baseSpec = EXAMPLE_SPECS.packagingAux;
let sent = 0;
/** The example with its output current moved by 0.1 µA more for each request sent. */
function nextSpec(): typeof baseSpec {
  sent += 1;
  const output = baseSpec.outputs[0] as (typeof baseSpec.outputs)[number];
  return { ...baseSpec, outputs: [{ ...output, currentA: output.currentA + sent * 1e-7 }] };
}
/** Input voltages of a sweep: `count` spread evenly over the spec's range. */
const sweepVoltagesV = Array.from({ length: sweepPoints }, (_, i) =>
  sweepPoints === 1
    ? baseSpec.inputVoltageNominalV
    : baseSpec.inputVoltageMinV +
      ((baseSpec.inputVoltageMaxV - baseSpec.inputVoltageMinV) * i) / (sweepPoints - 1),
);
/** The body of the next request: a design request, or a small sweep job. */
function nextBody(): string {
  const spec = nextSpec();
  if (target === 'designs') return JSON.stringify({ spec });
  return JSON.stringify({
    kind: 'sweep',
    input: {
      spec,
      grid: {
        inputVoltagesV: sweepVoltagesV,
        loadFractions: [1],
        switchingFrequenciesHz: [baseSpec.switchingFrequencyHz],
      },
    },
  });
}

/**
 * The CPU seconds the service's engine has spent on designs so far, all API processes together
 * (the `designservice_design_engine_cpu_seconds_total` counter of /metrics).
 */
async function engineCpuSeconds(baseUrl: string, token: string): Promise<number> {
  const response = await fetch(`${baseUrl}/metrics`, {
    headers: { authorization: `Bearer ${token}` },
  });
  const text = await response.text();
  const match = /^designservice_design_engine_cpu_seconds_total (\S+)$/m.exec(text);
  if (!response.ok || match === null)
    throw new Error(`no engine CPU in /metrics (${response.status})`);
  return Number(match[1]);
}

/**
 * Whether every accepted job completed. The service may have accepted a few more than the load
 * generator counted: requests in flight when autocannon stopped, whose answers it never read.
 */
function completionVerdict(completion: JobCompletion, accepted: number): string {
  const completed = completion.states['completed'] ?? 0;
  const others = Object.values(completion.states).reduce((sum, n) => sum + n, 0) - completed;
  if (others === 0 && completed >= accepted) {
    const extra = completed - accepted;
    return ` (every accepted job completed${extra > 0 ? `; ${extra} more were accepted as the load stopped, their answers unread` : ''})`;
  }
  if (completion.unfinished > 0) return ` (${completion.unfinished} not finished at --drain-s)`;
  return ' (every accepted job finished, not all completed)';
}

/** Starts the service and resolves once every API process listens. */
async function startService(env: Record<string, string>): Promise<ChildProcess> {
  const profiling =
    args['cpu-prof'] === undefined ? [] : ['--cpu-prof', '--cpu-prof-dir', args['cpu-prof']];
  const nodeOptions = [...profiling, ...(args['node-option'] ?? [])];
  const child = spawn(process.execPath, [...nodeOptions, '--import', 'tsx', 'api/server.ts'], {
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  await new Promise<void>((resolve, reject) => {
    child.once('exit', (code) => reject(new Error(`service exited early with code ${code}`)));
    let buffered = '';
    child.stdout?.on('data', (chunk: Buffer) => {
      buffered += chunk.toString();
      const lines = buffered.split('\n');
      buffered = lines.pop() ?? '';
      for (const line of lines) if (line.includes('design service listening on')) resolve();
    });
  });
  // Keep draining the log (one access line a request) so the pipe never blocks the service.
  const logFile = args['service-log'];
  if (logFile === undefined) child.stdout?.resume();
  else child.stdout?.pipe(createWriteStream(logFile, { flags: 'a' }));
  return child;
}

/**
 * The commands Redis executed per request between two readings (INFO commandstats counts the
 * commands a script runs as well as the script call: `evalsha` is a round trip, `rpush` inside
 * it is not), and the bytes it received per request. Background work (BullMQ's queue events,
 * the readings themselves) is in it too; rarer than one command in 100 requests is left out.
 */
function redisCallsPerRequest(before: RedisFigures, after: RedisFigures, requests: number): string {
  const calls = Object.entries(after.calls)
    .map(([name, count]) => [name, (count - (before.calls[name] ?? 0)) / requests] as const)
    .filter(([, perRequest]) => perRequest >= 0.01)
    .sort(([, a], [, b]) => b - a)
    .map(([name, perRequest]) => `${name} ${perRequest.toFixed(2)}`);
  const inputKb = (after.inputBytes - before.inputBytes) / requests / 1024;
  return `${calls.join(', ') || 'no commands'} (script calls and the commands they run both counted); ${inputKb.toFixed(1)} kB received`;
}

let redisServer: TestRedisServer | undefined;
let service: ChildProcess | undefined;
const workers: TestWorkerProcess[] = [];
try {
  let redisUrl = args['redis-url'];
  if (args.redis && redisUrl === undefined) {
    redisServer = await startRedisServer();
    redisUrl = redisServer.url;
  }
  const port = await freePort();
  let token: string;
  const env: Record<string, string> = {
    PORT: String(port),
    HOST: '127.0.0.1',
    API_PROCESSES: String(processes),
    // The load comes from one key: lift the per-key limit so it measures the service.
    RATE_LIMIT_PER_MINUTE: '100000000',
    // And from one tenant: let its unfinished jobs queue up to the largest allowed.
    JOBS_PER_TENANT_MAX: '100000',
  };
  if (redisUrl === undefined) {
    token = issueKey().token;
    Object.assign(env, { REDIS_URL: '', LOCAL_API_KEY: token });
  } else {
    const keys = createRedisKeyStore({ redisUrl });
    token = (await createKey(keys, { tenant: 'load-test', role: 'design', label: 'npm run load' }))
      .token;
    await keys.close();
    env.REDIS_URL = redisUrl;
  }
  service = await startService(env);
  if (target === 'jobs' && redisUrl !== undefined) {
    for (let i = 0; i < workerCount; i++) {
      workers.push(await startWorkerProcess({ REDIS_URL: redisUrl }));
    }
  }
  const servicePid = service.pid as number;
  const pids = () => [servicePid, ...childrenOf(servicePid)];
  const workerPids = workers.map((worker) => worker.pid);
  // From before the warm-up: the workers compute the warm-up's jobs too, and all are counted.
  const workerCpuBefore = workerPids.map(cpuSecondsOf);

  const headers: Record<string, string> = {
    'content-type': 'application/json',
    authorization: `Bearer ${token}`,
  };
  let acceptedJobs = 0;
  const load = (seconds: number) =>
    autocannon({
      url: `http://127.0.0.1:${port}/v1/${target}${includeWaveforms ? '?include=waveforms' : ''}`,
      method: 'POST',
      headers,
      connections,
      duration: seconds,
      ...(rate === undefined ? {} : { overallRate: rate }),
      requests: [
        {
          setupRequest: (request) => ({
            ...request,
            body: nextBody(),
            headers: args.idempotency
              ? { ...request.headers, 'idempotency-key': crypto.randomUUID() }
              : request.headers,
          }),
          ...(target === 'jobs'
            ? {
                onResponse: (status: number) => {
                  if (status === 202) acceptedJobs += 1;
                },
              }
            : {}),
        },
      ],
    });

  // Warm-up (JIT, the first designs' allocations), not counted.
  if (warmupS > 0) await load(warmupS);

  const cpuBefore = pids().map(cpuSecondsOf);
  const faultsBefore = pids().map(minorFaultsOf);
  const ownFaultsBefore = minorFaultsOf(process.pid);
  const ownCpuBefore = process.cpuUsage();
  const rssBefore = [...pids(), ...workerPids].map(rssMbOf);
  const redisBefore = redisUrl === undefined ? undefined : await redisFigures(redisUrl);
  const baseUrl = `http://127.0.0.1:${port}`;
  const engineBefore = target === 'designs' ? await engineCpuSeconds(baseUrl, token) : 0;
  const samples: string[] = [];
  const started = Date.now();
  const sampler = setInterval(() => {
    const s = Math.round((Date.now() - started) / 1000);
    samples.push(
      `${s} s: ${[...pids(), ...workerPids].map((pid) => rssMbOf(pid).toFixed(0)).join(' + ')} MB`,
    );
  }, sampleS * 1000);
  const result = await load(durationS);
  clearInterval(sampler);
  const serviceCpuS = pids()
    .map(cpuSecondsOf)
    .reduce((sum, cpu, i) => sum + cpu - (cpuBefore[i] ?? 0), 0);
  const ownCpu = process.cpuUsage(ownCpuBefore);
  const serviceFaults = pids()
    .map(minorFaultsOf)
    .reduce((sum, faults, i) => sum + faults - (faultsBefore[i] ?? 0), 0);
  const ownFaults = minorFaultsOf(process.pid) - ownFaultsBefore;
  const rssAfter = [...pids(), ...workerPids].map(rssMbOf);
  const redisAfter = redisUrl === undefined ? undefined : await redisFigures(redisUrl);
  const engineCpuS =
    target === 'designs' ? (await engineCpuSeconds(baseUrl, token)) - engineBefore : 0;

  // Jobs: wait for every accepted one (the warm-up's too) to finish.
  let completion: JobCompletion | undefined;
  let drainServiceCpuS = 0;
  if (target === 'jobs') {
    const drainCpuBefore = pids().map(cpuSecondsOf);
    completion = await waitForJobs(baseUrl, token, 'sweep', acceptedJobs, drainS);
    drainServiceCpuS = pids()
      .map(cpuSecondsOf)
      .reduce((sum, cpu, i) => sum + cpu - (drainCpuBefore[i] ?? 0), 0);
  }
  const workerCpuS = workerPids
    .map(cpuSecondsOf)
    .reduce((sum, cpu, i) => sum + cpu - (workerCpuBefore[i] ?? 0), 0);

  const requests = Math.max(1, result.requests.total);
  const ok = result.requests.total - result.non2xx;
  const statuses = Object.entries(result.statusCodeStats ?? {})
    .map(([code, { count }]) => `${code}: ${count}`)
    .join(', ');
  const perRequestMs = (cpuS: number) => ((cpuS / requests) * 1e3).toFixed(2);
  const mb = (values: number[]) => values.map((v) => v.toFixed(0)).join(' + ');
  const what =
    target === 'designs'
      ? `POST /v1/designs${includeWaveforms ? '?include=waveforms' : ''} (flyback, transformer designed, a new spec every request${includeWaveforms ? ', answered with its waveforms' : ''})`
      : `POST /v1/jobs (a sweep of ${sweepPoints} point(s) of a new spec every request)`;
  const backend =
    redisUrl === undefined
      ? 'embedded backend (jobs computed in the API process)'
      : `Redis backend (${redisUrl})${target === 'jobs' ? `, ${workerCount} worker process(es)` : ''}`;
  const processNames = `primary + API processes${workerPids.length > 0 ? ' + workers' : ''}`;
  console.log(
    [
      `machine: ${cpus().length} cores, ${cpus()[0]?.model ?? 'unknown cpu'}, Node ${process.version}, load average ${loadavg()
        .map((l) => l.toFixed(1))
        .join(' ')} (1, 5, 15 min, at the end)`,
      `service: ${processes} API process(es), ${backend}${args.idempotency ? ', every request with its own Idempotency-Key' : ''}`,
      `${what}, ${connections} connections${rate === undefined ? '' : ` at most ${rate} requests/s`}, ${durationS} s after ${warmupS} s of warm-up:`,
      `  ${(ok / durationS).toFixed(0)} ${target === 'designs' ? 'designs' : 'jobs accepted'}/s answered 2xx (autocannon's mean ${result.requests.average.toFixed(0)} requests/s); ${result.requests.total} requests, statuses ${statuses || 'none'}`,
      `  latency p50 ${result.latency.p50} ms, p90 ${result.latency.p90} ms, p99 ${result.latency.p99} ms, max ${result.latency.max} ms`,
      `  errors ${result.errors} (timeouts ${result.timeouts}), non-2xx ${result.non2xx}`,
      `  service CPU ${serviceCpuS.toFixed(1)} s = ${perRequestMs(serviceCpuS)} ms per request (all its API processes)` +
        (redisBefore === undefined || redisAfter === undefined
          ? ''
          : `; Redis CPU ${perRequestMs(redisAfter.cpuS - redisBefore.cpuS)} ms per request`) +
        `; load generator CPU ${perRequestMs((ownCpu.user + ownCpu.system) / 1e6)} ms per request`,
      ...(target === 'designs'
        ? [
            `  of which the engine (designConverter, the service's own count in /metrics) ${perRequestMs(engineCpuS)} ms and the rest of the service ${perRequestMs(serviceCpuS - engineCpuS)} ms per request`,
          ]
        : []),
      `  minor page faults per request: service ${(serviceFaults / requests).toFixed(1)}` +
        (redisBefore?.faults === undefined || redisAfter?.faults === undefined
          ? ''
          : `, Redis ${((redisAfter.faults - redisBefore.faults) / requests).toFixed(1)}`) +
        `, load generator ${(ownFaults / requests).toFixed(1)} (a page is 4 kB; an answer is ${Math.ceil(result.throughput.total / requests / 4096)} pages)`,
      ...(redisBefore === undefined || redisAfter === undefined
        ? []
        : [`  Redis per request: ${redisCallsPerRequest(redisBefore, redisAfter, requests)}`]),
      `  answers ${(result.throughput.total / requests / 1024).toFixed(1)} kB each`,
      `  RSS ${mb(rssBefore)} MB before, ${mb(rssAfter)} MB after (${processNames})` +
        (redisBefore === undefined || redisAfter === undefined
          ? ''
          : `; Redis used memory ${redisBefore.usedMb.toFixed(0)} MB before, ${redisAfter.usedMb.toFixed(0)} MB after`),
      ...(samples.length > 0 ? [`  RSS every ${sampleS} s: ${samples.join('; ')}`] : []),
      ...(completion === undefined
        ? []
        : [
            `  accepted jobs (warm-up included): ${acceptedJobs}; after ${completion.drainS.toFixed(0)} s more: ${Object.entries(
              completion.states,
            )
              .map(([state, count]) => `${state} ${count}`)
              .join(', ')}${completionVerdict(completion, acceptedJobs)}`,
            workerPids.length > 0
              ? `  worker CPU ${workerCpuS.toFixed(1)} s for every accepted job (warm-up included) = ${((workerCpuS / Math.max(1, (completion.states['completed'] ?? 0) * sweepPoints)) * 1e3).toFixed(2)} ms per sweep point completed`
              : `  the API process computed the jobs too (its CPU above includes those it ran during the run; ${drainServiceCpuS.toFixed(1)} s more while the rest finished)`,
          ]),
    ].join('\n'),
  );
} finally {
  await Promise.allSettled(workers.map((worker) => worker.stop('SIGTERM')));
  if (service?.pid !== undefined && service.exitCode === null) {
    const exited = new Promise((resolve) => service?.once('exit', resolve));
    process.kill(service.pid, 'SIGTERM');
    await exited;
  }
  await redisServer?.stop();
}
