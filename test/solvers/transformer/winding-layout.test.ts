import { describe, expect, it } from 'vitest';
import { windingLayout } from '../../../solvers/transformer/winding-layout.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('windingLayout', () => {
  const foil = { kind: 'foil', thicknessM: 0.15e-3, insulationThicknessM: 50e-6 } as const;

  // ref: common practice — a foil winding is one turn to a layer, wound over itself, with film
  // between turns: six turns are six layers of 0.15 mm + 50 µm.
  it('windingLayout(6 turns of foil) lays one turn to a layer across the breadth', () => {
    const layout = windingLayout(6, foil, 20e-3);
    if (layout === undefined) throw new Error('the foil should fit');
    expect(layout.turnsPerLayer).toBe(1);
    expect(layout.layerCount).toBe(6);
    expectClose(layout.heightM, 6 * 0.2e-3, { rel: 1e-12 });
    expectClose(layout.outsideAreaM2, 6 * 20e-3 * 0.2e-3, { rel: 1e-12 });
    expect(layout.wire).toEqual({ ...foil, widthM: 20e-3 });
  });

  // ref: common practice — a foil narrower than the breadth is still one turn to a layer.
  it('windingLayout(foil narrower than half the breadth) still lays one turn to a layer', () => {
    const layout = windingLayout(4, { ...foil, widthM: 8e-3 }, 20e-3);
    expect(layout?.turnsPerLayer).toBe(1);
    expect(layout?.layerCount).toBe(4);
  });

  it('windingLayout(foil wider than the breadth) does not fit', () => {
    expect(windingLayout(4, { ...foil, widthM: 21e-3 }, 20e-3)).toBeUndefined();
  });
});
