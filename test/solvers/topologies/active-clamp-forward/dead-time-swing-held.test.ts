import { describe, expect, it } from 'vitest';
import { deadTimeSwing } from '../../../../solvers/topologies/active-clamp-forward/dead-time-swing.js';
import { deadTimeSwingHeld } from '../../../../solvers/topologies/active-clamp-forward/dead-time-swing-held.js';
import { expectClose } from '../../../helpers/expect-close.js';

// Checks of the closed form against its own definition (no outside source: the held current is
// the valley's plus the freewheel's fall over the rest of the dead time less the lead, and the
// lead is the one deadTimeSwing gives for that current). The swing itself: dead-time-swing.test.ts.
const C = 200e-12;

/** The lead (positive area over Vin) and the held current it implies, for a self-check. */
function fixedPointGap(
  vin: number,
  vc: number,
  imv: number,
  valleyHeldA: number,
  slope: number,
  deadS: number,
): { leadS: number; impliedLeadS: number } {
  const swing = deadTimeSwingHeld(vin, vc, imv, valleyHeldA, slope, C, deadS);
  const leadS = swing.positiveVoltSecondsVs / vin;
  const restS = deadS - (C * vc) / -imv;
  const heldA = valleyHeldA + slope * (restS - leadS);
  const impliedLeadS = deadTimeSwing(vin, vc, imv, heldA, C, deadS).positiveVoltSecondsVs / vin;
  return { leadS, impliedLeadS };
}

describe('deadTimeSwingHeld', () => {
  it('is the valley swing where nothing freewheels (slope 0) or the inductors hold the drain', () => {
    for (const held of [-0.3, 0.2]) {
      expect(deadTimeSwingHeld(48, 40, -0.4, held, 0, C, 100e-9)).toEqual(
        deadTimeSwing(48, 40, -0.4, held, C, 100e-9),
      );
    }
  });

  it('takes less current than the valley where the stages freewheel, and holds its fixed point', () => {
    // A partial swing (the drain still above zero at the gate) and a complete one (body diode).
    for (const [valleyHeldA, slope] of [
      [-0.1, 2e5],
      [-0.6, 1e6],
    ] as const) {
      const { leadS, impliedLeadS } = fixedPointGap(48, 40, -0.4, valleyHeldA, slope, 100e-9);
      const valleyLeadS =
        deadTimeSwing(48, 40, -0.4, valleyHeldA, C, 100e-9).positiveVoltSecondsVs / 48;
      expect(leadS).toBeGreaterThan(0);
      expect(leadS).toBeLessThan(valleyLeadS);
      expectClose(leadS, impliedLeadS, { rel: 1e-9 });
    }
  });

  it('holds its fixed point over a spread of inputs', () => {
    let seed = 7;
    const random = () => ((seed = (seed * 16807) % 2147483647) - 1) / 2147483646;
    for (let i = 0; i < 2000; i++) {
      const imv = -(0.05 + random());
      const valleyHeldA = -(0.01 + random());
      const slope = 1e4 + random() * 3e6;
      const deadS = (40 + random() * 300) * 1e-9;
      const vc = 10 + random() * 60;
      if (deadS <= (C * vc) / -imv) continue;
      const { leadS, impliedLeadS } = fixedPointGap(48, vc, imv, valleyHeldA, slope, deadS);
      expect(Math.abs(leadS - impliedLeadS)).toBeLessThanOrEqual(1e-9 * deadS);
    }
  });
});
