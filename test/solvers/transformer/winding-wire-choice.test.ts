import { describe, expect, it } from 'vitest';
import { roundWireGauge } from '../../../solvers/magnetics/round-wire-gauge.js';
import { windingWireChoice } from '../../../solvers/transformer/winding-wire-choice.js';

describe('windingWireChoice', () => {
  // ref: skin depth in copper δ ≈ 66/√f mm at 20 °C (common practice; 0.209 mm at 100 kHz),
  // times √(1 + 0.00393·80) at 100 °C (IEC 60028) ≈ 0.239 mm, so 2δ ≈ 0.48 mm; ASTM B258
  // diameters: AWG 24 is 0.511 mm, AWG 25 is 0.455 mm (the series formula, 0.127·92^((36−n)/39)).
  it('windingWireChoice(1 A, 100 kHz) takes AWG 25, the thickest wire under two skin depths', () => {
    const wire = windingWireChoice(1, 100e3);
    expect(wire).toMatchObject({ kind: 'round', awg: 25 });
  });

  // ref: common practice — copper sized by current density: 1 A at 4.5 A/mm² needs 0.222 mm²,
  // two AWG 25 wires (0.162 mm² each by ASTM B258) in parallel.
  it('windingWireChoice parallels wires to meet the current density', () => {
    const wire = windingWireChoice(1, 100e3);
    if (wire.kind !== 'round') throw new Error('expected round wire');
    expect(wire.parallelCount).toBe(2);
    expect(wire.parallelCount * roundWireGauge(25).copperAreaM2).toBeGreaterThanOrEqual(1 / 4.5e6);
  });

  // ref: common practice — many thin strands in parallel are litz; 20 A at 4.5 A/mm² needs
  // 4.44 mm², 28 strands of AWG 25.
  it('windingWireChoice(20 A, 100 kHz) turns to a litz bundle', () => {
    expect(windingWireChoice(20, 100e3)).toEqual({ kind: 'litz', strandAwg: 25, strandCount: 28 });
  });
});
