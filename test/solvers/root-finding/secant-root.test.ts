import { describe, expect, it } from 'vitest';
import { secantRoot } from '../../../solvers/root-finding/secant-root.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('secantRoot', () => {
  it('secantRoot(x² − 2) converges to √2 from two guesses', () => {
    // ref: common practice (√2 = 1.41421356237…)
    expectClose(
      secantRoot((x) => x * x - 2, 1, 2, 0, 3),
      Math.SQRT2,
      { abs: 1e-12 },
    );
  });

  it('secantRoot(a line) lands on its root in one step', () => {
    // ref: common practice, the secant through two points of a line meets its root exactly
    expectClose(
      secantRoot((x) => 3 * x - 1, 0, 1, -1, 1),
      1 / 3,
      { abs: 1e-15 },
    );
  });

  it('secantRoot returns NaN when a step leaves [lo, hi] or f is flat', () => {
    expect(secantRoot((x) => x - 5, 0, 1, 0, 2)).toBeNaN();
    expect(secantRoot(() => 1, 0, 1, 0, 2)).toBeNaN();
  });

  it('secantRoot(x² − 2) with f(x0) given converges to √2 without evaluating f at x0', () => {
    // ref: common practice (√2 = 1.41421356237…)
    const tried: number[] = [];
    const f = (x: number) => {
      tried.push(x);
      return x * x - 2;
    };
    expectClose(secantRoot(f, 1, 2, 0, 3, { valueAtX0: -1 }), Math.SQRT2, { abs: 1e-12 });
    expect(tried).not.toContain(1);
  });
});
