import { describe, expect, it } from 'vitest';
import { designInductor } from '../../../solvers/inductor/design-inductor.js';
import type { InductorDuty } from '../../../solvers/inductor/inductor-duty.js';
import { outputInductorDesignView } from '../../../solvers/inductor/output-inductor-design-view.js';
import { CORE_SHAPE_CATALOG } from '../../../solvers/magnetics/core-shape-catalog.js';
import { coreGeometry } from '../../../solvers/magnetics/core-geometry.js';
import { MU_0_H_PER_M } from '../../../solvers/magnetics/gapped-inductance.js';
import { lossTemperatureFactor } from '../../../solvers/magnetics/loss-temperature-factor.js';
import { MATERIAL_CLASSES } from '../../../solvers/magnetics/material-classes.js';
import { saturationFluxDensity } from '../../../solvers/magnetics/saturation-flux-density.js';
import type { Waveform } from '../../../solvers/waveform/waveform.js';
import { expectClose } from '../../helpers/expect-close.js';

const PERIOD_S = 10e-6;
const ferrite = MATERIAL_CLASSES.find((m) => m.id === 'mnzn-power-low-frequency');
if (ferrite === undefined) throw new Error('catalog material missing');

/** Invented duty: a 100 kHz buck-derived output inductor of 40 µH. */
function triangle(valleyA: number, peakA: number, dutyCycle: number): Waveform {
  return {
    periodS: PERIOD_S,
    timesS: [0, dutyCycle * PERIOD_S, PERIOD_S],
    values: [valleyA, peakA, valleyA],
  };
}

/** Discontinuous: rises from zero for D·T, falls to zero over fall·T, then idles. */
function discontinuous(peakA: number, dutyCycle: number, fall: number): Waveform {
  return {
    periodS: PERIOD_S,
    timesS: [0, dutyCycle * PERIOD_S, (dutyCycle + fall) * PERIOD_S, PERIOD_S],
    values: [0, peakA, 0, 0],
  };
}

const duty: InductorDuty = {
  outputIndex: 0,
  name: 'output-inductor-1',
  ambientTemperatureC: 40,
  cornerLabels: ['ccm-full-load', 'dcm-light-load'],
  inductanceH: 40e-6,
  currentsA: [triangle(6.8, 9.2, 0.4), discontinuous(1.2, 0.25, 0.35)],
};
const request = { shapes: CORE_SHAPE_CATALOG, materials: [ferrite] };

/**
 * iGSE loss density of a piecewise-linear flux made of rising and falling ramps of equal swing
 * ΔB (durations t_i, idle segments contributing nothing): Pv = ki·ΔB^β·Σ t_i^(1−α) / T, with
 * ki = k / ((2π)^(α−1)·∫₀^2π |cos θ|^α dθ·2^(β−α)), the integral by a fine midpoint rule here.
 */
function igseClosedForm(swingT: number, rampDurationsS: number[]): number {
  const { k, alpha, beta } = ferrite!.steinmetz;
  const steps = 200000;
  let integral = 0;
  for (let i = 0; i < steps; i++) {
    integral += Math.abs(Math.cos(((i + 0.5) * 2 * Math.PI) / steps)) ** alpha;
  }
  integral *= (2 * Math.PI) / steps;
  const ki = k / ((2 * Math.PI) ** (alpha - 1) * integral * 2 ** (beta - alpha));
  const sum = rampDurationsS.reduce((total, t) => total + t ** (1 - alpha), 0);
  return (ki * swingT ** beta * sum) / PERIOD_S;
}

describe('designInductor', () => {
  const designed = designInductor(duty, request);
  if (!designed.ok) throw new Error(JSON.stringify(designed.issues));
  const { build, evaluation } = designed.value;
  const view = outputInductorDesignView(duty, build, evaluation);
  const g = evaluation.geometry;
  const turns = view.turns;

  // ref: Mohan, Undeland, Robbins, 3rd ed., ch. 30, and Erickson & Maksimović, Fundamentals of
  // Power Electronics, 2nd ed., ch. 13–14 (from memory): L = μ0·N²·Ae/(lg/F + le/μr), with
  // McLyman's fringing factor F = 1 + (lg/√Ae)·ln(2G/lg) (4th ed., ch. 8) widening the gap.
  it('designInductor cuts the gap so that the reluctance formula gives the target inductance', () => {
    expect(view.gapLengthM).toBeGreaterThan(0);
    const lg = view.gapLengthM;
    const fringing =
      1 + (lg / Math.sqrt(g.effectiveAreaM2)) * Math.log((2 * g.windowBreadthM) / lg);
    const reluctanceL =
      (MU_0_H_PER_M * turns ** 2 * g.effectiveAreaM2) /
      (lg / fringing + g.effectiveLengthM / ferrite.initialPermeability);
    expectClose(reluctanceL, 40e-6, { rel: 1e-6 });
    expectClose(view.inductanceH, 40e-6, { rel: 1e-6 });
  });

  // ref: Faraday's law for a wound core, λ = L·i = N·B·A (Mohan, Undeland, Robbins, 3rd ed.,
  // ch. 30): the peak flux density follows the peak current, in the core's smallest section.
  it('designInductor reports the peak flux density from N·B·Amin = L·Ipk', () => {
    const corner = view.corners[0];
    if (corner === undefined) throw new Error('no corner');
    expectClose(corner.currentPeakA, 9.2, { rel: 1e-12 });
    expectClose(turns * corner.peakFluxDensityT * g.minimumAreaM2, 40e-6 * 9.2, { rel: 1e-9 });
    // The search's own bound: under fluxDensityUtilizationMax of Bsat at the corner temperature.
    const bsat = saturationFluxDensity(ferrite, corner.temperatureC);
    expect(corner.peakFluxDensityT).toBeLessThanOrEqual(0.8 * bsat);
    expect(Number.isInteger(turns) && turns >= 1).toBe(true);
    expect(view.windowFill).toBeLessThanOrEqual(0.5);
  });

  // ref: Venkatachalam, Sullivan, Abdallah, Tacca, IEEE COMPEL 2002 (iGSE), closed form for a
  // piecewise-linear (triangular) flux: ki·ΔB^β·(t1^(1−α) + t2^(1−α))/T.
  it('designInductor takes the ripple core loss by the iGSE closed form for triangular flux', () => {
    const corner = view.corners[0];
    if (corner === undefined) throw new Error('no corner');
    const swingT = (40e-6 * (9.2 - 6.8)) / (turns * g.effectiveAreaM2);
    expectClose(corner.fluxDensitySwingT, swingT, { rel: 1e-9 });
    const pv = igseClosedForm(swingT, [0.4 * PERIOD_S, 0.6 * PERIOD_S]);
    const factor = lossTemperatureFactor(ferrite, corner.temperatureC);
    expectClose(corner.coreLossW, pv * g.effectiveVolumeM3 * factor, { rel: 1e-6 });
  });

  // ref: same closed form; in discontinuous conduction the idle interval has dB/dt = 0 and adds
  // nothing, and the current's DC and RMS follow from the triangle (common practice).
  it('designInductor handles a discontinuous corner', () => {
    const corner = view.corners[1];
    if (corner === undefined) throw new Error('no corner');
    expect(corner.conductionMode).toBe('dcm');
    expect(view.corners[0]?.conductionMode).toBe('ccm');
    expectClose(corner.currentAverageA, (1.2 * 0.6) / 2, { rel: 1e-12 });
    expectClose(corner.currentRippleA, 1.2, { rel: 1e-12 });
    const swingT = (40e-6 * 1.2) / (turns * g.effectiveAreaM2);
    const pv = igseClosedForm(swingT, [0.25 * PERIOD_S, 0.35 * PERIOD_S]);
    const factor = lossTemperatureFactor(ferrite, corner.temperatureC);
    expectClose(corner.coreLossW, pv * g.effectiveVolumeM3 * factor, { rel: 1e-6 });
    // DC loss: I_dc²·R at the corner's own temperature.
    expectClose(corner.copperDcLossW, corner.currentAverageA ** 2 * corner.resistanceOhm, {
      rel: 1e-9,
    });
    expect(corner.copperAcLossW).toBeGreaterThan(0);
  });

  // ref: common practice — a ring core cannot take a cut gap, and the search goes from the
  // smallest core up: every smaller gappable shape has no build inside the limits.
  it('designInductor picks the smallest gappable core that fits', () => {
    expect(build.shape.family).not.toBe('ring');
    const smaller = CORE_SHAPE_CATALOG.filter(
      (shape) =>
        shape.family !== 'ring' && coreGeometry(shape).effectiveVolumeM3 < g.effectiveVolumeM3,
    );
    expect(smaller.length).toBeGreaterThan(0);
    for (const shape of smaller) {
      expect(designInductor(duty, { shapes: [shape], materials: [ferrite] }).ok).toBe(false);
    }
  });

  // ref: first-order tolerance of L = N²/(Rc + Rg) (common practice): a gap-dominated core
  // spreads about as its gap does, plus the core's share of the permeability tolerance.
  it('designInductor reports the inductance tolerance from the gap and the material', () => {
    const { worstCase, rss, gapToleranceM, permeabilityTolerance } = view.inductanceTolerance;
    expect(worstCase).toBeGreaterThanOrEqual(rss);
    expect(worstCase).toBeLessThanOrEqual(gapToleranceM / view.gapLengthM + permeabilityTolerance);
    expect(worstCase).toBeGreaterThan(0);
  });

  it('designInductor answers with numbers at outputs[k].inductanceH when no core fits', () => {
    const heavy: InductorDuty = {
      ...duty,
      outputIndex: 1,
      name: 'output-inductor-2',
      inductanceH: 5e-3,
      currentsA: [triangle(95, 105, 0.4)],
      cornerLabels: ['full-load'],
    };
    const result = designInductor(heavy, request);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    // The wound-core limits, restated for the inductor of output 2.
    const limits = new Set(['window_fill_limit', 'flux_density_limit', 'temperature_rise_limit']);
    for (const issue of result.issues) {
      expect(issue.path).toEqual(['outputs', 1, 'inductanceH']);
      expect(issue.constraint.startsWith('output-inductor-2: ')).toBe(true);
      expect(Number.isFinite(issue.required) && Number.isFinite(issue.limit)).toBe(true);
      expect(limits.has(issue.code) || issue.code === 'non_physical_value').toBe(true);
    }
  });
});
