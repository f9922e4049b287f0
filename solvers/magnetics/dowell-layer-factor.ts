import { dowellKernels } from './dowell-kernels.js';

/**
 * Returns Dowell's AC-to-DC resistance ratio of layer `layerIndex` (m ≥ 0.5, counted from the
 * zero-field side of its portion, where the field at the layer's surfaces is (m − 1) and m
 * times the layer's ampere-turns per breadth) at penetration ratio Δ ≥ 0. m need not be an
 * integer: m = 0.5 is a layer centred on a field null, as in interleaved windings.
 * @throws RangeError for a layer index below 0.5 or a bad Δ.
 */
export function dowellLayerFactor(penetrationRatio: number, layerIndex: number): number {
  if (!(Number.isFinite(layerIndex) && layerIndex >= 0.5)) {
    throw new RangeError(
      `dowellLayerFactor: layerIndex must be finite and ≥ 0.5, got ${layerIndex}`,
    );
  }
  const { skin, proximity } = dowellKernels(penetrationRatio);
  // ref: Dowell, Proc. IEE, 1966, layer loss with surface fields H1 = (m − 1)·H, H2 = m·H:
  // Fr,m = Δ·[(H1² + H2²)·G1 − 4·H1·H2·G2]/H² = Δ·[ς1 + 2m(m − 1)·ς2], using ς1 − 2·G2 = ς2
  // with G2 = (sinh Δ cos Δ + cosh Δ sin Δ)/(cosh 2Δ − cos 2Δ).
  return skin + 2 * layerIndex * (layerIndex - 1) * proximity;
}
