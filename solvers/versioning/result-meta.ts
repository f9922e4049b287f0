import { canonicalJson } from './canonical-json.js';

/**
 * Version of the engine's numbers. Bump it (and add a "numbers changed" entry to CHANGELOG.md)
 * with every change that moves any result.
 */
export const SOLVER_VERSION = '0.4.0';

/** Version of the shape of specs and results. Bump it with every breaking schema change. */
export const SCHEMA_VERSION = '2';

/** The provenance every stored result carries. */
export interface ResultMeta {
  solverVersion: string;
  schemaVersion: string;
  /** SHA-256 of the canonical JSON of the parsed input (defaults applied), hex. */
  inputHash: string;
  /** ISO 8601 creation time. */
  createdAt: string;
}

/** SHA-256 of the canonical JSON of `input`, as lower-case hex (Web Crypto, no I/O). */
export async function inputHash(input: unknown): Promise<string> {
  const bytes = new TextEncoder().encode(canonicalJson(input));
  const digest = await crypto.subtle.digest('SHA-256', bytes);
  return Array.from(new Uint8Array(digest), (byte) => byte.toString(16).padStart(2, '0')).join('');
}

/** Builds the provenance of a result computed now from `input`. */
export async function resultMeta(input: unknown, now: Date = new Date()): Promise<ResultMeta> {
  return {
    solverVersion: SOLVER_VERSION,
    schemaVersion: SCHEMA_VERSION,
    inputHash: await inputHash(input),
    createdAt: now.toISOString(),
  };
}
