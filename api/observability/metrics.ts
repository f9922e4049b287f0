import { Counter, Histogram, Registry, collectDefaultMetrics } from 'prom-client';

/** The service's Prometheus metrics, on a registry of their own (one per app). */
export interface ServiceMetrics {
  registry: Registry;
  /** Requests answered, by method, route pattern and status code. */
  httpRequests: Counter<'method' | 'route' | 'status'>;
  /** Time from request to response, s, by method and route pattern. */
  httpDuration: Histogram<'method' | 'route'>;
}

/** Latency buckets of the HTTP histogram, s: 1 ms to 10 s. */
const HTTP_BUCKETS_S = [0.001, 0.0025, 0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 10];

/**
 * Creates the metrics of one app. `processMetrics` adds the Node process's own (CPU, memory,
 * event-loop lag, garbage collection) with the `designservice_` prefix; off in tests that create
 * many apps.
 */
export function createServiceMetrics(options: { processMetrics?: boolean } = {}): ServiceMetrics {
  const registry = new Registry();
  if (options.processMetrics ?? true) {
    collectDefaultMetrics({ register: registry, prefix: 'designservice_' });
  }
  return {
    registry,
    httpRequests: new Counter({
      name: 'designservice_http_requests_total',
      help: 'HTTP requests answered, by method, route pattern and status code.',
      labelNames: ['method', 'route', 'status'] as const,
      registers: [registry],
    }),
    httpDuration: new Histogram({
      name: 'designservice_http_request_duration_seconds',
      help: 'Time from request to response, s, by method and route pattern.',
      labelNames: ['method', 'route'] as const,
      buckets: HTTP_BUCKETS_S,
      registers: [registry],
    }),
  };
}
