import { describe, expect, it } from 'vitest';
import { expectClose } from '../../helpers/expect-close.js';
import { losslessDoubleEnded, pushPullSpec } from '../../helpers/double-ended-specs.js';
import {
  describeDoubleEndedRelations,
  designedDoubleEnded,
  issuesOfSpec,
} from '../../helpers/double-ended-relations.js';

describeDoubleEndedRelations('pushPull', pushPullSpec, 1);

describe('pushPull (stresses)', () => {
  it('lets each switch block twice the input voltage', () => {
    const design = designedDoubleEnded(losslessDoubleEnded(pushPullSpec, 'center-tapped'));
    for (const corner of design.corners) {
      expect(corner.switches).toHaveLength(2);
      for (const device of corner.switches) {
        // ref: Mohan, Undeland, Robbins, 3rd ed., §10-5-1 (from memory): a push-pull switch
        // blocks 2·Vin while the other half of the primary is driven
        expectClose(device.voltagePeakV, 2 * corner.inputVoltageV, { rel: 1e-6 });
      }
    }
  });

  it('refuses a 60 V switch on a 36 V input: it would need to block about 72 V', () => {
    const issues = issuesOfSpec(
      pushPullSpec({ primarySwitch: { onResistanceOhm: 0.01, voltageRatingV: 60 } }),
    );
    const rating = issues.find(
      (i) => i.code === 'switch_voltage_rating' && i.corner === 'max-input/100pct-load',
    );
    // ref: common practice, a push-pull switch needs a rating above 2·Vin; here Vin + Vp, a little
    // below 72 V for the drops
    expect(rating?.required ?? NaN).toBeGreaterThan(70);
    expect(rating?.required ?? NaN).toBeLessThanOrEqual(72);
    expectClose(rating?.limit ?? NaN, 54, { rel: 1e-12 });
  });
});
