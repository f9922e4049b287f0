import type { Context, MiddlewareHandler } from 'hono';
import { bodyLimit } from 'hono/body-limit';

/**
 * Hono's bodyLimit, without its cost on the common request: a body declared by Content-Length
 * (and not chunked) is judged by that header alone, so the request is not turned into a Web
 * Request with a body stream just to be measured (@hono/node-server then reads the body
 * straight from the socket when the handler asks for it; Node's HTTP parser never passes on
 * more bytes than Content-Length declares). GET and HEAD carry no body. Anything else (a
 * chunked body) is counted as it streams by Hono's own middleware.
 */
export function declaredBodyLimit(options: {
  maxSize: number;
  onError: (c: Context) => Response | Promise<Response>;
}): MiddlewareHandler {
  const streamed = bodyLimit(options);
  return async (c, next) => {
    if (c.req.method === 'GET' || c.req.method === 'HEAD') return next();
    const declared = c.req.header('content-length');
    if (
      declared !== undefined &&
      /^\d+$/.test(declared) &&
      c.req.header('transfer-encoding') === undefined
    ) {
      return Number(declared) > options.maxSize ? options.onError(c) : next();
    }
    return streamed(c, next);
  };
}
