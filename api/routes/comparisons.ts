import { Hono } from 'hono';
import { tenantOf } from '../auth/caller.js';
import { evaluateComparison } from '../comparisons/evaluate-comparison.js';
import { withoutWaveforms } from '../designs/waveforms.js';
import { readInclude } from '../http/read-include.js';
import { readJsonBody } from '../http/read-json-body.js';
import { sendJson } from '../http/send-json.js';
import type { MaterialStore } from '../stores/material-store.js';
import { ComparisonRequestSchema } from '../schemas/comparison-request-schema.js';

/**
 * /v1/comparisons: design one spec with several topologies inline and rank them. Nothing is
 * stored; a client keeps the design it chooses by POSTing that entry's spec to /v1/designs. A user
 * material the spec names is looked up in `materials` and put inline first. Each ranked design's
 * corners come without their waveforms unless the query says `include=waveforms`.
 */
export function comparisonRoutes({ materials }: { materials: MaterialStore }): Hono {
  const routes = new Hono();

  routes.post('/', async (c) => {
    const include = readInclude(c);
    const request = await readJsonBody(c, ComparisonRequestSchema);
    const comparison = await evaluateComparison(request, { materials, tenant: tenantOf(c) });
    if (include.waveforms) return sendJson(c, 200, comparison);
    const ranked = comparison.ranked.map((entry) => ({
      ...entry,
      design: withoutWaveforms(entry.design),
    }));
    return sendJson(c, 200, { ...comparison, ranked });
  });

  return routes;
}
