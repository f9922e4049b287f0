import { redisStoreConnection, type RedisStoreOptions } from '../stores/redis-store-connection.js';
import {
  beginOutcome,
  type IdempotencyRecord,
  type IdempotencyStore,
} from './idempotency-store.js';

/** Options of the store (see RedisStoreOptions). */
export type RedisIdempotencyStoreOptions = RedisStoreOptions;

/**
 * Deletes the key only while it still holds this fingerprint's claim (not a completed response,
 * not another request's claim). KEYS: the key; ARGV: the claim's JSON.
 */
const RELEASE_SCRIPT = `
if redis.call('GET', KEYS[1]) == ARGV[1] then return redis.call('DEL', KEYS[1]) end
return 0
`;

/**
 * An IdempotencyStore on Redis: one string key per idempotency key holding the record's JSON,
 * claimed with SET NX PX (atomic, so of two concurrent requests exactly one executes), replaced
 * by the response with a longer expiry once the request completes. Outages reject with
 * StoreUnavailableError (the API answers 503 and the client may retry with the same key).
 */
export function createRedisIdempotencyStore(
  options: RedisIdempotencyStoreOptions,
): IdempotencyStore {
  const connection = redisStoreConnection({ ...options, storeName: 'idempotency store' });
  const { redis, guarded, keyPrefix } = connection;
  const redisKey = (key: string) => `${keyPrefix}:idempotency:${key}`;
  const claim = (fingerprint: string) =>
    JSON.stringify({ fingerprint } satisfies IdempotencyRecord);

  return {
    async begin(key, fingerprint, claimTtlMs) {
      return guarded(async () => {
        // Two tries: a key that expires between SET NX and GET is simply claimed again.
        for (let attempt = 0; attempt < 2; attempt += 1) {
          const set = await redis.set(redisKey(key), claim(fingerprint), 'PX', claimTtlMs, 'NX');
          if (set === 'OK') return { kind: 'claimed' } as const;
          const existing = await redis.get(redisKey(key));
          if (existing !== null) {
            return beginOutcome(JSON.parse(existing) as IdempotencyRecord, fingerprint);
          }
        }
        return { kind: 'in-progress' } as const;
      });
    },
    async complete(key, fingerprint, response, ttlMs) {
      const record: IdempotencyRecord = { fingerprint, response };
      await guarded(() => redis.set(redisKey(key), JSON.stringify(record), 'PX', ttlMs));
    },
    async release(key, fingerprint) {
      await guarded(() => redis.eval(RELEASE_SCRIPT, 1, redisKey(key), claim(fingerprint)));
    },
    isReady: connection.isReady,
    close: connection.close,
  };
}
