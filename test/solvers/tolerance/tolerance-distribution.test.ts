import { describe, expect, it } from 'vitest';
import {
  addToHistogram,
  deviationBin,
  histogramPercentile,
  mergeHistograms,
  type DeviationHistogram,
} from '../../../solvers/tolerance/deviation-histogram.js';
import { sampleStream } from '../../../solvers/tolerance/random-stream.js';
import { distributionEnds, drawValue } from '../../../solvers/tolerance/tolerance-distribution.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('distributions', () => {
  it('put the band ends where their definitions say', () => {
    // ref: definitions: relative x is value = nominal·(1 + x); a normal's worst case is ±3σ.
    expect(
      distributionEnds({ kind: 'uniform', scale: 'relative', lower: -0.1, upper: 0.2 }, 50),
    ).toEqual({
      lower: 45,
      upper: 60,
    });
    expect(distributionEnds({ kind: 'band', scale: 'absolute', lower: 36, upper: 72 }, 48)).toEqual(
      {
        lower: 36,
        upper: 72,
      },
    );
    const normal = distributionEnds({ kind: 'normal', scale: 'relative', sigma: 0.02 }, 100);
    expectClose(normal.lower, 94, { rel: 1e-12 });
    expectClose(normal.upper, 106, { rel: 1e-12 });
    expect(distributionEnds({ kind: 'fixed', value: 3 }, 1)).toEqual({ lower: 3, upper: 3 });
    expect(distributionEnds({ kind: 'fixed' }, 1)).toEqual({ lower: 1, upper: 1 });
  });

  it('draw uniform values over their band with its mean', () => {
    const source = sampleStream(3, 0, 0);
    const n = 20_000;
    let sum = 0;
    let lowest = Infinity;
    let highest = -Infinity;
    for (let i = 0; i < n; i++) {
      const v = drawValue({ kind: 'uniform', scale: 'absolute', lower: 36, upper: 72 }, 48, source);
      sum += v;
      lowest = Math.min(lowest, v);
      highest = Math.max(highest, v);
    }
    // ref: uniform on [a, b]: mean (a + b)/2, standard deviation (b − a)/√12.
    expect(lowest).toBeGreaterThanOrEqual(36);
    expect(highest).toBeLessThan(72);
    expect(Math.abs(sum / n - 54)).toBeLessThan((4 * 36) / Math.sqrt(12 * n));
  });

  it('draw normal values about the nominal within the truncation', () => {
    const source = sampleStream(3, 1, 0);
    let widest = 0;
    for (let i = 0; i < 5000; i++) {
      const v = drawValue({ kind: 'normal', scale: 'relative', sigma: 0.05 }, 10, source);
      widest = Math.max(widest, Math.abs(v - 10));
    }
    // 3σ = 1.5; 5000 draws reach past 2.5σ (P(|Z| > 2.5) ≈ 1.2 %, standard normal tables).
    expect(widest).toBeLessThanOrEqual(1.5 + 1e-12);
    expect(widest).toBeGreaterThan(1.25);
  });
});

describe('the deviation histogram', () => {
  it('bins by the relative deviation, 20 bins per decade, signed', () => {
    expect(deviationBin(100, 100)).toBe(0);
    // |d| = 1e-9 starts bin 1; a decade up is 20 bins further.
    expect(deviationBin(100 + 100 * 1.0000001e-9, 100)).toBe(1);
    expect(deviationBin(100 + 100 * 1.0000001e-8, 100)).toBe(21);
    expect(deviationBin(100 - 100 * 1.0000001e-8, 100)).toBe(-21);
  });

  it('reads percentiles within a bin of the exact nearest-rank value, whatever the grouping', () => {
    const values = Array.from({ length: 1000 }, (_, i) => 100 + 10 * Math.sin(i * 0.7));
    const sorted = [...values].sort((a, b) => a - b);
    const min = sorted[0] as number;
    const max = sorted.at(-1) as number;
    const whole: DeviationHistogram = {};
    for (const v of values) addToHistogram(whole, v, 100);
    const first: DeviationHistogram = {};
    const second: DeviationHistogram = {};
    values.slice(0, 400).forEach((v) => addToHistogram(first, v, 100));
    values.slice(400).forEach((v) => addToHistogram(second, v, 100));
    mergeHistograms(first, second);
    for (const p of [0.01, 0.5, 0.99]) {
      // ref: nearest-rank definition, the ⌈p·n⌉-th smallest value.
      const exact = sorted[Math.ceil(p * values.length) - 1] as number;
      const read = histogramPercentile(whole, p, 100, min, max) ?? NaN;
      // One bin spans a factor 10^(1/20) ≈ 1.122 in the deviation: within 12 % of it.
      expect(Math.abs(read - exact)).toBeLessThanOrEqual(0.13 * Math.abs(exact - 100) + 1e-9);
      expect(histogramPercentile(first, p, 100, min, max)).toBe(read);
    }
  });

  it('has no percentile when empty', () => {
    expect(histogramPercentile({}, 0.5, 1, 0, 2)).toBeUndefined();
  });
});
