import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';

/**
 * What a key may do: 'read' reads (GET); 'design' also evaluates, stores and submits (POST,
 * DELETE of its own jobs); 'admin' also manages its tenant's keys.
 */
export const ROLES = ['read', 'design', 'admin'] as const;
export type Role = (typeof ROLES)[number];

/** True when a key of role `held` may do what `needed` allows. */
export function roleAllows(held: Role, needed: Role): boolean {
  return ROLES.indexOf(held) >= ROLES.indexOf(needed);
}

/** Tenants are named by their callers' administrators: 1–64 letters, digits, `-` and `_`. */
export const TENANT_PATTERN = /^[A-Za-z0-9_-]{1,64}$/;

/**
 * An API key as handed out once: `icd_<id>_<secret>`, where the id (16 hex digits) names the key
 * in listings and logs and the secret (43 base64url characters, 256 random bits) proves it.
 */
const KEY_FORMAT = /^icd_([0-9a-f]{16})_([A-Za-z0-9_-]{43})$/;

/** A freshly made key: the token to hand out once, its public id and the hash to keep. */
export interface IssuedKey {
  token: string;
  id: string;
  hash: string;
}

/**
 * SHA-256 of the whole token, hex. A fast hash is enough for 256-bit random secrets: nothing to
 * guess (a slow password hash protects low-entropy secrets; common practice for API keys).
 */
export function keyHash(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

/** Makes a new key from the system's cryptographic random source. */
export function issueKey(): IssuedKey {
  const id = randomBytes(8).toString('hex');
  const token = `icd_${id}_${randomBytes(32).toString('base64url')}`;
  return { token, id, hash: keyHash(token) };
}

/** The id a well-formed token names, or undefined for anything else. */
export function keyIdOf(token: string): string | undefined {
  return KEY_FORMAT.exec(token)?.[1];
}

/** Compares two hex hashes in constant time (no timing hint of how much matched). */
export function hashesEqual(a: string, b: string): boolean {
  const left = Buffer.from(a, 'hex');
  const right = Buffer.from(b, 'hex');
  return left.length === right.length && timingSafeEqual(left, right);
}
