/**
 * Thrown by a job runner whose backend cannot be reached (Redis down or not answering in time).
 * The API answers 503 with Retry-After; `retryAfterS` is the suggested wait, s.
 */
export class BackendUnavailableError extends Error {
  override readonly name = 'BackendUnavailableError';
  readonly retryAfterS: number;

  constructor(message: string, options: { cause?: unknown; retryAfterS?: number } = {}) {
    super(message, options.cause === undefined ? undefined : { cause: options.cause });
    this.retryAfterS = options.retryAfterS ?? 5;
  }
}
