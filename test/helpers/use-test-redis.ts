import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Redis } from 'ioredis';
import { afterAll, beforeAll } from 'vitest';
import { startRedisServer, type RestartableRedisServer } from './redis-server.js';

// Apart from redis-server.ts, which the bench and load scripts import outside vitest.
/** Options of useTestRedis. */
export interface UseTestRedisOptions {
  /**
   * Append-only persistence in a fresh temporary directory (removed after the file's tests), as
   * docker-compose.yml runs Redis, so data survives `server.kill` and `server.restart()`.
   * @defaultValue false (no persistence)
   */
  appendOnly?: boolean;
}

/** The Redis of one test file, as useTestRedis gives it. */
export interface TestRedis {
  /** Its URL (redis://127.0.0.1:port). */
  readonly url: string;
  /** The server itself, to kill and restart it. */
  readonly server: RestartableRedisServer;
  /**
   * A client of the test's own (reads, clean-up), made on first use and closed after the
   * file's tests; commands wait for a reconnection (`maxRetriesPerRequest: null`).
   */
  readonly admin: Redis;
}

/**
 * Gives the calling test file a Redis of its own: started on a free port in `beforeAll`,
 * stopped by its PID in `afterAll` (after the file's own afterAll hooks, which vitest runs in
 * reverse order, so what a file started on it is stopped first). Call it at the top of the file;
 * read its fields inside hooks and tests only.
 */
export function useTestRedis(options: UseTestRedisOptions = {}): TestRedis {
  let server: RestartableRedisServer | undefined;
  let admin: Redis | undefined;
  let dataDir: string | undefined;
  const started = (): RestartableRedisServer => {
    if (server === undefined) throw new Error('useTestRedis: read it inside a hook or test');
    return server;
  };
  beforeAll(async () => {
    if (options.appendOnly === true) dataDir = await mkdtemp(join(tmpdir(), 'test-redis-'));
    server = await startRedisServer(dataDir === undefined ? {} : { appendOnlyDir: dataDir });
  });
  afterAll(async () => {
    if (admin !== undefined) await admin.quit().catch(() => admin?.disconnect());
    await server?.stop();
    if (dataDir !== undefined) await rm(dataDir, { recursive: true, force: true });
  });
  return {
    get url() {
      return started().url;
    },
    get server() {
      return started();
    },
    get admin() {
      admin ??= new Redis(started().url, { maxRetriesPerRequest: null }).on('error', () => {});
      return admin;
    },
  };
}
