import { redisStoreConnection, type RedisStoreOptions } from '../stores/redis-store-connection.js';
import type { ApiKeyRecord, KeyStore } from './key-store.js';
import { rateCounterKey } from './rate-limit.js';

/** Options of the store (see RedisStoreOptions). */
export type RedisKeyStoreOptions = RedisStoreOptions;

/**
 * Revokes in one atomic step, only a key of the given tenant. KEYS: records hash;
 * ARGV: id, tenant, time. Returns 1, or 0 when the tenant has no such key.
 */
const REVOKE_SCRIPT = `
local json = redis.call('HGET', KEYS[1], ARGV[1])
if not json then return 0 end
local record = cjson.decode(json)
if record.tenant ~= ARGV[2] then return 0 end
if not record.revokedAt then
  record.revokedAt = ARGV[3]
  redis.call('HSET', KEYS[1], ARGV[1], cjson.encode(record))
end
return 1
`;

/**
 * Finds a key and counts the request in the key's rate window, in one step on the server.
 * KEYS: records hash, the window's counter; ARGV: id, the token's hash, the counter's time to
 * live (ms), then the roles that allow the operation. Counts (INCR, PEXPIRE, as the request
 * counter does) only a key that is not revoked, has that hash and holds one of those roles: the
 * checks authenticate makes (it makes them again, the hash in constant time). Returns
 * {record JSON, count}, {record JSON} when not counted, or {} when there is no such key.
 */
const FIND_COUNTING_SCRIPT = `
local json = redis.call('HGET', KEYS[1], ARGV[1])
if not json then return {} end
local record = cjson.decode(json)
if record.revokedAt ~= nil or record.hash ~= ARGV[2] then return {json} end
for i = 4, #ARGV do
  if record.role == ARGV[i] then
    local count = redis.call('INCR', KEYS[2])
    redis.call('PEXPIRE', KEYS[2], ARGV[3])
    return {json, count}
  end
end
return {json}
`;

/** The script as an ioredis command (EVALSHA, loading the script again if Redis lost it). */
interface WithFindCounting {
  icdFindKeyCounting(
    records: string,
    counter: string,
    id: string,
    tokenHash: string,
    ttlMs: number,
    ...roles: string[]
  ): Promise<[string?, number?]>;
}

/**
 * A KeyStore on Redis: one hash of records (id → JSON) and, per tenant, a list of its key ids
 * in creation order. Shared by every API process, and what `npm run keys` writes to. Its
 * findCounting counts in the counters createRedisRequestCounter keeps (same prefix, same keys).
 */
export function createRedisKeyStore(options: RedisKeyStoreOptions): KeyStore {
  const connection = redisStoreConnection({ ...options, storeName: 'key store' });
  const { redis, guarded, keyPrefix } = connection;
  const records = `${keyPrefix}:{keys}:records`;
  const tenantOrder = (tenant: string) => `${keyPrefix}:{keys}:tenant:${tenant}`;
  const parse = (json: string | null | undefined) =>
    json === null || json === undefined ? undefined : (JSON.parse(json) as ApiKeyRecord);
  redis.defineCommand('icdFindKeyCounting', { numberOfKeys: 2, lua: FIND_COUNTING_SCRIPT });
  const scripted = redis as unknown as WithFindCounting;

  return {
    async create(record) {
      await guarded(() =>
        redis
          .multi()
          .hset(records, record.id, JSON.stringify(record))
          .rpush(tenantOrder(record.tenant), record.id)
          .exec(),
      );
    },
    async find(id) {
      return parse(await guarded(() => redis.hget(records, id)));
    },
    // The key lookup and the rate count in one round trip (authenticate, then rateLimit).
    async findCounting(id, { tokenHash, roles, windowStartMs, windowMs }) {
      const [json, count] = await guarded(() =>
        scripted.icdFindKeyCounting(
          records,
          rateCounterKey(keyPrefix, id, windowStartMs),
          id,
          tokenHash,
          windowMs * 2,
          ...roles,
        ),
      );
      return { record: parse(json), count };
    },
    async list(tenant) {
      const ids = await guarded(() => redis.lrange(tenantOrder(tenant), 0, -1));
      if (ids.length === 0) return [];
      const jsons = await guarded(() => redis.hmget(records, ...ids));
      return jsons.flatMap((json) => parse(json) ?? []);
    },
    async revoke(tenant, id, at) {
      const revoked = await guarded(
        () => redis.eval(REVOKE_SCRIPT, 1, records, id, tenant, at) as Promise<number>,
      );
      return revoked === 1;
    },
    async activeCount() {
      const all = await guarded(() => redis.hvals(records));
      return all.filter((json) => parse(json)?.revokedAt === undefined).length;
    },
    isReady: connection.isReady,
    close: connection.close,
  };
}
