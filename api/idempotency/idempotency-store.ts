/** A response kept for replay: what a retried request gets back instead of a second execution. */
export interface StoredResponse {
  status: number;
  /** The headers worth replaying (content type, Location), lower-case names. */
  headers: Record<string, string>;
  /** The body's bytes as first sent (a design's answer is 120 kB: kept as bytes, never as text). */
  body: Uint8Array;
}

/** What `begin` found under a key. */
export type IdempotencyBegin =
  /** The key was free and is now claimed by this request: execute it, then complete or release. */
  | { kind: 'claimed' }
  /** A request with the same fingerprint finished before: replay its response. */
  | { kind: 'replay'; response: StoredResponse }
  /** A request with the same fingerprint is still running. */
  | { kind: 'in-progress' }
  /** The key was used for a different request (another body, path or method). */
  | { kind: 'mismatch' };

/**
 * Where idempotency keys and the responses they guard live. Keys are scoped by the caller
 * (`scope`, for example the tenant) so two callers' keys never meet.
 */
export interface IdempotencyStore {
  /**
   * Claims `key` for a request with `fingerprint`, atomically; a claim not completed within
   * `claimTtlMs` lapses (a crashed request does not hold its key for ever).
   */
  begin(key: string, fingerprint: string, claimTtlMs: number): Promise<IdempotencyBegin>;
  /** Keeps the response of the request holding the claim for `ttlMs`. */
  complete(
    key: string,
    fingerprint: string,
    response: StoredResponse,
    ttlMs: number,
  ): Promise<void>;
  /** Drops a claim whose request did not finish (a 5xx): a retry will execute it afresh. */
  release(key: string, fingerprint: string): Promise<void>;
  isReady(): Promise<boolean>;
  close(): Promise<void>;
}

/** The record kept under a key. */
export interface IdempotencyRecord {
  fingerprint: string;
  response?: StoredResponse;
}

/** The outcome of `begin` for a key that already holds `record`. */
export function beginOutcome(record: IdempotencyRecord, fingerprint: string): IdempotencyBegin {
  if (record.fingerprint !== fingerprint) return { kind: 'mismatch' };
  return record.response === undefined
    ? { kind: 'in-progress' }
    : { kind: 'replay', response: record.response };
}
