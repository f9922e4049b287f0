import { describe, expect, it } from 'vitest';
import { average } from '../../../../solvers/waveform/average.js';
import { peak } from '../../../../solvers/waveform/peak.js';
import { rms } from '../../../../solvers/waveform/rms.js';
import { valueAt } from '../../../../solvers/waveform/value-at.js';
import { solveFlyback } from '../../../helpers/flyback-corners.js';
import { expectClose } from '../../../helpers/expect-close.js';
import { telecomSpec } from '../../../helpers/flyback-specs.js';

describe('flybackOutputRippleV and the capacitor currents', () => {
  const { corners } = solveFlyback(telecomSpec());

  it('gives the output capacitor the AC part of the secondary current, √(Irms² − Io²)', () => {
    for (const corner of corners) {
      const secondaryA = corner.waveforms.secondaryCurrentsA[0];
      const output = corner.outputs[0];
      if (secondaryA === undefined || output === undefined) throw new Error('output');
      // ref: Erickson & Maksimović, 2nd ed. (from memory), §2.3 (charge balance: the capacitor
      // carries no DC)
      expectClose(
        output.capacitorRippleCurrentRmsA,
        Math.sqrt(rms(secondaryA) ** 2 - output.currentA ** 2),
        // The engine takes the waveform's own mean; charge balance holds it to the load within
        // about 3e-11 at DCM corners, where the idle ring makes the duty cycle steep.
        { rel: 1e-10 },
      );
    }
  });

  it('gives the input capacitor the AC part of the switch current', () => {
    for (const corner of corners) {
      const switchA = corner.waveforms.primaryCurrentA;
      // ref: common practice, the source supplies the mean, the capacitor the rest
      expectClose(
        corner.inputCapacitorRippleCurrentRmsA,
        Math.sqrt(rms(switchA) ** 2 - average(switchA) ** 2),
        {
          rel: 1e-12,
        },
      );
    }
  });

  it('gives the ripple ΔQ/C + ESR·Δi, ΔQ the charge drawn while is < Io (sampled independently)', () => {
    for (const corner of corners) {
      const secondaryA = corner.waveforms.secondaryCurrentsA[0];
      const output = corner.outputs[0];
      if (secondaryA === undefined || output === undefined) throw new Error('output');
      // Midpoint-rule integral of (Io − is)⁺ over 200 000 samples of the period.
      const samples = 200_000;
      const stepS = secondaryA.periodS / samples;
      let deficitC = 0;
      for (let k = 0; k < samples; k++) {
        deficitC += Math.max(0, output.currentA - valueAt(secondaryA, (k + 0.5) * stepS)) * stepS;
      }
      const expectedV = deficitC / 470e-6 + 0.02 * peak(secondaryA);
      // ref: Erickson & Maksimović, 2nd ed. (from memory), §2.3 (capacitor charge, ΔQ = C·Δv);
      // common practice for the ESR step. The sampled integral is good to about 1e-6 here.
      expectClose(output.rippleVoltagePeakToPeakV, expectedV, { rel: 1e-5 });
      expect(output.rippleVoltagePeakToPeakV).toBeGreaterThan(0);
    }
  });
});
