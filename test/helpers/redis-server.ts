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

/** Options of startRedisServer. */
export interface RedisServerOptions {
  /**
   * A directory for append-only persistence (`--appendonly yes --appendfsync everysec`, as in
   * docker-compose.yml): data written there survives a kill and restart(). Default: no
   * persistence at all.
   */
  appendOnlyDir?: string;
}

/** A test Redis that can also be killed and started again on the same port and directory. */
export interface RestartableRedisServer extends TestRedisServer {
  /** Sends `signal` to the server by its PID and waits for its exit. */
  kill(signal: NodeJS.Signals): Promise<void>;
  /** Starts the server again on the same port (and directory) and waits until it answers PING. */
  restart(): Promise<void>;
}

async function spawnRedis(port: number, options: RedisServerOptions): Promise<ChildProcess> {
  const persistence =
    options.appendOnlyDir === undefined
      ? ['--save', '', '--appendonly', 'no']
      : [
          '--save',
          '',
          '--appendonly',
          'yes',
          '--appendfsync',
          'everysec',
          '--dir',
          options.appendOnlyDir,
        ];
  const child = spawn(
    'redis-server',
    ['--port', String(port), '--bind', '127.0.0.1', ...persistence],
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
  return child;
}

/**
 * Starts `redis-server` on a free port (persistence off unless `appendOnlyDir` is given) and
 * waits until it answers PING. Call stop() in afterAll.
 */
export async function startRedisServer(
  options: RedisServerOptions = {},
): Promise<RestartableRedisServer> {
  const port = await freePort();
  let child = await spawnRedis(port, options);
  const kill = async (signal: NodeJS.Signals) => {
    if (child.pid !== undefined && child.exitCode === null && child.signalCode === null) {
      process.kill(child.pid, signal);
    }
    await exited(child);
  };
  return {
    url: `redis://127.0.0.1:${port}`,
    port,
    kill,
    async restart() {
      await kill('SIGKILL');
      child = await spawnRedis(port, options);
    },
    stop: () => kill('SIGTERM'),
  };
}
