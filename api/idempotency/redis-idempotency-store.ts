import { redisStoreConnection, type RedisStoreOptions } from '../stores/redis-store-connection.js';
import {
  beginOutcome,
  type IdempotencyRecord,
  type IdempotencyStore,
  type StoredResponse,
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

const NEWLINE = 0x0a;

/**
 * A completed record's Redis value: its JSON without the body, a newline (JSON.stringify writes
 * none of its own) and the body's bytes as they are. Inside the JSON, a 120 kB answer cost a
 * decoding to text, an escaping of every quote and an encoding back, and the same on a replay.
 */
function responseValue(fingerprint: string, response: StoredResponse): Buffer {
  const { body, ...head } = response;
  const json = JSON.stringify({ fingerprint, response: head });
  return Buffer.concat([Buffer.from(json, 'utf8'), Buffer.of(NEWLINE), body]);
}

/** The record of a Redis value: a claim's JSON, or a completed record (see responseValue). */
function recordOf(value: Buffer): IdempotencyRecord {
  const newline = value.indexOf(NEWLINE);
  if (newline === -1) {
    const record = JSON.parse(value.toString('utf8')) as IdempotencyRecord | LegacyRecord;
    // Completed by an earlier version of the service, the body inside the JSON as text.
    const { response } = record;
    if (typeof response?.body !== 'string') return record as IdempotencyRecord;
    return { ...record, response: { ...response, body: new TextEncoder().encode(response.body) } };
  }
  const head = JSON.parse(value.subarray(0, newline).toString('utf8')) as {
    fingerprint: string;
    response: Omit<StoredResponse, 'body'>;
  };
  const body = new Uint8Array(
    value.buffer,
    value.byteOffset + newline + 1,
    value.length - newline - 1,
  );
  return { fingerprint: head.fingerprint, response: { ...head.response, body } };
}

/** A record as versions before bodies were kept as bytes wrote it: all of it JSON. */
interface LegacyRecord {
  fingerprint: string;
  response?: Omit<StoredResponse, 'body'> & { body: string };
}

/**
 * An IdempotencyStore on Redis: one string key per idempotency key holding the record,
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
          const existing = await redis.getBuffer(redisKey(key));
          if (existing !== null) return beginOutcome(recordOf(existing), fingerprint);
        }
        return { kind: 'in-progress' } as const;
      });
    },
    async complete(key, fingerprint, response, ttlMs) {
      const value = responseValue(fingerprint, response);
      await guarded(() => redis.set(redisKey(key), value, 'PX', ttlMs));
    },
    async release(key, fingerprint) {
      await guarded(() => redis.eval(RELEASE_SCRIPT, 1, redisKey(key), claim(fingerprint)));
    },
    isReady: connection.isReady,
    close: connection.close,
  };
}
