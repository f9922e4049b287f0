/**
 * A mergeable histogram of a quantity's deviation from its nominal value, for percentiles that do
 * not depend on how the samples were chunked: integer counts in bins logarithmic in the relative
 * deviation d = (y − y0)/|y0| (absolute when y0 = 0), 20 bins per decade from 1e-9 up (so a
 * percentile is good to about 12 % of its deviation from the nominal), signed; bin 0 holds
 * |d| < 1e-9. Counts add exactly, so merging in any grouping gives the same histogram.
 */

/** Bin counts by signed bin index (as a string key: plain JSON). */
export type DeviationHistogram = Record<string, number>;

const BINS_PER_DECADE = 20;
const SMALLEST_DEVIATION = 1e-9;
/** Largest bin index: deviations beyond 1e-9·10^11 = 100 (10 000 %) share the last bin. */
const LARGEST_BIN = 11 * BINS_PER_DECADE;

function scaleOf(nominal: number): number {
  return nominal === 0 ? 1 : Math.abs(nominal);
}

/** The signed bin of `value` about `nominal`. */
export function deviationBin(value: number, nominal: number): number {
  const d = (value - nominal) / scaleOf(nominal);
  const magnitude = Math.abs(d);
  if (!(magnitude >= SMALLEST_DEVIATION)) return 0;
  const bin = Math.min(
    LARGEST_BIN,
    1 + Math.floor(BINS_PER_DECADE * Math.log10(magnitude / SMALLEST_DEVIATION)),
  );
  return d < 0 ? -bin : bin;
}

/** Counts `value` into `histogram` in place. */
export function addToHistogram(
  histogram: DeviationHistogram,
  value: number,
  nominal: number,
): void {
  const key = String(deviationBin(value, nominal));
  histogram[key] = (histogram[key] ?? 0) + 1;
}

/** Adds every count of `other` into `histogram` in place. */
export function mergeHistograms(histogram: DeviationHistogram, other: DeviationHistogram): void {
  for (const [key, count] of Object.entries(other)) histogram[key] = (histogram[key] ?? 0) + count;
}

/**
 * The nearest-rank percentile (the ⌈p·n⌉-th smallest of n) read off the histogram: the geometric
 * centre of the bin holding that rank, clamped to [min, max]. Undefined for an empty histogram.
 */
export function histogramPercentile(
  histogram: DeviationHistogram,
  p: number,
  nominal: number,
  min: number,
  max: number,
): number | undefined {
  const bins = Object.entries(histogram)
    .map(([key, count]) => [Number(key), count] as const)
    .sort((a, b) => a[0] - b[0]);
  const n = bins.reduce((sum, [, count]) => sum + count, 0);
  if (n === 0) return undefined;
  const rank = Math.max(1, Math.ceil(p * n));
  let seen = 0;
  for (const [bin, count] of bins) {
    seen += count;
    if (seen < rank) continue;
    if (bin === 0) return Math.min(max, Math.max(min, nominal));
    const magnitude = SMALLEST_DEVIATION * 10 ** ((Math.abs(bin) - 0.5) / BINS_PER_DECADE);
    const value = nominal + Math.sign(bin) * magnitude * scaleOf(nominal);
    return Math.min(max, Math.max(min, value));
  }
  return max;
}
