/** Median and tail of a set of timings, s. */
export interface TimingSummary {
  label: string;
  count: number;
  medianS: number;
  p90S: number;
  p99S: number;
}

/** Summarizes timings (s) by their median, 90th and 99th percentiles (nearest rank). */
export function summarizeTimings(samplesS: number[]): TimingSummary {
  const sorted = [...samplesS].sort((a, b) => a - b);
  const rank = (q: number) =>
    sorted[Math.min(sorted.length - 1, Math.ceil(q * sorted.length) - 1)] ?? NaN;
  return { label: '', count: sorted.length, medianS: rank(0.5), p90S: rank(0.9), p99S: rank(0.99) };
}

/**
 * Returns the printed verdict of a summary against a target time (s): the median decides pass or
 * fail, and the p99 is judged beside it, since on a shared machine the tail mostly measures the
 * neighbours.
 */
export function targetVerdict(summary: TimingSummary, targetS: number): string {
  const verdict = (s: number) => (s < targetS ? 'pass' : 'FAIL');
  const target = `${(targetS * 1e3).toFixed(0)} ms`;
  return `${verdict(summary.medianS).toUpperCase()} against the ${target} target (median ${verdict(summary.medianS)}, p99 ${verdict(summary.p99S)})`;
}
