import { describe, expect, it } from 'vitest';
import {
  slabConductionRise,
  windingHotSpotRisePerWatt,
} from '../../../solvers/magnetics/winding-hot-spot.js';
import { expectClose } from '../../helpers/expect-close.js';

/**
 * Peak rise of a slab with uniform generation q, insulated at x = 0 and held at 0 at x = t,
 * by finite differences on −k·T'' = q (n cells, mirror node at the insulated face, Thomas
 * algorithm): an independent numerical solution of the same boundary-value problem.
 */
function finiteDifferencePeak(q: number, t: number, k: number, n: number): number {
  const h = t / n;
  // Unknowns T0..T(n−1); T(n) = 0. Row 0 (mirror T(−1) = T1): 2T0 − 2T1 = q·h²/k.
  const a = new Array<number>(n).fill(-1);
  const b = new Array<number>(n).fill(2);
  const c = new Array<number>(n).fill(-1);
  const d = new Array<number>(n).fill((q * h * h) / k);
  c[0] = -2;
  for (let i = 1; i < n; i++) {
    const w = (a[i] as number) / (b[i - 1] as number);
    b[i] = (b[i] as number) - w * (c[i - 1] as number);
    d[i] = (d[i] as number) - w * (d[i - 1] as number);
  }
  const x = new Array<number>(n).fill(0);
  x[n - 1] = (d[n - 1] as number) / (b[n - 1] as number);
  for (let i = n - 2; i >= 0; i--) {
    x[i] = ((d[i] as number) - (c[i] as number) * (x[i + 1] as number)) / (b[i] as number);
  }
  return x[0] as number;
}

describe('slabConductionRise', () => {
  it('slabConductionRise(q, t, k) is q·t²/(2k), e.g. 25 K for 1 MW/m³, 5 mm, 0.5 W/(m·K)', () => {
    // ref: Incropera, DeWitt et al., Fundamentals of Heat and Mass Transfer, plane wall with
    // uniform generation, T(0) − Ts = q·L²/(2k) at the adiabatic plane (from memory);
    // by hand 1e6·(5e-3)²/(2·0.5) = 25 K
    expectClose(slabConductionRise(1e6, 5e-3, 0.5), 25, { rel: 1e-12 });
  });

  it('slabConductionRise agrees with a finite-difference solution of −k·T″ = q', () => {
    // ref: Incropera, DeWitt et al., Fundamentals of Heat and Mass Transfer, ch. 3, the heat
    // equation with generation (from memory); the second-order difference scheme is exact
    // for a quadratic profile, so only round-off separates the two
    for (const [q, t, k] of [
      [2e5, 3e-3, 0.4],
      [5e6, 1e-3, 1.2],
    ] as const) {
      expectClose(slabConductionRise(q, t, k), finiteDifferencePeak(q, t, k, 200), {
        rel: 1e-9,
      });
    }
  });

  it('slabConductionRise throws RangeError for a zero thickness or conductivity', () => {
    // ref: common practice, a slab needs a thickness and a finite conductivity
    expect(() => slabConductionRise(1e6, 0, 0.4)).toThrow(RangeError);
    expect(() => slabConductionRise(1e6, 1e-3, 0)).toThrow(RangeError);
    expect(() => slabConductionRise(-1, 1e-3, 0.4)).toThrow(RangeError);
  });
});

describe('windingHotSpotRisePerWatt', () => {
  it('windingHotSpotRisePerWatt is t/(2k·MLT·b): 1 W in a 6 × 28 mm build of 82 mm turns', () => {
    // ref: Incropera, DeWitt et al., plane wall with uniform generation (from memory), with
    // q = P/(MLT·b·t); by hand 6e-3/(2·0.4·82e-3·28e-3) = 3.267 K/W
    const perWatt = windingHotSpotRisePerWatt({
      buildM: 6e-3,
      breadthM: 28e-3,
      meanTurnLengthM: 82e-3,
      conductivityWPerMK: 0.4,
    });
    expectClose(perWatt, 3.267, { rel: 1e-3 });
  });
});
