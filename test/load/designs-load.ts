import autocannon from 'autocannon';
import { spawn, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import { parseArgs } from 'node:util';
import { Redis } from 'ioredis';
import { issueKey } from '../../api/auth/api-key.js';
import { createKey } from '../../api/auth/create-key.js';
import { createRedisKeyStore } from '../../api/auth/redis-key-store.js';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { freePort, startRedisServer, type TestRedisServer } from '../helpers/redis-server.js';

// `npm run load`: loads POST /v1/designs on loopback and prints requests per second, latency,
// errors, the service's CPU time per request and its memory growth (issue 6). It starts the
// service itself (`api/server.ts`, as `npm start` runs it) and, with --redis, a throwaway
// redis-server (persistence off) on a free port; it stops both by their PIDs at the end. It
// asserts nothing: the figures go to the README. Linux only (CPU and memory come from /proc).
//
//   npm run load -- [--duration 60] [--warmup 5] [--connections 10] [--processes 1]
//                   [--redis | --redis-url redis://…] [--idempotency] [--cpu-prof DIR]
//
// --processes sets API_PROCESSES (more than one needs Redis); --redis starts a throwaway Redis,
// --redis-url uses yours (a key of tenant `load-test` is added to it); --idempotency sends a new
// Idempotency-Key with every request; --cpu-prof writes a V8 CPU profile of every API process
// into DIR (open it in Chrome's DevTools); --node-option passes an option to the service's node
// (repeatable; the cluster's processes inherit it), e.g. --node-option=--max-semi-space-size=32.
//
// Every request carries a different spec (the output current moves by 0.1 µA per request), so a
// result cache, were one ever added, could not make repeated requests free: each request runs
// the whole design (flyback, transformer designed), stores it and answers it.

const { values: args } = parseArgs({
  options: {
    duration: { type: 'string', default: '60' },
    warmup: { type: 'string', default: '5' },
    connections: { type: 'string', default: '10' },
    processes: { type: 'string', default: '1' },
    redis: { type: 'boolean', default: false },
    'redis-url': { type: 'string' },
    idempotency: { type: 'boolean', default: false },
    'sample-s': { type: 'string', default: '10' },
    'cpu-prof': { type: 'string' },
    'node-option': { type: 'string', multiple: true, default: [] },
  },
});

const durationS = Number(args.duration);
const warmupS = Number(args.warmup);
const connections = Number(args.connections);
const processes = Number(args.processes);
const sampleS = Number(args['sample-s']);
for (const [name, value] of Object.entries({ durationS, warmupS, connections, processes })) {
  if (!Number.isFinite(value) || value < 0) throw new Error(`bad --${name}: ${value}`);
}

// Invented scenario: the documented example, an imagined packaging machine's auxiliary supply.
const baseSpec = EXAMPLE_SPECS.packagingAux;
let sent = 0;
/** The body of the next request: the example with its output current moved by 0.1 µA a request. */
function nextBody(): string {
  sent += 1;
  const output = baseSpec.outputs[0] as (typeof baseSpec.outputs)[number];
  const spec = { ...baseSpec, outputs: [{ ...output, currentA: output.currentA + sent * 1e-7 }] };
  return JSON.stringify({ spec });
}

/** CPU seconds (user + system) a process has used so far, from /proc/<pid>/stat. */
function cpuSecondsOf(pid: number): number {
  const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
  // Fields after the command (which may hold spaces) start after the last ')'.
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  const ticksPerS = 100; // USER_HZ, 100 on Linux
  return (Number(fields[11]) + Number(fields[12])) / ticksPerS;
}

/** Resident set size of a process, MB, from /proc/<pid>/status. */
function rssMbOf(pid: number): number {
  const match = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  return match ? Number(match[1]) / 1024 : NaN;
}

/** The direct children of a process (the cluster's API processes), from /proc. */
function childrenOf(pid: number): number[] {
  const text = readFileSync(`/proc/${pid}/task/${pid}/children`, 'utf8').trim();
  return text === '' ? [] : text.split(/\s+/).map(Number);
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
  child.stdout?.resume();
  return child;
}

/** Redis's used memory (MB: the stored designs live there) and CPU time (s) so far. */
async function redisFigures(url: string): Promise<{ usedMb: number; cpuS: number }> {
  const client = new Redis(url, { maxRetriesPerRequest: 1 });
  try {
    const info = await client.info();
    const field = (name: string) => Number(new RegExp(`${name}:([\\d.]+)`).exec(info)?.[1]);
    return {
      usedMb: field('used_memory') / 1024 ** 2,
      cpuS: field('used_cpu_sys') + field('used_cpu_user'),
    };
  } finally {
    client.disconnect();
  }
}

let redisServer: TestRedisServer | undefined;
let service: ChildProcess | undefined;
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
  const servicePid = service.pid as number;
  const pids = () => [servicePid, ...childrenOf(servicePid)];

  const headers: Record<string, string> = {
    'content-type': 'application/json',
    authorization: `Bearer ${token}`,
  };
  const load = (seconds: number) =>
    autocannon({
      url: `http://127.0.0.1:${port}/v1/designs`,
      method: 'POST',
      headers,
      connections,
      duration: seconds,
      requests: [
        {
          setupRequest: (request) => ({
            ...request,
            body: nextBody(),
            headers: args.idempotency
              ? { ...request.headers, 'idempotency-key': crypto.randomUUID() }
              : request.headers,
          }),
        },
      ],
    });

  // Warm-up (JIT, the first designs' allocations), not counted.
  if (warmupS > 0) await load(warmupS);

  const cpuBefore = pids().map(cpuSecondsOf);
  const ownCpuBefore = process.cpuUsage();
  const rssBefore = pids().map(rssMbOf);
  const redisBefore = redisUrl === undefined ? undefined : await redisFigures(redisUrl);
  const samples: string[] = [];
  const started = Date.now();
  const sampler = setInterval(() => {
    const s = Math.round((Date.now() - started) / 1000);
    samples.push(
      `${s} s: ${pids()
        .map((pid) => rssMbOf(pid).toFixed(0))
        .join(' + ')} MB`,
    );
  }, sampleS * 1000);
  const result = await load(durationS);
  clearInterval(sampler);
  const serviceCpuS = pids()
    .map(cpuSecondsOf)
    .reduce((sum, cpu, i) => sum + cpu - (cpuBefore[i] ?? 0), 0);
  const ownCpu = process.cpuUsage(ownCpuBefore);
  const rssAfter = pids().map(rssMbOf);
  const redisAfter = redisUrl === undefined ? undefined : await redisFigures(redisUrl);

  const ok = result.requests.total - result.non2xx;
  const statuses = Object.entries(result.statusCodeStats ?? {})
    .map(([code, { count }]) => `${code}: ${count}`)
    .join(', ');
  const perRequestMs = (cpuS: number) =>
    ((cpuS / Math.max(1, result.requests.total)) * 1e3).toFixed(2);
  const mb = (values: number[]) => values.map((v) => v.toFixed(0)).join(' + ');
  console.log(
    [
      `machine: ${cpus().length} cores, ${cpus()[0]?.model ?? 'unknown cpu'}, Node ${process.version}, load average ${loadavg()
        .map((l) => l.toFixed(1))
        .join(' ')} (1, 5, 15 min, at the end)`,
      `service: ${processes} API process(es), ${redisUrl === undefined ? 'embedded backend' : `Redis backend (${redisUrl})`}${args.idempotency ? ', every request with its own Idempotency-Key' : ''}`,
      `POST /v1/designs (flyback, transformer designed, a new spec every request), ${connections} connections, ${durationS} s after ${warmupS} s of warm-up:`,
      `  ${(ok / durationS).toFixed(0)} designs/s answered 2xx (autocannon's mean ${result.requests.average.toFixed(0)} requests/s); ${result.requests.total} requests, statuses ${statuses || 'none'}`,
      `  latency p50 ${result.latency.p50} ms, p90 ${result.latency.p90} ms, p99 ${result.latency.p99} ms, max ${result.latency.max} ms`,
      `  errors ${result.errors} (timeouts ${result.timeouts}), non-2xx ${result.non2xx}`,
      `  service CPU ${serviceCpuS.toFixed(1)} s = ${perRequestMs(serviceCpuS)} ms per request (all its processes)` +
        (redisBefore === undefined || redisAfter === undefined
          ? ''
          : `; Redis CPU ${perRequestMs(redisAfter.cpuS - redisBefore.cpuS)} ms per request`) +
        `; load generator CPU ${perRequestMs((ownCpu.user + ownCpu.system) / 1e6)} ms per request`,
      `  answers ${(result.throughput.total / Math.max(1, result.requests.total) / 1024).toFixed(1)} kB each`,
      `  service RSS ${mb(rssBefore)} MB before, ${mb(rssAfter)} MB after (primary + API processes)` +
        (redisBefore === undefined || redisAfter === undefined
          ? ''
          : `; Redis used memory ${redisBefore.usedMb.toFixed(0)} MB before, ${redisAfter.usedMb.toFixed(0)} MB after (the stored designs)`),
      ...(samples.length > 0 ? [`  RSS every ${sampleS} s: ${samples.join('; ')}`] : []),
    ].join('\n'),
  );
} finally {
  if (service?.pid !== undefined && service.exitCode === null) {
    const exited = new Promise((resolve) => service?.once('exit', resolve));
    process.kill(service.pid, 'SIGTERM');
    await exited;
  }
  await redisServer?.stop();
}
