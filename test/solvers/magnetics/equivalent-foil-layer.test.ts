import { describe, expect, it } from 'vitest';
import { equivalentFoilLayer } from '../../../solvers/magnetics/equivalent-foil-layer.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('equivalentFoilLayer', () => {
  it('equivalentFoilLayer(round) gives h = d·√π/2 and η = N·h/b', () => {
    const layer = equivalentFoilLayer({
      layerCount: 2,
      turnsPerLayer: 10,
      breadthM: 8e-3,
      conductor: { kind: 'round', bareDiameterM: 0.6e-3 },
    });
    // ref: Dowell, Proc. IEE, 1966, round wire as the square of equal area, η = N·a/b
    expectClose(layer.thicknessM, (0.6e-3 * Math.sqrt(Math.PI)) / 2, { rel: 1e-15 });
    expectClose(layer.porosity, (10 * layer.thicknessM) / 8e-3, { rel: 1e-15 });
    // ref: Kazimierczuk, High-Frequency Magnetic Components, 2nd ed., round-wire Dowell
    // Δ = (π/4)^(3/4)·(d/δ)·sqrt(d/p), p = b/N (from memory); here with δ = 1 m
    const delta = layer.thicknessM * Math.sqrt(layer.porosity);
    expectClose(delta, (Math.PI / 4) ** 0.75 * 0.6e-3 * Math.sqrt(0.6e-3 / 0.8e-3), { rel: 1e-14 });
    expect(layer.layerCount).toBe(2);
  });

  it('equivalentFoilLayer(foil) keeps the thickness and takes η = w/b', () => {
    const layer = equivalentFoilLayer({
      layerCount: 5,
      turnsPerLayer: 1,
      breadthM: 20e-3,
      conductor: { kind: 'foil', thicknessM: 0.1e-3, widthM: 18e-3 },
    });
    // ref: Dowell, Proc. IEE, 1966, foil layer copper factor
    expectClose(layer.thicknessM, 0.1e-3, { rel: 1e-15 });
    expectClose(layer.porosity, 0.9, { rel: 1e-15 });
  });

  it('equivalentFoilLayer(litz) treats k strands as √k × √k strand layers', () => {
    const layer = equivalentFoilLayer({
      layerCount: 2,
      turnsPerLayer: 4,
      breadthM: 10e-3,
      conductor: { kind: 'litz', strandBareDiameterM: 0.1e-3, strandCount: 100 },
    });
    // ref: common practice, litz strand-layer approximation (from memory)
    expectClose(layer.layerCount, 20, { rel: 1e-15 });
    expectClose(layer.porosity, (40 * 0.1e-3 * Math.sqrt(Math.PI)) / 2 / 10e-3, { rel: 1e-14 });
  });

  it('equivalentFoilLayer rejects a layer wider than its breadth', () => {
    const tooWide = {
      layerCount: 1,
      turnsPerLayer: 20,
      breadthM: 10e-3,
      conductor: { kind: 'round' as const, bareDiameterM: 0.6e-3 },
    };
    expect(() => equivalentFoilLayer(tooWide)).toThrow(RangeError);
  });
});
