import { average } from '../waveform/average.js';
import { fourierCoefficients } from '../waveform/fourier-coefficients.js';
import { rmsAbout } from '../waveform/rms.js';
import type { Waveform } from '../waveform/waveform.js';
import { dowellKernelTable, fillDowellKernels } from './dowell-kernel-table.js';
import { writeDowellKernels } from './dowell-kernels.js';
import { equivalentFoilLayer, fundamentalPenetrationRatio } from './equivalent-foil-layer.js';
import { dowellProximityWeight } from './dowell-factor.js';
import type { WindingPortion } from './winding-portion.js';

/**
 * A periodic current as the winding loss reads it: its mean, its AC mean square and the mean
 * square of each harmonic 1…N. It does not depend on the winding, so a search over windings
 * computes it once per current.
 */
export interface CurrentSpectrum {
  periodS: number;
  /** Mean current, A. */
  dcA: number;
  /** Mean square of the current less its mean, A². */
  acSquareA2: number;
  /** Mean square I_n,rms² of harmonics 1…N, A² (index n − 1). */
  harmonicSquaresA2: readonly number[];
}

/** Scratch for the Fourier coefficients of {@link currentSpectrum}, grown as needed. */
let scratchRe = new Float64Array(64);
let scratchIm = new Float64Array(64);

/** Returns the spectrum of `currentA` (A) with harmonics 1…`harmonicCount`. */
export function currentSpectrum(currentA: Waveform, harmonicCount: number): CurrentSpectrum {
  if (!Number.isInteger(harmonicCount) || harmonicCount < 0) {
    throw new RangeError(
      `currentSpectrum: harmonicCount must be a non-negative integer, got ${harmonicCount}`,
    );
  }
  const dcA = average(currentA);
  // The AC mean square from the waveform less its mean, so a large DC part does not cancel it.
  const acRmsA = rmsAbout(currentA, dcA);
  if (scratchRe.length < harmonicCount) {
    scratchRe = new Float64Array(harmonicCount);
    scratchIm = new Float64Array(harmonicCount);
  }
  fourierCoefficients(currentA, harmonicCount, scratchRe, scratchIm);
  const harmonicSquaresA2: number[] = new Array<number>(harmonicCount);
  for (let n = 0; n < harmonicCount; n++) {
    const x = scratchRe[n] as number;
    const y = scratchIm[n] as number;
    // I_n,rms² = a_n²/2 with the amplitude a_n = 2·|Xn|, as harmonics() gives it.
    const amplitude = 2 * Math.sqrt(x * x + y * y);
    harmonicSquaresA2[n] = 0.5 * amplitude * amplitude;
  }
  return { periodS: currentA.periodS, dcA, acSquareA2: acRmsA * acRmsA, harmonicSquaresA2 };
}

/** Copper loss of one winding portion for one current waveform. */
export interface WindingLoss {
  /** Rdc·I_dc², W. */
  dcLossW: number;
  /** Rdc·Σ Fr(n·f)·I_n,rms² over the harmonics, tail included, W. */
  acLossW: number;
  /** The part of acLossW estimated for harmonics above harmonicsUsed, W. */
  tailLossW: number;
  /** dcLossW + acLossW, W. */
  totalLossW: number;
  /** totalLossW/I_rms², Ω (Rdc for a zero current). */
  effectiveResistanceOhm: number;
  /** Highest harmonic order summed exactly. */
  harmonicsUsed: number;
}

/** Options for {@link windingAcResistance}. */
export interface WindingAcResistanceOptions {
  /** Copper temperature for the skin depth, °C (Rdc is passed at temperature). @defaultValue 20 */
  temperatureC?: number;
  /** Harmonics summed first; doubled while the tail is too large. @defaultValue 32 */
  harmonicCount?: number;
  /** Cap on the harmonics summed; the tail estimate covers the rest. @defaultValue 256 */
  maxHarmonicCount?: number;
  /** The tail estimate must stay below this fraction of the total loss. @defaultValue 0.01 */
  tailTolerance?: number;
}

const DEFAULTS = {
  temperatureC: 20,
  harmonicCount: 32,
  maxHarmonicCount: 256,
  tailTolerance: 0.01,
} satisfies Required<WindingAcResistanceOptions>;

/**
 * Tail estimate: harmonics above order N carry the unsummed mean square r (Parseval) at factors
 * rising as n^q, q = log2(Fr(2(N + 1)f)/Fr((N + 1)f)) clamped to 0…0.5 (0.5 is Dowell's Δ ≫ 1
 * limit, Fr ∝ √f). With I_n² ∝ n^(−p), Σ_(n>N) Fr·I_n² ≈ Fr((N + 1)f)·r·(p − 1)/(p − 1 − q). p = 2,
 * the slowest decay of a piecewise-linear waveform (one with jumps), gives the weight 1/(1 − q):
 * asymptotically exact for jumps or a flat Fr, too large (up to 1.67 times for p = 4, about 1.7
 * seen where edges are only starting to roll the spectrum off) for currents without jumps.
 * Exported for the core search's copper bound, which takes it at a lower bound of the factors'
 * ratio (the weight does not fall as the ratio rises).
 */
export function tailWeight(factorNext: number, factorDouble: number): number {
  const q = Math.min(0.5, Math.max(0, Math.log2(factorDouble / factorNext)));
  return 1 / (1 - q);
}

/**
 * Returns the copper loss of `currentA` (a periodic current, A) in a winding portion of DC
 * resistance `dcResistanceOhm` (at temperature, Ω): P = Rdc·[I_dc² + Σ Fr(n·f)·(aₙ/√2)²] with
 * Dowell's portion factor per harmonic, plus a Parseval tail estimate for the unsummed orders
 * (see tailWeight: it errs high, by at most about the tail itself).
 * Truncation: harmonics 1…N, N doubling from harmonicCount while tailLossW > tailTolerance·
 * totalLossW, up to maxHarmonicCount (and up to the harmonics a given spectrum holds).
 * @throws RangeError for a negative or non-finite resistance or bad options.
 */
export function windingAcResistance(
  currentA: Waveform | CurrentSpectrum,
  portion: WindingPortion,
  dcResistanceOhm: number,
  options: WindingAcResistanceOptions = {},
): WindingLoss {
  const loss: WindingLoss = {
    dcLossW: NaN,
    acLossW: NaN,
    tailLossW: NaN,
    totalLossW: NaN,
    effectiveResistanceOhm: NaN,
    harmonicsUsed: 0,
  };
  writeWindingLoss(loss, currentA, portion, dcResistanceOhm, options);
  return loss;
}

/**
 * {@link windingAcResistance} written into the fields of `out` (the same numbers, and the same
 * errors): for a caller that evaluates the loss hundreds of times a design and keeps one
 * scratch, where a fresh result object and its boxed numbers were most of the garbage.
 */
export function writeWindingLoss(
  out: WindingLoss,
  currentA: Waveform | CurrentSpectrum,
  portion: WindingPortion,
  dcResistanceOhm: number,
  options: WindingAcResistanceOptions = {},
): void {
  const temperatureC = options.temperatureC ?? DEFAULTS.temperatureC;
  const harmonicCount = options.harmonicCount ?? DEFAULTS.harmonicCount;
  const maxHarmonicCount = options.maxHarmonicCount ?? DEFAULTS.maxHarmonicCount;
  const tailTolerance = options.tailTolerance ?? DEFAULTS.tailTolerance;
  if (!(Number.isFinite(dcResistanceOhm) && dcResistanceOhm >= 0)) {
    throw new RangeError(
      `windingAcResistance: dcResistanceOhm must be ≥ 0, got ${dcResistanceOhm}`,
    );
  }
  if (!(
    Number.isInteger(harmonicCount) &&
    harmonicCount >= 1 &&
    maxHarmonicCount >= harmonicCount
  )) {
    throw new RangeError('windingAcResistance: need 1 ≤ harmonicCount ≤ maxHarmonicCount');
  }
  if (!(tailTolerance > 0 && tailTolerance < 1)) {
    throw new RangeError(
      `windingAcResistance: tailTolerance must be in (0, 1), got ${tailTolerance}`,
    );
  }
  const foil = equivalentFoilLayer(portion);
  const { layerCount } = foil;
  if (!(Number.isFinite(layerCount) && layerCount >= 0.5)) {
    throw new RangeError(`dowellFactor: layerCount must be finite and ≥ 0.5, got ${layerCount}`);
  }
  // Δ ∝ 1/δ ∝ √f, so Δ at order n is Δ1·√n.
  const delta1 = fundamentalPenetrationRatio(foil, currentA.periodS, temperatureC);
  // A waveform's spectrum is taken as far as each pass needs; a given spectrum as far as it goes.
  const given = 'harmonicSquaresA2' in currentA ? currentA : undefined;
  let spectrum = given ?? currentSpectrum(currentA as Waveform, harmonicCount);
  const { dcA, acSquareA2 } = spectrum;
  const countMax =
    given === undefined
      ? maxHarmonicCount
      : Math.min(maxHarmonicCount, given.harmonicSquaresA2.length);
  let count = Math.min(harmonicCount, countMax);
  // Dowell's factor of the portion, skin + (2/3)(M² − 1)·proximity, as dowellFactor has it.
  const proximityWeight = dowellProximityWeight(layerCount);
  // A doubled count sums on from the orders already summed: the same additions in the same
  // order as summing 1…2N afresh (a waveform's harmonics do not depend on how many are taken).
  SUMS[0] = 0;
  SUMS[1] = 0;
  let tailA2 = harmonicSums(
    spectrum.harmonicSquaresA2,
    0,
    count,
    delta1,
    proximityWeight,
    acSquareA2,
  );
  while (tailA2 > tailTolerance * (dcA * dcA + (SUMS[0] as number) + tailA2) && count < countMax) {
    const summed = count;
    count = Math.min(2 * count, countMax);
    if (given === undefined && spectrum.harmonicSquaresA2.length < count) {
      spectrum = currentSpectrum(currentA as Waveform, count);
    }
    tailA2 = harmonicSums(
      spectrum.harmonicSquaresA2,
      summed,
      count,
      delta1,
      proximityWeight,
      acSquareA2,
    );
  }
  const weightedA2 = SUMS[0] as number;
  const dcLossW = dcResistanceOhm * dcA * dcA;
  const tailLossW = dcResistanceOhm * tailA2;
  const acLossW = dcResistanceOhm * weightedA2 + tailLossW;
  const totalLossW = dcLossW + acLossW;
  const rmsSquareA2 = dcA * dcA + acSquareA2;
  out.dcLossW = dcLossW;
  out.acLossW = acLossW;
  out.tailLossW = tailLossW;
  out.totalLossW = totalLossW;
  out.effectiveResistanceOhm = rmsSquareA2 > 0 ? totalLossW / rmsSquareA2 : dcResistanceOhm;
  out.harmonicsUsed = count;
}

/**
 * The running sums of {@link harmonicSums}: Σ Fr(n·f)·I_n,rms² (A²) and Σ I_n,rms² (A²) over the
 * orders summed so far. Module scratch, not a returned object: a design sums hundreds of times.
 */
const SUMS = new Float64Array(2);

/**
 * 2⁻⁵⁶: a term below this fraction of a positive running sum is under a quarter of the sum's
 * ulp (at least 2⁻⁵²·sum), so adding it cannot change the sum's bits (round to nearest).
 */
const NEGLIGIBLE_FRACTION = 2 ** -56;

/** √n for the orders of the usual 64 harmonics (Math.sqrt's own, correctly rounded values). */
const ORDER_ROOTS = Float64Array.from({ length: 131 }, (_, n) => Math.sqrt(n));

/**
 * Sums orders from + 1…count of the current into {@link SUMS}, each weighted by Dowell's factor
 * at Δ1·√n, and returns the tail estimate for the orders above count, A². Dowell's terms are
 * computed only at the orders whose term can change the sum, the next order and its double (the
 * tail's slope): a term is left out, exactly, when even the bounds skin ≤ 1 + Δ and
 * proximity ≤ 1.1·Δ (checked over Δ in 0…1000 in dowell-kernels.test.ts) make it negligible
 * (NEGLIGIBLE_FRACTION). That is most orders of a half-wave-symmetric current, whose even
 * harmonics are round-off, about 1e-30 of the others.
 */
function harmonicSums(
  squaresA2: readonly number[],
  from: number,
  count: number,
  delta1: number,
  proximityWeight: number,
  acSquareA2: number,
): number {
  const doubleOrder = 2 * (count + 1);
  const table = dowellKernelTable(delta1, doubleOrder);
  const { skin, proximity } = table;
  // |skin + w·proximity| ≤ (1 + Δ)·(1 + 2|w|), since 1.1·|w|·Δ ≤ 2|w|·(1 + Δ).
  const boundWeight = 1 + 2 * Math.abs(proximityWeight);
  let weightedA2 = SUMS[0] as number;
  let summedA2 = SUMS[1] as number;
  // The spectrum holds every order up to count (windingAcResistance caps count at its length);
  // read as plain numbers, since a `?? 0` here boxed every term of the sum.
  for (let n = from + 1; n <= count; n++) {
    const squareA2 = squaresA2[n - 1] as number;
    summedA2 += squareA2;
    const root = n < ORDER_ROOTS.length ? (ORDER_ROOTS[n] as number) : Math.sqrt(n);
    if (squareA2 * boundWeight * (1 + delta1 * root) < weightedA2 * NEGLIGIBLE_FRACTION) continue;
    if (Number.isNaN(skin[n])) writeDowellKernels(delta1 * root, skin, proximity, n);
    weightedA2 += ((skin[n] as number) + proximityWeight * (proximity[n] as number)) * squareA2;
  }
  SUMS[0] = weightedA2;
  SUMS[1] = summedA2;
  fillDowellKernels(table, count + 1);
  fillDowellKernels(table, doubleOrder);
  // Parseval: Σ over all orders of I_n,rms² equals the AC mean square.
  const unsummedA2 = Math.max(0, acSquareA2 - summedA2);
  const nextFactor =
    (skin[count + 1] as number) + proximityWeight * (proximity[count + 1] as number);
  const doubleFactor =
    (skin[doubleOrder] as number) + proximityWeight * (proximity[doubleOrder] as number);
  return tailWeight(nextFactor, doubleFactor) * nextFactor * unsummedA2;
}
