/** Thrown by a DesignStore when its backing store cannot be reached; the API answers 503. */
export class StoreUnavailableError extends Error {
  override name = 'StoreUnavailableError';
}
