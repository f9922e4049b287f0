import { spawn, type ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';

/** A worker process (workers/worker.ts) started by a test, with the JSON lines it logged. */
export interface TestWorkerProcess {
  pid: number;
  /** Every JSON line the worker wrote to stdout so far. */
  events: Record<string, unknown>[];
  /** Resolves once a logged event satisfies `predicate`. */
  waitForEvent(
    predicate: (event: Record<string, unknown>) => boolean,
  ): Promise<Record<string, unknown>>;
  /** Sends `signal` (SIGTERM by default) to the process by its PID and waits for its exit code. */
  stop(signal?: NodeJS.Signals): Promise<number | null>;
  exited: Promise<number | null>;
}

const ROOT = fileURLToPath(new URL('../../', import.meta.url));

/**
 * The node options a worker is launched with (`npm run worker`, docker-compose.yml): a young
 * generation of 2 × 64 MB instead of Node's 2 × 16 MB (32 MB cut the core search's CPU by about a
 * third, 64 MB about a fifth more; README, "Running with Redis and workers"). Keep the three in
 * step.
 */
export const WORKER_NODE_ARGS: readonly string[] = ['--max-semi-space-size=64'];

/**
 * Spawns `node [WORKER_NODE_ARGS] [nodeArgs] --import tsx workers/worker.ts` with `env` added to
 * this environment and waits until it reports ready (unless `waitUntilReady` is false).
 */
export async function startWorkerProcess(
  env: Record<string, string>,
  options: { waitUntilReady?: boolean; nodeArgs?: readonly string[] } = {},
): Promise<TestWorkerProcess> {
  const args = [
    ...WORKER_NODE_ARGS,
    ...(options.nodeArgs ?? []),
    '--import',
    'tsx',
    'workers/worker.ts',
  ];
  const child: ChildProcess = spawn(process.execPath, args, {
    cwd: ROOT,
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  if (child.pid === undefined) throw new Error('could not spawn the worker process');
  const pid = child.pid;
  const events: Record<string, unknown>[] = [];
  const waiters: {
    predicate: (event: Record<string, unknown>) => boolean;
    resolve: (e: Record<string, unknown>) => void;
  }[] = [];
  let stderr = '';
  let pending = '';
  child.stdout?.setEncoding('utf8');
  child.stdout?.on('data', (chunk: string) => {
    pending += chunk;
    let newline = pending.indexOf('\n');
    while (newline >= 0) {
      const line = pending.slice(0, newline);
      pending = pending.slice(newline + 1);
      newline = pending.indexOf('\n');
      if (!line.startsWith('{')) continue;
      const event = JSON.parse(line) as Record<string, unknown>;
      events.push(event);
      for (const waiter of [...waiters]) {
        if (waiter.predicate(event)) {
          waiters.splice(waiters.indexOf(waiter), 1);
          waiter.resolve(event);
        }
      }
    }
  });
  child.stderr?.setEncoding('utf8');
  child.stderr?.on('data', (chunk: string) => (stderr += chunk));
  const exited = new Promise<number | null>((resolve) =>
    child.once('exit', (code) => resolve(code)),
  );

  const waitForEvent = (predicate: (event: Record<string, unknown>) => boolean) => {
    const seen = events.find(predicate);
    if (seen) return Promise.resolve(seen);
    return Promise.race([
      new Promise<Record<string, unknown>>((resolve) => waiters.push({ predicate, resolve })),
      exited.then((code) => {
        throw new Error(`worker ${pid} exited (code ${code}) before the event: ${stderr}`);
      }),
    ]);
  };
  const handle: TestWorkerProcess = {
    pid,
    events,
    waitForEvent,
    exited,
    async stop(signal = 'SIGTERM') {
      if (child.exitCode === null && child.signalCode === null) process.kill(pid, signal);
      return exited;
    },
  };
  if (options.waitUntilReady !== false) await waitForEvent((event) => event.event === 'ready');
  return handle;
}
