import { describe, expect, it } from 'vitest';
import { designConverter } from '../../../solvers/design/design-converter.js';
import { INLINE_MATERIAL_NOTE } from '../../../solvers/design/transformer-model-notes.js';
import { igseCoreLoss } from '../../../solvers/magnetics/igse-core-loss.js';
import type { MaterialClass } from '../../../solvers/magnetics/material-class.js';
import { MATERIAL_CLASSES } from '../../../solvers/magnetics/material-classes.js';
import { SpecSchema } from '../../../solvers/spec/spec-schema.js';
import { expectClose } from '../../helpers/expect-close.js';
import { telecomSpec } from '../../helpers/flyback-specs.js';
import { forwardTelecomSpec } from '../../helpers/forward-specs.js';

const builtIn = MATERIAL_CLASSES.find((m) => m.id === 'mnzn-power-low-frequency');
if (builtIn === undefined) throw new Error('the catalog has the low-frequency ferrite class');

/**
 * Invented material (not any product): a flat loss temperature factor, a saturation flux density
 * of 0.35 T at both temperatures, the Steinmetz coefficients of the invented low-frequency class.
 */
const invented: MaterialClass = {
  id: 'invented-flat-ferrite',
  steinmetz: { ...builtIn.steinmetz },
  lossTemperatureFactor: { ct2: 0, ct1: 0, ct0: 1 },
  saturation: {
    lowTemperatureC: 25,
    lowFluxDensityT: 0.35,
    highTemperatureC: 100,
    highFluxDensityT: 0.35,
  },
  initialPermeability: 2000,
  initialPermeabilityTolerance: 0.25,
  frequencyMinHz: 50e3,
  frequencyMaxHz: 200e3,
};

function designOf(spec: Parameters<typeof designConverter>[0]) {
  const result = designConverter(spec);
  if (!result.ok) throw new Error(JSON.stringify(result.issues));
  const { transformer } = result.value;
  if (transformer === undefined) throw new Error('expected a designed transformer');
  return { design: result.value, transformer };
}

describe('designConverter with an inline material', () => {
  // ref: common practice — a material is its numbers: the built-in class's numbers sent inline
  // under another id design the same transformer, with the same losses.
  it('designConverter(inline copy of a class) designs what naming the class designs', () => {
    const copy: MaterialClass = { ...builtIn, id: 'invented-copy-of-a-class' };
    const named = designOf(telecomSpec({ magnetics: { materialId: builtIn.id } }));
    const inline = designOf(telecomSpec({ magnetics: { material: copy } }));
    expect(inline.transformer.materialId).toBe('invented-copy-of-a-class');
    expect(inline.transformer.coreShape).toBe(named.transformer.coreShape);
    inline.transformer.corners.forEach((corner, index) => {
      const other = named.transformer.corners[index];
      expectClose(corner.coreLossW, other?.coreLossW ?? NaN, { rel: 1e-12 });
      expectClose(corner.totalLossW, other?.totalLossW ?? NaN, { rel: 1e-12 });
    });
    expect(inline.design.modelNotes).toContain(INLINE_MATERIAL_NOTE);
    expect(named.design.modelNotes).not.toContain(INLINE_MATERIAL_NOTE);
  });

  // ref: Venkatachalam, Sullivan, Abdallah, Tacca, IEEE COMPEL 2002 (iGSE): with a flat
  // temperature factor ct = 1 the core loss is Ve·Pv(iGSE) of the flux B = Lm·im/(Np·Ae) at any
  // temperature; the flux is rebuilt here from the corner's magnetizing current.
  it('designConverter(forward, inline flat material) core loss is Ve times the iGSE density', () => {
    const { design, transformer } = designOf(
      forwardTelecomSpec({ magnetics: { material: invented } }),
    );
    expect(transformer.materialId).toBe(invented.id);
    if (design.topology === 'flyback') throw new Error('expected a forward design');
    const primaryTurns = transformer.windings[0]?.turns ?? NaN;
    design.corners.forEach((corner, index) => {
      const im = corner.waveforms.magnetizingCurrentA;
      const scale =
        transformer.magnetizingInductanceH / (primaryTurns * transformer.core.effectiveAreaM2);
      const flux = { ...im, values: im.values.map((value) => value * scale) };
      const expected = igseCoreLoss(flux, invented.steinmetz) * transformer.core.effectiveVolumeM3;
      expectClose(transformer.corners[index]?.coreLossW ?? NaN, expected, { rel: 1e-9 });
    });
  });

  // ref: common practice — saturation is held at the posted flux density: the peak stays
  // below fluxDensityUtilizationMax times it at every corner.
  it('designConverter(flyback, inline material) holds the flux below its saturation', () => {
    const { transformer } = designOf(telecomSpec({ magnetics: { material: invented } }));
    for (const corner of transformer.corners) {
      expectClose(corner.saturationFluxDensityT, 0.35, { rel: 1e-12 });
      expect(corner.peakFluxDensityT).toBeLessThanOrEqual(0.8 * 0.35 * (1 + 1e-12));
    }
  });

  // ref: common practice — an id the engine cannot resolve is an issue with its path and
  // numbers (none found, one needed), not an exception.
  it('designConverter(unknown materialId) answers with an unknown_material issue', () => {
    const result = designConverter(telecomSpec({ magnetics: { materialId: 'no-such-material' } }));
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.issues).toEqual([
      {
        code: 'unknown_material',
        path: ['magnetics', 'materialId'],
        constraint: 'materialId names a built-in material class, or magnetics.material is given',
        quantity: 'materialMatchCount',
        required: 1,
        limit: 0,
      },
    ]);
  });
});

describe('SpecSchema magnetics.material', () => {
  const base = telecomSpec();

  // ref: common practice — two names for one thing must agree.
  it('SpecSchema refuses a materialId that differs from the inline material id', () => {
    const parsed = SpecSchema.safeParse({
      ...base,
      magnetics: { materialId: 'other-id', material: invented },
    });
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.map((issue) => issue.path)).toEqual([
      ['magnetics', 'material', 'id'],
    ]);
  });

  // ref: common practice — interpolating between two saturation points needs two temperatures.
  it('SpecSchema refuses saturation points at one temperature', () => {
    const flat = { ...invented, saturation: { ...invented.saturation, highTemperatureC: 25 } };
    const parsed = SpecSchema.safeParse({ ...base, magnetics: { material: flat } });
    expect(parsed.error?.issues.map((issue) => issue.path)).toEqual([
      ['magnetics', 'material', 'saturation', 'highTemperatureC'],
    ]);
  });

  // ref: common practice — a spec without the new field parses exactly as before.
  it('SpecSchema leaves magnetics.material out when it is not sent', () => {
    expect('material' in base.magnetics).toBe(false);
  });
});
