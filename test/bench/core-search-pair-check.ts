/**
 * How much of the 1M bench search two independent processes do at once on this machine, with no
 * queue between them: `npx tsx test/bench/core-search-pair-check.ts [pairs]` (3 by default).
 * Each child (`node --max-semi-space-size=64 --import tsx`, as the workers run) first runs the
 * bench's warm-up job in-process (the same invented flyback with 1 % more output current), then
 * the timed 1M search (`coreSearchWorkersRequest(1_000_000)`, every chunk in-process, then the
 * reduction). Per pair: one child alone, then two at once released together once both are warm.
 * Prints each run's wall and CPU time and the pair's work over one alone's,
 * alone·(1/wallA + 1/wallB) (2 on two cores that do not interfere), then the median: the ceiling
 * a 2-worker job of this search could reach here, against issue 5's 1.7×.
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { cpuUsage } from 'node:process';
import { fileURLToPath } from 'node:url';
import { CORE_SEARCH_COMPUTATION } from '../../solvers/core-search/core-search-computation.js';
import type { CoreSearchRequest } from '../../solvers/core-search/core-search-request-schema.js';
import { runChunkToEnd } from '../../solvers/jobs/chunked-computation.js';
import { WORKER_NODE_ARGS } from '../helpers/worker-process.js';
import {
  coreSearchWorkersRequest,
  coreSearchWorkersWarmUpSpec,
} from './core-search-workers.bench.js';

const CANDIDATES = 1_000_000;
const SELF = fileURLToPath(import.meta.url);

interface ChildRun {
  wallS: number;
  cpuS: number;
}

function runSearch(request: CoreSearchRequest): void {
  const plan = CORE_SEARCH_COMPUTATION.plan(request);
  const outputs = plan.chunks.map((chunk) =>
    runChunkToEnd(CORE_SEARCH_COMPUTATION.runChunk(request, chunk)),
  );
  CORE_SEARCH_COMPUTATION.reduce(request, outputs);
}

/** The child: warm up, say so, wait for `goFile`, run the timed search, print one JSON line. */
async function child(readyFile: string, goFile: string): Promise<void> {
  runSearch(coreSearchWorkersRequest(CANDIDATES, coreSearchWorkersWarmUpSpec()));
  writeFileSync(readyFile, '');
  while (!existsSync(goFile)) await new Promise((resolve) => setTimeout(resolve, 20));
  const cpu0 = cpuUsage();
  const wall0 = performance.now();
  runSearch(coreSearchWorkersRequest(CANDIDATES));
  const cpu = cpuUsage(cpu0);
  const run: ChildRun = {
    wallS: (performance.now() - wall0) / 1000,
    cpuS: (cpu.user + cpu.system) / 1e6,
  };
  console.log(JSON.stringify(run));
}

/** Starts `count` children, releases them together once all are warm, returns their runs. */
async function runTogether(count: number, dir: string): Promise<ChildRun[]> {
  const goFile = join(dir, 'go');
  rmSync(goFile, { force: true });
  const children = Array.from({ length: count }, (_, i) => {
    const readyFile = join(dir, `ready-${i}`);
    rmSync(readyFile, { force: true });
    const proc = spawn(
      process.execPath,
      [...WORKER_NODE_ARGS, '--import', 'tsx', SELF, '--child', readyFile, goFile],
      { stdio: ['ignore', 'pipe', 'inherit'] },
    );
    let out = '';
    proc.stdout.on('data', (data: Buffer) => (out += data.toString()));
    const done = new Promise<ChildRun>((resolve, reject) => {
      proc.on('exit', (code) =>
        code === 0
          ? resolve(JSON.parse(out.trim()) as ChildRun)
          : reject(new Error(`pair check child exited with ${String(code)}`)),
      );
    });
    return { readyFile, done };
  });
  while (!children.every((c) => existsSync(c.readyFile))) {
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  writeFileSync(goFile, '');
  return Promise.all(children.map((c) => c.done));
}

async function main(): Promise<void> {
  const pairs = Number(process.argv[2] ?? 3);
  const dir = mkdtempSync(join(tmpdir(), 'pair-check-'));
  const ratios: number[] = [];
  const text = (r: ChildRun) => `${r.wallS.toFixed(2)} s wall, ${r.cpuS.toFixed(2)} s CPU`;
  try {
    for (let i = 0; i < pairs; i++) {
      const [alone] = await runTogether(1, dir);
      const [a, b] = await runTogether(2, dir);
      if (alone === undefined || a === undefined || b === undefined) throw new Error('no run');
      const ratio = alone.wallS * (1 / a.wallS + 1 / b.wallS);
      ratios.push(ratio);
      console.log(
        `pair ${i + 1}: alone ${text(alone)}; together ${text(a)} and ${text(b)}; ` +
          `the pair does ${ratio.toFixed(2)}× the work of one`,
      );
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  const sorted = [...ratios].sort((x, y) => x - y);
  const median = sorted[Math.floor(sorted.length / 2)] ?? NaN;
  console.log(
    `1M flyback search, two processes at once without the queue: median ${median.toFixed(2)}× ` +
      `the work of one (${sorted.map((r) => r.toFixed(2)).join(', ')}; issue 5 asks 1.7× of 2 workers)`,
  );
}

if (process.argv[2] === '--child') {
  await child(process.argv[3] ?? '', process.argv[4] ?? '');
} else {
  await main();
}
