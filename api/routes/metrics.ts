import { Hono } from 'hono';
import type { ServiceMetrics } from '../observability/metrics.js';

/**
 * /metrics: the Prometheus text exposition of the app's registry (of every API process's, merged,
 * in a cluster; see ServiceMetrics.scrape).
 */
export function metricsRoutes(metrics: ServiceMetrics): Hono {
  const routes = new Hono();
  routes.get('/metrics', async (c) => {
    const body = await metrics.scrape();
    return c.body(body, 200, { 'content-type': metrics.registry.contentType });
  });
  return routes;
}
