import { createHash } from 'node:crypto';
import { canonicalJson } from './canonical-json.js';

/**
 * Version of the engine's numbers. Bump it (and add a "numbers changed" entry to CHANGELOG.md)
 * with every change that moves any result.
 */
export const SOLVER_VERSION = '0.31.0';

/** Version of the shape of specs and results. Bump it with every breaking schema change. */
export const SCHEMA_VERSION = '3';

/** The provenance every stored result carries. */
export interface ResultMeta {
  solverVersion: string;
  schemaVersion: string;
  /** SHA-256 of the canonical JSON of the parsed input (defaults applied), hex. */
  inputHash: string;
  /** ISO 8601 creation time. */
  createdAt: string;
}

/**
 * SHA-256 of the canonical JSON (UTF-8) of `input`, as lower-case hex. Computed synchronously by
 * Node's own hash (no thread-pool round trip, unlike Web Crypto's digest); async so that callers
 * need not change if it ever moves off the request path.
 */
export async function inputHash(input: unknown): Promise<string> {
  return createHash('sha256').update(canonicalJson(input), 'utf8').digest('hex');
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
