/**
 * Dowell's two functions of the penetration ratio Δ, each multiplied by Δ: the skin term
 * Δ·(sinh 2Δ + sin 2Δ)/(cosh 2Δ − cos 2Δ) (→ 1 at Δ = 0) and the proximity term
 * Δ·(sinh Δ − sin Δ)/(cosh Δ + cos Δ) (→ 0 at Δ = 0).
 */
export interface DowellKernels {
  skin: number;
  proximity: number;
}

/** Below this Δ the skin term equals its series 1 + 4Δ⁴/45 to better than 1e-32. */
const SKIN_SERIES_LIMIT = 1e-4;
/** Below this Δ the closed forms cancel or overflow-free exponential forms are not needed. */
const EXPONENTIAL_FORM_LIMIT = 1;
/** Above this Δ, e^(−Δ) < 1e-17: both terms equal Δ to within half an ulp. */
const ASYMPTOTE_LIMIT = 40;

/** Below this Δ the slopes are taken from the series (see writeDowellKernelSlopes). */
const SLOPE_SERIES_LIMIT = 0.01;

/** One-slot scratch for {@link dowellKernels}. */
const SCRATCH_SKIN = new Float64Array(1);
const SCRATCH_PROXIMITY = new Float64Array(1);

/**
 * Returns Dowell's skin and proximity terms for penetration ratio Δ ≥ 0 (layer thickness over
 * skin depth, porosity-corrected), accurate to a few ulp for every finite Δ: series and
 * cancellation-free forms below Δ = 1, forms in e^(−Δ) above it (no overflow).
 * ref: P. L. Dowell, "Effects of eddy currents in transformer windings", Proc. IEE, 1966.
 * @throws RangeError for a negative or non-finite Δ.
 */
export function dowellKernels(penetrationRatio: number): DowellKernels {
  writeDowellKernels(penetrationRatio, SCRATCH_SKIN, SCRATCH_PROXIMITY, 0);
  return { skin: SCRATCH_SKIN[0] as number, proximity: SCRATCH_PROXIMITY[0] as number };
}

/**
 * Writes {@link dowellKernels} of Δ into skin[index] and proximity[index] (the same numbers),
 * with no object per Δ: a winding's loss sum at one temperature takes dozens of them. The
 * usual range, 1 ≤ Δ < 40, is computed here and the rest apart, which keeps this small enough
 * for the compiler to inline into a caller's loop.
 * @throws RangeError for a negative or non-finite Δ.
 */
export function writeDowellKernels(
  penetrationRatio: number,
  skin: Float64Array,
  proximity: Float64Array,
  index: number,
): void {
  const d = penetrationRatio;
  if (!(d >= EXPONENTIAL_FORM_LIMIT && d < ASYMPTOTE_LIMIT)) {
    writeOuterKernels(d, skin, proximity, index);
    return;
  }
  // Three transcendental calls: sin 2Δ = 2·sin Δ·cos Δ, cos 2Δ = (cos Δ − sin Δ)(cos Δ + sin Δ).
  // Numerator and denominator of each ratio multiplied by 2e^(−2Δ) (skin) or 2e^(−Δ)
  // (proximity); both denominators stay ≥ (1 − e^(−π))² ≈ 0.92 for Δ ≥ 1 (no overflow).
  const s = Math.sin(d);
  const c = Math.cos(d);
  const e1 = Math.exp(-d);
  const e2 = e1 * e1;
  const e4 = e2 * e2;
  skin[index] = (d * (1 - e4 + 4 * s * c * e2)) / (1 + e4 - 2 * (c - s) * (c + s) * e2);
  proximity[index] = (d * (1 - e2 - 2 * s * e1)) / (1 + e2 + 2 * c * e1);
}

/** {@link writeDowellKernels} outside 1 ≤ Δ < 40: the asymptote above, series forms below. */
function writeOuterKernels(
  d: number,
  skin: Float64Array,
  proximity: Float64Array,
  index: number,
): void {
  if (!(Number.isFinite(d) && d >= 0)) {
    throw new RangeError(`dowellKernels: penetration ratio must be finite and ≥ 0, got ${d}`);
  }
  if (d >= ASYMPTOTE_LIMIT) {
    skin[index] = d;
    proximity[index] = d;
    return;
  }
  const s = Math.sin(d);
  const c = Math.cos(d);
  const d4 = d * d * d * d;
  // Below Δ = 1, sinh and cosh from one expm1 (no cancellation: e^Δ − 1 is computed whole):
  // with e^Δ − 1 = m, sinh Δ = m·(1 + 1/e^Δ)/2 and cosh Δ = (e^Δ + 1/e^Δ)/2.
  const m = Math.expm1(d);
  const e = 1 + m;
  const sh = (0.5 * m * (e + 1)) / e;
  const ch = 0.5 * (e + 1 / e);
  // Maclaurin: Δ·(sinh 2Δ + sin 2Δ)/(cosh 2Δ − cos 2Δ) = 1 + 4Δ⁴/45 + O(Δ⁸) (derived from
  // sinh x + sin x = 2(x + x⁵/5! + …) and cosh x − cos x = 2(x²/2! + x⁶/6! + …)).
  // Otherwise sinh 2Δ + sin 2Δ = 2(sinh Δ·cosh Δ + sin Δ·cos Δ) and cosh 2Δ − cos 2Δ =
  // 2(sinh²Δ + sin²Δ): sums of positives below Δ = 1, free of cancellation.
  skin[index] =
    d < SKIN_SERIES_LIMIT ? 1 + (4 * d4) / 45 : (d * (sh * ch + s * c)) / (sh * sh + s * s);
  // sinh Δ − sin Δ = 2·Σ Δ^(4j+3)/(4j+3)!, j = 0…4; the next term is below 1e-17 relative for Δ < 1.
  const d3 = d * d * d;
  const series =
    2 *
    d3 *
    (1 / 6 +
      d4 * (1 / 5040 + d4 * (1 / 39916800 + d4 * (1 / 1307674368000 + d4 / 1.21645100408832e17))));
  proximity[index] = (d * series) / (ch + c);
}

/**
 * Writes the derivatives in Δ of {@link dowellKernels}' two terms, d(skin)/dΔ and
 * d(proximity)/dΔ, into skinSlope[index] and proximitySlope[index]: from the same closed forms
 * (quotient rule; series below Δ = 0.01, 1 for both above Δ = 40). For a loss's slope in
 * temperature (a model between exact evaluations), not for a loss itself.
 * @throws RangeError for a negative or non-finite Δ.
 */
export function writeDowellKernelSlopes(
  penetrationRatio: number,
  skinSlope: Float64Array,
  proximitySlope: Float64Array,
  index: number,
): void {
  const d = penetrationRatio;
  if (!(Number.isFinite(d) && d >= 0)) {
    throw new RangeError(`dowellKernelSlopes: penetration ratio must be finite and ≥ 0, got ${d}`);
  }
  if (d >= ASYMPTOTE_LIMIT) {
    skinSlope[index] = 1;
    proximitySlope[index] = 1;
    return;
  }
  if (d < SLOPE_SERIES_LIMIT) {
    // Derivatives of the series 1 + 4Δ⁴/45 and Δ⁴/6 (see writeOuterKernels), whose next terms
    // are O(Δ⁸): below Δ = 0.01 good to 1e-8 relative, where the quotient rule's two terms of
    // order 1/Δ would cancel.
    skinSlope[index] = (16 * d * d * d) / 45;
    proximitySlope[index] = (2 * d * d * d) / 3;
    return;
  }
  const s = Math.sin(d);
  const c = Math.cos(d);
  if (d >= EXPONENTIAL_FORM_LIMIT) {
    // The forms of writeDowellKernels: skin = Δ·n/q, proximity = Δ·p/r, each a function of
    // e^(−Δ), sin Δ and cos Δ; d(Δ·n/q)/dΔ = n/q + Δ·(n′q − n·q′)/q².
    const e1 = Math.exp(-d);
    const e2 = e1 * e1;
    const e4 = e2 * e2;
    const s2 = 2 * s * c;
    const c2 = (c - s) * (c + s);
    const n = 1 - e4 + 2 * s2 * e2;
    const dn = 4 * e4 + 4 * e2 * (c2 - s2);
    const q = 1 + e4 - 2 * c2 * e2;
    const dq = -4 * e4 + 4 * e2 * (s2 + c2);
    skinSlope[index] = n / q + (d * (dn * q - n * dq)) / (q * q);
    const p = 1 - e2 - 2 * s * e1;
    const dp = 2 * e2 - 2 * e1 * (c - s);
    const r = 1 + e2 + 2 * c * e1;
    const dr = -2 * e2 - 2 * e1 * (s + c);
    proximitySlope[index] = p / r + (d * (dp * r - p * dr)) / (r * r);
    return;
  }
  // Below Δ = 1, writeOuterKernels' forms: skin = Δ·a/b with a = sinh·cosh + sin·cos,
  // b = sinh² + sin² (b′ = 2a); proximity = Δ·x/y with x = sinh − sin, y = cosh + cos.
  const m = Math.expm1(d);
  const e = 1 + m;
  const sh = (0.5 * m * (e + 1)) / e;
  const ch = 0.5 * (e + 1 / e);
  const a = sh * ch + s * c;
  const b = sh * sh + s * s;
  const da = ch * ch + sh * sh + (c - s) * (c + s);
  skinSlope[index] = a / b + (d * (da * b - 2 * a * a)) / (b * b);
  const x = sh - s;
  const y = ch + c;
  proximitySlope[index] = x / y + (d * ((ch - c) * y - x * (sh - s))) / (y * y);
}
