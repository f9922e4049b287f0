import { skinDepth } from './skin-depth.js';
import type { WindingPortion } from './winding-portion.js';

/** A winding portion mapped onto Dowell's equivalent foil layers. */
export interface EquivalentFoilLayer {
  /** Thickness of the equivalent foil, m. */
  thicknessM: number;
  /** Porosity (layer copper factor) η: copper breadth of a layer over the winding breadth, 0..1. */
  porosity: number;
  /** Layers of equivalent foil in the portion (strand layers for litz). */
  layerCount: number;
}

/**
 * Returns the equivalent foil of a portion; its penetration ratio is Δ = (thicknessM/δ)·√porosity.
 * Round wire (diameter d) becomes squares of equal area, side h = d·√π/2, and η = N·h/b
 * (Dowell 1966); foil keeps h = t, η = N·w/b. Litz is approximate (see the code).
 * @throws RangeError for non-positive dimensions or a layer that does not fit its breadth.
 */
export function equivalentFoilLayer(portion: WindingPortion): EquivalentFoilLayer {
  const { layerCount, turnsPerLayer, breadthM, conductor } = portion;
  if (!(breadthM > 0 && turnsPerLayer > 0 && layerCount >= 0.5 && Number.isFinite(breadthM))) {
    throw new RangeError('equivalentFoilLayer: breadth, turns per layer and layers must be > 0');
  }
  let thicknessM: number;
  let copperBreadthM: number;
  let fitsBreadthM: number;
  let layers = layerCount;
  switch (conductor.kind) {
    case 'round':
      // ref: Dowell, Proc. IEE, 1966: a round wire is replaced by the square of equal area, and
      // η = N·a/b with a the square's side. This equals Kazimierczuk's round-wire form
      // Δ = (π/4)^(3/4)·(d/δ)·sqrt(d/p), p = b/N the pitch (High-Frequency Magnetic Components,
      // 2nd ed., from memory); η = N·d/b without the √π/2 would give Δ 6 % low.
      thicknessM = (conductor.bareDiameterM * Math.sqrt(Math.PI)) / 2;
      copperBreadthM = turnsPerLayer * thicknessM;
      fitsBreadthM = turnsPerLayer * conductor.bareDiameterM;
      break;
    case 'litz': {
      // Approximation (common practice, from memory; cf. Kazimierczuk, 2nd ed., litz chapter):
      // a bundle of k strands behaves as √k × √k strands, so a portion of M bundle layers is
      // M·√k layers of round strands, N·√k strands to a layer. A coarse estimate: it ignores
      // how the twist shares the bundle's own field among the strands.
      const side = Math.sqrt(conductor.strandCount);
      thicknessM = (conductor.strandBareDiameterM * Math.sqrt(Math.PI)) / 2;
      copperBreadthM = turnsPerLayer * side * thicknessM;
      fitsBreadthM = turnsPerLayer * side * conductor.strandBareDiameterM;
      layers = layerCount * side;
      break;
    }
    case 'foil':
      thicknessM = conductor.thicknessM;
      copperBreadthM = turnsPerLayer * conductor.widthM;
      fitsBreadthM = copperBreadthM;
      break;
  }
  if (!(thicknessM > 0 && Number.isFinite(thicknessM) && copperBreadthM > 0)) {
    throw new RangeError('equivalentFoilLayer: conductor dimensions must be finite and > 0');
  }
  // A small round-off margin: a foil exactly as wide as the breadth is η = 1.
  if (fitsBreadthM > breadthM * (1 + 1e-12)) {
    throw new RangeError(
      `equivalentFoilLayer: a layer needs ${fitsBreadthM} m of copper breadth, only ${breadthM} m`,
    );
  }
  return { thicknessM, porosity: Math.min(1, copperBreadthM / breadthM), layerCount: layers };
}

/**
 * Δ1, the penetration ratio of `foil` at the fundamental of period `periodS` (s) with the copper
 * at `temperatureC` (°C): (thickness/δ)·√porosity. Harmonic n has Δ1·√n (δ ∝ 1/√f).
 */
export function fundamentalPenetrationRatio(
  foil: EquivalentFoilLayer,
  periodS: number,
  temperatureC: number,
): number {
  return (foil.thicknessM / skinDepth(1 / periodS, { temperatureC })) * Math.sqrt(foil.porosity);
}
