import { issueKey, type Role } from './api-key.js';
import type { ApiKeyRecord, KeyStore } from './key-store.js';

/** A key just made: its record (as stored) and its token, which exists nowhere else. */
export interface CreatedKey {
  record: ApiKeyRecord;
  token: string;
}

/** Makes a key for `tenant` with `role`, stores its hash and returns the token once. */
export async function createKey(
  keys: KeyStore,
  options: { tenant: string; role: Role; label: string; now?: Date },
): Promise<CreatedKey> {
  const { token, id, hash } = issueKey();
  const record: ApiKeyRecord = {
    id,
    tenant: options.tenant,
    role: options.role,
    label: options.label,
    hash,
    createdAt: (options.now ?? new Date()).toISOString(),
  };
  await keys.create(record);
  return { record, token };
}

/** A key as listings show it: everything but the hash. */
export function keyView(record: ApiKeyRecord) {
  const { hash: _hash, ...view } = record;
  return { ...view, links: { self: `/v1/admin/keys/${record.id}` } };
}
