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
    // ref: common practice, the switch peak (Vin) against 0.9 of the rating
    expectClose(rating?.required ?? NaN, 400, { rel: 1e-3 });
    expectClose(rating?.limit ?? NaN, 360, { rel: 1e-12 });
    expect(rating?.path).toEqual(['primarySwitch', 'voltageRatingV']);
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
    });
    const issue = issuesOfSpec(centerTapped).find((i) => i.code === 'rectifier_voltage_rating');
    const bridge = designedDoubleEnded(fullBridgeSpec());
    const bridgePeakV = Math.max(...bridge.summary.rectifierVoltagePeaksV);
    // ref: common practice, a center-tapped rectifier blocks about twice what a bridge diode does
    expect(issue?.required ?? NaN).toBeGreaterThan(1.9 * bridgePeakV);
    expectClose(issue?.limit ?? NaN, 135, { rel: 1e-12 });
    expect(bridgePeakV).toBeLessThan(135);
  });
});
