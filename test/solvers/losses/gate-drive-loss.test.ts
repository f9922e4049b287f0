import { describe, it } from 'vitest';
import { gateDriveLoss } from '../../../solvers/losses/gate-drive-loss.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('gateDriveLoss', () => {
  it('gateDriveLoss(Qg, V, fs) is Qg·V·fs: the drive supplies Qg at V every period', () => {
    // ref: common practice, P = Qg·Vdrive·fs (half in charging, half in discharging the gate)
    expectClose(gateDriveLoss(25e-9, 12, 100e3), 25e-9 * 12 * 100e3, { rel: 1e-15 });
    // ref: common practice, the loss is linear in frequency
    expectClose(gateDriveLoss(25e-9, 12, 200e3), 2 * gateDriveLoss(25e-9, 12, 100e3), {
      rel: 1e-15,
    });
  });
});
