import { createHash } from 'node:crypto';
import type { Context, MiddlewareHandler } from 'hono';
import { ProblemError } from '../errors/problem-error.js';
import { PROBLEM_TYPES } from '../errors/problem-types.js';
import type { IdempotencyStore, StoredResponse } from './idempotency-store.js';

/** The request header that makes a POST safe to retry. */
export const IDEMPOTENCY_KEY_HEADER = 'idempotency-key';
/** Set on a replayed response, so a client can tell it did not execute again. */
export const IDEMPOTENCY_REPLAYED_HEADER = 'idempotency-replayed';

/** 1–255 visible ASCII characters (a UUID is the usual choice). */
const ACCEPTABLE_KEY = /^[\x21-\x7e]{1,255}$/;

/** Response headers a replay repeats. */
const REPLAYED_HEADERS = ['content-type', 'location'] as const;

/** Options of the idempotency middleware. */
export interface IdempotencyOptions {
  store: IdempotencyStore;
  /** How long a completed response is replayed, ms. */
  ttlMs: number;
  /** How long a claim holds while its request runs before it lapses, ms. @defaultValue 60000 */
  claimTtlMs?: number;
  /** Whose keys these are (keys of different scopes never meet). @defaultValue one shared scope */
  scopeOf?: (c: Context) => string;
  /** Seconds a client is told to wait when its first request is still running. @defaultValue 1 */
  retryAfterS?: number;
}

const sha256 = (text: string) => createHash('sha256').update(text).digest('hex');

/**
 * Idempotent POSTs, after the IETF draft "The Idempotency-Key HTTP Header Field"
 * (draft-ietf-httpapi-idempotency-key-header): a request carrying `Idempotency-Key` executes at
 * most once per key; a retry with the same method, path, query string and body gets the first
 * response again
 * (with `Idempotency-Replayed: true`) and creates nothing; the same key with another request is
 * 409 (where the draft suggests 422, this service's contract says 409); a retry while the first
 * still runs is 409 with Retry-After. Responses of 5xx are not kept, so a request that failed on
 * an outage can be retried with its key. Requests without the header pass through unchanged.
 */
export function idempotency(options: IdempotencyOptions): MiddlewareHandler {
  const { store, ttlMs, claimTtlMs = 60_000, scopeOf = () => '', retryAfterS = 1 } = options;
  return async (c, next) => {
    const key = c.req.header(IDEMPOTENCY_KEY_HEADER);
    if (c.req.method !== 'POST' || key === undefined) return next();
    if (!ACCEPTABLE_KEY.test(key)) {
      throw new ProblemError(PROBLEM_TYPES.invalidParameter, {
        detail: 'Idempotency-Key must be 1 to 255 visible ASCII characters (a UUID, for example)',
      });
    }
    const storeKey = sha256(`${scopeOf(c)}\u0000${key}`);
    const body = await c.req.text();
    // The query is part of the request: `include=waveforms` asks for another answer.
    const query = new URL(c.req.url).search;
    const fingerprint = sha256(`${c.req.method}\u0000${c.req.path}\u0000${query}\u0000${body}`);
    const begun = await store.begin(storeKey, fingerprint, claimTtlMs);
    switch (begun.kind) {
      case 'replay':
        return replay(begun.response);
      case 'mismatch':
        throw new ProblemError(PROBLEM_TYPES.idempotencyKeyReused, {
          detail:
            'this Idempotency-Key was used with another request (method, path, query or body); use a new key',
        });
      case 'in-progress':
        throw new ProblemError(PROBLEM_TYPES.idempotencyInProgress, {
          detail: 'the first request with this Idempotency-Key is still running; retry shortly',
          retryAfterS,
        });
      case 'claimed':
        break;
    }
    try {
      await next();
    } catch (error) {
      await store.release(storeKey, fingerprint).catch(() => {});
      throw error;
    }
    if (c.res.status >= 500) {
      await store.release(storeKey, fingerprint).catch(() => {});
      return;
    }
    // The body's bytes, read once: clone() and text() made the answer a tee of streams, its
    // 120 kB decoded to text, and @hono/node-server then had to stream it rather than write it.
    const { status, headers } = c.res;
    const answer = new Uint8Array(await c.res.arrayBuffer());
    const response: StoredResponse = {
      status,
      headers: Object.fromEntries(
        REPLAYED_HEADERS.flatMap((name) => {
          const value = headers.get(name);
          return value === null ? [] : [[name, value]];
        }),
      ),
      body: answer,
    };
    // Cleared first: assigning over a response would rebuild the new one around a body stream.
    c.res = undefined;
    c.res = new Response(answer, { status, headers });
    await store.complete(storeKey, fingerprint, response, ttlMs);
  };
}

function replay(stored: StoredResponse): Response {
  return new Response(stored.body, {
    status: stored.status,
    headers: { ...stored.headers, [IDEMPOTENCY_REPLAYED_HEADER]: 'true' },
  });
}
