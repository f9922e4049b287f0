import { materialNameKey, type MaterialStore, type UserMaterialRecord } from './material-store.js';

/**
 * A MaterialStore in this process's memory: the embedded default when no REDIS_URL is set.
 * Records are kept as JSON text, as the Redis store keeps them, so reads return the same values
 * from both and no caller can change a stored record.
 */
export function createMemoryMaterialStore(): MaterialStore {
  // Keyed by tenant and id (or name): another tenant's material simply is not there.
  const records = new Map<string, string>();
  const idsByName = new Map<string, string>();
  const key = (tenant: string, part: string) => `${tenant}\u0000${part}`;
  let isClosed = false;

  const read = (tenant: string, id: string) => {
    const json = records.get(key(tenant, id));
    return json === undefined ? undefined : (JSON.parse(json) as UserMaterialRecord);
  };

  return {
    async create(tenant, content) {
      const nameKey = key(tenant, materialNameKey(content.name));
      if (idsByName.has(nameKey)) return 'name-taken';
      const record = { id: crypto.randomUUID(), ...content };
      idsByName.set(nameKey, record.id);
      records.set(key(tenant, record.id), JSON.stringify(record));
      return record;
    },
    async get(tenant, id) {
      return read(tenant, id);
    },
    async list(tenant) {
      // A Map iterates in insertion order: the order of creation.
      const prefix = key(tenant, '');
      return [...records.entries()].flatMap(([stored, json]) =>
        stored.startsWith(prefix) ? [JSON.parse(json) as UserMaterialRecord] : [],
      );
    },
    async isReady() {
      return !isClosed;
    },
    async close() {
      isClosed = true;
    },
  };
}
