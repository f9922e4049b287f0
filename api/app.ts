import { Hono } from 'hono';
import { bodyLimit } from 'hono/body-limit';
import type { JobRunner } from '../workers/runners/job-runner.js';
import type { AppConfig } from './config.js';
import { PROBLEM_TYPES } from './errors/problem-types.js';
import { toProblem } from './errors/to-problem.js';
import { allowedMethods } from './http/allowed-methods.js';
import { buildOpenApiDocument } from './openapi/build-openapi-document.js';
import { problem } from './problem.js';
import { comparisonRoutes } from './routes/comparisons.js';
import { coreShapeRoutes } from './routes/core-shapes.js';
import { designRoutes } from './routes/designs.js';
import { healthRoutes } from './routes/health.js';
import { jobRoutes } from './routes/jobs.js';
import { materialRoutes } from './routes/materials.js';
import { openapiRoutes } from './routes/openapi.js';
import { wireRoutes } from './routes/wires.js';
import type { DesignStore } from './stores/design-store.js';
import type { MaterialStore } from './stores/material-store.js';

/** What the app is built from: the design and material stores, the job runner and the settings. */
export interface AppDeps {
  designs: DesignStore;
  materials: MaterialStore;
  jobs: JobRunner;
  config: AppConfig;
}

/**
 * The HTTP API as a Hono app (Web-standard Request → Response). Every error, thrown or not
 * found, leaves as application/problem+json through problem(); nothing else builds error bodies.
 */
export function createApp(deps: AppDeps): Hono {
  const { designs, materials, jobs, config } = deps;
  const app = new Hono();

  app.use(
    '*',
    bodyLimit({
      maxSize: config.bodyLimitBytes,
      onError: (c) =>
        problem(c, PROBLEM_TYPES.payloadTooLarge, {
          detail: `request bodies are limited to ${config.bodyLimitBytes} bytes`,
        }),
    }),
  );
  app.route('/', healthRoutes({ designs, jobs, retryAfterS: config.retryAfterS }));
  app.route('/', openapiRoutes(config));
  app.route('/v1/designs', designRoutes({ designs, materials }));
  app.route('/v1/comparisons', comparisonRoutes({ materials }));
  app.route('/v1/catalog/core-shapes', coreShapeRoutes());
  app.route('/v1/catalog/materials', materialRoutes({ materials }));
  app.route('/v1/catalog/wires', wireRoutes());
  app.route('/v1/jobs', jobRoutes({ jobs, materials, limits: config.jobSizeLimits }));

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
      console.error(`${c.req.method} ${c.req.path} failed:`, error);
    }
    return problem(c, found.problemType, found.details);
  });
  return app;
}
