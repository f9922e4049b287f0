/** Median and tail of a set of timings, s. */
export interface TimingSummary {
  label: string;
  count: number;
  medianS: number;
  /** Mean, s: the time per evaluation with garbage collection spread over every run. */
  meanS: number;
  p90S: number;
  p99S: number;
}

/** Summarizes timings (s) by their median, mean, 90th and 99th percentiles (nearest rank). */
export function summarizeTimings(samplesS: number[]): TimingSummary {
  const sorted = [...samplesS].sort((a, b) => a - b);
  const rank = (q: number) =>
    sorted[Math.min(sorted.length - 1, Math.ceil(q * sorted.length) - 1)] ?? NaN;
  const meanS = sorted.reduce((sum, s) => sum + s, 0) / sorted.length;
  return {
    label: '',
    count: sorted.length,
    medianS: rank(0.5),
    meanS,
    p90S: rank(0.9),
    p99S: rank(0.99),
  };
}

/**
 * Returns the printed verdict of a summary against a target time (s): the median and the mean
 * (which spreads the garbage collection a design causes over every run) must both be under it;
 * the p99 is judged beside them, since on a shared machine the tail mostly measures the
 * neighbours and single young-generation scavenges.
 */
export function targetVerdict(summary: TimingSummary, targetS: number): string {
  const verdict = (s: number) => (s < targetS ? 'pass' : 'FAIL');
  const target = `${(targetS * 1e3).toFixed(0)} ms`;
  const overall = summary.medianS < targetS && summary.meanS < targetS ? 'PASS' : 'FAIL';
  return `${overall} against the ${target} target (median ${verdict(summary.medianS)}, mean ${verdict(summary.meanS)}, p99 ${verdict(summary.p99S)})`;
}
