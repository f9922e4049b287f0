import type { Server } from 'node:http';
import { createAdaptorServer } from '@hono/node-server';
import supertest from 'supertest';
import { createApp } from '../../api/app.js';
import type { Role } from '../../api/auth/api-key.js';
import { createKey } from '../../api/auth/create-key.js';
import type { KeyStore } from '../../api/auth/key-store.js';
import { createMemoryKeyStore } from '../../api/auth/memory-key-store.js';
import { loadConfig, type AppConfig } from '../../api/config.js';
import type { Logger } from '../../api/observability/logger.js';
import type { ServiceMetrics } from '../../api/observability/metrics.js';
import type { DesignStore } from '../../api/stores/design-store.js';
import type { MaterialStore } from '../../api/stores/material-store.js';
import { createMemoryDesignStore } from '../../api/stores/memory-design-store.js';
import { createMemoryMaterialStore } from '../../api/stores/memory-material-store.js';
import { JOB_COMPUTATIONS } from '../../solvers/index.js';
import { createInProcessRunner } from '../../workers/runners/in-process.js';
import type { JobRunner } from '../../workers/runners/job-runner.js';

/** The tenant of `http`'s key. */
export const TEST_TENANT = 'test-tenant';

/** The real app on a real Node server (port 0), with the memory stores and in-process runner. */
export interface ApiTestApp {
  /** Requests as an admin of TEST_TENANT (its key is sent with every request). */
  http: ReturnType<typeof supertest.agent>;
  /** The admin key of TEST_TENANT that `http` sends. */
  token: string;
  /** Requests with no key at all. */
  anonymous: ReturnType<typeof supertest>;
  /** A client with a new key of `role` for `tenant` (other tenants see none of TEST_TENANT's data). */
  as(tenant: string, role?: Role): Promise<ReturnType<typeof supertest.agent>>;
  keys: KeyStore;
  server: Server;
  designs: DesignStore;
  materials: MaterialStore;
  jobs: JobRunner;
  config: AppConfig;
  close(): Promise<void>;
}

/**
 * Starts createApp on @hono/node-server with the default config (overridable) and the embedded
 * backends, or the given ones. Call close() after the tests.
 */
export async function startApiTestApp(
  options: {
    config?: Partial<AppConfig>;
    designs?: DesignStore;
    materials?: MaterialStore;
    jobs?: JobRunner;
    keys?: KeyStore;
    logger?: Logger;
    metrics?: ServiceMetrics;
  } = {},
): Promise<ApiTestApp> {
  // A rate limit no test file reaches unless it sets its own.
  const config = {
    ...loadConfig({}),
    rateLimitPerMinute: 1_000_000,
    jobsPerTenantMax: 100_000,
    ...options.config,
  };
  const designs = options.designs ?? createMemoryDesignStore();
  const materials = options.materials ?? createMemoryMaterialStore();
  const jobs =
    options.jobs ??
    createInProcessRunner({
      computations: JOB_COMPUTATIONS,
      concurrency: config.inProcessConcurrency,
    });
  const keys = options.keys ?? createMemoryKeyStore();
  const app = createApp({
    designs,
    materials,
    jobs,
    config,
    keys,
    ...(options.logger === undefined ? {} : { logger: options.logger }),
    ...(options.metrics === undefined ? {} : { metrics: options.metrics }),
  });
  const server = createAdaptorServer({ fetch: app.fetch }) as Server;
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const tokenOf = async (tenant: string, role: Role) =>
    (await createKey(keys, { tenant, role, label: `test key of ${tenant}` })).token;
  const as = async (tenant: string, role: Role = 'admin') =>
    supertest.agent(server).set('authorization', `Bearer ${await tokenOf(tenant, role)}`);
  const token = await tokenOf(TEST_TENANT, 'admin');
  return {
    http: supertest.agent(server).set('authorization', `Bearer ${token}`),
    token,
    anonymous: supertest(server),
    as,
    keys,
    server,
    designs,
    materials,
    jobs,
    config,
    async close() {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await jobs.close();
      await designs.close();
      await materials.close();
    },
  };
}
