import { describe, expect, it } from 'vitest';
import { operatingCorners } from '../../../solvers/design/operating-corners.js';
import { telecomSpec } from '../../helpers/flyback-specs.js';

describe('operatingCorners', () => {
  it('operatingCorners(spec) is min, nominal, max input × each load fraction, in that order', () => {
    const corners = operatingCorners(telecomSpec({ loadFractions: [1, 0.25, 0.125] }));
    // ref: common practice, a design is checked at each input extreme and load point
    expect(
      corners.map((corner) => [corner.label, corner.inputVoltageV, corner.loadFraction]),
    ).toEqual([
      ['min-input/100pct-load', 36, 1],
      ['min-input/25pct-load', 36, 0.25],
      ['min-input/12.5pct-load', 36, 0.125],
      ['nominal-input/100pct-load', 48, 1],
      ['nominal-input/25pct-load', 48, 0.25],
      ['nominal-input/12.5pct-load', 48, 0.125],
      ['max-input/100pct-load', 72, 1],
      ['max-input/25pct-load', 72, 0.25],
      ['max-input/12.5pct-load', 72, 0.125],
    ]);
  });

  it('keeps all 3 × N corners when input voltages coincide', () => {
    const corners = operatingCorners(
      telecomSpec({ inputVoltageMinV: 48, inputVoltageNominalV: 48, inputVoltageMaxV: 48 }),
    );
    // ref: common practice, corner indices stay predictable for clients
    expect(corners).toHaveLength(9);
    expect(new Set(corners.map((corner) => corner.label)).size).toBe(9);
  });
});
