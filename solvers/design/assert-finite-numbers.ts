/**
 * Throws an Error naming the path of the first number in `value` that is NaN or ±Infinity,
 * walking objects and arrays depth first. A non-finite number in a result is a bug, never data.
 */
export function assertFiniteNumbers(value: unknown, path = '$'): void {
  // The allocation-free walk runs on every result; the path is built only for a failure.
  if (isAllFinite(value)) return;
  throw new Error(`non-finite number at ${firstNonFinitePath(value, path)}`);
}

function isAllFinite(value: unknown): boolean {
  if (typeof value === 'number') return Number.isFinite(value);
  if (Array.isArray(value)) {
    // Numbers are checked in place: a design is mostly arrays of numbers (waveforms), and a
    // call per number was most of the walk.
    for (let i = 0; i < value.length; i++) {
      const item: unknown = value[i];
      if (typeof item === 'number') {
        if (!Number.isFinite(item)) return false;
      } else if (!isAllFinite(item)) return false;
    }
    return true;
  }
  if (value !== null && typeof value === 'object') {
    const record = value as Record<string, unknown>;
    for (const key in record) {
      const item = record[key];
      if (typeof item === 'number') {
        if (!Number.isFinite(item)) return false;
      } else if (!isAllFinite(item)) return false;
    }
  }
  return true;
}

function firstNonFinitePath(value: unknown, path: string): string | undefined {
  if (typeof value === 'number') return Number.isFinite(value) ? undefined : `${path} (${value})`;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const found = firstNonFinitePath(value[i], `${path}[${i}]`);
      if (found !== undefined) return found;
    }
    return undefined;
  }
  if (value !== null && typeof value === 'object') {
    for (const [key, item] of Object.entries(value)) {
      const found = firstNonFinitePath(item, `${path}.${key}`);
      if (found !== undefined) return found;
    }
  }
  return undefined;
}
