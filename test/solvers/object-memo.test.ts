import { describe, expect, it } from 'vitest';
import { ObjectMemo, withScopedMemos } from '../../solvers/object-memo.js';

// ObjectMemo is bookkeeping, not engine physics: these checks pin down where entries are kept
// (ref: common practice — a memo scoped to one call forgets its entries when the call ends,
// while entries made outside any scope serve every later call).
describe('ObjectMemo', () => {
  it('keeps an entry made in a scope only until the outermost scope ends', () => {
    const memo = new ObjectMemo<object, number>();
    const key = {};
    withScopedMemos(() => {
      memo.set(key, 1);
      expect(withScopedMemos(() => memo.get(key))).toBe(1);
      expect(memo.get(key)).toBe(1);
    });
    expect(memo.get(key)).toBeUndefined();
    expect(withScopedMemos(() => memo.get(key))).toBeUndefined();
  });

  it('serves an entry made outside a scope inside later scopes and after them', () => {
    const memo = new ObjectMemo<object, string>();
    const key = {};
    memo.set(key, 'lasting');
    expect(withScopedMemos(() => memo.get(key))).toBe('lasting');
    expect(memo.get(key)).toBe('lasting');
  });

  it('drops the scope’s entries when the scoped call throws', () => {
    const memo = new ObjectMemo<object, number>();
    const key = {};
    expect(() =>
      withScopedMemos(() => {
        memo.set(key, 2);
        throw new Error('stop');
      }),
    ).toThrow('stop');
    expect(memo.get(key)).toBeUndefined();
    memo.set(key, 3);
    expect(memo.get(key)).toBe(3);
  });
});
