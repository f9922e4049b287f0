import { describe, expect, it } from 'vitest';
import { issueKey } from '../../api/auth/api-key.js';
import type { ApiKeyRecord, KeyStore } from '../../api/auth/key-store.js';

function record(tenant: string, role: ApiKeyRecord['role'] = 'design'): ApiKeyRecord {
  const { id, hash } = issueKey();
  return { id, tenant, role, label: 'contract', hash, createdAt: new Date().toISOString() };
}

/** What every KeyStore must do; `fresh` gives an empty store. */
export function keyStoreContract(name: string, fresh: () => Promise<KeyStore>) {
  describe(`${name} keeps the KeyStore contract`, () => {
    it('finds a created key by id; lists keys per tenant in creation order', async () => {
      const store = await fresh();
      const a = record('tenant-a');
      const b = record('tenant-a', 'admin');
      const c = record('tenant-b');
      for (const r of [a, b, c]) await store.create(r);
      expect(await store.find(a.id)).toEqual(a);
      expect(await store.find(issueKey().id)).toBeUndefined();
      expect(await store.list('tenant-a')).toEqual([a, b]);
      expect(await store.list('tenant-b')).toEqual([c]);
      expect(await store.list('tenant-c')).toEqual([]);
      expect(await store.activeCount()).toBe(3);
      await store.close();
    });

    it('revokes only a key of the given tenant, once, and counts it no more', async () => {
      const store = await fresh();
      const a = record('tenant-a');
      await store.create(a);
      expect(await store.revoke('tenant-b', a.id, '2026-12-02T00:00:00.000Z')).toBe(false);
      expect((await store.find(a.id))?.revokedAt).toBeUndefined();
      expect(await store.revoke('tenant-a', a.id, '2026-12-02T00:00:00.000Z')).toBe(true);
      expect(await store.revoke('tenant-a', a.id, '2026-12-03T00:00:00.000Z')).toBe(true);
      expect((await store.find(a.id))?.revokedAt).toBe('2026-12-02T00:00:00.000Z');
      expect(await store.activeCount()).toBe(0);
      await store.close();
    });
  });
}
