import type { Context } from 'hono';
import type { ProblemDetails } from './errors/problem-error.js';
import type { ProblemType } from './errors/problem-types.js';
import { safeJson } from './http/safe-json.js';

/** The media type of RFC 9457 problem details. */
export const PROBLEM_MEDIA_TYPE = 'application/problem+json';

/**
 * Renders an RFC 9457 problem: `type`, `title`, `status`, `detail`, `instance` (the request
 * path) and any extension members, as application/problem+json; sets Retry-After when given.
 * The one place error bodies are built.
 */
export function problem(c: Context, problemType: ProblemType, details: ProblemDetails = {}) {
  const body = {
    type: problemType.type,
    title: problemType.title,
    status: problemType.status,
    ...(details.detail === undefined ? {} : { detail: details.detail }),
    instance: c.req.path,
    ...details.extensions,
  };
  const headers: Record<string, string> = {
    ...details.headers,
    'content-type': PROBLEM_MEDIA_TYPE,
  };
  if (details.retryAfterS !== undefined) headers['retry-after'] = String(details.retryAfterS);
  return new Response(safeJson(body), { status: problemType.status, headers });
}
