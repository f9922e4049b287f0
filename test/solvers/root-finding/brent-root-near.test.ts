import { describe, expect, it } from 'vitest';
import { brentRootNear } from '../../../solvers/root-finding/brent-root-near.js';

describe('brentRootNear', () => {
  // x² − 2 has its root at √2 (a fact of arithmetic).
  const f = (x: number) => x * x - 2;

  it('finds √2 from a hint next to it, and from none', () => {
    expect(brentRootNear(f, 0, 2, Math.SQRT2 + 1e-7)).toBeCloseTo(Math.SQRT2, 12);
    expect(brentRootNear(f, 0, 2, undefined)).toBeCloseTo(Math.SQRT2, 12);
  });

  it('falls back to the whole interval when the hint is far off or outside it', () => {
    expect(brentRootNear(f, 0, 2, 0.5)).toBeCloseTo(Math.SQRT2, 12);
    expect(brentRootNear(f, 0, 2, 5)).toBeCloseTo(Math.SQRT2, 12);
  });

  it('evaluates only near the hint when the root is there', () => {
    const seen: number[] = [];
    brentRootNear((x) => (seen.push(x), f(x)), 0, 2, Math.SQRT2, { relativeSpan: 1e-3 });
    expect(Math.min(...seen)).toBeGreaterThanOrEqual(Math.SQRT2 - 2e-3);
  });

  it('is NaN when the interval brackets no root', () => {
    expect(brentRootNear(f, 2, 3, 2.5)).toBeNaN();
  });
});
