import type { Context } from 'hono';
import type { ContentfulStatusCode } from 'hono/utils/http-status';
import { safeJson } from './safe-json.js';

/**
 * A JSON response whose numbers are all finite (see safeJson): a non-finite number is a bug and
 * reaches app.onError as a 500, never the client as null.
 */
export function sendJson(
  c: Context,
  status: ContentfulStatusCode,
  body: unknown,
  headers: Record<string, string> = {},
): Response {
  return sendJsonText(c, status, safeJson(body), headers);
}

/**
 * A JSON response from text already serialized with its numbers checked (safeJson's text, or
 * its UTF-8 bytes).
 */
export function sendJsonText(
  c: Context,
  status: ContentfulStatusCode,
  json: string | Uint8Array<ArrayBuffer>,
  headers: Record<string, string> = {},
): Response {
  return c.body(json, status, { 'content-type': 'application/json; charset=utf-8', ...headers });
}
