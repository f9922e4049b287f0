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

/** A RequestCounter on Redis (INCR, expiring with its window), shared by every API process. */
export function createRedisRequestCounter(redis: Redis, keyPrefix = 'icd'): RequestCounter {
  return {
    async increment(key, startMs, windowMs) {
      const counter = `${keyPrefix}:rate:${key}:${startMs}`;
      const [[, count]] = (await redis
        .multi()
        .incr(counter)
        .pexpire(counter, windowMs * 2)
        .exec()) as [[Error | null, number], [Error | null, number]];
      return count;
    },
  };
}

const WINDOW_MS = 60_000;

/**
 * At most `perMinute` requests per API key in each clock minute (a fixed window, common
 * practice); the next one is 429 with Retry-After, the seconds to the window's end. Open paths
 * (no caller) are not counted. A counter that cannot be reached lets the request through: the
 * limit protects the service, it must not take it down with the counter.
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
    const windowStartMs = nowMs - (nowMs % WINDOW_MS);
    const count = await counter.increment(caller.keyId, windowStartMs, WINDOW_MS).catch(() => 0);
    if (count > perMinute) {
      throw new ProblemError(PROBLEM_TYPES.tooManyRequests, {
        detail: `this key may send ${perMinute} requests a minute; wait for the next minute`,
        retryAfterS: Math.max(1, Math.ceil((windowStartMs + WINDOW_MS - nowMs) / 1000)),
      });
    }
    return next();
  };
}
