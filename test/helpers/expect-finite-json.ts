import { expect } from 'vitest';

/**
 * Asserts that a response body is JSON that JSON.parse reads back unchanged and holds no
 * non-finite number token (NaN, Infinity): JSON cannot carry them, so a serializer that let one
 * through would have written a bare token or a null.
 */
export function expectFiniteJson(text: string): void {
  // Outside strings, NaN and Infinity can only appear as bare tokens.
  const withoutStrings = text.replace(/"(?:[^"\\]|\\.)*"/g, '""');
  expect(withoutStrings).not.toMatch(/\b(?:NaN|Infinity)\b/);
  expect(() => JSON.parse(text)).not.toThrow();
}
