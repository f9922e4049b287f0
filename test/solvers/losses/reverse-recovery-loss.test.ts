import { describe, it } from 'vitest';
import { reverseRecoveryLoss } from '../../../solvers/losses/reverse-recovery-loss.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('reverseRecoveryLoss', () => {
  it('reverseRecoveryLoss(Qrr, Vr, fs) is Qrr·Vr·fs', () => {
    // ref: Erickson & Maksimović, 2nd ed., §4.3.2 (from memory): the recovered charge is pulled
    // through the reverse voltage once per period, W = Qr·V
    expectClose(reverseRecoveryLoss(40e-9, 60, 100e3), 40e-9 * 60 * 100e3, { rel: 1e-15 });
  });

  it('reverseRecoveryLoss(0, Vr, fs) is zero for a diode without stored charge', () => {
    // ref: common practice, a Schottky-class diode has no minority-carrier recovery charge
    expectClose(reverseRecoveryLoss(0, 60, 100e3), 0, { abs: 0 });
  });
});
