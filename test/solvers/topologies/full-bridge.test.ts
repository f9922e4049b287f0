import { describe, expect, it } from 'vitest';
import { expectClose } from '../../helpers/expect-close.js';
import { fullBridgeSpec, losslessDoubleEnded } from '../../helpers/double-ended-specs.js';
import {
  describeDoubleEndedRelations,
  designedDoubleEnded,
  issuesOfSpec,
} from '../../helpers/double-ended-relations.js';

describeDoubleEndedRelations('fullBridge', fullBridgeSpec, 1);

describe('fullBridge (stresses)', () => {
  it('lets each of the four switches block the input voltage', () => {
    const design = designedDoubleEnded(losslessDoubleEnded(fullBridgeSpec, 'full-bridge'));
    for (const corner of design.corners) {
      expect(corner.switches).toHaveLength(4);
      for (const device of corner.switches) {
        // ref: Mohan, Undeland, Robbins, 3rd ed., §10-5-3 (from memory): each full-bridge
        // switch blocks Vin
        expectClose(device.voltagePeakV, corner.inputVoltageV, { rel: 1e-6 });
      }
    }
  });

  it('refuses a 400 V switch on a 400 V input, naming the derated rating with numbers', () => {
    const issues = issuesOfSpec(
      fullBridgeSpec({ primarySwitch: { onResistanceOhm: 0.25, voltageRatingV: 400 } }),
    );
    const rating = issues.find(
      (i) => i.code === 'switch_voltage_rating' && i.corner === 'max-input/100pct-load',
    );
    // ref: common practice, the switch peak against 0.9 of the rating: Vin plus the body diode's
    // drop (the spec's 0.8 V) while the leakage decays through the opposite body diodes after a
    // turn-off (ngspice: bridge-decay-drop-netlist.test.ts; it was Vin before 2026-12-05)
    expectClose(rating?.required ?? NaN, 400 + 0.8, { rel: 1e-3 });
    expectClose(rating?.limit ?? NaN, 360, { rel: 1e-12 });
    expect(rating?.path).toEqual(['primarySwitch', 'voltageRatingV']);
  });

  it('names the output voltage D = 0.5 reaches when the lossless duty fits but the drops do not', () => {
    // Lossless D = n·(48 + 2·0.8)/(2·300) = 0.48 at the lowest input; 20 Ω of primary copper.
    const turnsRatio = (0.48 * 2 * 300) / 49.6;
    const spec = fullBridgeSpec({
      ambientTemperatureC: 20,
      transformer: { turnsRatio, primaryResistanceOhm: 20, leakageInductanceH: 0 },
    });
    const issue = issuesOfSpec(spec).find(
      (i) => i.code === 'power_not_deliverable' && i.corner === 'min-input/100pct-load',
    );
    expect(issue?.quantity).toBe('outputVoltageV');
    expect(issue?.path).toEqual(['transformer', 'turnsRatio']);
    expectClose(issue?.required ?? NaN, 48, { rel: 0 });
    // ref: Erickson & Maksimović, 2nd ed., ch. 3 (from memory), averaged equivalent circuit with
    // conduction losses; Mohan, Undeland, Robbins, 3rd ed., §10-5 (from memory): at D = 0.5 the
    // output stage sees a duty of 1, so Vo = Vp/n − 2·Vf − (Rw + 2·Rd)·Io − RL·Io with
    // Vp = Vin − (2·Rds + Rp)·Io/n (the magnetizing current's mean over the on-time is zero)
    const primaryV = 300 - ((2 * 0.25 + 20) * 10) / turnsRatio;
    const expectedV = primaryV / turnsRatio - 1.6 - (0.02 + 0.02) * 10 - 0.01 * 10;
    expectClose(issue?.limit ?? NaN, expectedV, { rel: 1e-9 });
  });

  it('a center-tapped secondary doubles the rectifier stress: 150 V diodes fail where a bridge passes', () => {
    const centerTapped = fullBridgeSpec({
      outputs: [
        {
          voltageV: 48,
          currentA: 10,
          secondaryArrangement: 'center-tapped',
          rectifier: { kind: 'diode', forwardVoltageV: 0.8, voltageRatingV: 150 },
        },
      ],
      // Both arrangements on the same (chosen, not whole-turns) ratio, so only the rectifier differs.
      magnetics: { mode: 'assume' },
    });
    // The largest requirement over the corners: at light load the switch-node ring clamps the
    // winding at the full drive voltage, a little above the loaded on-state's.
    const requiredV = Math.max(
      ...issuesOfSpec(centerTapped)
        .filter((i) => i.code === 'rectifier_voltage_rating')
        .map((i) => i.required ?? NaN),
    );
    const issue = issuesOfSpec(centerTapped).find((i) => i.code === 'rectifier_voltage_rating');
    const bridge = designedDoubleEnded(fullBridgeSpec({ magnetics: { mode: 'assume' } }));
    const bridgePeakV = Math.max(...bridge.summary.rectifierVoltagePeaksV);
    // ref: common practice, a center-tapped rectifier blocks about twice what a bridge diode does
    expect(requiredV).toBeGreaterThan(1.9 * bridgePeakV);
    expectClose(issue?.limit ?? NaN, 135, { rel: 1e-12 });
    expect(bridgePeakV).toBeLessThan(135);
  });
});
