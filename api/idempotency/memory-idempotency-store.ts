import {
  beginOutcome,
  type IdempotencyRecord,
  type IdempotencyStore,
} from './idempotency-store.js';

interface Entry {
  record: IdempotencyRecord;
  expiresAtMs: number;
}

/**
 * An IdempotencyStore in this process's memory (the embedded backend): entries expire lazily
 * when read, and the oldest are dropped beyond `maxEntries`. Nothing survives the process.
 */
export function createMemoryIdempotencyStore(
  options: { maxEntries?: number; now?: () => number } = {},
): IdempotencyStore {
  const { maxEntries = 100_000, now = Date.now } = options;
  const entries = new Map<string, Entry>();

  const live = (key: string): Entry | undefined => {
    const entry = entries.get(key);
    if (entry === undefined) return undefined;
    if (entry.expiresAtMs > now()) return entry;
    entries.delete(key);
    return undefined;
  };
  const put = (key: string, record: IdempotencyRecord, ttlMs: number) => {
    entries.delete(key); // re-inserted last: Map order is the eviction order
    entries.set(key, { record, expiresAtMs: now() + ttlMs });
    for (const oldest of entries.keys()) {
      if (entries.size <= maxEntries) break;
      entries.delete(oldest);
    }
  };

  return {
    async begin(key, fingerprint, claimTtlMs) {
      const existing = live(key);
      if (existing !== undefined) return beginOutcome(existing.record, fingerprint);
      put(key, { fingerprint }, claimTtlMs);
      return { kind: 'claimed' };
    },
    async complete(key, fingerprint, response, ttlMs) {
      put(key, { fingerprint, response }, ttlMs);
    },
    async release(key, fingerprint) {
      const record = live(key)?.record;
      if (record?.fingerprint === fingerprint && record.response === undefined) entries.delete(key);
    },
    async isReady() {
      return true;
    },
    async close() {
      entries.clear();
    },
  };
}
