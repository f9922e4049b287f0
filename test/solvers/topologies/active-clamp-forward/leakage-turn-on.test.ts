import { describe, expect, it } from 'vitest';
import { leakageCurrentAtTurnOn } from '../../../../solvers/topologies/active-clamp-forward/leakage-turn-on.js';
import { expectClose } from '../../../helpers/expect-close.js';

describe('leakageCurrentAtTurnOn', () => {
  // Vin 18 V, Im,v −6 A, 1 µH of leakage: the body diode lets Vin lift the current 18 A/µs.
  const L = 1e-6;

  it('leakageCurrentAtTurnOn(no capacitance) rises from Im,v at Vin/L over the time left', () => {
    // ref: common practice, an inductance across a constant voltage, di/dt = V/L
    expectClose(leakageCurrentAtTurnOn(18, -6, 0, 0, L, 100e-9), -6 + (18 * 100e-9) / L, {
      rel: 1e-12,
    });
  });

  it('leakageCurrentAtTurnOn(long dead time) stops at zero, where the body diode stops', () => {
    expect(leakageCurrentAtTurnOn(18, -6, 0, 0, L, 1e-6)).toBe(0);
    expect(leakageCurrentAtTurnOn(18, -6, 0, 200e-12, L, 1e-6)).toBe(0);
  });

  it('leakageCurrentAtTurnOn(held below zero) stops where the output inductors are all commutated', () => {
    // ΣIv/n 2 A against Im,v −6 A: the current stops at −4 A, the rest of the time is at Vin.
    expect(leakageCurrentAtTurnOn(18, -6, -4, 0, L, 1e-6)).toBe(-4);
  });

  it('leakageCurrentAtTurnOn(200 pF) loses ½·C·Vin² of the leakage energy on the drain’s way down', () => {
    const C = 200e-12;
    const restS = 100e-9;
    // ref: common practice, a lossless L–C exchange conserves energy: ½·L·i1² + ½·C·Vin² = ½·L·Im,v²
    // where the drain reaches zero, after a quarter-wave fraction asin(Vin/(|Im,v|·√(L/C)))·√(LC);
    // then di/dt = Vin/L on the body diode
    const i1 = -Math.sqrt(36 - (C * 18 * 18) / L);
    const dropS = Math.asin(18 / (6 * Math.sqrt(L / C))) * Math.sqrt(L * C);
    expectClose(leakageCurrentAtTurnOn(18, -6, 0, C, L, restS), i1 + (18 * (restS - dropS)) / L, {
      rel: 1e-9,
    });
  });

  it('leakageCurrentAtTurnOn(small leakage) follows the resonance where the drain stays above zero', () => {
    // 10 nH and 200 pF: Z = 7.1 Ω, |Im,v|·Z = 7.1 V < 18 V; an eighth of the resonance.
    const l = 10e-9;
    const C = 200e-12;
    const eighthS = (Math.PI / 4) * Math.sqrt(l * C);
    // ref: common practice, an L–C resonance from current I0 at zero capacitor swing, i = I0·cos ωt
    expectClose(leakageCurrentAtTurnOn(18, -1, 0, C, l, eighthS), -Math.SQRT1_2, { rel: 1e-9 });
  });

  it('leakageCurrentAtTurnOn(no negative current or no time) leaves Im,v as it was', () => {
    expect(leakageCurrentAtTurnOn(18, 0.5, 0, 200e-12, L, 100e-9)).toBe(0.5);
    expect(leakageCurrentAtTurnOn(18, -6, 0, 200e-12, L, -10e-9)).toBe(-6);
  });
});
