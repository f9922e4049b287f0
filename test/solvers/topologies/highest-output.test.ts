import { describe, expect, it } from 'vitest';
import { highestOutputV } from '../../../solvers/topologies/highest-output.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('highestOutputV', () => {
  it('highestOutputV(a hump) finds its top between the grid points', () => {
    // ref: calculus, d/dn (a/n − b/n²) = 0 at n = 2b/a, where a/n − b/n² = a²/(4b): the shape of
    // Vo(n) behind a resistance (the maximum power transfer theorem); a = 8.1, b = 2.025 puts
    // the top at n = 0.5 with 8.1, a grid point of [0.3, 0.7].
    const top = highestOutputV((n) => 8.1 / n - 2.025 / (n * n), 0.3, 0.7);
    expectClose(top, (8.1 * 8.1) / (4 * 2.025), { rel: 1e-9 });
    // The same with the top between grid points (0.52 against a step of 0.02 from 0.31).
    const shifted = highestOutputV((n) => 8.1 / n - (8.1 * 0.26) / (n * n), 0.31, 0.71);
    expectClose(shifted, (8.1 * 8.1) / (4 * 8.1 * 0.26), { rel: 1e-9 });
  });

  it('highestOutputV takes a range end when the values only fall, and skips NaN', () => {
    expectClose(
      highestOutputV((n) => 1 / n, 0.5, 1),
      2,
      { rel: 0 },
    );
    expectClose(
      highestOutputV((n) => (n < 0.6 ? NaN : 1 / n), 0.5, 1),
      1 / 0.6,
      { rel: 1e-9 },
    );
    expect(highestOutputV(() => NaN, 0.5, 1)).toBeNaN();
  });
});
