import { Hono } from 'hono';
import type { JobRunner } from '../../workers/runners/job-runner.js';
import { ProblemError } from '../errors/problem-error.js';
import { PROBLEM_TYPES } from '../errors/problem-types.js';
import { sendJson } from '../http/send-json.js';
import type { DesignStore } from '../stores/design-store.js';

const upOrDown = (check: Promise<boolean>) =>
  check.then(
    (isUp) => (isUp ? 'up' : 'down'),
    () => 'down' as const,
  );

/** /healthz (liveness: the process answers) and /readyz (the store and job backend answer). */
export function healthRoutes(deps: {
  designs: DesignStore;
  jobs: JobRunner;
  retryAfterS: number;
}): Hono {
  const routes = new Hono();

  routes.get('/healthz', (c) => sendJson(c, 200, { status: 'ok' }));

  routes.get('/readyz', async (c) => {
    const [designStore, jobBackend] = await Promise.all([
      upOrDown(deps.designs.isReady()),
      upOrDown(deps.jobs.isReady()),
    ]);
    const checks = { designStore, jobBackend };
    if (designStore === 'up' && jobBackend === 'up') {
      return sendJson(c, 200, { status: 'ready', checks });
    }
    const down = Object.entries(checks).filter(([, state]) => state === 'down');
    throw new ProblemError(PROBLEM_TYPES.unavailable, {
      detail: `not ready: ${down.map(([name]) => name).join(' and ')} down`,
      extensions: { checks },
      retryAfterS: deps.retryAfterS,
    });
  });

  return routes;
}
