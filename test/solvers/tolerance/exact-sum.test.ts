import { describe, expect, it } from 'vitest';
import { addExact, exactValue, mergeExact } from '../../../solvers/tolerance/exact-sum.js';

const sumOf = (values: readonly number[]) => {
  const partials: number[] = [];
  for (const value of values) addExact(partials, value);
  return partials;
};

describe('exact summation', () => {
  it('sums ten 0.1 to exactly 1', () => {
    // ref: Python documentation, math.fsum: fsum([.1] * 10) == 1.0 where sum() gives 0.9999999999999999.
    expect(exactValue(sumOf(Array.from({ length: 10 }, () => 0.1)))).toBe(1);
  });

  it('keeps what cancellation would lose', () => {
    // ref: exact arithmetic: 1e100 + 1 − 1e100 = 1 (Python's fsum example of the same kind).
    expect(exactValue(sumOf([1e100, 1, -1e100]))).toBe(1);
  });

  it('gives the same bits whatever the order and grouping', () => {
    const values = Array.from({ length: 1000 }, (_, i) => Math.sin(i) * 10 ** ((i % 17) - 8));
    const whole = exactValue(sumOf(values));
    const reversed = exactValue(sumOf([...values].reverse()));
    const grouped = sumOf(values.slice(0, 333));
    mergeExact(grouped, sumOf(values.slice(333, 334)));
    mergeExact(grouped, sumOf(values.slice(334)));
    expect(reversed).toBe(whole);
    expect(exactValue(grouped)).toBe(whole);
  });

  it('refuses a non-finite value', () => {
    expect(() => addExact([], Number.NaN)).toThrow(RangeError);
  });
});
