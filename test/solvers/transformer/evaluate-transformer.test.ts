import { describe, expect, it } from 'vitest';
import { CORE_SHAPE_CATALOG } from '../../../solvers/magnetics/core-shape-catalog.js';
import { coreGeometry } from '../../../solvers/magnetics/core-geometry.js';
import { gappedInductance } from '../../../solvers/magnetics/gapped-inductance.js';
import { MATERIAL_CLASSES } from '../../../solvers/magnetics/material-classes.js';
import { roundWireGauge } from '../../../solvers/magnetics/round-wire-gauge.js';
import { COPPER_RESISTIVITY_20C_OHM_M } from '../../../solvers/materials/copper-resistance.js';
import { evaluateTransformer } from '../../../solvers/transformer/evaluate-transformer.js';
import type { TransformerBuild } from '../../../solvers/transformer/transformer-build.js';
import { TRANSFORMER_EVALUATION_DEFAULTS } from '../../../solvers/transformer/transformer-evaluation-options.js';
import { transformerIssues } from '../../../solvers/transformer/transformer-issues.js';
import { expectClose } from '../../helpers/expect-close.js';
import { flybackDuty } from './transformer-duties.js';

const shape = CORE_SHAPE_CATALOG.find((s) => s.designation === 'ETD 29');
const material = MATERIAL_CLASSES.find((m) => m.id === 'mnzn-power-low-frequency');
if (shape === undefined || material === undefined) throw new Error('catalog entries missing');

const build: TransformerBuild = {
  shape,
  material,
  turns: [40, 10],
  wires: [
    { kind: 'round', awg: 25, parallelCount: 1 },
    { kind: 'round', awg: 25, parallelCount: 3 },
  ],
  arrangement: 'interleaved',
  gapLengthM: 0,
};

describe('evaluateTransformer', () => {
  const duty = flybackDuty();
  const evaluation = evaluateTransformer(duty, build);
  if (evaluation === undefined) throw new Error('the build should fit');
  const geometry = coreGeometry(shape);

  // ref: Mohan, Undeland, Robbins, 3rd ed., ch. 30 (from memory): L = N²/(Rcore + Rgap); the
  // gap is cut so that the gapped core gives the converter's magnetizing inductance.
  it('evaluateTransformer(flyback duty) cuts the gap for the magnetizing inductance', () => {
    expect(evaluation.gapLengthM).toBeGreaterThan(0);
    expectClose(evaluation.magnetizingInductanceH, 200e-6, { rel: 1e-6 });
    const core = {
      turns: 40,
      effectiveLengthM: geometry.effectiveLengthM,
      effectiveAreaM2: geometry.effectiveAreaM2,
      relativePermeability: material.initialPermeability,
      windowHeightM: geometry.windowBreadthM,
      fringing: 'mclyman' as const,
    };
    expectClose(gappedInductance(core, evaluation.gapLengthM), 200e-6, { rel: 1e-6 });
  });

  // ref: IEC 60028: R = ρ20·l/A with ρ20 = 1/58 Ω·mm²/m; l = N·MLT, A of ASTM B258 AWG 25.
  it('evaluateTransformer gives each winding R20 = ρ20·N·MLT/A', () => {
    const area = roundWireGauge(25).copperAreaM2;
    expectClose(
      evaluation.resistancesAt20COhm[0] ?? NaN,
      (COPPER_RESISTIVITY_20C_OHM_M * 40 * geometry.meanTurnLengthM) / area,
      { rel: 1e-9 },
    );
    expectClose(
      evaluation.resistancesAt20COhm[1] ?? NaN,
      (COPPER_RESISTIVITY_20C_OHM_M * 10 * geometry.meanTurnLengthM) / (3 * area),
      { rel: 1e-9 },
    );
  });

  // ref: Faraday's law and L = Nφ/i (Mohan, Undeland, Robbins, 3rd ed., ch. 30, from memory):
  // B = Lm·i/(Np·A), at the smallest section for the peak.
  it('evaluateTransformer reads the peak flux density B = Lm·Ipk/(Np·Amin)', () => {
    const corner = evaluation.corners[0];
    if (corner === undefined) throw new Error('no corner');
    expectClose(corner.peakFluxDensityT, (200e-6 * 1.4) / (40 * geometry.minimumAreaM2), {
      rel: 1e-12,
    });
    expectClose(corner.fluxDensitySwingT, (200e-6 * 0.8) / (40 * geometry.effectiveAreaM2), {
      rel: 1e-12,
    });
  });

  // ref: McLyman, Transformer and Inductor Design Handbook, 4th ed., ch. 6: ΔT = 450·(P/At)^0.826,
  // At in cm² (from memory); the settled temperature satisfies it with the settled loss.
  it('evaluateTransformer settles loss and temperature on McLyman’s surface relation', () => {
    const corner = evaluation.corners[0];
    if (corner === undefined) throw new Error('no corner');
    expect(corner.isThermallyStable).toBe(true);
    const riseK = 450 * (corner.totalLossW / (geometry.surfaceAreaM2 * 1e4)) ** 0.826;
    expectClose(corner.temperatureRiseK, riseK, { abs: 0.1 });
    expect(corner.coreLossW).toBeGreaterThan(0);
    expect(corner.copperLossW).toBeGreaterThan(0);
  });

  // ref: Incropera, DeWitt et al., Fundamentals of Heat and Mass Transfer, plane wall with
  // uniform generation (from memory): the build t as a slab insulated on the bobbin side with
  // q = Pcu/(MLT·b·t) peaks q·t²/(2k) = Pcu·t/(2k·MLT·b) above the surface temperature, with
  // b the breadth between the end margins and k the default 0.4 W/(m·K) (common practice).
  it('evaluateTransformer puts the hot spot Pcu·t/(2k·MLT·b) above the surface temperature', () => {
    for (const corner of evaluation.corners) {
      const t = evaluation.stack.stackHeightM;
      const expected =
        (corner.copperLossW * t) /
        (2 * 0.4 * geometry.meanTurnLengthM * (geometry.windowBreadthM - 2 * 0.5e-3));
      expect(expected).toBeGreaterThan(0);
      expectClose(corner.hotSpotRiseK, expected, { rel: 1e-12 });
      expectClose(corner.hotSpotTemperatureC, corner.temperatureC + expected, { rel: 1e-12 });
    }
  });

  // ref: common practice — a hot-spot limit below the estimate is a broken limit, with numbers.
  it('transformerIssues flags hot_spot_limit at each corner whose hot spot exceeds the limit', () => {
    const hottest = Math.max(...evaluation.corners.map((c) => c.hotSpotTemperatureC));
    const limit = hottest - 0.01;
    const settings = { ...TRANSFORMER_EVALUATION_DEFAULTS, hotSpotTemperatureMaxC: limit };
    const hot = transformerIssues(evaluation, settings).filter((i) => i.code === 'hot_spot_limit');
    expect(hot.length).toBeGreaterThanOrEqual(1);
    for (const issue of hot) {
      expect(issue.quantity).toBe('hotSpotTemperatureC');
      expect(issue.required).toBeGreaterThan(limit);
      expect(issue.limit).toBe(limit);
      expect(issue.corner).toBeDefined();
    }
    const relaxed = { ...settings, hotSpotTemperatureMaxC: hottest + 0.01 };
    expect(transformerIssues(evaluation, relaxed).some((i) => i.code === 'hot_spot_limit')).toBe(
      false,
    );
  });

  // ref: Dowell, Proc. IEE, 1966 — AC resistance is never below DC: every harmonic's factor ≥ 1.
  it('evaluateTransformer never reports an AC loss below zero', () => {
    for (const w of evaluation.corners[0]?.windings ?? []) {
      expect(w.acLossW).toBeGreaterThan(0);
      expect(w.dcLossW).toBeGreaterThanOrEqual(0);
    }
  });
});
