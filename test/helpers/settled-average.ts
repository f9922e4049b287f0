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

/**
 * {@link settledAverage} of output `k`'s voltage (numbered from 1, as the decks name it) from a
 * deck's three window measures, `output_K_voltage_earlier_v`, `_previous_v` and `_v`, V; a measure
 * missing reads NaN (and fails the comparison that follows).
 */
export function settledOutputV(
  measures: Readonly<Record<string, number | undefined>>,
  k: number,
  options: SettledAverageOptions = {},
): number {
  return settledAverage(
    measures[`output_${k}_voltage_earlier_v`] ?? NaN,
    measures[`output_${k}_voltage_previous_v`] ?? NaN,
    measures[`output_${k}_voltage_v`] ?? NaN,
    options,
  );
}
