import { describe, expect, it } from 'vitest';
import { litzWire } from '../../../solvers/magnetics/litz-wire.js';
import { roundWireGauge } from '../../../solvers/magnetics/round-wire-gauge.js';
import { COPPER_RESISTIVITY_20C_OHM_M } from '../../../solvers/materials/copper-resistance.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('litzWire', () => {
  it('litzWire(38, 100).copperAreaM2 is 100 strands of the ASTM B258 AWG 38 area', () => {
    const d = 0.127e-3 * 92 ** (-2 / 39);
    // ref: ASTM B258 strand diameter; area of k circles
    expectClose(litzWire(38, 100).copperAreaM2, (100 * Math.PI * d * d) / 4, { rel: 1e-14 });
  });

  it('litzWire DC resistance per metre is ρ·takeUp/(k·As) at 20 °C and at 100 °C', () => {
    const strandAreaM2 = roundWireGauge(40).copperAreaM2;
    const bundle = litzWire(40, 270, { takeUpFactor: 1.04 });
    // ref: IEC 60028, R' = ρ20·l/A, strand path 1.04 m per metre of bundle
    expectClose(
      bundle.resistancePerLengthOhmPerM,
      (COPPER_RESISTIVITY_20C_OHM_M * 1.04) / (270 * strandAreaM2),
      { rel: 1e-14 },
    );
    const hot = litzWire(40, 270, { takeUpFactor: 1.04, temperatureC: 100 });
    // ref: IEC 60028, α20 = 0.00393 /K
    expectClose(hot.resistancePerLengthOhmPerM, bundle.resistancePerLengthOhmPerM * 1.3144, {
      rel: 1e-12,
    });
  });

  it('litzWire overall diameter at packing 0.75 is about 1.155·do·√k', () => {
    const bundle = litzWire(38, 64);
    // ref: common practice, bunched litz diameter ≈ 1.155·strand overall diameter·√k (from memory)
    expectClose(bundle.overallDiameterM, 1.155 * bundle.strandOverallDiameterM * 8, { rel: 1e-3 });
  });

  it('litzWire copper fill of the bundle circle is below hexagonal packing', () => {
    const bundle = litzWire(42, 200, { packingFactor: 0.9 });
    const fill = bundle.copperAreaM2 / ((Math.PI * bundle.overallDiameterM ** 2) / 4);
    // ref: common practice, circles fill at most π/(2√3) ≈ 0.9069 of the plane
    expect(fill).toBeLessThan(Math.PI / (2 * Math.sqrt(3)));
    expect(() => litzWire(42, 200, { packingFactor: 0.95 })).toThrow(RangeError);
    expect(() => litzWire(42, 0)).toThrow(RangeError);
  });
});
