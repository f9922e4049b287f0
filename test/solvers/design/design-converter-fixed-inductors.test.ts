import { describe, expect, it } from 'vitest';
import { designConverter } from '../../../solvers/design/design-converter.js';
import type { Design } from '../../../solvers/design/design-schema.js';
import { coreGeometry } from '../../../solvers/magnetics/core-geometry.js';
import { CORE_SHAPE_CATALOG } from '../../../solvers/magnetics/core-shape-catalog.js';
import { MU_0_H_PER_M } from '../../../solvers/magnetics/gapped-inductance.js';
import { MATERIAL_CLASSES } from '../../../solvers/magnetics/material-classes.js';
import type { Issue } from '../../../solvers/result.js';
import { SpecSchema, type Spec } from '../../../solvers/spec/spec-schema.js';
import { expectClose } from '../../helpers/expect-close.js';
import { halfBridgeSpec } from '../../helpers/double-ended-specs.js';
import { telecomSpec } from '../../helpers/flyback-specs.js';
import { forwardTelecomSpec } from '../../helpers/forward-specs.js';

function designed(spec: Spec): Design {
  const result = designConverter(spec);
  if (!result.ok) throw new Error(JSON.stringify(result.issues));
  return result.value;
}

function issuesOf(spec: Spec): Issue[] {
  const result = designConverter(spec);
  if (result.ok) throw new Error('expected the design to be refused');
  return result.issues;
}

/** `spec` with `entries` as magnetics.outputInductors (parsed, so the schema's checks apply). */
function withInductors(spec: Spec, entries: object[]): Spec {
  return SpecSchema.parse({ ...spec, magnetics: { ...spec.magnetics, outputInductors: entries } });
}

/** The fields a design's output inductor reports that the spec takes under the same names. */
function buildOf(inductor: NonNullable<Design['outputInductors']>[number], withGap: boolean) {
  return {
    outputIndex: inductor.outputIndex,
    coreShape: inductor.coreShape,
    materialId: inductor.materialId,
    turns: inductor.turns,
    wire: inductor.wire,
    ...(withGap ? { gapLengthM: inductor.gapLengthM } : {}),
  };
}

/**
 * McLyman's fringing factor, F = 1 + (lg/√Ae)·ln(2G/lg) (McLyman, Transformer and Inductor
 * Design Handbook, 3rd ed., ch. 8, from memory), written out here rather than taken from the
 * engine.
 */
function fringing(gapM: number, areaM2: number, windowHeightM: number): number {
  return 1 + (gapM / Math.sqrt(areaM2)) * Math.log((2 * windowHeightM) / gapM);
}

describe('designConverter with output inductors fixed in the spec', () => {
  // Invented scenario (test/helpers/forward-specs.ts): 36–72 V to 12 V 8 A, 100 kHz.
  const spec = forwardTelecomSpec({ magnetics: { mode: 'design' } });
  const design = designed(spec);
  const inductor = design.outputInductors?.[0];
  if (inductor === undefined) throw new Error('a designed forward carries its output inductor');

  // ref: spec contract — a stored design's inductor (its own fields, the gap left to the
  // inductance) fixed into the spec is evaluated without a search and gives the same design.
  it('reproduces the design it came from, number for number, when its build is fixed', () => {
    const again = designed(withInductors(spec, [buildOf(inductor, false)]));
    expect(JSON.stringify(again)).toBe(JSON.stringify(design));
  });

  // ref: spec contract — every design of a buck-derived topology round-trips its inductors.
  it('round-trips the half bridge too', () => {
    const bridgeSpec = halfBridgeSpec({ magnetics: { mode: 'design' } });
    const bridge = designed(bridgeSpec);
    const builds = (bridge.outputInductors ?? []).map((item) => buildOf(item, false));
    expect(builds.length).toBeGreaterThan(0);
    expect(JSON.stringify(designed(withInductors(bridgeSpec, builds)))).toBe(
      JSON.stringify(bridge),
    );
  });

  // ref: magnetic circuit L = N²/(Rc + Rg), Rc = le/(μ0·μr·Ae), Rg = lg/(μ0·Ae·F) (Mohan,
  // Undeland, Robbins, Power Electronics, 3rd ed., ch. 30, from memory), F by McLyman above.
  it('solves the output with the inductance a fixed gap gives, its origin the magnetics', () => {
    const gapM = 1.25 * inductor.gapLengthM;
    const fixed = designed(
      withInductors(spec, [{ ...buildOf(inductor, false), gapLengthM: gapM }]),
    );
    const shape = CORE_SHAPE_CATALOG.find((s) => s.designation === inductor.coreShape);
    const material = MATERIAL_CLASSES.find((m) => m.id === inductor.materialId);
    if (shape === undefined || material === undefined) throw new Error('catalog entries');
    const g = coreGeometry(shape);
    const coreReluctance =
      g.effectiveLengthM / (MU_0_H_PER_M * material.initialPermeability * g.effectiveAreaM2);
    const gapReluctance =
      gapM /
      (MU_0_H_PER_M * g.effectiveAreaM2 * fringing(gapM, g.effectiveAreaM2, g.windowBreadthM));
    const expectedH = inductor.turns ** 2 / (coreReluctance + gapReluctance);
    if (fixed.topology !== 'two-switch-forward') throw new Error('expected a two-switch forward');
    expectClose(fixed.choices.outputInductancesH[0] ?? NaN, expectedH, { rel: 1e-12 });
    expect(fixed.choices.origins.outputInductancesH).toEqual(['magnetics']);
    const view = fixed.outputInductors?.[0];
    expect(view?.gapLengthM).toBe(gapM);
    expectClose(view?.inductanceH ?? NaN, expectedH, { rel: 1e-12 });
    // ref: buck-derived output stage, ΔI = (Vs − Vo)·D·T/L (Mohan et al., ch. 7): the same
    // volt-seconds over a smaller L; at the full-load CCM corner L·ΔI stays within the few
    // per cent the duty cycle moves with the losses.
    const full = (d: Design) =>
      d.outputInductors?.[0]?.corners.find((c) => c.label === 'max-input/100pct-load');
    const before = full(design);
    const after = full(fixed);
    if (before === undefined || after === undefined) throw new Error('full-load corner');
    expect(after.currentRippleA).toBeGreaterThan(before.currentRippleA);
    expectClose(expectedH * after.currentRippleA, inductor.inductanceH * before.currentRippleA, {
      rel: 0.02,
    });
  });

  // ref: toroid inductance L = μ0·μr·N²·Ae/le (no gap; common practice for distributed-gap
  // powder rings), with the engine's IEC 60205 Ae and le of the ring.
  it('takes a ring with no gap and a distributed-gap material, its inductance from μr', () => {
    const ring = designed(
      withInductors(spec, [
        {
          outputIndex: 0,
          coreShape: 'R 36/23/15',
          materialId: 'powdered-iron',
          turns: 20,
          gapLengthM: 0,
          wire: inductor.wire,
        },
      ]),
    );
    const shape = CORE_SHAPE_CATALOG.find((s) => s.designation === 'R 36/23/15');
    const material = MATERIAL_CLASSES.find((m) => m.id === 'powdered-iron');
    if (shape === undefined || material === undefined) throw new Error('catalog entries');
    const g = coreGeometry(shape);
    const expectedH =
      (MU_0_H_PER_M * material.initialPermeability * 20 ** 2 * g.effectiveAreaM2) /
      g.effectiveLengthM;
    expectClose(ring.outputInductors?.[0]?.inductanceH ?? NaN, expectedH, { rel: 1e-12 });
    expect(ring.outputInductors?.[0]?.gapLengthM).toBe(0);
  });

  // ref: common practice — a ring (toroid) cannot be cut: refused unless its gap is fixed at 0.
  it('refuses a ring whose gap would have to be cut', () => {
    const issues = issuesOf(
      withInductors(spec, [
        { outputIndex: 0, coreShape: 'R 36/23/15', materialId: 'powdered-iron', turns: 20 },
      ]),
    );
    expect(issues).toEqual([
      expect.objectContaining({
        code: 'non_physical_value',
        path: ['magnetics', 'outputInductors', 0, 'coreShape'],
      }),
    ]);
  });

  // ref: McLyman's fringing relation is meant for gaps well below the window height G; the
  // engine cuts none beyond G/2 and takes none fixed beyond it.
  it('refuses a fixed gap beyond half the window height, with the numbers', () => {
    const [issue] = issuesOf(
      withInductors(spec, [{ ...buildOf(inductor, false), gapLengthM: 0.02 }]),
    );
    const shape = CORE_SHAPE_CATALOG.find((s) => s.designation === inductor.coreShape);
    if (shape === undefined) throw new Error('catalog shape');
    expect(issue).toMatchObject({
      code: 'non_physical_value',
      path: ['magnetics', 'outputInductors', 0, 'gapLengthM'],
      required: 0.02,
    });
    expectClose(issue?.limit ?? NaN, coreGeometry(shape).windowBreadthM / 2, { rel: 1e-12 });
  });

  // ref: spec contract — two values for one inductance must agree (1 %).
  it('refuses a fixed gap whose inductance contradicts outputs[k].inductanceH', () => {
    const stated = SpecSchema.parse({
      ...spec,
      outputs: [{ ...spec.outputs[0], inductanceH: inductor.inductanceH }],
    });
    const issues = issuesOf(
      withInductors(stated, [
        { ...buildOf(inductor, false), gapLengthM: 1.25 * inductor.gapLengthM },
      ]),
    );
    expect(issues).toEqual([
      expect.objectContaining({
        code: 'non_physical_value',
        quantity: 'inductanceH',
        path: ['magnetics', 'outputInductors', 0, 'gapLengthM'],
        limit: inductor.inductanceH,
      }),
    ]);
    // The gap the design reports agrees with the inductance it was cut for.
    expect(() => designed(withInductors(stated, [buildOf(inductor, true)]))).not.toThrow();
  });

  // ref: common practice — B = L·Ipk/(N·Amin): a quarter of the turns saturates the core; the
  // fixed build is judged on its own evaluation and its issues point at it.
  it('refuses a fixed build that saturates, at the build', () => {
    const issues = issuesOf(withInductors(spec, [{ ...buildOf(inductor, false), turns: 3 }]));
    expect(issues.length).toBeGreaterThan(0);
    for (const issue of issues) {
      expect(issue.code).toBe('flux_density_limit');
      expect(issue.path).toEqual(['magnetics', 'outputInductors', 0]);
      expect(issue.required).toBeGreaterThan(issue.limit);
    }
  });

  // ref: spec contract — an unknown material id is a 422 at the field that names it.
  it('refuses a material id that names nothing', () => {
    expect(
      issuesOf(withInductors(spec, [{ ...buildOf(inductor, false), materialId: 'no-such' }])),
    ).toEqual([
      expect.objectContaining({
        code: 'unknown_material',
        path: ['magnetics', 'outputInductors', 0, 'materialId'],
      }),
    ]);
  });

  // ref: spec contract — what the entry leaves open is still searched, within what it fixes.
  it('searches within a partly fixed build', () => {
    const partial = designed(withInductors(spec, [{ outputIndex: 0, coreShape: 'ETD 34' }]));
    expect(partial.outputInductors?.[0]?.coreShape).toBe('ETD 34');
    expect(partial.choices.origins).toMatchObject({ outputInductancesH: ['target'] });
  });

  // ref: spec contract — the flyback has no output inductor and ignores the block.
  it('ignores the block on a flyback', () => {
    const flyback = telecomSpec();
    const plain = designed(flyback);
    const ignored = designed(withInductors(flyback, [buildOf(inductor, true)]));
    expect(JSON.stringify(ignored)).toBe(JSON.stringify(plain));
  });

  // ref: spec contract — contradictions between fields are parse errors (400) with a path.
  it('rejects a repeated output, an output the spec lacks, and a gap without its core', () => {
    const parse = (entries: object[]) =>
      SpecSchema.safeParse({ ...spec, magnetics: { ...spec.magnetics, outputInductors: entries } });
    const paths = (entries: object[]) => {
      const result = parse(entries);
      return result.success ? [] : result.error.issues.map((issue) => issue.path);
    };
    expect(paths([{ outputIndex: 0 }, { outputIndex: 0 }])).toEqual([
      ['magnetics', 'outputInductors', 1, 'outputIndex'],
    ]);
    expect(paths([{ outputIndex: 1 }])).toEqual([
      ['magnetics', 'outputInductors', 0, 'outputIndex'],
    ]);
    expect(paths([{ outputIndex: 0, coreShape: 'ETD 34', gapLengthM: 1e-3 }])).toEqual([
      ['magnetics', 'outputInductors', 0, 'gapLengthM'],
    ]);
    expect(paths([buildOf(inductor, true)])).toEqual([]);
  });
});
