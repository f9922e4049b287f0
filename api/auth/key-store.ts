import type { Role } from './api-key.js';

/** A key as stored: never its token, only the token's hash. */
export interface ApiKeyRecord {
  /** The public part of the token (16 hex digits). */
  id: string;
  tenant: string;
  role: Role;
  /** What the key is for, as its creator wrote it. */
  label: string;
  /** SHA-256 of the token, hex. */
  hash: string;
  /** ISO 8601. */
  createdAt: string;
  /** ISO 8601; a revoked key authenticates nothing. */
  revokedAt?: string;
}

/**
 * One request to count as a key is found (KeyStore.findCounting): counted only when the key
 * exists, is not revoked, has `tokenHash` as its hash and holds one of `roles`, which is exactly
 * when authentication lets the request through to the rate limit.
 */
export interface KeyRequestCount {
  /** SHA-256 of the token the request presented, hex (keyHash). */
  tokenHash: string;
  /** The roles that allow the request's operation. */
  roles: readonly Role[];
  /** Start of the rate window the request falls in, ms since the epoch. */
  windowStartMs: number;
  /** Length of the rate window, ms. */
  windowMs: number;
}

/**
 * Where API keys live. Every method rejects with StoreUnavailableError when the backing store
 * cannot be reached.
 */
export interface KeyStore {
  create(record: ApiKeyRecord): Promise<void>;
  /** The key with this id, revoked or not; undefined when there is none. */
  find(id: string): Promise<ApiKeyRecord | undefined>;
  /**
   * find(id), and in the same step on the server one request of the key counted in its rate
   * window (see KeyRequestCount): `count` is the window's count with it, or undefined when the
   * request was not counted. Optional: a store that shares its server with the request counter
   * offers it to save a round trip a request; the count is the one RequestCounter.increment
   * keeps (rateCounterKey).
   */
  findCounting?(
    id: string,
    request: KeyRequestCount,
  ): Promise<{ record: ApiKeyRecord | undefined; count: number | undefined }>;
  /** The tenant's keys in creation order, revoked ones included. */
  list(tenant: string): Promise<ApiKeyRecord[]>;
  /** Marks the tenant's key revoked; false when the tenant has no key with that id. */
  revoke(tenant: string, id: string, at: string): Promise<boolean>;
  /** Number of keys not revoked, over every tenant (start-up checks whether any exists). */
  activeCount(): Promise<number>;
  isReady(): Promise<boolean>;
  close(): Promise<void>;
}
