import { describe, expect, it } from 'vitest';
import { brentRoot } from '../../../solvers/root-finding/brent-root.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('brentRoot', () => {
  it('brentRoot(x² − 2, 0, 2) returns √2 to the tolerance', () => {
    // ref: common practice, √2 = 1.4142135623730951 (IEEE 754 double)
    expectClose(
      brentRoot((x) => x * x - 2, 0, 2),
      Math.SQRT2,
      { abs: 1e-12 },
    );
  });

  it('brentRoot(cos x − x, 0, 1) returns the Dottie number', () => {
    // ref: common practice, the fixed point of cos, 0.739085133215160641655 (from memory)
    expectClose(
      brentRoot((x) => Math.cos(x) - x, 0, 1),
      0.7390851332151607,
      { abs: 1e-12 },
    );
  });

  it('brentRoot returns NaN when the ends do not bracket a root', () => {
    // ref: common practice, a bracketing method needs a sign change
    expect(brentRoot((x) => x * x + 1, -1, 1)).toBeNaN();
  });

  it("brentRoot(cos x − x) with the ends' values given returns the Dottie number without evaluating the ends", () => {
    // ref: common practice, the fixed point of cos, 0.739085133215160641655 (from memory)
    const tried: number[] = [];
    const f = (x: number) => {
      tried.push(x);
      return Math.cos(x) - x;
    };
    const root = brentRoot(f, 0, 1, { valueAtLo: 1, valueAtHi: Math.cos(1) - 1 });
    expectClose(root, 0.7390851332151607, { abs: 1e-12 });
    expect(tried).not.toContain(0);
    expect(tried).not.toContain(1);
  });
});
