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
    // A design is mostly arrays of numbers (waveforms): those get a loop of their own, which the
    // engine compiles for arrays of doubles, reading each without boxing it. One loop for every
    // kind of array read most of them as boxed values and was most of the walk.
    return typeof value[0] === 'number' ? areFiniteNumbers(value) : areAllFinite(value);
  }
  if (value !== null && typeof value === 'object') {
    const record = value as Record<string, unknown>;
    for (const key in record) {
      const item = record[key];
      if (typeof item === 'number') {
        if (!Number.isFinite(item)) return false;
      } else if (typeof item !== 'object' || item === null) {
        // A string, boolean or undefined field: nothing to walk.
      } else if ((key === 'timesS' || key === 'values') && Array.isArray(item)) {
        if (!areFiniteColumn(item)) return false;
      } else if (!isAllFinite(item)) return false;
    }
  }
  return true;
}

/**
 * `isAllFinite` of a waveform's column (`timesS` or `values`). Most of a design's numbers are in
 * these, and they are arrays of doubles: a loop of their own sees (almost) only that elements
 * kind and reads each number unboxed, where the shared loop below, fed arrays of every kind,
 * boxed each (about four fifths of the walk's time in a half-bridge design). No branch per
 * number: each adds x − x to a sum, which is +0 for every finite x and NaN for NaN and
 * ±Infinity (and a NaN stays in the sum), so the sums stay 0 exactly when every number is
 * finite; two sums, for the even and the odd items, so that each addition need not wait for the
 * one before. An item that is not a number is walked as any other value.
 */
function areFiniteColumn(values: readonly unknown[]): boolean {
  let even = 0;
  let odd = 0;
  const count = values.length;
  let i = 0;
  for (; i + 1 < count; i += 2) {
    const a = values[i];
    const b = values[i + 1];
    if (typeof a === 'number' && typeof b === 'number') {
      even += a - a;
      odd += b - b;
    } else if (!isAllFinite(a) || !isAllFinite(b)) return false;
  }
  if (i < count && !isAllFinite(values[i])) return false;
  return even + odd === 0;
}

/** `isAllFinite` of an array that starts with a number (any later item may be anything). */
function areFiniteNumbers(values: readonly unknown[]): boolean {
  for (let i = 0; i < values.length; i++) {
    const item = values[i];
    if (typeof item === 'number') {
      if (!Number.isFinite(item)) return false;
    } else if (!isAllFinite(item)) return false;
  }
  return true;
}

/**
 * `isAllFinite` of any other array: the same loop, kept apart so that each stays monomorphic.
 * An item that is the very object before it (a bridge rectifier's waveforms, listed once for
 * each of a pair) was walked just now: it is not walked again.
 */
function areAllFinite(values: readonly unknown[]): boolean {
  for (let i = 0; i < values.length; i++) {
    const item = values[i];
    if (typeof item === 'number') {
      if (!Number.isFinite(item)) return false;
    } else if (i > 0 && item === values[i - 1] && typeof item === 'object') {
      continue;
    } else if (!isAllFinite(item)) return false;
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
