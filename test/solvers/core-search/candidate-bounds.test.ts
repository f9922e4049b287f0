import { describe, expect, it } from 'vitest';
import {
  BOUND_HARMONIC_COUNT,
  acSquareBoundA2,
  minimumLossTemperatureFactor,
  saturationLimitT,
  unitCoreLossDensity,
} from '../../../solvers/core-search/candidate-bounds.js';
import { dowellFactor } from '../../../solvers/magnetics/dowell-factor.js';
import { equivalentFoilLayer } from '../../../solvers/magnetics/equivalent-foil-layer.js';
import { skinDepth } from '../../../solvers/magnetics/skin-depth.js';
import {
  currentSpectrum,
  windingAcResistance,
} from '../../../solvers/magnetics/winding-ac-resistance.js';
import type { WindingPortion } from '../../../solvers/magnetics/winding-portion.js';
import { igseCoreLoss } from '../../../solvers/magnetics/igse-core-loss.js';
import { lossTemperatureFactor } from '../../../solvers/magnetics/loss-temperature-factor.js';
import { MATERIAL_CLASSES } from '../../../solvers/magnetics/material-classes.js';
import { saturationFluxDensity } from '../../../solvers/magnetics/saturation-flux-density.js';
import { TRANSFORMER_EVALUATION_DEFAULTS } from '../../../solvers/transformer/transformer-evaluation-options.js';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { settleFromBelow, surfaceLossForRiseW } from '../../../solvers/core-search/leaf-bounds.js';
import { surfaceRiseK, temperatureRise } from '../../../solvers/magnetics/temperature-rise.js';
import { copperResistance } from '../../../solvers/materials/copper-resistance.js';
import { expectClose } from '../../helpers/expect-close.js';

// The facts the core search's bounds rest on, checked on the engine's own models.
describe('core-search bounds', () => {
  it("Dowell's factor is at least 1 and never falls as the penetration ratio grows", () => {
    // ref: P. L. Dowell, "Effects of eddy currents in transformer windings", Proc. IEE 113(8),
    // 1966, fig. 4 (from memory): Fr rises monotonically with h/δ for every layer count. The
    // bound takes the fundamental's factor for every harmonic on this.
    for (const layers of [0.5, 0.75, 1, 1.5, 2, 3, 6, 12]) {
      let previous = 1;
      for (let delta = 0; delta <= 12; delta += 0.02) {
        const factor = dowellFactor(delta, layers);
        expect(factor).toBeGreaterThanOrEqual(1 - 1e-12);
        expect(factor).toBeGreaterThanOrEqual(previous - 1e-12);
        previous = factor;
      }
    }
  });

  it('iGSE core loss is homogeneous of degree β in the flux density', () => {
    // ref: Venkatachalam, Sullivan, Abdallah, Tacca, IEEE COMPEL 2002, eq. 15:
    // Pv = (1/T)∫ki·|dB/dt|^α·ΔB^(β−α) dt, so Pv(c·B) = c^β·Pv(B). The bound scales one
    // evaluation per material by (Np·Ae)^−β on this.
    const material = MATERIAL_CLASSES[0]!;
    const current = piecewiseLinear(10e-6, [
      [0, -0.4],
      [3e-6, 1.2],
      [10e-6, -0.4],
    ]);
    const lm = 200e-6;
    const unit = unitCoreLossDensity(current, lm, material);
    for (const [turns, areaM2] of [
      [12, 71e-6],
      [30, 125e-6],
    ] as const) {
      const scale = lm / (turns * areaM2);
      const flux = piecewiseLinear(
        current.periodS,
        current.timesS.map((t, i) => [t, (current.values[i] as number) * scale] as const),
      );
      expectClose(
        unit * (turns * areaM2) ** -material.steinmetz.beta,
        igseCoreLoss(flux, material.steinmetz),
        { rel: 1e-9 },
      );
    }
  });

  it('takes the least loss temperature factor and the largest saturation over the allowed range', () => {
    // ref: common practice — a quadratic's least value on an interval is at an end or its vertex;
    // a linear function's largest at an end. Checked against a dense scan.
    const settings = TRANSFORMER_EVALUATION_DEFAULTS;
    for (const material of MATERIAL_CLASSES) {
      for (const [lowC, highC] of [
        [25, 65],
        [40, 120],
        [-20, 10],
      ] as const) {
        let least = Infinity;
        let most = 0;
        for (let t = lowC; t <= highC + 1e-9; t += (highC - lowC) / 2000) {
          least = Math.min(least, lossTemperatureFactor(material, t));
          most = Math.max(most, saturationFluxDensity(material, t));
        }
        expect(minimumLossTemperatureFactor(material, lowC, highC)).toBeLessThanOrEqual(
          least + 1e-12,
        );
        expectClose(minimumLossTemperatureFactor(material, lowC, highC), least, { rel: 1e-5 });
        const limit = saturationLimitT(material, lowC, {
          ...settings,
          temperatureRiseMaxK: highC - lowC,
        });
        expectClose(limit, settings.fluxDensityUtilizationMax * most, { rel: 1e-12 });
      }
    }
  });

  it('bounds the AC copper loss from below by the first harmonics at the hottest copper', () => {
    // ref: Dowell, Proc. IEE 113(8), 1966 (from memory): Fr rises with Δ ∝ √(n·f)/√ρ(T), so the
    // hottest copper gives each order its least factor and a higher order never a smaller one;
    // Parseval (common practice): the harmonics' mean squares add up to the AC mean square.
    // Checked against the engine's own winding loss (Dowell per harmonic, tail) at cooler copper.
    expect(BOUND_HARMONIC_COUNT).toBeLessThanOrEqual(TRANSFORMER_EVALUATION_DEFAULTS.harmonicCount);
    const frequencyHz = 100e3;
    const period = 1 / frequencyHz;
    const currents = [
      // A flyback primary (trapezoid, then off) and a secondary (stepped triangle).
      piecewiseLinear(period, [
        [0, 0.8],
        [0.45 * period, 2.4],
        [0.45 * period, 0],
        [period, 0],
      ]),
      piecewiseLinear(period, [
        [0, 0],
        [0.45 * period, 0],
        [0.45 * period, 9],
        [0.95 * period, 3],
        [0.95 * period, 0],
        [period, 0],
      ]),
    ];
    const portions: WindingPortion[] = [
      {
        layerCount: 0.5,
        turnsPerLayer: 20,
        breadthM: 20e-3,
        conductor: { kind: 'round', bareDiameterM: 0.5e-3 },
      },
      {
        layerCount: 3,
        turnsPerLayer: 12,
        breadthM: 20e-3,
        conductor: { kind: 'round', bareDiameterM: 0.8e-3 },
      },
      {
        layerCount: 2,
        turnsPerLayer: 1,
        breadthM: 20e-3,
        conductor: { kind: 'foil', thicknessM: 0.2e-3, widthM: 20e-3 },
      },
      {
        layerCount: 1.5,
        turnsPerLayer: 8,
        breadthM: 20e-3,
        conductor: { kind: 'litz', strandBareDiameterM: 0.1e-3, strandCount: 60 },
      },
    ];
    const hotC = 110;
    for (const current of currents) {
      const spectrum = currentSpectrum(current, BOUND_HARMONIC_COUNT);
      let summedA2 = 0;
      for (const squareA2 of spectrum.harmonicSquaresA2) summedA2 += squareA2;
      const unsummedA2 = Math.max(0, spectrum.acSquareA2 - summedA2);
      for (const portion of portions) {
        const foil = equivalentFoilLayer(portion);
        const delta1 =
          (foil.thicknessM / skinDepth(frequencyHz, { temperatureC: hotC })) *
          Math.sqrt(foil.porosity);
        const factors = Array.from({ length: BOUND_HARMONIC_COUNT + 1 }, (_, i) =>
          dowellFactor(delta1 * Math.sqrt(i + 1), foil.layerCount),
        );
        const boundA2 = acSquareBoundA2(factors, spectrum.harmonicSquaresA2, unsummedA2);
        // Never below the fundamental's factor times the whole AC mean square (the old bound).
        expect(boundA2).toBeGreaterThanOrEqual(factors[0]! * spectrum.acSquareA2 * (1 - 1e-12));
        for (const temperatureC of [20, 60, hotC]) {
          const loss = windingAcResistance(current, portion, 1, {
            temperatureC,
            harmonicCount: TRANSFORMER_EVALUATION_DEFAULTS.harmonicCount,
            maxHarmonicCount: TRANSFORMER_EVALUATION_DEFAULTS.harmonicCountMax,
            tailTolerance: TRANSFORMER_EVALUATION_DEFAULTS.harmonicTailTolerance,
          });
          // With Rdc = 1 Ω the AC loss is Σ Fr·I_n² (tail included) itself.
          expect(boundA2).toBeLessThanOrEqual(loss.acLossW * (1 + 1e-12));
        }
      }
    }
  });

  it('settleFromBelow stays under the coolest settled temperature and within a tenth of a kelvin of it', () => {
    // ref: McLyman, Transformer and Inductor Design Handbook, 4th ed., ch. 6 (surface
    // dissipation, the evaluation's thermal model) (from memory); a settled temperature is a
    // fixed point T = ambient + rise(P(T)), found here by a dense scan from the ambient up.
    const surfaceAreaM2 = 40e-4;
    for (const material of MATERIAL_CLASSES) {
      for (const [coreW, copperAt20CW] of [
        [0.3, 0.2],
        [1.2, 0.1],
        [0.05, 1.5],
      ] as const) {
        const context = { material, ambientC: 40, hotC: 100, surfaceAreaM2, toleranceK: 0.05 };
        const lossAt = (c: number) =>
          coreW * lossTemperatureFactor(material, c) + copperResistance(copperAt20CW, c);
        let settledC = Infinity;
        for (let c = 40; c <= 100; c += 1e-3) {
          const riseK = temperatureRise({
            method: 'surface-dissipation',
            totalLossW: lossAt(c),
            surfaceAreaM2,
          });
          if (40 + riseK <= c) {
            settledC = c;
            break;
          }
        }
        // A copper loss without Dowell's factors: the same at every grid temperature.
        const copper = { gridHotC: 100, at20CW: () => copperAt20CW };
        const bound = settleFromBelow(context, coreW, copper, 1, {
          temperatureC: 0,
          transformerW: 0,
        });
        if (settledC === Infinity) {
          expect(bound.temperatureC).toBeGreaterThan(100);
          continue;
        }
        expect(bound.temperatureC).toBeLessThanOrEqual(settledC);
        expect(bound.temperatureC).toBeGreaterThan(settledC - 0.1);
        expect(bound.transformerW).toBeLessThanOrEqual(lossAt(settledC) * (1 + 1e-12));
      }
    }
  });

  it('surfaceLossForRiseW inverts the surface-dissipation rise', () => {
    // ref: McLyman, Transformer and Inductor Design Handbook, 4th ed., ch. 6 (from memory): the
    // rise 450·(P/At)^0.826 is increasing in P, so it has one inverse.
    for (const lossW of [0.1, 1, 7.5]) {
      for (const surfaceAreaM2 of [10e-4, 60e-4]) {
        const riseK = temperatureRise({
          method: 'surface-dissipation',
          totalLossW: lossW,
          surfaceAreaM2,
        });
        expectClose(surfaceLossForRiseW(riseK, surfaceAreaM2), lossW, { rel: 1e-12 });
      }
    }
  });

  it("surfaceRiseK gives the evaluation's surface-dissipation rise to the bit", () => {
    // ref: McLyman, Transformer and Inductor Design Handbook, 4th ed., ch. 6 (from memory): the
    // search's bounds and the evaluation's fixed point call surfaceRiseK directly; a bound that
    // rounded differently from temperatureRise could prune a candidate at the rise limit.
    for (const lossW of [0, 1e-3, 0.1, 1, 3.3, 7.5, 40]) {
      for (const surfaceAreaM2 of [2e-4, 10e-4, 37.7e-4, 60e-4]) {
        const riseK = temperatureRise({
          method: 'surface-dissipation',
          totalLossW: lossW,
          surfaceAreaM2,
        });
        expect(surfaceRiseK(lossW, surfaceAreaM2)).toBe(riseK);
      }
    }
    expect(() => surfaceRiseK(Number.NaN, 1e-3)).toThrow(RangeError);
  });
});
