import { describe, it } from 'vitest';
import { average } from '../../../../solvers/waveform/average.js';
import { cornerAt, solveFlyback } from '../../../helpers/flyback-corners.js';
import { expectClose } from '../../../helpers/expect-close.js';
import { telecomSpec } from '../../../helpers/flyback-specs.js';

const ideal = { kind: 'diode', forwardVoltageV: 0, resistanceOhm: 0 } as const;

describe('flybackOutputVoltages (several outputs)', () => {
  it('holds each output at Vo0·n0/nk through an ideal transformer, with nk = n0·Vo0/Vok', () => {
    const { choices, corners } = solveFlyback(
      telecomSpec({
        outputs: [
          {
            voltageV: 12,
            currentA: 2,
            rectifier: ideal,
            windingResistanceOhm: 0,
            capacitorEsrOhm: 0,
          },
          {
            voltageV: 5,
            currentA: 1,
            rectifier: ideal,
            windingResistanceOhm: 0,
            capacitorEsrOhm: 0,
          },
        ],
        primarySwitch: { onResistanceOhm: 1e-9, voltageRatingV: 200 },
        transformer: { primaryResistanceOhm: 0, leakageInductanceH: 0 },
      }),
    );
    const [n0, n1] = choices.outputTurnsRatios as [number, number];
    // ref: common practice, ideal transformer: winding voltages in proportion to turns
    expectClose(n1, (n0 * 12) / 5, { rel: 1e-9 });
    for (const corner of corners) {
      expectClose(corner.outputs[1]?.voltageV ?? NaN, 5, { rel: 1e-9 });
    }
  });

  it('balances every output charge and the total energy, and meets each voltage at nominal full load', () => {
    const spec = telecomSpec({
      outputs: [
        {
          voltageV: 12,
          currentA: 2,
          rectifier: { kind: 'diode', forwardVoltageV: 0.45, resistanceOhm: 0.02 },
          windingResistanceOhm: 0.006,
        },
        {
          voltageV: 5,
          currentA: 1,
          rectifier: { kind: 'diode', forwardVoltageV: 0.3, resistanceOhm: 0.03 },
          windingResistanceOhm: 0.004,
        },
      ],
    });
    const { corners } = solveFlyback(spec);
    for (const corner of corners) {
      for (const [k, output] of spec.outputs.entries()) {
        const secondaryA = corner.waveforms.secondaryCurrentsA[k];
        if (secondaryA === undefined) throw new Error('secondary');
        // ref: Erickson & Maksimović, 2nd ed. (from memory), §2.3, capacitor charge balance on each
        // output
        expectClose(average(secondaryA), output.currentA * corner.loadFraction, { rel: 1e-9 });
      }
      const lossW = corner.losses.reduce((sum, loss) => sum + loss.powerW, 0);
      // ref: common practice, conservation of energy
      expectClose(corner.inputPowerW, corner.outputPowerW + lossW, { rel: 1e-12 });
    }
    // ref: common practice, auxiliary turns are set for the nominal operating point
    expectClose(cornerAt(corners, 'nominal-input/100pct-load').outputs[1]?.voltageV ?? NaN, 5, {
      rel: 1e-8,
    });
  });
});
