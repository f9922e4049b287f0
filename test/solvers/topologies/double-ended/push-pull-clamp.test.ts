import { describe, expect, it } from 'vitest';
import { expectClose } from '../../../helpers/expect-close.js';
import {
  pushPullTurnOffSpike,
  pushPullTurnOnRing,
  withTurnOnRingCurrent,
} from '../../../../solvers/topologies/double-ended/push-pull-clamp.js';
import { piecewiseLinear } from '../../../../solvers/waveform/piecewise-linear.js';
import { peak } from '../../../../solvers/waveform/peak.js';

// Invented values: 1 µH of leakage, 100 pF drains, a 36 V rail, a 54 V clamp, 100 kHz; no
// magnetizing current, and a damping of 1000·√(Llk/C) across each leakage (a ring Q of some 1000,
// near the lossless circuit the closed forms below hold for).
const BASE = {
  leakageH: 1e-6,
  turnOffA: 10,
  magnetizingA: 0,
  switchCapacitanceF: 100e-12,
  clampV: 54,
  inputV: 36,
  windingV: 36,
  frequencyHz: 100e3,
  dampingRatio: 1000,
};

describe('pushPullTurnOffSpike', () => {
  it('gives the clamp all of ½·Llk·I² without drain capacitance (the RCD relation with Vr = 0)', () => {
    const spike = pushPullTurnOffSpike({ ...BASE, switchCapacitanceF: 0 });
    // ref: Pressman, Billings, Morey, 3rd ed. (from memory): RCD clamp ½·Llk·I²·fs·Vc/(Vc − Vr),
    // here with the winding held at zero (Vr = 0) and two turn-offs a period
    expectClose(spike.clampW, 1e-6 * 100 * 100e3, { rel: 1e-12 });
    expect(spike.aboveRailV).toBe(54);
    // ref: common practice, the leakage current falls at Vc/Llk while the clamp conducts
    expectClose(spike.holdS, (1e-6 * 10) / 54, { rel: 1e-12 });
  });

  it('splits the energy as a series LC ring does where the winding starts at zero', () => {
    // With Vp = 0 the freewheel holds the winding at zero from the start, and the drain rings
    // with Llk and its own C from 0 through the rail: a² + (Z·i)² is constant about the rail.
    const spike = pushPullTurnOffSpike({ ...BASE, windingV: 0 });
    const z = Math.sqrt(1e-6 / 100e-12);
    const onsetA2 = (36 ** 2 + (z * 10) ** 2 - 54 ** 2) / z ** 2;
    // ref: energy conservation of the series LC ring (common practice): the clamp takes
    // ½·Llk·i² at its onset, twice a period (within 2e-3: the damping's Q of 1000 takes
    // some 1e-3 of it while the clamp conducts)
    expectClose(spike.clampW, 1e-6 * onsetA2 * 100e3, { rel: 2e-3 });
    expectClose(spike.ringW, 100e-12 * 54 ** 2 * 100e3, { rel: 1e-12 });
  });

  it('rises as both drains behind their leakages do while the winding is free', () => {
    // Undamped, with rectifier a carrying the outputs' current, the halves' currents keep
    // their difference (I0 = 1 A) and the winding is half the drains' difference: the drains'
    // difference ramps at I0/C, their sum rings with Llk and C about 2·Vin from its start
    // (va + vb = Vin + Vp = 72 V, the current I0). The drain meets a 20 V clamp, Vin + Vc =
    // 56 V, where (Z·I0·sin ωt + I0·t/C)/2 = 56 V: some 5.8 ns, 0.58 rad of the ring, the
    // winding still some 7 V above zero there.
    const spike = pushPullTurnOffSpike({ ...BASE, turnOffA: 1, clampV: 20 });
    const z = Math.sqrt(1e-6 / 100e-12);
    const w = 1 / Math.sqrt(1e-6 * 100e-12);
    const va = (t: number) => (z * Math.sin(w * t) + t / 100e-12) / 2;
    let lo = 0;
    let hi = 1 / w;
    for (let k = 0; k < 60; k++) {
      const mid = (lo + hi) / 2;
      if (va(mid) < 56) lo = mid;
      else hi = mid;
    }
    // ref: the series LC ring (common practice) in the sum, a constant current into C in the
    // difference (the transformer's ampere-turns, rectifier a conducting), derived here; within
    // 1e-3 (the damping's Q of 1000, and the resistors' share of the currents)
    expectClose(spike.riseS, lo, { rel: 1e-3 });
    expect(spike.aboveRailV).toBe(20);
  });

  it('gives the clamp more than the other drain on the winding did: its leakage lets the winding fall at once', () => {
    // The invented 18–36 V push-pull at 24 V and 10 % load (the netlist test's corner): 0.45 µH,
    // 2.325 A at the turn-off, 0.82 A of it magnetizing, Vp 23.5 V, the stated damping of 10.
    const spike = pushPullTurnOffSpike({
      leakageH: 4.546e-7,
      turnOffA: 2.325,
      magnetizingA: 0.8206,
      switchCapacitanceF: 100e-12,
      clampV: 54,
      inputV: 24,
      windingV: 23.51,
      frequencyHz: 100e3,
      dampingRatio: 10,
    });
    // ref: ngspice (Debian package), that corner's deck at 32 steps a ring, its clamp held at
    // 54 V by a source (a scratch run): 17.60 nC a turn-off (the engine 18.04); the model with the other drain
    // straight on the winding gave 15.9 nC
    expectClose(spike.clampW / (54 * 2 * 100e3), 17.6e-9, { rel: 0.05 });
  });

  it('throws RangeError without leakage, clamp or damping', () => {
    expect(() => pushPullTurnOffSpike({ ...BASE, leakageH: 0 })).toThrow(RangeError);
    expect(() => pushPullTurnOffSpike({ ...BASE, clampV: 0 })).toThrow(RangeError);
    expect(() => pushPullTurnOffSpike({ ...BASE, dampingRatio: 0 })).toThrow(RangeError);
  });
});

// Invented values: two halves of 10 µH leakage, 100 pF drains, Vp = 200 V, 188.6 kHz.
const RING = {
  leakageH: 10e-6,
  switchCapacitanceF: 100e-12,
  windingV: 200,
  startAboveRailV: 0,
  frequencyHz: 188.6e3,
};

describe('pushPullTurnOnRing', () => {
  it('overshoots to 2·Vp above the rail from the freewheel below the clamp (an undamped LC step)', () => {
    const ring = pushPullTurnOnRing({ ...RING, clampV: 600 });
    if (ring === undefined) throw new Error('no ring');
    // ref: common practice, a series LC driven by a step ΔV peaks at 2·ΔV above its start after
    // half a period π·√(LC), its current ΔV/√(L/C) at a quarter; here L = 2·Llk, ΔV = Vp
    expectClose(ring.aboveRailV, 400, { rel: 1e-12 });
    expectClose(ring.currentA, 200 / Math.sqrt(20e-6 / 100e-12), { rel: 1e-12 });
    expectClose(ring.riseS, Math.PI * Math.sqrt(20e-6 * 100e-12), { rel: 1e-12 });
    expect(ring.clampW).toBe(0);
    // ½·C·ΔV² rung away at each of the two turn-ons a period
    expectClose(ring.ringW, 100e-12 * 200 ** 2 * 188.6e3, { rel: 1e-12 });
  });

  it('puts the energy past the clamp into it: ½·L·ic²·Vc/(Vc − Vp), L = 2·Llk', () => {
    const ring = pushPullTurnOnRing({ ...RING, windingV: 400, clampV: 600 });
    if (ring === undefined) throw new Error('no ring');
    expect(ring.aboveRailV).toBe(600);
    // ref: common practice, energy of the LC ring: (Z·ic)² + (Vc − Vp)² = Vp², then the current
    // falls at (Vc − Vp)/L into the clamp, which takes Vc times the charge
    const z = Math.sqrt(20e-6 / 100e-12);
    const ic = Math.sqrt(400 ** 2 - 200 ** 2) / z;
    expectClose(ring.clampW, 600 * ((0.5 * 20e-6 * ic * ic) / 200) * 2 * 188.6e3, { rel: 1e-12 });
    expectClose(ring.holdS, (20e-6 * ic) / 200, { rel: 1e-12 });
  });

  it('gives no ring where the drain starts at its driven level or without capacitance', () => {
    expect(pushPullTurnOnRing({ ...RING, clampV: 600, startAboveRailV: 200 })).toBeUndefined();
    expect(pushPullTurnOnRing({ ...RING, clampV: 600, switchCapacitanceF: 0 })).toBeUndefined();
  });

  it('adds a half sine of the ring current to the driven switch, cut at the turn-off', () => {
    const wave = piecewiseLinear(10e-6, [
      [0, 0],
      [1e-6, 1],
      [4e-6, 1.3],
      [4e-6, 0],
      [10e-6, 0],
    ]);
    const withRing = withTurnOnRingCurrent(wave, 0.5, 1e-6, 0.4e-6, 4e-6);
    // The crest at a quarter period on top of the ramp (1 A plus 0.1 A/µs).
    expectClose(peak(withRing), 1 + 0.1 * 0.2 + 0.5, { rel: 1e-9 });
    const cut = withTurnOnRingCurrent(wave, 0.5, 3.9e-6, 0.4e-6, 4e-6);
    expectClose(peak(cut), 1.3 + 0.5 * Math.sin(Math.PI / 4), { rel: 1e-6 });
  });
});
