import { serve } from '@hono/node-server';
import { JOB_COMPUTATIONS } from '../solvers/index.js';
import { createBullmqRunner } from '../workers/runners/bullmq.js';
import { createInProcessRunner } from '../workers/runners/in-process.js';
import { reconnectDelayMs } from '../workers/runners/redis-reconnect.js';
import type { JobRunner } from '../workers/runners/job-runner.js';
import { createApp } from './app.js';
import type { AppConfig } from './config.js';
import { Redis } from 'ioredis';
import type { KeyStore } from './auth/key-store.js';
import { localKey } from './auth/local-key.js';
import { createMemoryKeyStore } from './auth/memory-key-store.js';
import {
  createMemoryRequestCounter,
  createRedisRequestCounter,
  type RequestCounter,
} from './auth/rate-limit.js';
import { createRedisKeyStore } from './auth/redis-key-store.js';
import { createLogger } from './observability/logger.js';
import {
  createServiceMetrics,
  recordFinishedJob,
  type ServiceMetrics,
} from './observability/metrics.js';
import type { IdempotencyStore } from './idempotency/idempotency-store.js';
import { createMemoryIdempotencyStore } from './idempotency/memory-idempotency-store.js';
import { createRedisIdempotencyStore } from './idempotency/redis-idempotency-store.js';
import type { DesignStore } from './stores/design-store.js';
import type { MaterialStore } from './stores/material-store.js';
import { createMemoryDesignStore } from './stores/memory-design-store.js';
import { createMemoryMaterialStore } from './stores/memory-material-store.js';
import { createRedisDesignStore } from './stores/redis-design-store.js';
import { createRedisMaterialStore } from './stores/redis-material-store.js';

// One API process: picks the backends, serves the app and shuts down gracefully on SIGTERM or
// SIGINT. `api/server.ts` (`npm start`) runs it directly, or in each of API_PROCESSES processes.

/** Redis stores and BullMQ producer when REDIS_URL is set; else the embedded memory + in-process. */
function backends(
  config: AppConfig,
  metrics: ServiceMetrics,
): {
  designs: DesignStore;
  materials: MaterialStore;
  jobs: JobRunner;
  idempotencyKeys: IdempotencyStore;
  keys: KeyStore;
  requestCounter: RequestCounter;
  name: string;
} {
  if (config.redisUrl !== undefined) {
    return {
      designs: createRedisDesignStore({ redisUrl: config.redisUrl }),
      idempotencyKeys: createRedisIdempotencyStore({ redisUrl: config.redisUrl }),
      keys: createRedisKeyStore({ redisUrl: config.redisUrl }),
      requestCounter: createRedisRequestCounter(
        new Redis(config.redisUrl, {
          maxRetriesPerRequest: 1,
          commandTimeout: 500,
          retryStrategy: reconnectDelayMs,
        }).on('error', () => {}),
      ),
      materials: createRedisMaterialStore({ redisUrl: config.redisUrl }),
      jobs: createBullmqRunner({
        redisUrl: config.redisUrl,
        queueName: config.queueName,
        chunkTimeoutMs: config.jobChunkTimeoutS * 1000,
        // Every API process follows the queue's events, so each counts every job of the queue.
        onFinished: (record) => recordFinishedJob(metrics, record),
      }),
      name: `redis (${new URL(config.redisUrl).host}); jobs are computed by \`npm run worker\``,
    };
  }
  return {
    designs: createMemoryDesignStore(),
    idempotencyKeys: createMemoryIdempotencyStore(),
    keys: createMemoryKeyStore(),
    requestCounter: createMemoryRequestCounter(),
    materials: createMemoryMaterialStore(),
    jobs: createInProcessRunner({
      computations: JOB_COMPUTATIONS,
      concurrency: config.inProcessConcurrency,
      chunkTimeoutMs: config.jobChunkTimeoutS * 1000,
      onFinished: (record) => recordFinishedJob(metrics, record),
    }),
    name: `in-process (memory store, ${config.inProcessConcurrency} job(s) at once; nothing persists)`,
  };
}

/** Longest wait for requests in flight at shutdown, ms. */
const SHUTDOWN_GRACE_MS = 10_000;

/**
 * Serves the API in this process until SIGTERM or SIGINT, then stops taking connections, lets
 * requests in flight finish and exits 0. `isClusterWorker`: one of API_PROCESSES processes
 * forked by api/cluster-primary.ts (its start-up line says 'API process', not 'design service').
 */
export async function serveApi(config: AppConfig, { isClusterWorker = false } = {}): Promise<void> {
  const logger = createLogger({ level: config.logLevel });
  const metrics = createServiceMetrics({ clusterWorker: isClusterWorker });
  const { designs, materials, jobs, idempotencyKeys, keys, requestCounter, name } = backends(
    config,
    metrics,
  );
  if (config.redisUrl === undefined) {
    // Embedded: one admin key of tenant 'local', shown once; auth is never off.
    const { token, isNew } = await localKey(keys, config.localApiKey);
    logger.info(
      isNew
        ? {
            msg: 'local API key (send as Authorization: Bearer <key>)',
            tenant: 'local',
            key: token,
          }
        : { msg: 'local API key from LOCAL_API_KEY', tenant: 'local' },
    );
  } else if ((await keys.activeCount().catch(() => 1)) === 0) {
    logger.warn({
      msg: 'no API key exists yet: every request under /v1 will answer 401. Create one with `REDIS_URL=… npm run keys -- create --tenant <name> --role admin`',
    });
  }
  const app = createApp({
    designs,
    materials,
    jobs,
    config,
    keys,
    requestCounter,
    idempotencyKeys,
    logger,
    metrics,
  });
  const server = serve({ fetch: app.fetch, port: config.port, hostname: config.host }, (info) => {
    const host = info.family === 'IPv6' ? `[${info.address}]` : info.address;
    // In a cluster the primary says when the service as a whole listens (api/cluster-primary.ts).
    logger.info({
      msg: `${isClusterWorker ? 'API process' : 'design service'} listening on http://${host}:${info.port}`,
      backend: name,
    });
  });
  server.on('error', (error) => {
    logger.fatal({ msg: `cannot listen on ${config.host}:${config.port}: ${error.message}` });
    process.exit(1);
  });

  let isStopping = false;
  async function shutdown(signal: string) {
    if (isStopping) return;
    isStopping = true;
    logger.info({ msg: 'shutting down', signal });
    // Stop taking connections, let requests in flight finish (cut off after a grace period), then
    // release the backends: the in-process runner cancels its jobs, Redis connections quit.
    const forceClose = setTimeout(() => {
      if ('closeAllConnections' in server) server.closeAllConnections();
    }, SHUTDOWN_GRACE_MS);
    await new Promise<void>((resolve) => server.close(() => resolve()));
    clearTimeout(forceClose);
    await Promise.allSettled([
      jobs.close(),
      designs.close(),
      materials.close(),
      idempotencyKeys.close(),
      keys.close(),
    ]);
    process.exit(0);
  }
  process.on('SIGTERM', () => void shutdown('SIGTERM'));
  process.on('SIGINT', () => void shutdown('SIGINT'));
}
