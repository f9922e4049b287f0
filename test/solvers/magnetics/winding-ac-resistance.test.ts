import { describe, expect, it } from 'vitest';
import { dowellFactor } from '../../../solvers/magnetics/dowell-factor.js';
import { equivalentFoilLayer } from '../../../solvers/magnetics/equivalent-foil-layer.js';
import { skinDepth } from '../../../solvers/magnetics/skin-depth.js';
import { dowellKernels } from '../../../solvers/magnetics/dowell-kernels.js';
import {
  currentSpectrum,
  windingAcResistance,
} from '../../../solvers/magnetics/winding-ac-resistance.js';
import type { WindingPortion } from '../../../solvers/magnetics/winding-portion.js';
import { average } from '../../../solvers/waveform/average.js';
import { harmonics } from '../../../solvers/waveform/harmonics.js';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { rms } from '../../../solvers/waveform/rms.js';
import { expectClose } from '../../helpers/expect-close.js';

// Invented scenario: 100 kHz, three layers of 12 turns of 0.5 mm wire on a 10 mm breadth.
const T = 1e-5;
const PORTION: WindingPortion = {
  layerCount: 3,
  turnsPerLayer: 12,
  breadthM: 10e-3,
  conductor: { kind: 'round', bareDiameterM: 0.5e-3 },
};
const RDC_OHM = 0.05;

function factorAt(frequencyHz: number, portion: WindingPortion): number {
  const foil = equivalentFoilLayer(portion);
  const delta = (foil.thicknessM / skinDepth(frequencyHz)) * Math.sqrt(foil.porosity);
  return dowellFactor(delta, foil.layerCount);
}

/** A trapezoid: rise, flat top, fall, zero, each edge 2 % of the period (invented). */
const trapezoid = piecewiseLinear(T, [
  [0, 0],
  [0.02 * T, 3],
  [0.4 * T, 3],
  [0.42 * T, 0],
  [T, 0],
]);

describe('windingAcResistance', () => {
  it('windingAcResistance(DC current) is Rdc·I² with no AC loss', () => {
    const loss = windingAcResistance(
      piecewiseLinear(T, [
        [0, 2.5],
        [T, 2.5],
      ]),
      PORTION,
      RDC_OHM,
    );
    // ref: common practice, Joule's law P = R·I² for direct current
    expectClose(loss.totalLossW, RDC_OHM * 6.25, { rel: 1e-14 });
    expectClose(loss.acLossW, 0, { abs: 1e-15 });
    expectClose(loss.effectiveResistanceOhm, RDC_OHM, { rel: 1e-14 });
  });

  it('windingAcResistance(sinusoid) is Fr(f)·Rdc·I_rms²', () => {
    const points: [number, number][] = [];
    const steps = 4000;
    for (let i = 0; i <= steps; i++)
      points.push([(i / steps) * T, 2 * Math.sin((2 * Math.PI * i) / steps)]);
    const loss = windingAcResistance(piecewiseLinear(T, points), PORTION, RDC_OHM);
    // ref: Dowell, Proc. IEE, 1966: for a sinusoid P = Fr·Rdc·I_rms²; the 4000-segment polygon
    // misses the sine's mean square by ~1e-7 and adds harmonics near order 4000 of ~1e-7
    expectClose(loss.totalLossW, factorAt(1 / T, PORTION) * RDC_OHM * 2, { rel: 1e-5 });
    expectClose(loss.dcLossW, 0, { abs: 1e-15 });
  });

  it('windingAcResistance approaches Rdc·I_rms² (Parseval) when Fr ≈ 1 at every harmonic', () => {
    // Invented: fine 0.05 mm wire at 1 kHz, so Δ stays small up to order 1000.
    const slow = piecewiseLinear(1e-3, [
      [0, 1],
      [0.02e-3, 3],
      [0.4e-3, 3],
      [0.42e-3, 1],
      [1e-3, 1],
    ]);
    const fine: WindingPortion = {
      ...PORTION,
      conductor: { kind: 'round', bareDiameterM: 0.05e-3 },
    };
    const loss = windingAcResistance(slow, fine, RDC_OHM);
    // ref: Parseval's theorem, I_rms² = I_dc² + Σ I_n,rms²
    expectClose(loss.totalLossW, RDC_OHM * rms(slow) ** 2, { rel: 1e-6 });
    expectClose(loss.dcLossW, RDC_OHM * average(slow) ** 2, { rel: 1e-14 });
  });

  it('windingAcResistance(trapezoid) matches a 20000-harmonic sum within its tail tolerance', () => {
    let weighted = 0;
    let summed = 0;
    for (const h of harmonics(trapezoid, 20000)) {
      weighted += (factorAt(h.frequencyHz, PORTION) * h.amplitude ** 2) / 2;
      summed += h.amplitude ** 2 / 2;
    }
    const dc = average(trapezoid);
    // ref: Parseval's theorem: the 20000 harmonics carry the AC mean square to ~1e-9
    expectClose(dc * dc + summed, rms(trapezoid) ** 2, { rel: 1e-8 });
    const loss = windingAcResistance(trapezoid, PORTION, RDC_OHM);
    // ref: Dowell, Proc. IEE, 1966, harmonic by harmonic; for a current without jumps the tail
    // estimate errs high by less than itself, so the sums differ by at most tailLossW
    const bruteW = RDC_OHM * (dc * dc + weighted);
    expectClose(loss.totalLossW, bruteW, { abs: loss.tailLossW + 1e-9 * bruteW });
    expect(loss.totalLossW).toBeGreaterThanOrEqual(bruteW * (1 - 1e-9));
    expect(loss.tailLossW).toBeLessThanOrEqual(0.01 * loss.totalLossW);
    expect(loss.harmonicsUsed).toBeGreaterThanOrEqual(32);
  });

  it('windingAcResistance effective resistance exceeds Rdc and grows with layers', () => {
    const one = windingAcResistance(trapezoid, { ...PORTION, layerCount: 1 }, RDC_OHM);
    const four = windingAcResistance(trapezoid, { ...PORTION, layerCount: 4 }, RDC_OHM);
    // ref: Dowell, Proc. IEE, 1966, Fr ≥ 1 and rising with M through the proximity term
    expect(one.effectiveResistanceOhm).toBeGreaterThan(RDC_OHM);
    expect(four.effectiveResistanceOhm).toBeGreaterThan(one.effectiveResistanceOhm);
    expect(() => windingAcResistance(trapezoid, PORTION, -1)).toThrow(RangeError);
  });

  it('windingAcResistance(pulse with jumps) tail estimate matches a 65536-harmonic sum', () => {
    const pulse = piecewiseLinear(T, [
      [0, 3],
      [0.4 * T, 3],
      [0.4 * T, 0],
      [T, 0],
    ]);
    const loss = windingAcResistance(pulse, PORTION, RDC_OHM);
    const long = windingAcResistance(pulse, PORTION, RDC_OHM, {
      harmonicCount: 65536,
      maxHarmonicCount: 65536,
    });
    // ref: Parseval's theorem with Dowell's factor per harmonic: harmonics of a jump fall as 1/n
    // and Fr as √n, the case the tail weight 1/(1 − q) is exact for; allow 1 % of the tail
    expectClose(loss.totalLossW, long.totalLossW, { abs: 0.01 * loss.tailLossW });
    expect(loss.tailLossW).toBeGreaterThan(0.01 * loss.totalLossW);
  });
  it('windingAcResistance(half-wave-symmetric current) is bit for bit the plain harmonic sum', () => {
    // Invented: ±3 A trapezoid with 2 % edges, so every even harmonic is round-off (~1e-30 of
    // the odd ones) and the sum leaves those orders' Dowell terms out as negligible.
    const bipolar = piecewiseLinear(T, [
      [0, 0],
      [0.02 * T, 3],
      [0.48 * T, 3],
      [0.5 * T, 0],
      [0.52 * T, -3],
      [0.98 * T, -3],
      [T, 0],
    ]);
    // A tight tail tolerance, so the count doubles at least once (the sum goes on from 32).
    const loss = windingAcResistance(bipolar, PORTION, RDC_OHM, { tailTolerance: 1e-4 });
    const count = loss.harmonicsUsed;
    const spectrum = currentSpectrum(bipolar, count);
    expect(spectrum.harmonicSquaresA2[1]).toBeLessThan(1e-25 * spectrum.harmonicSquaresA2[0]!);
    // ref: Dowell, Proc. IEE, 1966, harmonic by harmonic, every order 1…N added in order in
    // IEEE 754 double arithmetic, and windingAcResistance's own Parseval tail for the rest
    const foil = equivalentFoilLayer(PORTION);
    const delta1 = (foil.thicknessM / skinDepth(1 / T)) * Math.sqrt(foil.porosity);
    const w = (2 / 3) * (foil.layerCount * foil.layerCount - 1);
    const factor = (n: number) => {
      const k = dowellKernels(delta1 * Math.sqrt(n));
      return k.skin + w * k.proximity;
    };
    let weighted = 0;
    let summed = 0;
    for (let n = 1; n <= count; n++) {
      const square = spectrum.harmonicSquaresA2[n - 1]!;
      summed += square;
      weighted += factor(n) * square;
    }
    const next = factor(count + 1);
    const q = Math.min(0.5, Math.max(0, Math.log2(factor(2 * (count + 1)) / next)));
    const tail = (1 / (1 - q)) * next * Math.max(0, spectrum.acSquareA2 - summed);
    expect(loss.tailLossW).toBe(RDC_OHM * tail);
    expect(loss.acLossW).toBe(RDC_OHM * weighted + RDC_OHM * tail);
    expect(count).toBeGreaterThan(32);
  });
});
