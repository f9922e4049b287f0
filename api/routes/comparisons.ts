import { Hono } from 'hono';
import { tenantOf } from '../auth/caller.js';
import { evaluateComparison } from '../comparisons/evaluate-comparison.js';
import { readJsonBody } from '../http/read-json-body.js';
import { sendJson } from '../http/send-json.js';
import type { MaterialStore } from '../stores/material-store.js';
import { ComparisonRequestSchema } from '../schemas/comparison-request-schema.js';

/**
 * /v1/comparisons: design one spec with several topologies inline and rank them. Nothing is
 * stored; a client keeps the design it chooses by POSTing that entry's spec to /v1/designs. A user
 * material the spec names is looked up in `materials` and put inline first.
 */
export function comparisonRoutes({ materials }: { materials: MaterialStore }): Hono {
  const routes = new Hono();

  routes.post('/', async (c) => {
    const request = await readJsonBody(c, ComparisonRequestSchema);
    return sendJson(c, 200, await evaluateComparison(request, { materials, tenant: tenantOf(c) }));
  });

  return routes;
}
