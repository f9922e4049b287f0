import { spawn } from 'node:child_process';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';

/** Options of {@link runNgspice}. */
export interface NgspiceOptions {
  /** The ngspice executable. @defaultValue 'ngspice' (on the PATH; CI installs the Debian package) */
  executable?: string;
  /** Wall-clock limit for one run, ms; the run is killed past it. @defaultValue 60000 */
  timeoutMs?: number;
  /** `.meas` names that must be in the results; a missing one throws. @defaultValue [] */
  expect?: readonly string[];
}

/** What one ngspice run gave: the `.meas` results by (lower-case) name, and its printed output. */
export interface NgspiceRun {
  measures: Record<string, number>;
  output: string;
}

const DEFAULTS = {
  executable: 'ngspice',
  timeoutMs: 60_000,
  expect: [],
} satisfies Required<NgspiceOptions>;

// A measurement line reads `name = 1.234e+00` and may go on with `at=` or `from= ... to= ...`.
const MEASURE_LINE = /^\s*([a-z_][\w.]*)\s*=\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:e[-+]?\d+)?)(?:\s|$)/i;
// ngspice -b exits 0 after a failed .meas or a bad line, and says so on stderr only.
const TROUBLE = /error|failed|too small|can't parse|singular|aborted/i;

// ngspice is single-threaded: run at most one per core, queue the rest (first come, first run).
const slots = { free: Math.max(1, availableParallelism()), waiting: [] as Array<() => void> };

/**
 * Runs `ngspice -b` on `netlist` in a fresh temporary directory and returns its `.meas` results.
 * At most one run per core goes at a time; further calls wait their turn (the timeout starts then).
 * @throws Error with ngspice's output when it is missing, fails, times out, reports an error or
 *   lacks an expected measurement.
 */
export async function runNgspice(
  netlist: string,
  options: NgspiceOptions = {},
): Promise<NgspiceRun> {
  if (slots.free > 0) slots.free -= 1;
  else await new Promise<void>((resolve) => slots.waiting.push(resolve));
  try {
    return await runNow(netlist, { ...DEFAULTS, ...options });
  } finally {
    const next = slots.waiting.shift();
    if (next === undefined) slots.free += 1;
    else next();
  }
}

async function runNow(netlist: string, o: Required<NgspiceOptions>): Promise<NgspiceRun> {
  const directory = await mkdtemp(join(tmpdir(), 'ngspice-'));
  try {
    const file = join(directory, 'circuit.cir');
    await writeFile(file, netlist, 'utf8');
    const { code, stdout, stderr, timedOut } = await spawnCollect(o.executable, ['-b', file], {
      cwd: directory,
      timeoutMs: o.timeoutMs,
    });
    const output = `${stdout}\n--- stderr ---\n${stderr.replace(/\r/g, '\n')}`;
    if (timedOut) throw new Error(`ngspice ran past ${o.timeoutMs} ms and was stopped:\n${output}`);
    if (code !== 0 || TROUBLE.test(stderr)) {
      throw new Error(`ngspice failed (exit code ${String(code)}):\n${output}`);
    }
    const measures: Record<string, number> = {};
    // Results sit between ngspice's 'Measurements for ...' heading and its closing statistics.
    const start = stdout.indexOf('Measurements for');
    const end = stdout.indexOf('Total analysis time', start);
    const block = start < 0 ? '' : stdout.slice(start, end < 0 ? undefined : end);
    for (const line of block.split('\n')) {
      const match = MEASURE_LINE.exec(line);
      if (match?.[1] !== undefined && match[2] !== undefined) {
        measures[match[1].toLowerCase()] = Number(match[2]);
      }
    }
    const missing = o.expect.filter((name) => !(name.toLowerCase() in measures));
    if (missing.length > 0) {
      throw new Error(`ngspice gave no result for ${missing.join(', ')}:\n${output}`);
    }
    return { measures, output };
  } finally {
    await rm(directory, { recursive: true, force: true });
  }
}

interface Collected {
  code: number | null;
  stdout: string;
  stderr: string;
  timedOut: boolean;
}

function spawnCollect(
  executable: string,
  args: string[],
  { cwd, timeoutMs }: { cwd: string; timeoutMs: number },
): Promise<Collected> {
  return new Promise((resolve, reject) => {
    const child = spawn(executable, args, { cwd, stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    let timedOut = false;
    const timer = setTimeout(() => {
      timedOut = true;
      child.kill('SIGKILL');
    }, timeoutMs);
    child.stdout.setEncoding('utf8').on('data', (chunk: string) => (stdout += chunk));
    child.stderr.setEncoding('utf8').on('data', (chunk: string) => (stderr += chunk));
    child.on('error', (error: NodeJS.ErrnoException) => {
      clearTimeout(timer);
      reject(
        error.code === 'ENOENT'
          ? new Error(
              `ngspice is not installed ('${executable}' not found); the netlist tests need it. ` +
                'Install the Debian package (apt-get install ngspice, or run test/tools/ensure-test-tools.sh).',
            )
          : error,
      );
    });
    child.on('close', (code) => {
      clearTimeout(timer);
      resolve({ code, stdout, stderr, timedOut });
    });
  });
}
