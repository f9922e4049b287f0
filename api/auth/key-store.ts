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
 * Where API keys live. Every method rejects with StoreUnavailableError when the backing store
 * cannot be reached.
 */
export interface KeyStore {
  create(record: ApiKeyRecord): Promise<void>;
  /** The key with this id, revoked or not; undefined when there is none. */
  find(id: string): Promise<ApiKeyRecord | undefined>;
  /** The tenant's keys in creation order, revoked ones included. */
  list(tenant: string): Promise<ApiKeyRecord[]>;
  /** Marks the tenant's key revoked; false when the tenant has no key with that id. */
  revoke(tenant: string, id: string, at: string): Promise<boolean>;
  /** Number of keys not revoked, over every tenant (start-up checks whether any exists). */
  activeCount(): Promise<number>;
  isReady(): Promise<boolean>;
  close(): Promise<void>;
}
