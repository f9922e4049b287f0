/**
 * The random stream the scans (`ngspice-scan.ts`, `model-fallback-scan.ts`, `throw-scan.ts`)
 * draw their invented specs from: a linear congruential stream, so the same seed draws the same
 * specs on any machine (the seeds quoted in DEVELOPERS.md and the changelog rely on it; do not
 * change its arithmetic).
 */
export interface ScanStream {
  /** The next number in [0, 1). */
  random: () => number;
  /** One of `values`, drawn with the next number. */
  pick: <T>(values: readonly T[]) => T;
}

/** The stream of `seed`. */
export function scanStream(seed: number): ScanStream {
  let state = seed;
  const random = (): number => (state = (state * 1103515245 + 12345) % 2147483648) / 2147483648;
  const pick = <T>(values: readonly T[]): T => values[Math.floor(random() * values.length)] as T;
  return { random, pick };
}
