import { describe, expect, it } from 'vitest';
import { gapLengthForInductance } from '../../../solvers/magnetics/gap-length-for-inductance.js';
import { MU_0_H_PER_M, gappedInductance } from '../../../solvers/magnetics/gapped-inductance.js';
import { fringingFactor } from '../../../solvers/magnetics/fringing-factor.js';
import { inductanceTolerance } from '../../../solvers/magnetics/inductance-tolerance.js';
import { expectClose } from '../../helpers/expect-close.js';

const core = {
  turns: 20,
  effectiveLengthM: 0.096,
  effectiveAreaM2: 1.88e-4,
  relativePermeability: 2300,
  windowHeightM: 0.0296,
  fringing: 'none',
} as const;

describe('gappedInductance', () => {
  it('gappedInductance(F = 1) is μ0·N²·Ae/(lg + le/μr)', () => {
    // ref: Mohan, Undeland, Robbins, Power Electronics, 3rd ed., ch. 30 (magnetic circuit)
    const expected = (MU_0_H_PER_M * 400 * 1.88e-4) / (1e-3 + 0.096 / 2300);
    expectClose(gappedInductance(core, 1e-3), expected, { rel: 1e-12 });
  });

  it('gappedInductance(gap-dominated core) tends to N²·μ0·Ae/lg', () => {
    // ref: Mohan, Undeland, Robbins, 3rd ed., ch. 30: with μr → ∞ only the gap's reluctance remains
    const stiff = { ...core, relativePermeability: 1e9 };
    expectClose(gappedInductance(stiff, 1e-3), (400 * MU_0_H_PER_M * 1.88e-4) / 1e-3, {
      rel: 1e-6,
    });
  });

  it('gappedInductance with fringing exceeds the value without it', () => {
    // ref: McLyman, Transformer and Inductor Design Handbook, 4th ed., ch. 8: F > 1 raises L
    const withFringing = gappedInductance({ ...core, fringing: 'mclyman' }, 1e-3);
    expect(withFringing).toBeGreaterThan(gappedInductance(core, 1e-3));
  });
});

describe('fringingFactor', () => {
  it('fringingFactor(lg, Ae, G) is 1 + (lg/√Ae)·ln(2G/lg), evaluated by hand', () => {
    // ref: McLyman, 4th ed., ch. 8 (fringing flux factor); lg = 1 mm, √Ae = 13.711 mm,
    // G = 29.6 mm: 1 + 0.072932·ln 59.2 = 1 + 0.072932·4.08092 = 1.29763
    expectClose(fringingFactor(1e-3, 1.88e-4, 0.0296), 1.29763, { rel: 1e-5 });
    // ref: McLyman, 4th ed., ch. 8: no gap, no fringing
    expectClose(fringingFactor(0, 1.88e-4, 0.0296), 1, { abs: 0 });
  });
});

describe('gapLengthForInductance', () => {
  it('gapLengthForInductance(F = 1) equals μ0·N²·Ae/L − le/μr', () => {
    // ref: Mohan, Undeland, Robbins, 3rd ed., ch. 30, the reluctance formula solved for lg
    const result = gapLengthForInductance(core, 100e-6);
    if (!result.ok) throw new Error('no gap');
    expectClose(result.value, (MU_0_H_PER_M * 400 * 1.88e-4) / 100e-6 - 0.096 / 2300, {
      rel: 1e-6,
    });
  });

  it('gapLengthForInductance(McLyman) returns the gap whose inductance is the target', () => {
    // ref: McLyman, 4th ed., ch. 8; the gap found must reproduce the target with the same F
    const fringing = { ...core, fringing: 'mclyman' } as const;
    const result = gapLengthForInductance(fringing, 100e-6);
    if (!result.ok) throw new Error('no gap');
    expectClose(gappedInductance(fringing, result.value), 100e-6, { rel: 1e-6 });
  });

  it('gapLengthForInductance returns an issue when the ungapped core has too little inductance', () => {
    // ref: Mohan, Undeland, Robbins, 3rd ed., ch. 30: a gap only lowers L below N²·μ0·μr·Ae/le
    const result = gapLengthForInductance(core, 1);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.issues[0]?.quantity).toBe('targetInductanceH');
  });
});

describe('inductanceTolerance', () => {
  it('inductanceTolerance(gap-dominated, F = 1) follows the gap one for one', () => {
    // ref: common practice (first-order tolerance): L ∝ 1/lg, so δL/L = δlg/lg
    const stiff = { ...core, relativePermeability: 1e9 };
    const t = inductanceTolerance(stiff, 1e-3, 0.05e-3, 0.25);
    expectClose(t.gapSensitivity, -1, { rel: 1e-6 });
    expectClose(t.permeabilitySensitivity, 0, { abs: 1e-6 });
    expectClose(t.worstCaseTolerance, 0.05, { rel: 1e-5 });
  });

  it('inductanceTolerance sensitivities match finite differences of gappedInductance', () => {
    // ref: common practice (a derivative by central differences, error O(h²))
    const fringing = { ...core, fringing: 'mclyman' } as const;
    const t = inductanceTolerance(fringing, 0.5e-3, 0, 0);
    const h = 1e-4;
    const lnL = (lg: number, mu: number) =>
      Math.log(gappedInductance({ ...fringing, relativePermeability: mu }, lg));
    const dGap = (lnL(0.5e-3 * (1 + h), 2300) - lnL(0.5e-3 * (1 - h), 2300)) / (2 * h);
    const dMu = (lnL(0.5e-3, 2300 * (1 + h)) - lnL(0.5e-3, 2300 * (1 - h))) / (2 * h);
    expectClose(t.gapSensitivity, dGap, { rel: 1e-6 });
    expectClose(t.permeabilitySensitivity, dMu, { rel: 1e-6 });
  });
});
