import { describe, expect, it } from 'vitest';
import { foilConductor } from '../../../solvers/magnetics/foil-conductor.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('foilConductor', () => {
  it('foilConductor(0.1 mm, 20 mm) is 2 mm² and 1/116 Ω/m at 20 °C', () => {
    const foil = foilConductor(0.1e-3, 20e-3);
    // ref: common practice, area of a rectangle
    expectClose(foil.copperAreaM2, 2e-6, { rel: 1e-14 });
    // ref: IEC 60028, ρ20 = 1/58 Ω·mm²/m over 2 mm²
    expectClose(foil.resistancePerLengthOhmPerM, 1 / 116, { rel: 1e-14 });
  });

  it('foilConductor at 120 °C carries the IEC 60028 temperature rise', () => {
    // ref: IEC 60028, R(T) = R20·(1 + 0.00393·(T − 20))
    expectClose(
      foilConductor(0.2e-3, 10e-3, { temperatureC: 120 }).resistancePerLengthOhmPerM,
      (1 / 116) * 1.393,
      { rel: 1e-12 },
    );
  });

  it('foilConductor rejects non-positive dimensions', () => {
    expect(() => foilConductor(0, 1e-2)).toThrow(RangeError);
    expect(() => foilConductor(1e-4, -1)).toThrow(RangeError);
  });
});
