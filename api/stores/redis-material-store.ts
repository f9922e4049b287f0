import { materialNameKey, type MaterialStore, type UserMaterialRecord } from './material-store.js';
import { redisStoreConnection, type RedisStoreOptions } from './redis-store-connection.js';

/** Options of the store (see RedisStoreOptions). */
export type RedisMaterialStoreOptions = RedisStoreOptions;

/**
 * Claims the name and stores the record in one atomic step (a Lua script runs alone on the
 * server), so of two concurrent creates with one name exactly one wins. KEYS: names hash
 * (name key → id), records hash (id → JSON), order list (ids). Returns 1, or 0 when taken.
 */
const CREATE_SCRIPT = `
if redis.call('HSETNX', KEYS[1], ARGV[1], ARGV[2]) == 0 then return 0 end
redis.call('HSET', KEYS[2], ARGV[2], ARGV[3])
redis.call('RPUSH', KEYS[3], ARGV[2])
return 1
`;

/**
 * A MaterialStore on Redis: per tenant, a hash of names, a hash of records (JSON) and a list of
 * ids in creation order, under one `{materials:<tenant>}` hash tag so they share a cluster slot.
 * Connection failures and timeouts reject with StoreUnavailableError (the API answers 503).
 */
export function createRedisMaterialStore(options: RedisMaterialStoreOptions): MaterialStore {
  const connection = redisStoreConnection({ ...options, storeName: 'material store' });
  const { redis, guarded, keyPrefix } = connection;
  // One set of keys per tenant, under one hash tag per tenant (one cluster slot each).
  const keys = (tenant: string) => ({
    names: `${keyPrefix}:{materials:${tenant}}:names`,
    records: `${keyPrefix}:{materials:${tenant}}:records`,
    order: `${keyPrefix}:{materials:${tenant}}:order`,
  });

  return {
    async create(tenant, content) {
      const { names, records, order } = keys(tenant);
      const record: UserMaterialRecord = { id: crypto.randomUUID(), ...content };
      const created = await guarded(
        () =>
          redis.eval(
            CREATE_SCRIPT,
            3,
            names,
            records,
            order,
            materialNameKey(content.name),
            record.id,
            JSON.stringify(record),
          ) as Promise<number>,
      );
      return created === 1 ? record : 'name-taken';
    },
    async get(tenant, id) {
      const json = await guarded(() => redis.hget(keys(tenant).records, id));
      return json === null ? undefined : (JSON.parse(json) as UserMaterialRecord);
    },
    async list(tenant) {
      const { records, order } = keys(tenant);
      const ids = await guarded(() => redis.lrange(order, 0, -1));
      if (ids.length === 0) return [];
      const jsons = await guarded(() => redis.hmget(records, ...ids));
      return jsons.flatMap((json) =>
        json === null ? [] : [JSON.parse(json) as UserMaterialRecord],
      );
    },
    isReady: connection.isReady,
    close: connection.close,
  };
}
