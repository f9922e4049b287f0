import { describe, expect, it } from 'vitest';
import { CORE_SHAPE_CATALOG } from '../../../solvers/magnetics/core-shape-catalog.js';
import { coreGeometry } from '../../../solvers/magnetics/core-geometry.js';
import { MATERIAL_CLASSES } from '../../../solvers/magnetics/material-classes.js';
import { COPPER_RESISTIVITY_20C_OHM_M } from '../../../solvers/materials/copper-resistance.js';
import { designTransformer } from '../../../solvers/transformer/design-transformer.js';
import { evaluateTransformer } from '../../../solvers/transformer/evaluate-transformer.js';
import { foilBuild } from '../../../solvers/transformer/foil-build.js';
import type { TransformerBuild } from '../../../solvers/transformer/transformer-build.js';
import { TRANSFORMER_EVALUATION_DEFAULTS } from '../../../solvers/transformer/transformer-evaluation-options.js';
import type { TransformerRequest } from '../../../solvers/transformer/transformer-request.js';
import { expectClose } from '../../helpers/expect-close.js';
import { flybackDuty, forwardDuty } from './transformer-duties.js';

const shape = CORE_SHAPE_CATALOG.find((s) => s.designation === 'ETD 29');
const material = MATERIAL_CLASSES.find((m) => m.id === 'mnzn-power-low-frequency');
if (shape === undefined || material === undefined) throw new Error('catalog entries missing');
const { endMarginM, sectionInsulationM } = TRANSFORMER_EVALUATION_DEFAULTS;
const geometry = coreGeometry(shape);
const breadthM = geometry.windowBreadthM - 2 * endMarginM;

const build: TransformerBuild = {
  shape,
  material,
  turns: [16, 4],
  wires: [
    { kind: 'round', awg: 25, parallelCount: 4 },
    { kind: 'litz', strandAwg: 25, strandCount: 28 },
  ],
  arrangement: 'interleaved',
  gapLengthM: 0,
};

describe('foilBuild', () => {
  const duty = forwardDuty();

  // ref: common practice — foil for the few turns of high current that would otherwise be litz.
  it('foilBuild puts foil across the breadth in place of a litz winding of few turns', () => {
    const foil = foilBuild(duty, build, breadthM, sectionInsulationM, geometry.meanTurnLengthM);
    if (foil === undefined) throw new Error('the litz secondary should become foil');
    expect(foil.wires[0]).toEqual(build.wires[0]);
    expect(foil.wires[1]).toMatchObject({ kind: 'foil', widthM: breadthM });
    expect(foil.turns).toEqual(build.turns);
    expect(foilBuild(duty, build, breadthM, sectionInsulationM, 0.05, { turnsMax: 3 })).toBe(
      undefined,
    );
  });

  // ref: IEC 60028: R20 = ρ20·N·MLT/(t·w), ρ20 = 1/58 Ω·mm²/m; window fill and stack height by
  // hand from the turns, the foil's thickness plus film, and the round wire's outside square.
  it('evaluateTransformer(foil build) gives R20 = ρ20·N·MLT/(t·w) and the fill by hand', () => {
    const foil = foilBuild(duty, build, breadthM, sectionInsulationM, geometry.meanTurnLengthM);
    const wire = foil?.wires[1];
    if (foil === undefined || wire?.kind !== 'foil') throw new Error('expected a foil secondary');
    const evaluation = evaluateTransformer(duty, foil);
    if (evaluation === undefined) throw new Error('the foil build should fit');
    expectClose(
      evaluation.resistancesAt20COhm[1] ?? NaN,
      (COPPER_RESISTIVITY_20C_OHM_M * 4 * geometry.meanTurnLengthM) / (wire.thicknessM * breadthM),
      { rel: 1e-12 },
    );
    const layer = wire.thicknessM + wire.insulationThicknessM;
    const primary = evaluation.stack.layouts[0];
    if (primary === undefined) throw new Error('no primary layout');
    expectClose(
      evaluation.windowFill,
      (primary.outsideAreaM2 + 4 * breadthM * layer) / geometry.windowAreaM2,
      { rel: 1e-12 },
    );
    // Interleaved: two primary halves around the foil, three sections, two insulation gaps.
    const primaryHalves = [8, 8].map((turns) => Math.ceil(turns / primary.turnsPerLayer));
    expectClose(
      evaluation.stack.stackHeightM,
      (primaryHalves[0]! + primaryHalves[1]!) * primary.dimensions.layerHeightM +
        4 * layer +
        2 * sectionInsulationM,
      { rel: 1e-12 },
    );
  });
});

describe('designTransformer with foil', () => {
  const request: TransformerRequest = {
    shapes: CORE_SHAPE_CATALOG.filter((s) => s.family !== 'ring'),
    materials: MATERIAL_CLASSES.filter((m) => m.id.startsWith('mnzn')),
    arrangement: 'interleaved',
  };
  const worstW = (corners: ReadonlyArray<{ totalLossW: number }>) =>
    Math.max(...corners.map((corner) => corner.totalLossW));

  // ref: common practice — a low-voltage secondary of 20 A is wound in foil; the engine keeps
  // foil only where it loses less than the round wire or litz it would otherwise wind.
  it('designTransformer(20 A forward secondary, one core) winds foil, losing less than without it', () => {
    const oneCore = { ...request, shapes: [shape] };
    const withFoil = designTransformer(forwardDuty(), oneCore);
    const without = designTransformer(forwardDuty(), { ...oneCore, foilChoice: { turnsMax: 0 } });
    if (!withFoil.ok || !without.ok) throw new Error('both designs should be feasible');
    expect(withFoil.value.build.wires[1]?.kind).toBe('foil');
    expect(without.value.build.wires[1]?.kind).toBe('litz');
    expect(worstW(withFoil.value.evaluation.corners)).toBeLessThanOrEqual(
      worstW(without.value.evaluation.corners),
    );
    const limits = TRANSFORMER_EVALUATION_DEFAULTS;
    expect(withFoil.value.evaluation.windowFill).toBeLessThanOrEqual(limits.windowFillMax);
    expect(withFoil.value.evaluation.windowHeightFill).toBeLessThanOrEqual(1);
  });

  // ref: common practice — the smallest core that holds the windings within every limit wins;
  // foil packs copper closer than litz, so it never needs a larger one.
  it('designTransformer(20 A forward secondary, catalog) takes no larger a core with foil', () => {
    const withFoil = designTransformer(forwardDuty(), request);
    const without = designTransformer(forwardDuty(), { ...request, foilChoice: { turnsMax: 0 } });
    if (!withFoil.ok || !without.ok) throw new Error('both designs should be feasible');
    expect(withFoil.value.build.wires.some((wire) => wire.kind === 'foil')).toBe(true);
    expect(coreGeometry(withFoil.value.build.shape).effectiveVolumeM3).toBeLessThanOrEqual(
      coreGeometry(without.value.build.shape).effectiveVolumeM3,
    );
  });

  // ref: common practice — no foil next to a gap, whose fringing field crosses it broadside.
  it('designTransformer(gapped flyback duty) never winds foil', () => {
    const chosen = designTransformer(flybackDuty([{ valleyA: 3, peakA: 6 }]), request);
    if (!chosen.ok) throw new Error(JSON.stringify(chosen.issues));
    // Its secondary is litz of four turns: foil would be offered on an ungapped core.
    expect(chosen.value.build.wires[1]?.kind).toBe('litz');
    expect(chosen.value.build.turns[1]).toBeLessThanOrEqual(10);
    expect(chosen.value.build.wires.some((wire) => wire.kind === 'foil')).toBe(false);
  });

  // ref: common practice — a fixed conductor is the user's choice and is kept as given.
  it('designTransformer(fixed foil) keeps the given foil and reports its laid width', () => {
    const foil = { kind: 'foil', thicknessM: 0.3e-3, insulationThicknessM: 50e-6 } as const;
    const chosen = designTransformer(forwardDuty(), {
      ...request,
      shapes: [shape],
      wires: [{ kind: 'round', awg: 25, parallelCount: 4 }, foil],
    });
    if (!chosen.ok) throw new Error(JSON.stringify(chosen.issues));
    expect(chosen.value.build.wires[1]).toEqual(foil);
    expect(chosen.value.evaluation.stack.layouts[1]?.wire).toEqual({ ...foil, widthM: breadthM });
  });

  // ref: common practice — a foil wider than the window's breadth cannot be wound on it.
  it('designTransformer(foil wider than the window) answers window_fill_limit with the widths', () => {
    const chosen = designTransformer(forwardDuty(), {
      ...request,
      shapes: [shape],
      wires: [
        { kind: 'round', awg: 25, parallelCount: 4 },
        { kind: 'foil', thicknessM: 0.3e-3, widthM: 0.05, insulationThicknessM: 50e-6 },
      ],
    });
    expect(chosen.ok).toBe(false);
    if (chosen.ok) return;
    expect(chosen.issues[0]).toMatchObject({
      code: 'window_fill_limit',
      quantity: 'windingPitchM',
      required: 0.05,
    });
    expectClose(chosen.issues[0]?.limit ?? NaN, breadthM, { rel: 1e-12 });
  });
});
