import { Hono } from 'hono';
import type { JobRunner } from '../workers/runners/job-runner.js';
import type { AppConfig } from './config.js';
import { authenticate } from './auth/authenticate.js';
import type { KeyStore } from './auth/key-store.js';
import { createMemoryRequestCounter, rateLimit, type RequestCounter } from './auth/rate-limit.js';
import { PROBLEM_TYPES } from './errors/problem-types.js';
import { toProblem } from './errors/to-problem.js';
import { allowedMethods } from './http/allowed-methods.js';
import { declaredBodyLimit } from './http/body-limit.js';
import { idempotency } from './idempotency/idempotency.js';
import type { IdempotencyStore } from './idempotency/idempotency-store.js';
import { createMemoryIdempotencyStore } from './idempotency/memory-idempotency-store.js';
import { buildOpenApiDocument } from './openapi/build-openapi-document.js';
import { silentLogger, type Logger } from './observability/logger.js';
import { createServiceMetrics, watchQueue, type ServiceMetrics } from './observability/metrics.js';
import { requestContext, type RequestVariables } from './observability/request-context.js';
import { problem } from './problem.js';
import { comparisonRoutes } from './routes/comparisons.js';
import { coreShapeRoutes } from './routes/core-shapes.js';
import { designRoutes } from './routes/designs.js';
import { healthRoutes } from './routes/health.js';
import { jobRoutes } from './routes/jobs.js';
import { keyRoutes } from './routes/keys.js';
import { materialRoutes } from './routes/materials.js';
import { metricsRoutes } from './routes/metrics.js';
import { openapiRoutes } from './routes/openapi.js';
import { wireRoutes } from './routes/wires.js';
import type { DesignStore } from './stores/design-store.js';
import type { MaterialStore } from './stores/material-store.js';

/**
 * What the app is built from: the design and material stores, the job runner and the settings;
 * the idempotency store (in memory when omitted), the logger (silent when omitted) and the
 * metrics (a fresh registry when omitted).
 */
export interface AppDeps {
  designs: DesignStore;
  materials: MaterialStore;
  jobs: JobRunner;
  config: AppConfig;
  /** The API keys every route but health, readiness and the document requires. */
  keys: KeyStore;
  /** Counts requests per key for RATE_LIMIT_PER_MINUTE (in memory when omitted). */
  requestCounter?: RequestCounter;
  idempotencyKeys?: IdempotencyStore;
  logger?: Logger;
  metrics?: ServiceMetrics;
}

/**
 * The HTTP API as a Hono app (Web-standard Request → Response). Every error, thrown or not
 * found, leaves as application/problem+json through problem(); nothing else builds error bodies.
 */
export function createApp(deps: AppDeps): Hono<{ Variables: RequestVariables }> {
  const { designs, materials, jobs, config } = deps;
  const logger = deps.logger ?? silentLogger();
  const metrics = deps.metrics ?? createServiceMetrics({ processMetrics: false });
  watchQueue(metrics, jobs);
  const app = new Hono<{ Variables: RequestVariables }>();

  app.use('*', requestContext({ logger, metrics }));
  // With the Redis key store, the key's lookup also counts the request for the rate limit.
  app.use('*', authenticate({ keys: deps.keys, countRequests: true }));
  app.use(
    '*',
    rateLimit({
      counter: deps.requestCounter ?? createMemoryRequestCounter(),
      perMinute: config.rateLimitPerMinute,
    }),
  );
  app.use(
    '*',
    declaredBodyLimit({
      maxSize: config.bodyLimitBytes,
      onError: (c) =>
        problem(c, PROBLEM_TYPES.payloadTooLarge, {
          detail: `request bodies are limited to ${config.bodyLimitBytes} bytes`,
        }),
    }),
  );
  // Inside the body limit: it reads the body to fingerprint the request. Keys are per tenant.
  app.use(
    '/v1/*',
    idempotency({
      store: deps.idempotencyKeys ?? createMemoryIdempotencyStore(),
      ttlMs: config.idempotencyTtlS * 1000,
      scopeOf: (c) => c.get('caller').tenant,
    }),
  );
  app.route('/', healthRoutes({ designs, jobs, retryAfterS: config.retryAfterS }));
  app.route('/', openapiRoutes(config));
  app.route('/', metricsRoutes(metrics));
  app.route(
    '/v1/designs',
    designRoutes({
      designs,
      materials,
      onEngineCpuS: (seconds) => metrics.designEngineCpu.inc(seconds),
    }),
  );
  app.route('/v1/comparisons', comparisonRoutes({ materials }));
  app.route('/v1/catalog/core-shapes', coreShapeRoutes());
  app.route('/v1/catalog/materials', materialRoutes({ materials }));
  app.route('/v1/catalog/wires', wireRoutes());
  app.route('/v1/admin/keys', keyRoutes({ keys: deps.keys }));
  app.route(
    '/v1/jobs',
    jobRoutes({
      jobs,
      materials,
      limits: config.jobSizeLimits,
      jobsPerTenantMax: config.jobsPerTenantMax,
      retryAfterS: config.retryAfterS,
    }),
  );

  // A documented path asked with a method it does not offer is 405 with Allow, not 404.
  const methodsAt = allowedMethods(buildOpenApiDocument(config));
  app.notFound((c) => {
    const allowed = methodsAt(c.req.path);
    if (allowed === undefined) {
      return problem(c, PROBLEM_TYPES.notFound, {
        detail: `nothing at ${c.req.method} ${c.req.path}`,
      });
    }
    const response = problem(c, PROBLEM_TYPES.methodNotAllowed, {
      detail: `${c.req.path} answers ${allowed.join(', ')}, not ${c.req.method}`,
    });
    response.headers.set('allow', allowed.join(', '));
    return response;
  });
  app.onError((error, c) => {
    const found = toProblem(error, config);
    // Bugs are logged with their stack on the server; the client gets the problem only.
    if (found.problemType.status >= 500 && found.problemType !== PROBLEM_TYPES.unavailable) {
      (c.get('log') ?? logger).error({ err: error, msg: 'request failed' });
    }
    return problem(c, found.problemType, found.details);
  });
  return app;
}
