import { describe, expect, it } from 'vitest';
import { hypotenuse } from '../../../../solvers/topologies/double-ended/hypotenuse.js';

describe('hypotenuse', () => {
  // ref: Pythagorean triples (common practice): 3-4-5 and 5-12-13 are exact in binary floating
  // point, and so is their hypotenuse.
  it('hypotenuse(3, 4) is 5 and hypotenuse(-5, 12) is 13, exactly', () => {
    expect(hypotenuse(3, 4)).toBe(5);
    expect(hypotenuse(-5, 12)).toBe(13);
  });

  // ref: ECMAScript 2023, §21.3.2.18 Math.hypot, as Node's V8 implements it (a general-purpose
  // reference): the same double for every pair, the special values included. Bit equality is
  // the claim here (the engine relies on it to keep its numbers), so toBe/Object.is, not a
  // tolerance.
  it('hypotenuse(a, b) is bit for bit Math.hypot(a, b) over magnitudes 1e-300 to 1e300', () => {
    let seed = 12345;
    const next = () => {
      // A small linear congruential generator (Numerical Recipes' constants): reproducible.
      seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
      return seed / 2 ** 32;
    };
    let mismatches = 0;
    for (let i = 0; i < 200_000; i++) {
      const a = (next() - 0.5) * 10 ** Math.floor(next() * 600 - 300);
      const b = i % 17 === 0 ? a * 1e-9 : (next() - 0.5) * 10 ** Math.floor(next() * 40 - 20);
      if (!Object.is(hypotenuse(a, b), Math.hypot(a, b))) mismatches++;
    }
    expect(mismatches).toBe(0);
    for (const [a, b] of [
      [0, 0],
      [-0, -0],
      [NaN, 1],
      [Infinity, NaN],
      [NaN, -Infinity],
      [1e308, 1e308],
      [5e-324, 5e-324],
    ] as const) {
      expect(Object.is(hypotenuse(a, b), Math.hypot(a, b))).toBe(true);
    }
  });
});
