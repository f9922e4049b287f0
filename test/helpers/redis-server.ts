import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import { Redis } from 'ioredis';

/** A throwaway Redis started by a test: its URL, and a stop() that ends it by its PID. */
export interface TestRedisServer {
  url: string;
  port: number;
  stop(): Promise<void>;
}

/** A TCP port that was free a moment ago (the OS picks it). */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.unref();
    server.on('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      const port = typeof address === 'object' && address !== null ? address.port : 0;
      server.close(() => resolve(port));
    });
  });
}

async function answersPing(url: string): Promise<boolean> {
  const client = new Redis(url, {
    lazyConnect: true,
    maxRetriesPerRequest: 0,
    retryStrategy: () => null,
  });
  client.on('error', () => {});
  try {
    await client.connect();
    return (await client.ping()) === 'PONG';
  } catch {
    return false;
  } finally {
    client.disconnect();
  }
}

function exited(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
  return new Promise((resolve) => child.once('exit', () => resolve()));
}

/**
 * Starts `redis-server` on a free port with persistence off and waits until it answers PING.
 * Call stop() in afterAll.
 */
export async function startRedisServer(): Promise<TestRedisServer> {
  const port = await freePort();
  const child = spawn(
    'redis-server',
    ['--port', String(port), '--bind', '127.0.0.1', '--save', '', '--appendonly', 'no'],
    { stdio: 'ignore' },
  );
  const url = `redis://127.0.0.1:${port}`;
  const deadline = Date.now() + 10_000;
  while (!(await answersPing(url))) {
    if (child.exitCode !== null || Date.now() > deadline) {
      if (child.pid !== undefined && child.exitCode === null) process.kill(child.pid, 'SIGKILL');
      throw new Error(`redis-server on port ${port} did not start (exit code ${child.exitCode})`);
    }
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  return {
    url,
    port,
    async stop() {
      if (child.pid !== undefined && child.exitCode === null && child.signalCode === null) {
        process.kill(child.pid, 'SIGTERM');
      }
      await exited(child);
    },
  };
}
