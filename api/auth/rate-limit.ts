import type { MiddlewareHandler } from 'hono';
import type { Redis } from 'ioredis';
import { ProblemError } from '../errors/problem-error.js';
import { PROBLEM_TYPES } from '../errors/problem-types.js';
import './caller.js';

/** Counts requests per key and fixed one-minute window. */
export interface RequestCounter {
  /** Adds one request of `key` in the window starting at `windowStartMs`; returns the count. */
  increment(key: string, windowStartMs: number, windowMs: number): Promise<number>;
}

/** A RequestCounter in memory; windows older than the current one are dropped as time passes. */
export function createMemoryRequestCounter(): RequestCounter {
  const counts = new Map<string, number>();
  let windowStartMs = 0;
  return {
    async increment(key, startMs) {
      if (startMs !== windowStartMs) {
        counts.clear();
        windowStartMs = startMs;
      }
      const count = (counts.get(key) ?? 0) + 1;
      counts.set(key, count);
      return count;
    },
  };
}

/**
 * Counts one request and (re)sets the counter's expiry, in one step on the server. KEYS: the
 * counter; ARGV: its time to live, ms. Returns the count.
 */
const INCREMENT_SCRIPT = `
local count = redis.call('INCR', KEYS[1])
redis.call('PEXPIRE', KEYS[1], ARGV[1])
return count
`;

/** The script as an ioredis command (EVALSHA, loading the script again if Redis lost it). */
interface WithIncrement {
  icdRateIncrement(counter: string, ttlMs: number): Promise<number>;
}

/**
 * The Redis key of one API key's request count in the window starting at `windowStartMs`. Under
 * the key store's `{keys}` hash tag, so that its findCounting script (the key's record and this
 * count) touches one cluster slot.
 */
export function rateCounterKey(keyPrefix: string, keyId: string, windowStartMs: number): string {
  return `${keyPrefix}:{keys}:rate:${keyId}:${windowStartMs}`;
}

/**
 * A RequestCounter on Redis (INCR, expiring two windows after the last request), shared by every
 * API process. One script call a request: a MULTI of INCR and PEXPIRE was four commands to send,
 * queue and answer. With the Redis key store the API counts as it finds the key instead
 * (KeyStore.findCounting, in the same counters), and this one only counts what that did not.
 */
export function createRedisRequestCounter(redis: Redis, keyPrefix = 'icd'): RequestCounter {
  redis.defineCommand('icdRateIncrement', { numberOfKeys: 1, lua: INCREMENT_SCRIPT });
  const scripted = redis as unknown as WithIncrement;
  return {
    async increment(key, startMs, windowMs) {
      return scripted.icdRateIncrement(rateCounterKey(keyPrefix, key, startMs), windowMs * 2);
    },
  };
}

/** Length of a rate window, ms: one clock minute. */
export const RATE_WINDOW_MS = 60_000;

/** Start of the rate window `nowMs` falls in, ms since the epoch. */
export const rateWindowStartMs = (nowMs: number): number => nowMs - (nowMs % RATE_WINDOW_MS);

/** A request authenticate has already counted (KeyStore.findCounting), and in which window. */
export interface CountedRequest {
  windowStartMs: number;
  count: number;
}

declare module 'hono' {
  interface ContextVariableMap {
    countedRequest: CountedRequest;
  }
}

/**
 * At most `perMinute` requests per API key in each clock minute (a fixed window, common
 * practice); the next one is 429 with Retry-After, the seconds to the window's end. Open paths
 * (no caller) are not counted. A counter that cannot be reached lets the request through: the
 * limit protects the service, it must not take it down with the counter. A request authenticate
 * counted as it found the key (`countedRequest`, same window) is judged by that count.
 */
export function rateLimit(deps: {
  counter: RequestCounter;
  perMinute: number;
  now?: () => number;
}): MiddlewareHandler {
  const { counter, perMinute, now = Date.now } = deps;
  return async (c, next) => {
    const caller = c.get('caller');
    if (caller === undefined) return next();
    const nowMs = now();
    const windowStartMs = rateWindowStartMs(nowMs);
    // Counted already as the key was found, in this window: no second count, no round trip.
    const counted = c.get('countedRequest');
    const count =
      counted !== undefined && counted.windowStartMs === windowStartMs
        ? counted.count
        : await counter.increment(caller.keyId, windowStartMs, RATE_WINDOW_MS).catch(() => 0);
    if (count > perMinute) {
      throw new ProblemError(PROBLEM_TYPES.tooManyRequests, {
        detail: `this key may send ${perMinute} requests a minute; wait for the next minute`,
        retryAfterS: Math.max(1, Math.ceil((windowStartMs + RATE_WINDOW_MS - nowMs) / 1000)),
      });
    }
    return next();
  };
}
