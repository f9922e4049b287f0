import { Hono } from 'hono';
import type { ServiceMetrics } from '../observability/metrics.js';

/** /metrics: the Prometheus text exposition of the app's registry. */
export function metricsRoutes(metrics: ServiceMetrics): Hono {
  const routes = new Hono();
  routes.get('/metrics', async (c) => {
    const body = await metrics.registry.metrics();
    return c.body(body, 200, { 'content-type': metrics.registry.contentType });
  });
  return routes;
}
