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

  it('refuses a 60 V switch on a 36 V input without leakage: it would need to block about 72 V', () => {
    const issues = issuesOfSpec(
      pushPullSpec({
        primarySwitch: { onResistanceOhm: 0.01, voltageRatingV: 60 },
        transformer: { primaryResistanceOhm: 0.01, leakageInductanceH: 0 },
      }),
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

  it('with leakage, clamps each drain at Vin + Vc, Vc = 1.5 × the highest input by default', () => {
    const spec = pushPullSpec({ magnetics: { mode: 'assume' } });
    const design = designedDoubleEnded(spec);
    // ref: common practice, an RCD clamp set above the voltage the off switch sees while the
    // other half is driven (about Vin); here clamp.voltageToReflectedRatio 1.5 × 36 V
    expectClose(design.choices.clampVoltageV ?? NaN, 54, { rel: 1e-12 });
    expect(design.choices.origins.clampVoltageV).toBe('default');
    for (const corner of design.corners) {
      for (const device of corner.switches) {
        // ref: Pressman, Billings, Morey, 3rd ed. (from memory): the leakage spike rides above
        // the off-state voltage until the clamp takes it; the default 0.01·Lm reaches it here
        // (Z·I of some hundreds of volts against 54 V)
        expectClose(device.voltagePeakV, corner.inputVoltageV + 54, { rel: 1e-12 });
      }
    }
    const rating = issuesOfSpec(
      pushPullSpec({
        magnetics: { mode: 'assume' },
        primarySwitch: { onResistanceOhm: 0.01, voltageRatingV: 90 },
      }),
    ).find((i) => i.code === 'switch_voltage_rating' && i.corner === 'max-input/100pct-load');
    // ref: common practice, the rating must cover the clamped spike: 36 + 54 V against 0.9 × 90 V
    expectClose(rating?.required ?? NaN, 90, { rel: 1e-12 });
    expectClose(rating?.limit ?? NaN, 81, { rel: 1e-12 });
  });

  it('takes clamp.voltageV from the spec and leaves the clamp out without leakage', () => {
    const fixed = designedDoubleEnded(
      pushPullSpec({ magnetics: { mode: 'assume' }, clamp: { voltageV: 45 } }),
    );
    expect(fixed.choices.clampVoltageV).toBe(45);
    expect(fixed.choices.origins.clampVoltageV).toBe('spec');
    const corner = fixed.corners.find((c) => c.label === 'min-input/100pct-load');
    // ref: common practice (RCD clamp): the drain is held at the rail plus the clamp voltage
    expectClose(corner?.switches[0]?.voltagePeakV ?? NaN, 18 + 45, { rel: 1e-12 });
    const none = designedDoubleEnded(
      pushPullSpec({
        magnetics: { mode: 'assume' },
        transformer: { primaryResistanceOhm: 0.01, leakageInductanceH: 0 },
      }),
    );
    expect(none.choices.clampVoltageV).toBeUndefined();
    expect(none.corners[0]?.losses.some((l) => l.component === 'leakage-ring')).toBe(false);
  });

  it('refuses a clamp voltage the other half’s drive would reach', () => {
    const issue = issuesOfSpec(
      pushPullSpec({ magnetics: { mode: 'assume' }, clamp: { voltageV: 30 } }),
    ).find((i) => i.code === 'clamp_voltage_too_low' && i.corner === 'max-input/100pct-load');
    // ref: common practice (RCD clamp): the clamp must sit above the off switch's voltage while
    // the other half is driven (Vin above the rail, less the drops), or it conducts all the time
    expect(issue?.path).toEqual(['clamp', 'voltageV']);
    expectClose(issue?.required ?? NaN, 36, { rel: 1e-12 });
    expectClose(issue?.limit ?? NaN, 30, { rel: 1e-12 });
  });
});
