/**
 * JSON text of a plain value, refusing any number JSON cannot carry: JSON.stringify would turn
 * NaN and ±Infinity into null and hide an engine bug, so this throws a RangeError instead.
 */
export function safeJson(value: unknown): string {
  return JSON.stringify(value, (key, item: unknown) => {
    if (typeof item === 'number' && !Number.isFinite(item)) {
      throw new RangeError(`non-finite number ${item} at key ${JSON.stringify(key)}`);
    }
    return item;
  });
}
