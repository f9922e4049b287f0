/** Options of {@link settledAverage}. */
export interface SettledAverageOptions {
  /** The last window counts as settled when it moved less than this fraction of itself. @defaultValue 2e-4 */
  settledRel?: number;
  /** Largest ratio of successive changes accepted as a geometric approach. @defaultValue 0.95 */
  ratioMax?: number;
}

const DEFAULTS = { settledRel: 2e-4, ratioMax: 0.95 } satisfies Required<SettledAverageOptions>;

/**
 * Returns the value that three consecutive, equally long window averages of a simulation settle
 * to, in their unit: the last one when it no longer moves, otherwise the limit of their geometric
 * (first-order, exponential) approach by Aitken's Δ² process.
 * @throws Error when the windows neither settle nor approach geometrically: the run is too short.
 */
export function settledAverage(
  earlier: number,
  previous: number,
  last: number,
  options: SettledAverageOptions = {},
): number {
  const o = { ...DEFAULTS, ...options };
  const firstChange = previous - earlier;
  const lastChange = last - previous;
  if (Math.abs(lastChange) <= o.settledRel * Math.abs(last)) return last;
  const ratio = lastChange / firstChange;
  if (!(ratio > 0 && ratio <= o.ratioMax)) {
    throw new Error(
      `settledAverage: windows ${earlier}, ${previous}, ${last} neither settle nor approach ` +
        `geometrically (ratio ${ratio}); simulate longer`,
    );
  }
  // ref: A. C. Aitken, Proc. Roy. Soc. Edinburgh 46 (1926), the delta-squared process (from memory):
  // the remaining geometric tail is lastChange · r / (1 − r).
  return last + (lastChange * ratio) / (1 - ratio);
}
