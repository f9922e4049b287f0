import { compareTopologies, TOPOLOGY_IDS } from '../../solvers/index.js';
import { telecomSpec } from '../helpers/flyback-specs.js';
import { summarizeTimings, type TimingSummary } from './timing-summary.js';

/**
 * Times one comparison of every registered topology on the invented 36–72 V telecom-style
 * scenario (see the helpers), ranked by nominal efficiency, in this process.
 */
export function benchComparison(options: { iterations?: number } = {}): TimingSummary {
  const iterations = options.iterations ?? 300;
  const spec = telecomSpec();
  for (let i = 0; i < 30; i += 1) compareTopologies(spec);
  const samplesS: number[] = [];
  for (let i = 0; i < iterations; i += 1) {
    const start = process.hrtime.bigint();
    compareTopologies(spec);
    samplesS.push(Number(process.hrtime.bigint() - start) * 1e-9);
  }
  const label = `comparison of ${TOPOLOGY_IDS.length} topologies`;
  return { ...summarizeTimings(samplesS), label };
}
