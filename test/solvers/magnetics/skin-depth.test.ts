import { describe, expect, it } from 'vitest';
import { skinDepth } from '../../../solvers/magnetics/skin-depth.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('skinDepth', () => {
  it('skinDepth in copper at 20 °C is 0.467, 0.209 and 0.0661 mm at 20 kHz, 100 kHz, 1 MHz', () => {
    // ref: δ = sqrt(ρ/(π·f·μ0)) with ρ = 1/58 µΩ·m (IEC 60028), evaluated by hand to 3 figures
    expectClose(skinDepth(20e3), 0.467e-3, { rel: 2e-3 });
    expectClose(skinDepth(100e3), 0.209e-3, { rel: 2e-3 });
    expectClose(skinDepth(1e6), 0.0661e-3, { rel: 2e-3 });
  });

  it('skinDepth matches the handbook rule δ = 6.62/√f cm for copper at 20 °C', () => {
    // ref: McLyman, Transformer and Inductor Design Handbook, 4th ed., skin depth ε = 6.62/√f cm
    // (from memory); its resistivity is slightly different, hence 0.5 %.
    for (const f of [1e3, 50e3, 250e3, 2e6]) {
      expectClose(skinDepth(f), (6.62 / Math.sqrt(f)) * 1e-2, { rel: 5e-3 });
    }
  });

  it('skinDepth at 100 °C grows by sqrt(1 + 0.00393·80)', () => {
    // ref: IEC 60028 resistivity law inside δ ∝ √ρ
    expectClose(skinDepth(100e3, { temperatureC: 100 }), skinDepth(100e3) * Math.sqrt(1.3144), {
      rel: 1e-14,
    });
  });

  it('skinDepth falls as 1/√f and as 1/√μr', () => {
    // ref: Kazimierczuk, High-Frequency Magnetic Components, 2nd ed., δ = sqrt(ρ/(πμf))
    expectClose(skinDepth(400e3), skinDepth(100e3) / 2, { rel: 1e-14 });
    expectClose(skinDepth(100e3, { relativePermeability: 4 }), skinDepth(100e3) / 2, {
      rel: 1e-14,
    });
    expect(() => skinDepth(0)).toThrow(RangeError);
  });
});
