import { describe, expect, it } from 'vitest';
import { lossTemperatureFactor } from '../../../solvers/magnetics/loss-temperature-factor.js';
import { MATERIAL_CLASSES } from '../../../solvers/magnetics/material-classes.js';
import { saturationFluxDensity } from '../../../solvers/magnetics/saturation-flux-density.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('MATERIAL_CLASSES', () => {
  it('lossTemperatureFactor of every class is 1 at its minimum, T = ct1/(2·ct2), and above elsewhere', () => {
    // ref: common practice, ct(T) = ct2·T² − ct1·T + ct0 normalized to 1 at minimum-loss temperature
    for (const material of MATERIAL_CLASSES) {
      const { ct2, ct1 } = material.lossTemperatureFactor;
      const minimumC = ct1 / (2 * ct2);
      expectClose(lossTemperatureFactor(material, minimumC), 1, { rel: 1e-12 });
      expect(lossTemperatureFactor(material, minimumC + 30)).toBeGreaterThan(1);
      expect(lossTemperatureFactor(material, minimumC - 30)).toBeGreaterThan(1);
    }
  });

  it('saturationFluxDensity interpolates linearly between the two stated points', () => {
    // ref: common practice (linear interpolation); ferrite Bsat falls as it warms
    for (const material of MATERIAL_CLASSES) {
      const s = material.saturation;
      expectClose(saturationFluxDensity(material, s.lowTemperatureC), s.lowFluxDensityT, {
        rel: 1e-12,
      });
      expectClose(saturationFluxDensity(material, s.highTemperatureC), s.highFluxDensityT, {
        rel: 1e-12,
      });
      const middleC = (s.lowTemperatureC + s.highTemperatureC) / 2;
      expectClose(
        saturationFluxDensity(material, middleC),
        (s.lowFluxDensityT + s.highFluxDensityT) / 2,
        { rel: 1e-12 },
      );
      expect(s.highFluxDensityT).toBeLessThan(s.lowFluxDensityT);
    }
  });

  it('MATERIAL_CLASSES MnZn power classes lose tens to hundreds of kW/m³ at 100 kHz, 0.1 T', () => {
    // ref: common practice, power MnZn ferrite near its loss minimum loses roughly
    // 30–300 kW/m³ (30–300 mW/cm³) at 100 kHz, 100 mT (from memory)
    for (const id of ['mnzn-power-low-frequency', 'mnzn-power-high-frequency']) {
      const material = MATERIAL_CLASSES.find((m) => m.id === id);
      if (material === undefined) throw new Error(`no ${id}`);
      const { k, alpha, beta } = material.steinmetz;
      const lossDensityWPerM3 = k * 100e3 ** alpha * 0.1 ** beta;
      expect(lossDensityWPerM3).toBeGreaterThan(30e3);
      expect(lossDensityWPerM3).toBeLessThan(300e3);
    }
  });
});
