import { keyHash, keyIdOf } from './api-key.js';
import { createKey } from './create-key.js';
import type { KeyStore } from './key-store.js';

/** The tenant of the embedded backend's one key. */
export const LOCAL_TENANT = 'local';

/**
 * The embedded backend's key: LOCAL_API_KEY when given (so scripts can keep one), else a new one.
 * Admin of tenant 'local'. Returns the token and whether it was made now (then it must be shown).
 */
export async function localKey(
  keys: KeyStore,
  given: string | undefined,
): Promise<{ token: string; isNew: boolean }> {
  const id = given === undefined ? undefined : keyIdOf(given);
  if (given !== undefined && id !== undefined) {
    await keys.create({
      id,
      tenant: LOCAL_TENANT,
      role: 'admin',
      label: 'local key (LOCAL_API_KEY)',
      hash: keyHash(given),
      createdAt: new Date().toISOString(),
    });
    return { token: given, isNew: false };
  }
  const created = await createKey(keys, {
    tenant: LOCAL_TENANT,
    role: 'admin',
    label: 'local key made at start-up',
  });
  return { token: created.token, isNew: true };
}
