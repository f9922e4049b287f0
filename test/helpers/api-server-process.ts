import { spawn, type ChildProcessWithoutNullStreams } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { freePort } from './redis-server.js';

/** The API process (api/server.ts, as `npm start` runs it) started by a test. */
export interface TestApiServerProcess {
  port: number;
  /** Base URL, for example http://127.0.0.1:40123. */
  url: string;
  /** Every JSON line it logged so far. */
  lines: Array<Record<string, unknown>>;
  child: ChildProcessWithoutNullStreams;
  /** Sends `signal` (SIGTERM by default) to the process by its PID and waits for its exit code. */
  stop(signal?: NodeJS.Signals): Promise<number | null>;
}

const ROOT = fileURLToPath(new URL('../../', import.meta.url));

/**
 * Starts api/server.ts on a free port of 127.0.0.1 with `env` added to this environment
 * (REDIS_URL empty unless given) and resolves once it logs that it listens.
 */
export async function startApiServerProcess(
  env: Record<string, string>,
): Promise<TestApiServerProcess> {
  const port = await freePort();
  const lines: Array<Record<string, unknown>> = [];
  const child = spawn(process.execPath, ['--import', 'tsx', 'api/server.ts'], {
    cwd: ROOT,
    env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', REDIS_URL: '', ...env },
  });
  const exited = new Promise<number | null>((resolve) => child.once('exit', resolve));
  const stop = async (signal: NodeJS.Signals = 'SIGTERM') => {
    if (child.pid !== undefined && child.exitCode === null && child.signalCode === null) {
      process.kill(child.pid, signal);
    }
    return exited;
  };
  let stderr = '';
  child.stderr.setEncoding('utf8');
  child.stderr.on('data', (chunk: string) => (stderr += chunk));
  try {
    await new Promise<void>((resolve, reject) => {
      let buffered = '';
      void exited.then((code) =>
        reject(new Error(`server exited early with code ${code}: ${stderr}`)),
      );
      child.stdout.on('data', (chunk: Buffer) => {
        buffered += chunk.toString();
        const complete = buffered.split('\n');
        buffered = complete.pop() ?? '';
        for (const line of complete) {
          if (line.trim() === '') continue;
          const parsed = JSON.parse(line) as Record<string, unknown>;
          lines.push(parsed);
          if (String(parsed['msg']).includes('listening on')) resolve();
        }
      });
    });
  } catch (error) {
    await stop('SIGKILL');
    throw error;
  }
  return { port, url: `http://127.0.0.1:${port}`, lines, child, stop };
}
