import { describe, expect, it } from 'vitest';
import { rcdClampLoss } from '../../../solvers/losses/rcd-clamp-loss.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('rcdClampLoss', () => {
  it('rcdClampLoss equals Vc times the clamp charge per period, from its derivation', () => {
    const leakageH = 2e-6;
    const peakA = 2.5;
    const clampV = 90;
    const reflectedV = 60;
    const frequencyHz = 100e3;
    // The leakage current falls linearly from Ipk to 0 in ts = Llk·Ipk/(Vc − Vr) into the clamp,
    // which therefore receives Vc·½·Ipk·ts per period.
    const commutationS = (leakageH * peakA) / (clampV - reflectedV);
    const derivedW = clampV * 0.5 * peakA * commutationS * frequencyHz;
    // ref: Pressman, Billings, Morey, 3rd ed., flyback leakage clamp (from memory); common practice
    // P = ½·Llk·Ipk²·fs·Vc/(Vc − Vr)
    expectClose(rcdClampLoss(leakageH, peakA, clampV, reflectedV, frequencyHz), derivedW, {
      rel: 1e-12,
    });
    // ref: common practice, a clamp far above Vr dissipates just the leakage energy ½·Llk·Ipk²·fs
    expectClose(
      rcdClampLoss(leakageH, peakA, 1e9, reflectedV, frequencyHz),
      0.5 * leakageH * peakA ** 2 * frequencyHz,
      {
        rel: 1e-6,
      },
    );
  });

  it('rcdClampLoss throws when the clamp voltage does not exceed the reflected voltage', () => {
    // ref: common practice, with Vc ≤ Vr the clamp conducts through the whole off-time
    expect(() => rcdClampLoss(1e-6, 1, 50, 60, 100e3)).toThrow(RangeError);
  });
});
