import type { ProblemType } from './problem-types.js';

/** What a problem response says beyond its type: detail, extension members, Retry-After. */
export interface ProblemDetails {
  detail?: string;
  /** RFC 9457 extension members, for example `errors` or `issues`. */
  extensions?: Record<string, unknown>;
  /** Seconds for the Retry-After header (503, 429, 409 in progress). */
  retryAfterS?: number;
  /** Further response headers, lower-case names (WWW-Authenticate on 401). */
  headers?: Record<string, string>;
}

/**
 * An error that is a client-facing problem. Anything in api/ may throw it; app.onError renders
 * it with problem(). Its message is the detail, so logs read the same as the response.
 */
export class ProblemError extends Error {
  override name = 'ProblemError';

  constructor(
    readonly problemType: ProblemType,
    readonly details: ProblemDetails = {},
  ) {
    super(details.detail ?? problemType.title);
  }
}
