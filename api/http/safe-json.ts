import { assertFiniteNumbers } from '../../solvers/index.js';

/**
 * JSON text of a plain value, refusing any number JSON cannot carry: JSON.stringify would turn
 * NaN and ±Infinity into null and hide an engine bug, so this throws an Error naming the path.
 * (One allocation-free walk, then a plain stringify: a replacer function is several times slower.)
 */
export function safeJson(value: unknown): string {
  assertFiniteNumbers(value);
  return JSON.stringify(value);
}
