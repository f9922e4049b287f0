/** The largest value of `pick` over `items` (0 for none). */
export function largestOver<T>(items: readonly T[], pick: (item: T) => number): number {
  return items.reduce((most, item) => Math.max(most, pick(item)), 0);
}
