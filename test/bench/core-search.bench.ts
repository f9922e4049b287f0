import { spawn } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import {
  CoreSearchRequestSchema,
  type CoreSearchRequest,
} from '../../solvers/core-search/core-search-request-schema.js';
import type { CoreSearchResult } from '../../solvers/core-search/core-search-candidate.js';
import { telecomSpec } from '../helpers/flyback-specs.js';
import { forwardTelecomSpec } from '../helpers/forward-specs.js';
import { WORKER_NODE_ARGS } from '../helpers/worker-process.js';

/** Issue 5's target: enumerated candidates per second per worker core, end to end. */
export const CORE_SEARCH_TARGET_PER_S = 200_000;

/**
 * The whole-catalog searches the benchmark runs: the design bench's invented telecom-style
 * flyback and two-switch forward (36–72 V to 12 V, 100 kHz; not any product) with every
 * default of the search space (every catalog shape, the materials for 100 kHz, 12 turn counts
 * per shape, three gap steps for the flyback, five wires per winding, both arrangements).
 */
export function coreSearchBenchRequests(): Record<string, CoreSearchRequest> {
  return {
    flyback: CoreSearchRequestSchema.parse({ spec: telecomSpec() }),
    'two-switch-forward': CoreSearchRequestSchema.parse({
      spec: forwardTelecomSpec({ magnetics: { mode: 'design' } }),
    }),
  };
}

/** One run of `core-search-probe.ts`: the search's first run and its warmed-up second run. */
export interface CoreSearchProbeRun {
  name: string;
  /** The median warmed-up run's process CPU time (plan, every chunk and the reduction), s. */
  cpuS: number;
  wallS: number;
  /** Every timed (warmed-up) run's CPU time, s. */
  warmCpuS: number[];
  /** Every warm-up run's CPU time, s (between the first run and the timed ones). */
  warmUpCpuS: number[];
  /** The first run's (a fresh worker's), s. */
  coldCpuS: number;
  coldWallS: number;
  counts: CoreSearchResult['counts'];
  /** Members of the Pareto front. */
  paretoFront: number;
  /** The best candidate's worst-corner loss, W (undefined where none passed). */
  bestLossW: number | undefined;
}

const ROOT = fileURLToPath(new URL('../../', import.meta.url));

/**
 * Runs the bench search `name` in a process of its own, launched as the workers are (with
 * `WORKER_NODE_ARGS`: the bench's own process keeps Node's default young generation, which
 * slows the search's block-lived objects), and returns its figures.
 */
export function runCoreSearchProbe(name = 'flyback'): Promise<CoreSearchProbeRun> {
  return new Promise((resolve, reject) => {
    const child = spawn(
      process.execPath,
      [...WORKER_NODE_ARGS, '--import', 'tsx', 'test/bench/core-search-probe.ts', name],
      { cwd: ROOT, stdio: ['ignore', 'pipe', 'inherit'] },
    );
    let out = '';
    child.stdout.setEncoding('utf8');
    child.stdout.on('data', (chunk: string) => (out += chunk));
    child.once('error', reject);
    child.once('exit', (code) => {
      if (code !== 0) return reject(new Error(`core-search probe exited with code ${code}`));
      resolve(JSON.parse(out.trim().split('\n').at(-1) ?? '{}') as CoreSearchProbeRun);
    });
  });
}
