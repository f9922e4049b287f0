import { describe, expect, it } from 'vitest';
import { designConverter } from '../../../solvers/design/design-converter.js';
import { coreGeometry } from '../../../solvers/magnetics/core-geometry.js';
import { CORE_SHAPE_CATALOG } from '../../../solvers/magnetics/core-shape-catalog.js';
import { SpecSchema } from '../../../solvers/spec/spec-schema.js';
import { TRANSFORMER_EVALUATION_DEFAULTS } from '../../../solvers/transformer/transformer-evaluation-options.js';
import { expectClose } from '../../helpers/expect-close.js';
import { runSearch, smallForwardSearch } from './core-search-fixtures.js';

describe('core search with foil in space.wires (invented two-switch forward scenario)', () => {
  const foil = { kind: 'foil', thicknessM: 0.2e-3, insulationThicknessM: 5e-5 } as const;
  const litz = { kind: 'litz', strandAwg: 25, strandCount: 8 } as const;
  const result = runSearch(
    smallForwardSearch({
      space: {
        coreShapes: ['ETD 34'],
        materialIds: ['mnzn-power-low-frequency'],
        primaryTurnsCount: 6,
        arrangements: ['interleaved'],
        wires: [[litz], [foil, litz]],
      },
    }),
  );

  // ref: common practice — the spec a search returns for a build winds that build again.
  it('returns foil members whose spec designs again to the same build and loss', () => {
    const members = result.top.filter((member) => member.wires[1]?.kind === 'foil');
    expect(members.length).toBeGreaterThan(0);
    const shape = CORE_SHAPE_CATALOG.find((s) => s.designation === 'ETD 34');
    if (shape === undefined) throw new Error('ETD 34 missing');
    const breadthM =
      coreGeometry(shape).windowBreadthM - 2 * TRANSFORMER_EVALUATION_DEFAULTS.endMarginM;
    for (const member of members) {
      const design = designConverter(SpecSchema.parse(member.spec));
      if (!design.ok) throw new Error(JSON.stringify(design.issues));
      const transformer = design.value.transformer;
      if (transformer === undefined) throw new Error('no transformer in the design');
      expect(transformer.windings.map((w) => w.turns)).toEqual(member.turns);
      // The design reports the width the foil was laid at: the core's usable breadth.
      expect(transformer.windings[1]?.wire).toEqual({ ...foil, widthM: breadthM });
      expectClose(design.value.summary.lossTotalMaxW, member.lossWorstCornerW, { rel: 1e-9 });
    }
  });
});
