import { describe, expect, it } from 'vitest';
import {
  BOUND_HARMONIC_COUNT,
  BOUND_TAIL_HARMONIC_COUNT,
  SECOND_SOLVE_HARMONIC_COUNT,
} from '../../../solvers/core-search/candidate-bounds.js';
import {
  CopperBound,
  copperTailOf,
  FACTOR_GRID_STEP_K,
  factorGridIndex,
  settleFromBelow,
  type WindowVerdict,
} from '../../../solvers/core-search/leaf-bounds.js';
import { dowellFactor } from '../../../solvers/magnetics/dowell-factor.js';
import { equivalentFoilLayer } from '../../../solvers/magnetics/equivalent-foil-layer.js';
import { lossTemperatureFactor } from '../../../solvers/magnetics/loss-temperature-factor.js';
import { MATERIAL_CLASSES } from '../../../solvers/magnetics/material-classes.js';
import { skinDepth } from '../../../solvers/magnetics/skin-depth.js';
import { surfaceRiseK } from '../../../solvers/magnetics/temperature-rise.js';
import {
  currentSpectrum,
  windingAcResistance,
} from '../../../solvers/magnetics/winding-ac-resistance.js';
import type { WindingPortion } from '../../../solvers/magnetics/winding-portion.js';
import { copperResistance } from '../../../solvers/materials/copper-resistance.js';
import {
  TRANSFORMER_EVALUATION_DEFAULTS,
  type TransformerEvaluationOptions,
} from '../../../solvers/transformer/transformer-evaluation-options.js';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import type { Waveform } from '../../../solvers/waveform/waveform.js';

// The copper bound with Dowell's factors taken at a grid temperature (CopperBound), on which
// the core search's temperature bound (settleFromBelow) now narrows: checked against the
// engine's own winding loss (Dowell per harmonic with its tail) on invented windings.
// ref: P. L. Dowell, "Effects of eddy currents in transformer windings", Proc. IEE 113(8), 1966
// (from memory): Fr rises with Δ = h/δ, and δ ∝ √ρ(T) grows as the copper warms, so a winding's
// factor at a warmer copper temperature is never larger than at a cooler one.
const frequencyHz = 100e3;
const period = 1 / frequencyHz;
const currents: Waveform[] = [
  // Invented: a forward primary (a pulse on a magnetizing ramp), a flyback secondary (stepped
  // triangle), a forward secondary (square pulse with a ramp), a push-pull half (two pulses).
  piecewiseLinear(period, [
    [0, 0.2],
    [0.42 * period, 3.1],
    [0.42 * period, 0],
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
  piecewiseLinear(period, [
    [0, 8.5],
    [0.4 * period, 9.5],
    [0.4 * period, 0],
    [period, 0],
  ]),
  piecewiseLinear(period, [
    [0, 4],
    [0.3 * period, 4.6],
    [0.3 * period, 0],
    [0.5 * period, 0],
    [0.5 * period, -4],
    [0.8 * period, -4.6],
    [0.8 * period, 0],
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
    layerCount: 4,
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
const ambientC = 40;
const hotC = 100;

/** A window verdict of one winding (the fields CopperBound reads), its factors at hotC. */
function windowOf(portion: WindingPortion): WindowVerdict {
  const foil = equivalentFoilLayer(portion);
  const delta1 =
    (foil.thicknessM / skinDepth(frequencyHz, { temperatureC: hotC })) * Math.sqrt(foil.porosity);
  const harmonicFactors = [
    Array.from({ length: BOUND_HARMONIC_COUNT + 1 }, (_, i) =>
      dowellFactor(delta1 * Math.sqrt(i + 1), foil.layerCount),
    ),
  ];
  return {
    leakageH: 0,
    harmonicFactors,
    foils: [
      {
        penetrationRatio: delta1,
        layerCount: foil.layerCount,
        thicknessM: foil.thicknessM,
        porosity: foil.porosity,
      },
    ],
    frequencyHz,
    hotC,
    foilTables: [[]],
  };
}

/** The evaluation's harmonic settings the tail's extra is taken for, and the ambient, °C. */
interface TailCase {
  settings: Required<TransformerEvaluationOptions>;
  ambientC: number;
}

/**
 * A CopperBound of one winding of Rdc(20 °C) `ohm` carrying `current`; with `tail`: with the
 * tail's extra for those settings and that ambient (orders 33…64 filled).
 */
function copperOf(
  current: Waveform,
  portion: WindingPortion,
  ohm: number,
  isLong: boolean,
  tail?: TailCase,
) {
  const count = isLong ? SECOND_SOLVE_HARMONIC_COUNT : BOUND_HARMONIC_COUNT;
  const spectrum = currentSpectrum(current, count);
  let summedA2 = 0;
  for (const squareA2 of spectrum.harmonicSquaresA2) summedA2 += squareA2;
  const copper = new CopperBound();
  copper.resistancesAt20COhm[0] = ohm;
  copper.dcSquaresA2[0] = spectrum.dcA * spectrum.dcA;
  copper.squaresA2[0] = spectrum.harmonicSquaresA2;
  copper.unsummedA2[0] = Math.max(0, spectrum.acSquareA2 - summedA2);
  if (tail !== undefined) {
    const long = currentSpectrum(current, BOUND_TAIL_HARMONIC_COUNT);
    let longSummedA2 = 0;
    for (const squareA2 of long.harmonicSquaresA2) longSummedA2 += squareA2;
    copper.tailSquaresA2[0] = long.harmonicSquaresA2;
    copper.unsummedTailA2[0] = Math.max(0, long.acSquareA2 - longSummedA2);
    copper.tail = copperTailOf(tail.settings, tail.ambientC, hotC);
  }
  copper.reset(windowOf(portion), 1, isLong);
  return copper;
}

/** The evaluation's copper loss of the winding at copper temperature `temperatureC`, W. */
function evaluatedCopperW(current: Waveform, portion: WindingPortion, ohm: number, tC: number) {
  const loss = evaluatedLoss(current, portion, ohm, tC);
  return loss.dcLossW + loss.acLossW;
}

/** The evaluation's winding loss at copper temperature `tC` (its default harmonic settings). */
function evaluatedLoss(
  current: Waveform,
  portion: WindingPortion,
  ohm: number,
  tC: number,
  settings: Required<TransformerEvaluationOptions> = TRANSFORMER_EVALUATION_DEFAULTS,
) {
  return windingAcResistance(current, portion, copperResistance(ohm, tC), {
    temperatureC: tC,
    harmonicCount: settings.harmonicCount,
    maxHarmonicCount: settings.harmonicCountMax,
    tailTolerance: settings.harmonicTailTolerance,
  });
}

describe('core-search copper bound on a temperature grid (invented windings)', () => {
  it('picks the least grid temperature at or above the one asked', () => {
    for (let tC = ambientC; tC <= hotC + 5; tC += 0.37) {
      const j = factorGridIndex(hotC, tC);
      expect(hotC - j * FACTOR_GRID_STEP_K).toBeGreaterThanOrEqual(Math.min(tC, hotC));
      // At most one step (and a hair, against round-off) warmer.
      expect(hotC - j * FACTOR_GRID_STEP_K).toBeLessThan(tC + FACTOR_GRID_STEP_K + 1e-6);
    }
  });

  it('lies under the evaluated copper loss at every temperature up to its grid temperature', () => {
    let closest = Infinity;
    for (const isLong of [false, true]) {
      for (const current of currents) {
        for (const portion of portions) {
          const copper = copperOf(current, portion, 0.05, isLong);
          let previous = 0;
          for (let j = 0; hotC - j * FACTOR_GRID_STEP_K >= ambientC; j++) {
            const gridC = hotC - j * FACTOR_GRID_STEP_K;
            const boundAt20W = copper.at20CW(j);
            // A cooler grid temperature: larger factors, a larger bound.
            expect(boundAt20W).toBeGreaterThanOrEqual(previous * (1 - 1e-12));
            previous = boundAt20W;
            for (const tC of [ambientC, (ambientC + gridC) / 2, gridC - 0.5, gridC]) {
              if (tC < ambientC) continue;
              const trueW = evaluatedCopperW(current, portion, 0.05, tC);
              const boundW = copperResistance(boundAt20W, tC);
              expect(boundW).toBeLessThanOrEqual(trueW * (1 + 1e-12));
              if (tC === gridC) closest = Math.min(closest, trueW / boundW);
            }
          }
        }
      }
    }
    // Not vacuous: at its own grid temperature the bound comes close to the evaluation.
    expect(closest).toBeLessThan(1.05);
  });

  it('with the tail’s extra lies under the evaluated copper loss from the ambient up to its grid temperature', () => {
    // The evaluation sums 32 orders, doubles to 64 while its tail estimate is over 5 % of the
    // total, and weighs the tail 1–2 times the next order's factor (`tailWeight`); the extra takes
    // that weight at a proven lower bound of the factors' ratio and each case's sums (see
    // `CopperBound`). Extra currents here: a trapezoid without jumps (its spectrum rolls off, so
    // the evaluation stops at 32 orders) beside the pulses above (jumps: it goes on to 64); a
    // steeper trapezoid and the forward's pulse again on DC offsets of 0–4 A in steps of 0.25 A,
    // so that at some offsets the evaluation's 5 % test changes its answer between the ambient
    // and the grid temperature (neither case is then proven, and the extra is the lesser of
    // both; either one alone lies over the evaluation here, 1.8 % and 5.8 %, tried). Ambients on
    // the grid (40 °C) and off it (47.3 and 71 °C): the extra takes its cool factors at the grid
    // index at or below the ambient, not at the bound's own index j (taken at j, or at the grid
    // temperature just above an ambient off the grid, the bound lies 0.13 % over, tried).
    // Scratch instrumentation of tailExtraA2 (2026-12-05): with these data every branch is
    // taken under the default settings (proven to stop, proven to go on, the lesser of both with
    // either one the lesser), the test below takes the others.
    // ref: P. L. Dowell, "Effects of eddy currents in transformer windings", Proc. IEE 113(8),
    // 1966 (from memory): Fr falls as the copper warms and rises with the order, the two facts
    // the extra's proof rests on; checked here against the engine's evaluation built on them.
    const rolled = piecewiseLinear(period, [
      [0, 0],
      [0.05 * period, 6],
      [0.4 * period, 6],
      [0.45 * period, 0],
      [period, 0],
    ]);
    const steepRolledAt = (offsetA: number) =>
      piecewiseLinear(period, [
        [0, offsetA],
        [0.01 * period, offsetA + 6],
        [0.39 * period, offsetA + 6],
        [0.4 * period, offsetA],
        [period, offsetA],
      ]);
    const pulseAt = (offsetA: number) =>
      piecewiseLinear(period, [
        [0, offsetA + 0.2],
        [0.42 * period, offsetA + 3.1],
        [0.42 * period, offsetA],
        [period, offsetA],
      ]);
    const swept: Waveform[] = [...currents, rolled];
    for (let offsetA = 0; offsetA <= 4; offsetA += 0.25) {
      swept.push(steepRolledAt(offsetA), pulseAt(offsetA));
    }
    const ambients = [40, 47.3, 71];
    // And at each ambient off the grid, the offset (by bisection, to 1e-12 A) under which the
    // evaluation on the litz winding (its weight at the 33rd order is 2 here, the tolerance
    // test's own, so a stop is provable) goes on to 64 orders at the ambient itself and stops at
    // 32 at the grid temperature just above it.
    for (const ambientC of ambients.slice(1)) {
      const goesOnAt = (offsetA: number) =>
        evaluatedLoss(steepRolledAt(offsetA), portions[3]!, 0.05, ambientC).harmonicsUsed > 32;
      let goesOnA = 0;
      let stopsA = 4;
      expect([goesOnAt(goesOnA), goesOnAt(stopsA)]).toEqual([true, false]);
      while (stopsA - goesOnA > 1e-12) {
        const midA = (goesOnA + stopsA) / 2;
        if (goesOnAt(midA)) goesOnA = midA;
        else stopsA = midA;
      }
      swept.push(steepRolledAt(goesOnA));
    }
    const thick: WindingPortion = {
      layerCount: 6,
      turnsPerLayer: 1,
      breadthM: 20e-3,
      conductor: { kind: 'foil', thicknessM: 0.4e-3, widthM: 20e-3 },
    };
    // Invented: fine litz in three layers, whose factors rise steeply with the order (Δ ≪ 1).
    const fineLitz: WindingPortion = {
      layerCount: 3,
      turnsPerLayer: 8,
      breadthM: 20e-3,
      conductor: { kind: 'litz', strandBareDiameterM: 0.05e-3, strandCount: 100 },
    };
    const windings = [...portions, thick, fineLitz];
    // The evaluation at every copper temperature of a 0.5 K grid from 40 to 100 °C and at each
    // ambient, per current and winding (the temperatures the bound must lie under).
    const temperaturesC = Array.from({ length: 121 }, (_, i) => 40 + 0.5 * i);
    for (const a of ambients) if (!temperaturesC.includes(a)) temperaturesC.push(a);
    let closest = Infinity;
    let gain = 0;
    // The largest bound over the evaluation anywhere (an expect per temperature was most of the
    // runtime), and where.
    let worst = 0;
    let worstAt = '';
    // Per case of the evaluation over [ambient, grid temperature]: the orders it sums at every
    // temperature there (32 or 64), and how close the bound comes at its grid temperature.
    const closestByCase = new Map<string, number>();
    for (const current of swept) {
      for (const [w, portion] of windings.entries()) {
        const evaluated = temperaturesC.map((tC) => evaluatedLoss(current, portion, 0.05, tC));
        for (const ambientC of ambients) {
          const tail = { settings: TRANSFORMER_EVALUATION_DEFAULTS, ambientC };
          for (const isLong of [false, true]) {
            const copper = copperOf(current, portion, 0.05, isLong, tail);
            const plain = copperOf(current, portion, 0.05, isLong);
            for (let j = 0; hotC - j * FACTOR_GRID_STEP_K >= ambientC; j++) {
              const gridC = hotC - j * FACTOR_GRID_STEP_K;
              const boundAt20W = copper.at20CW(j);
              // Never under the bound without the extra (the extra is at least zero).
              expect(boundAt20W).toBeGreaterThanOrEqual(plain.at20CW(j));
              gain = Math.max(gain, boundAt20W / plain.at20CW(j));
              const counts = new Set<number>();
              let atGrid = Infinity;
              temperaturesC.forEach((tC, i) => {
                if (tC < ambientC || tC > gridC) return;
                const loss = evaluated[i]!;
                counts.add(loss.harmonicsUsed);
                const trueW = loss.dcLossW + loss.acLossW;
                const boundW = copperResistance(boundAt20W, tC);
                if (boundW / trueW > worst) {
                  worst = boundW / trueW;
                  worstAt = `current ${swept.indexOf(current)}, winding ${w}, ambient ${ambientC} °C, j ${j}, ${tC} °C`;
                }
                if (tC === gridC) atGrid = trueW / boundW;
              });
              const key = [...counts].sort((a, b) => a - b).join('+');
              closestByCase.set(key, Math.min(closestByCase.get(key) ?? Infinity, atGrid));
              closest = Math.min(closest, atGrid);
            }
          }
        }
      }
    }
    expect(worst, worstAt).toBeLessThanOrEqual(1 + 1e-12);
    // All three of the evaluation's cases are met, and the extra is not vacuous: it raises the
    // bound by more than 10 % somewhere and brings it within 0.5 % of the evaluation somewhere.
    expect([...closestByCase.keys()].sort()).toEqual(['32', '32+64', '64']);
    expect(gain).toBeGreaterThan(1.1);
    expect(closest).toBeLessThan(1.005);
  });

  it('with the tail’s extra for other harmonic settings lies under the evaluation, and is none where the evaluation starts past 32 orders', () => {
    // The same claim for the evaluation's other harmonic settings (each a setting a caller may
    // give; the evaluation as `windingAcResistance` takes them): at most 32 orders (it never goes
    // on: the 32-order case's extra), at most 48 (it may stop short of 64: no 64-order extra),
    // at most 128 (the rest past 64 weighed at least once, at the 65th order's factor), and a
    // first count of 64 (no extra: the bound's tail is then the 33rd order's factor alone). And
    // a current without AC (no rest past 32 orders; the loss is Rdc·I² exactly).
    // ref: P. L. Dowell, Proc. IEE 113(8), 1966 (from memory), as above.
    const pulseAt = (offsetA: number) =>
      piecewiseLinear(period, [
        [0, offsetA + 0.2],
        [0.42 * period, offsetA + 3.1],
        [0.42 * period, offsetA],
        [period, offsetA],
      ]);
    const steady = piecewiseLinear(period, [
      [0, 2.5],
      [period, 2.5],
    ]);
    const swept: Waveform[] = [...currents, steady];
    for (let offsetA = 0; offsetA <= 3; offsetA += 0.5) swept.push(pulseAt(offsetA));
    const defaults = TRANSFORMER_EVALUATION_DEFAULTS;
    const cases = [
      { name: 'most 32', settings: { ...defaults, harmonicCountMax: 32 } },
      { name: 'most 48', settings: { ...defaults, harmonicCountMax: 48 } },
      { name: 'most 128', settings: { ...defaults, harmonicCountMax: 128 } },
      { name: 'first 64', settings: { ...defaults, harmonicCount: 64 } },
    ];
    const ambientC = 47.3;
    const temperaturesC = [ambientC];
    for (let tC = 48; tC <= hotC; tC += 1) temperaturesC.push(tC);
    for (const { name, settings } of cases) {
      let worst = 0;
      let worstAt = '';
      let gain = 0;
      const countsUsed = new Set<number>();
      for (const [c, current] of swept.entries()) {
        for (const [w, portion] of portions.entries()) {
          const evaluated = temperaturesC.map((tC) =>
            evaluatedLoss(current, portion, 0.05, tC, settings),
          );
          const copper = copperOf(current, portion, 0.05, false, { settings, ambientC });
          const plain = copperOf(current, portion, 0.05, false);
          for (let j = 0; hotC - j * FACTOR_GRID_STEP_K >= ambientC; j++) {
            const gridC = hotC - j * FACTOR_GRID_STEP_K;
            const boundAt20W = copper.at20CW(j);
            expect(boundAt20W).toBeGreaterThanOrEqual(plain.at20CW(j));
            gain = Math.max(gain, boundAt20W / plain.at20CW(j));
            temperaturesC.forEach((tC, i) => {
              if (tC > gridC) return;
              const loss = evaluated[i]!;
              countsUsed.add(loss.harmonicsUsed);
              const trueW = loss.dcLossW + loss.acLossW;
              const boundW = copperResistance(boundAt20W, tC);
              if (boundW / trueW > worst) {
                worst = boundW / trueW;
                worstAt = `${name}: current ${c}, winding ${w}, j ${j}, ${tC} °C`;
              }
            });
          }
        }
      }
      expect(worst, worstAt).toBeLessThanOrEqual(1 + 1e-12);
      // Each setting's case is met: the evaluation stays at 32 orders, stops at 48, or goes past
      // 64; and the extra is taken (more than 10 % somewhere; 1 % at most 48, where it is taken
      // only where the evaluation is proven to stop at 32) except from a first count of 64
      // (there it is none: taken anyway, the bound rises 59 %, tried).
      const used = [...countsUsed].sort((a, b) => a - b);
      if (name === 'most 32') expect(used).toEqual([32]);
      if (name === 'most 48') expect(used).toEqual([32, 48]);
      if (name === 'most 128') expect(used).toEqual([32, 64, 128]);
      if (name === 'first 64') expect(used).toEqual([64]);
      if (name === 'first 64') expect(gain).toBeLessThanOrEqual(1 + 1e-12);
      else expect(gain).toBeGreaterThan(name === 'most 48' ? 1.01 : 1.1);
    }
  });

  it('settleFromBelow on it stays under the coolest settled temperature, closer than before', () => {
    // ref: McLyman, Transformer and Inductor Design Handbook, 4th ed., ch. 6 (surface
    // dissipation, the evaluation's thermal model) (from memory): a settled temperature is a
    // fixed point T = ambient + rise(P(T)), found here by a dense scan with the exact copper.
    const surfaceAreaM2 = 12e-4;
    let tightest = Infinity;
    let gainK = 0;
    for (const material of MATERIAL_CLASSES) {
      for (const current of currents) {
        for (const portion of portions) {
          for (const [coreW, ohm] of [
            [0.3, 0.02],
            [0.1, 0.06],
          ] as const) {
            const lossAt = (tC: number) =>
              coreW * lossTemperatureFactor(material, tC) +
              evaluatedCopperW(current, portion, ohm, tC);
            let settledC = Infinity;
            for (let tC = ambientC; tC <= hotC; tC += 0.01) {
              if (ambientC + surfaceRiseK(lossAt(tC), surfaceAreaM2) <= tC) {
                settledC = tC;
                break;
              }
            }
            const context = { material, ambientC, hotC, surfaceAreaM2, toleranceK: 0.05 };
            const bound = settleFromBelow(
              context,
              coreW,
              copperOf(current, portion, ohm, true),
              1,
              { temperatureC: 0, transformerW: 0 },
            );
            if (settledC === Infinity) {
              expect(bound.temperatureC).toBeGreaterThan(ambientC);
              continue;
            }
            expect(bound.temperatureC).toBeLessThanOrEqual(settledC);
            expect(bound.transformerW).toBeLessThanOrEqual(lossAt(settledC) * (1 + 1e-12));
            tightest = Math.min(tightest, settledC - bound.temperatureC);
            // Never looser than Dowell's factors at the hottest allowed copper alone (the bound
            // before the grid), and tighter somewhere.
            const hotOnly = copperOf(current, portion, ohm, true);
            const atHotW = hotOnly.at20CW(0);
            const before = settleFromBelow(
              context,
              coreW,
              { gridHotC: hotC, at20CW: () => atHotW },
              1,
              { temperatureC: 0, transformerW: 0 },
            );
            expect(bound.temperatureC).toBeGreaterThanOrEqual(before.temperatureC - 1e-9);
            gainK = Math.max(gainK, bound.temperatureC - before.temperatureC);
          }
        }
      }
    }
    expect(tightest).toBeLessThan(0.1);
    expect(gainK).toBeGreaterThan(1);
  });
});
