import { brentRoot, type BrentRootOptions } from './brent-root.js';

/**
 * {@link brentRoot} on [lo, hi] started from a hint: a root from a nearby solve (the last
 * fixed-point pass, the previous duty-cycle trial) is bracketed first within `relativeSpan` ·
 * max(1, |hi|) of the hint, then, if that bracket holds no sign change, on the whole interval.
 * The same tolerance either way, so the same root to within it. NaN when neither brackets one.
 */
export function brentRootNear(
  f: (x: number) => number,
  lo: number,
  hi: number,
  hint: number | undefined,
  options: BrentRootOptions & { relativeSpan?: number } = {},
): number {
  if (hint !== undefined && hint > lo && hint < hi) {
    const span = (options.relativeSpan ?? 1e-6) * Math.max(1, Math.abs(hi));
    const near = brentRoot(f, Math.max(lo, hint - span), Math.min(hi, hint + span), options);
    if (Number.isFinite(near)) return near;
  }
  return brentRoot(f, lo, hi, options);
}
