import { Redis, ReplyError } from 'ioredis';
import { reconnectDelayMs } from '../../workers/runners/redis-reconnect.js';
import { StoreUnavailableError } from './store-unavailable-error.js';

/** Options every Redis-backed store takes. */
export interface RedisStoreOptions {
  /** Redis URL, for example redis://localhost:6379/0. */
  redisUrl: string;
  /** Prefix of every key. @defaultValue 'icd' */
  keyPrefix?: string;
  /** How long one command may wait (also while reconnecting) before the store gives up, ms. @defaultValue 1000 */
  commandTimeoutMs?: number;
}

/** The defaults of RedisStoreOptions. */
const REDIS_STORE_DEFAULTS = {
  keyPrefix: 'icd',
  commandTimeoutMs: 1000,
} satisfies Required<Omit<RedisStoreOptions, 'redisUrl'>>;

/** One store's Redis connection and the outage handling every Redis store shares. */
export interface RedisStoreConnection {
  redis: Redis;
  /** Prefix of every key of the store (the option, or its default). */
  keyPrefix: string;
  /** Runs one Redis operation; an unreachable or timed-out Redis rejects StoreUnavailableError. */
  guarded<T>(operation: () => Promise<T>): Promise<T>;
  /** True when Redis answers PING within the command timeout. */
  isReady(): Promise<boolean>;
  close(): Promise<void>;
}

/**
 * Opens the connection of a Redis-backed store named `storeName` (used in error messages).
 * Commands wait at most `commandTimeoutMs` (also while reconnecting) before the store gives up.
 */
export function redisStoreConnection(
  options: RedisStoreOptions & { storeName: string },
): RedisStoreConnection {
  const { redisUrl, keyPrefix, commandTimeoutMs, storeName } = {
    ...REDIS_STORE_DEFAULTS,
    ...options,
  };
  const redis = new Redis(redisUrl, {
    maxRetriesPerRequest: 1,
    commandTimeout: commandTimeoutMs,
    retryStrategy: reconnectDelayMs,
  });
  // Errors surface per command as StoreUnavailableError; without a listener ioredis would log each.
  redis.on('error', () => {});

  async function guarded<T>(operation: () => Promise<T>): Promise<T> {
    try {
      return await operation();
    } catch (error) {
      if (error instanceof ReplyError) throw error; // Redis answered: a bug, not an outage
      throw new StoreUnavailableError(`${storeName} unreachable: ${(error as Error).message}`);
    }
  }

  return {
    redis,
    keyPrefix,
    guarded,
    async isReady() {
      // While (re)connecting the PING waits in ioredis's queue, at most commandTimeoutMs.
      return guarded(() => redis.ping()).then(
        (reply) => reply === 'PONG',
        () => false,
      );
    },
    async close() {
      await redis.quit().catch(() => redis.disconnect());
    },
  };
}
