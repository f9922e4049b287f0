import { materialNameKey, type MaterialStore, type UserMaterialRecord } from './material-store.js';

/**
 * A MaterialStore in this process's memory: the embedded default when no REDIS_URL is set.
 * Records are kept as JSON text, as the Redis store keeps them, so reads return the same values
 * from both and no caller can change a stored record.
 */
export function createMemoryMaterialStore(): MaterialStore {
  const records = new Map<string, string>();
  const idsByName = new Map<string, string>();
  let isClosed = false;

  const read = (id: string) => {
    const json = records.get(id);
    return json === undefined ? undefined : (JSON.parse(json) as UserMaterialRecord);
  };

  return {
    async create(content) {
      const key = materialNameKey(content.name);
      if (idsByName.has(key)) return 'name-taken';
      const record = { id: crypto.randomUUID(), ...content };
      idsByName.set(key, record.id);
      records.set(record.id, JSON.stringify(record));
      return record;
    },
    async get(id) {
      return read(id);
    },
    async list() {
      // A Map iterates in insertion order: the order of creation.
      return [...records.keys()].flatMap((id) => read(id) ?? []);
    },
    async isReady() {
      return !isClosed;
    },
    async close() {
      isClosed = true;
    },
  };
}
