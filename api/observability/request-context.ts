import { randomUUID } from 'node:crypto';
import type { MiddlewareHandler } from 'hono';
import { routePath } from 'hono/route';
import type { Logger } from './logger.js';
import type { ServiceMetrics } from './metrics.js';

/** What every handler can read from the context: its request id and a logger carrying it. */
export interface RequestVariables {
  requestId: string;
  log: Logger;
}

declare module 'hono' {
  interface ContextVariableMap {
    requestId: string;
    log: Logger;
  }
}

/** Header a caller may set to have its own request id used (and that every response carries). */
export const REQUEST_ID_HEADER = 'x-request-id';

/** An incoming request id is kept only when it is short, printable and safe to log. */
const ACCEPTABLE_REQUEST_ID = /^[A-Za-z0-9._:-]{1,128}$/;

/**
 * Gives every request an id (the caller's X-Request-Id when acceptable, else a UUID), a child
 * logger that puts it on every line, and the `x-request-id` response header; once answered,
 * writes one access line and counts the request in the metrics by route pattern (never the raw
 * path, which would make a label per design id).
 */
export function requestContext(deps: {
  logger: Logger;
  metrics: ServiceMetrics;
}): MiddlewareHandler<{ Variables: RequestVariables }> {
  return async (c, next) => {
    const startedNs = process.hrtime.bigint();
    const incoming = c.req.header(REQUEST_ID_HEADER);
    const requestId =
      incoming !== undefined && ACCEPTABLE_REQUEST_ID.test(incoming) ? incoming : randomUUID();
    const log = deps.logger.child({ requestId });
    c.set('requestId', requestId);
    c.set('log', log);
    await next();
    c.res.headers.set(REQUEST_ID_HEADER, requestId);
    const durationS = Number(process.hrtime.bigint() - startedNs) / 1e9;
    // The last matched route is the handler that answered; '*' means nothing but middleware did.
    const pattern = routePath(c, -1);
    const route = pattern === '*' || pattern === '/*' ? 'unmatched' : pattern;
    const status = c.res.status;
    deps.metrics.httpRequests.inc({ method: c.req.method, route, status: String(status) });
    deps.metrics.httpDuration.observe({ method: c.req.method, route }, durationS);
    log[status >= 500 ? 'error' : 'info']({
      msg: 'request',
      method: c.req.method,
      route,
      path: c.req.path,
      status,
      durationMs: Math.round(durationS * 1e6) / 1e3,
    });
  };
}
