/**
 * Test-only reference for Dowell's factor by a different route: the one-dimensional field in a
 * foil layer, H(u) = [H1·sinh(γ(1 − u)) + H2·sinh(γu)]/sinh γ with γ = (1 + j)Δ, solves
 * d²H/dx² = jωμσ·H (Dowell, Proc. IEE, 1966). The loss ∫|dH/dx|² over the layer, by composite
 * Simpson quadrature, is divided by its DC value (H2 − H1)² to give the layer's Fr.
 */
type Complex = [re: number, im: number];

const mul = (a: Complex, b: Complex): Complex => [
  a[0] * b[0] - a[1] * b[1],
  a[0] * b[1] + a[1] * b[0],
];
const div = (a: Complex, b: Complex): Complex => {
  const m = b[0] * b[0] + b[1] * b[1];
  return [(a[0] * b[0] + a[1] * b[1]) / m, (a[1] * b[0] - a[0] * b[1]) / m];
};
const cosh = (z: Complex): Complex => [
  Math.cosh(z[0]) * Math.cos(z[1]),
  Math.sinh(z[0]) * Math.sin(z[1]),
];
const sinh = (z: Complex): Complex => [
  Math.sinh(z[0]) * Math.cos(z[1]),
  Math.cosh(z[0]) * Math.sin(z[1]),
];

/** Fr of a foil layer with surface fields h1, h2 (in phase) at penetration ratio delta. */
export function layerFieldLoss(delta: number, h1: number, h2: number, intervals = 4000): number {
  const gamma: Complex = [delta, delta];
  const sinhGamma = sinh(gamma);
  // Normalised current density J·h = dH/du = γ·[−H1·cosh(γ(1 − u)) + H2·cosh(γu)]/sinh γ.
  const density2 = (u: number): number => {
    const a = cosh([delta * (1 - u), delta * (1 - u)]);
    const b = cosh([delta * u, delta * u]);
    const j = div(mul(gamma, [h2 * b[0] - h1 * a[0], h2 * b[1] - h1 * a[1]]), sinhGamma);
    return j[0] * j[0] + j[1] * j[1];
  };
  let sum = density2(0) + density2(1);
  for (let i = 1; i < intervals; i++) sum += (i % 2 === 1 ? 4 : 2) * density2(i / intervals);
  return sum / (3 * intervals) / ((h2 - h1) * (h2 - h1));
}

/** Re{γ·coth γ}, γ = (1 + j)Δ: the surface-impedance form of a single layer's Fr. */
export function singleLayerSurfaceImpedance(delta: number): number {
  const gamma: Complex = [delta, delta];
  return mul(gamma, div(cosh(gamma), sinh(gamma)))[0];
}
