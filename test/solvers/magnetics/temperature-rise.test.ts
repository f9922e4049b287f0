import { describe, expect, it } from 'vitest';
import { temperatureRise } from '../../../solvers/magnetics/temperature-rise.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('temperatureRise', () => {
  it("temperatureRise('surface-dissipation') gives about 25 °C at 0.03 W/cm² and 50 °C at 0.07 W/cm²", () => {
    // ref: McLyman, Transformer and Inductor Design Handbook, 4th ed., ch. 6, temperature rise
    // against surface dissipation ψ (W/cm²): 25 °C near 0.03, 50 °C near 0.07 (from memory)
    expectClose(
      temperatureRise({ method: 'surface-dissipation', totalLossW: 3, surfaceAreaM2: 100e-4 }),
      25,
      { rel: 0.02 },
    );
    expectClose(
      temperatureRise({ method: 'surface-dissipation', totalLossW: 7, surfaceAreaM2: 100e-4 }),
      50,
      { rel: 0.02 },
    );
  });

  it("temperatureRise('volume-thermal-resistance') is 53 K/W times the loss for Ve = 1 cm³", () => {
    // ref: Maniktala, Switching Power Supplies A to Z, 2nd ed., Rth = 53·Ve^−0.54, Ve in cm³ (from memory)
    expectClose(
      temperatureRise({
        method: 'volume-thermal-resistance',
        totalLossW: 0.5,
        effectiveVolumeM3: 1e-6,
      }),
      26.5,
      { rel: 1e-12 },
    );
  });

  it("temperatureRise('volume-thermal-resistance') of a 11.5 cm³ core is in the teens of K/W", () => {
    // ref: common practice, ferrite transformers near 10 cm³ core volume run about 10–20 °C/W
    // in free air (from memory)
    const rise = temperatureRise({
      method: 'volume-thermal-resistance',
      totalLossW: 1,
      effectiveVolumeM3: 11.5e-6,
    });
    expect(rise).toBeGreaterThan(10);
    expect(rise).toBeLessThan(20);
  });
});
