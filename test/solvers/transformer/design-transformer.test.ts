import { describe, expect, it } from 'vitest';
import { CORE_SHAPE_CATALOG } from '../../../solvers/magnetics/core-shape-catalog.js';
import { MATERIAL_CLASSES } from '../../../solvers/magnetics/material-classes.js';
import { designTransformer } from '../../../solvers/transformer/design-transformer.js';
import { TRANSFORMER_EVALUATION_DEFAULTS } from '../../../solvers/transformer/transformer-evaluation-options.js';
import type { TransformerRequest } from '../../../solvers/transformer/transformer-request.js';
import { expectClose } from '../../helpers/expect-close.js';
import { flybackDuty } from './transformer-duties.js';

const ferrites = MATERIAL_CLASSES.filter((m) => m.id.startsWith('mnzn'));
const request: TransformerRequest = {
  shapes: CORE_SHAPE_CATALOG,
  materials: ferrites,
  arrangement: 'interleaved',
};
const duty = flybackDuty([
  { valleyA: 0.6, peakA: 1.4 },
  { valleyA: 0.1, peakA: 0.9 },
]);

describe('designTransformer', () => {
  // ref: common practice — a chosen transformer respects every limit it was held against.
  it('designTransformer(flyback duty) returns a build inside fill, flux and temperature limits', () => {
    const chosen = designTransformer(duty, request);
    if (!chosen.ok) throw new Error(JSON.stringify(chosen.issues));
    const { evaluation } = chosen.value;
    const limits = TRANSFORMER_EVALUATION_DEFAULTS;
    expect(evaluation.windowFill).toBeLessThanOrEqual(limits.windowFillMax);
    expect(evaluation.windowHeightFill).toBeLessThanOrEqual(1);
    expect(evaluation.corners).toHaveLength(2);
    for (const corner of evaluation.corners) {
      expect(corner.fluxDensityUtilization).toBeLessThanOrEqual(limits.fluxDensityUtilizationMax);
      expect(corner.temperatureRiseK).toBeLessThanOrEqual(limits.temperatureRiseMaxK);
      expect(corner.isThermallyStable).toBe(true);
    }
  });

  // ref: common practice — the turns ratio of a wound transformer is a ratio of whole turns.
  it('designTransformer keeps whole turns near the asked ratio, and fixed primary turns', () => {
    const chosen = designTransformer(duty, request);
    if (!chosen.ok) throw new Error('infeasible');
    const [np, ns] = chosen.value.build.turns;
    expect(Number.isInteger(np) && Number.isInteger(ns)).toBe(true);
    expect(Math.abs((np ?? 0) / (ns ?? 1) - 4)).toBeLessThanOrEqual(0.5);
    const fixed = designTransformer(duty, { ...request, primaryTurns: 60 });
    if (!fixed.ok) throw new Error('infeasible with 60 turns');
    expect(fixed.value.build.turns).toEqual([60, 15]);
  });

  // ref: common practice — a core far too small for the power cannot hold it: the smallest
  // cut-gap core of the catalog for this duty breaks a window, flux or temperature limit, said
  // with numbers.
  it('designTransformer(duty, one tiny core) answers with the limits it breaks', () => {
    const tiny = CORE_SHAPE_CATALOG.find((s) => s.designation === 'EFD 20/10/7');
    if (tiny === undefined) throw new Error('no EFD 20/10/7');
    const chosen = designTransformer(flybackDuty([{ valleyA: 3, peakA: 6 }]), {
      ...request,
      shapes: [tiny],
    });
    expect(chosen.ok).toBe(false);
    if (chosen.ok) return;
    for (const issue of chosen.issues) {
      expect([
        'window_fill_limit',
        'flux_density_limit',
        'temperature_rise_limit',
        'non_physical_value',
      ]).toContain(issue.code);
      expect(issue.path).toEqual(['magnetics']);
      expect(Number.isFinite(issue.required) && Number.isFinite(issue.limit)).toBe(true);
    }
  });

  // ref: common practice — a ferrite ring (toroid) is one closed piece and takes no cut gap, so
  // a flyback, whose gap sets the magnetizing inductance, is never wound on one; a forward's
  // ungapped core may be.
  it('designTransformer leaves rings out where the gap sets the inductance, and says so', () => {
    const rings = CORE_SHAPE_CATALOG.filter((s) => s.family === 'ring');
    const chosen = designTransformer(duty, request);
    if (!chosen.ok) throw new Error(JSON.stringify(chosen.issues));
    expect(chosen.value.build.shape.family).not.toBe('ring');
    const onRings = designTransformer(duty, { ...request, shapes: rings });
    expect(onRings.ok).toBe(false);
    if (onRings.ok) return;
    expect(onRings.issues).toHaveLength(1);
    expect(onRings.issues[0]).toMatchObject({
      code: 'non_physical_value',
      path: ['magnetics', 'coreShape'],
      required: 1,
      limit: 0,
    });
    const ungapped = designTransformer(
      { ...duty, gapRole: 'ungapped' },
      { ...request, shapes: rings },
    );
    expect(ungapped.ok && ungapped.value.build.shape.family).toBe('ring');
  });

  // ref: common practice — a build whose winding hot spot exceeds the limit is rejected: with
  // the limit just below the default choice's hot spot, the designer must take another build
  // that meets it; with the limit at the ambient, where no wound core can be, it must refuse
  // with hot_spot_limit and numbers.
  it('designTransformer rejects builds whose hot spot exceeds hotSpotTemperatureMaxC', () => {
    const chosen = designTransformer(duty, request);
    if (!chosen.ok) throw new Error('infeasible');
    const hottest = Math.max(...chosen.value.evaluation.corners.map((c) => c.hotSpotTemperatureC));
    const limit = hottest - 0.05;
    const cooler = designTransformer(duty, {
      ...request,
      evaluation: { hotSpotTemperatureMaxC: limit },
    });
    if (!cooler.ok) throw new Error(JSON.stringify(cooler.issues));
    for (const corner of cooler.value.evaluation.corners) {
      expect(corner.hotSpotTemperatureC).toBeLessThanOrEqual(limit);
    }
    const impossible = designTransformer(duty, {
      ...request,
      evaluation: { hotSpotTemperatureMaxC: duty.ambientTemperatureC },
    });
    expect(impossible.ok).toBe(false);
    if (impossible.ok) return;
    const hot = impossible.issues.filter((issue) => issue.code === 'hot_spot_limit');
    expect(hot.length).toBeGreaterThan(0);
    for (const issue of hot) {
      expect(issue.required).toBeGreaterThan(duty.ambientTemperatureC);
      expect(issue.limit).toBe(duty.ambientTemperatureC);
    }
  });

  // ref: common practice — a PQ pair designs like any other shape: its window, breadth and
  // mean turn come from coreGeometry, and the build respects every limit.
  it('designTransformer(duty, PQ shapes only) returns a PQ build inside every limit', () => {
    const pq = CORE_SHAPE_CATALOG.filter((s) => s.family === 'pq');
    const chosen = designTransformer(duty, { ...request, shapes: pq });
    if (!chosen.ok) throw new Error(JSON.stringify(chosen.issues));
    const { build, evaluation } = chosen.value;
    expect(build.shape.family).toBe('pq');
    const limits = TRANSFORMER_EVALUATION_DEFAULTS;
    expect(evaluation.windowFill).toBeLessThanOrEqual(limits.windowFillMax);
    expect(evaluation.windowHeightFill).toBeLessThanOrEqual(1);
    expectClose(evaluation.breadthM, evaluation.geometry.windowBreadthM - 2 * limits.endMarginM, {
      rel: 1e-12,
    });
    for (const corner of evaluation.corners) {
      expect(corner.fluxDensityUtilization).toBeLessThanOrEqual(limits.fluxDensityUtilizationMax);
      expect(corner.temperatureRiseK).toBeLessThanOrEqual(limits.temperatureRiseMaxK);
      expect(corner.hotSpotTemperatureC).toBeLessThanOrEqual(limits.hotSpotTemperatureMaxC);
    }
  });
});
