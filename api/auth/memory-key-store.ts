import type { ApiKeyRecord, KeyStore } from './key-store.js';

/** A KeyStore in this process's memory (the embedded backend); nothing survives the process. */
export function createMemoryKeyStore(): KeyStore {
  const records = new Map<string, ApiKeyRecord>();
  return {
    async create(record) {
      records.set(record.id, { ...record });
    },
    async find(id) {
      const record = records.get(id);
      return record && { ...record };
    },
    async list(tenant) {
      return [...records.values()].filter((r) => r.tenant === tenant).map((r) => ({ ...r }));
    },
    async revoke(tenant, id, at) {
      const record = records.get(id);
      if (record?.tenant !== tenant) return false;
      record.revokedAt ??= at;
      return true;
    },
    async activeCount() {
      return [...records.values()].filter((record) => record.revokedAt === undefined).length;
    },
    async isReady() {
      return true;
    },
    async close() {},
  };
}
