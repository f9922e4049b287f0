import { redisStoreConnection, type RedisStoreOptions } from '../stores/redis-store-connection.js';
import type { ApiKeyRecord, KeyStore } from './key-store.js';

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
 * A KeyStore on Redis: one hash of records (id → JSON) and, per tenant, a list of its key ids
 * in creation order. Shared by every API process, and what `npm run keys` writes to.
 */
export function createRedisKeyStore(options: RedisKeyStoreOptions): KeyStore {
  const connection = redisStoreConnection({ ...options, storeName: 'key store' });
  const { redis, guarded, keyPrefix } = connection;
  const records = `${keyPrefix}:{keys}:records`;
  const tenantOrder = (tenant: string) => `${keyPrefix}:{keys}:tenant:${tenant}`;
  const parse = (json: string | null) =>
    json === null ? undefined : (JSON.parse(json) as ApiKeyRecord);

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
