import { dowellKernels } from './dowell-kernels.js';

/**
 * Returns Dowell's AC-to-DC resistance ratio averaged over a winding portion of `layerCount`
 * layers (M ≥ 0.5; the field rises from zero to its peak across the portion) at penetration
 * ratio Δ ≥ 0 (see {@link equivalentFoilLayer}): ≥ 1 for M ≥ 1, 1 at Δ = 0,
 * → Δ·(2M² + 1)/3 for Δ ≫ 1. M = 0.5 is one layer between equal and opposite fields.
 * @throws RangeError for a layer count below 0.5 or a bad Δ.
 */
export function dowellFactor(penetrationRatio: number, layerCount: number): number {
  if (!(Number.isFinite(layerCount) && layerCount >= 0.5)) {
    throw new RangeError(`dowellFactor: layerCount must be finite and ≥ 0.5, got ${layerCount}`);
  }
  const { skin, proximity } = dowellKernels(penetrationRatio);
  // ref: P. L. Dowell, Proc. IEE, 1966; Kazimierczuk, High-Frequency Magnetic Components, 2nd
  // ed.: Fr = Δ·[ς1 + (2/3)(M² − 1)·ς2], the mean over m = 1…M of the layer factors
  // Δ·[ς1 + 2m(m − 1)·ς2], since Σ m(m − 1) = (M + 1)M(M − 1)/3.
  return skin + dowellProximityWeight(layerCount) * proximity;
}

/** The proximity term's weight in Dowell's factor of a portion of M layers: (2/3)(M² − 1). */
export function dowellProximityWeight(layerCount: number): number {
  return (2 / 3) * (layerCount * layerCount - 1);
}
