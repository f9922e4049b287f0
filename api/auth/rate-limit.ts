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
 * A RequestCounter on Redis (INCR, expiring two windows after the last request), shared by every
 * API process. One script call a request: a MULTI of INCR and PEXPIRE was four commands to send,
 * queue and answer.
 */
export function createRedisRequestCounter(redis: Redis, keyPrefix = 'icd'): RequestCounter {
  redis.defineCommand('icdRateIncrement', { numberOfKeys: 1, lua: INCREMENT_SCRIPT });
  const scripted = redis as unknown as WithIncrement;
  return {
    async increment(key, startMs, windowMs) {
      return scripted.icdRateIncrement(`${keyPrefix}:rate:${key}:${startMs}`, windowMs * 2);
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
