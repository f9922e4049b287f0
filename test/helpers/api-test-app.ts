import type { Server } from 'node:http';
import { createAdaptorServer } from '@hono/node-server';
import supertest from 'supertest';
import { createApp } from '../../api/app.js';
import { loadConfig, type AppConfig } from '../../api/config.js';
import type { DesignStore } from '../../api/stores/design-store.js';
import type { MaterialStore } from '../../api/stores/material-store.js';
import { createMemoryDesignStore } from '../../api/stores/memory-design-store.js';
import { createMemoryMaterialStore } from '../../api/stores/memory-material-store.js';
import { JOB_COMPUTATIONS } from '../../solvers/index.js';
import { createInProcessRunner } from '../../workers/runners/in-process.js';
import type { JobRunner } from '../../workers/runners/job-runner.js';

/** The real app on a real Node server (port 0), with the memory stores and in-process runner. */
export interface ApiTestApp {
  http: ReturnType<typeof supertest>;
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
  } = {},
): Promise<ApiTestApp> {
  const config = { ...loadConfig({}), ...options.config };
  const designs = options.designs ?? createMemoryDesignStore();
  const materials = options.materials ?? createMemoryMaterialStore();
  const jobs =
    options.jobs ??
    createInProcessRunner({
      computations: JOB_COMPUTATIONS,
      concurrency: config.inProcessConcurrency,
    });
  const app = createApp({ designs, materials, jobs, config });
  const server = createAdaptorServer({ fetch: app.fetch }) as Server;
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return {
    http: supertest(server),
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
