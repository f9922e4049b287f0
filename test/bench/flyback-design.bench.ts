import { designConverter } from '../../solvers/index.js';
import { telecomSpec } from '../helpers/flyback-specs.js';
import { summarizeTimings, type TimingSummary } from './timing-summary.js';

// Invented scenario: a 36–72 V telecom-style input, 12 V 2 A out (see test/helpers/flyback-specs.ts).
const SPEC = telecomSpec();

/** Times one complete flyback design (choices plus every corner) in this process. */
export function benchFlybackDesign(options: { iterations?: number } = {}): TimingSummary {
  const iterations = options.iterations ?? 5000;
  const first = designConverter(SPEC);
  if (!first.ok) throw new Error(`bench spec is infeasible: ${JSON.stringify(first.issues)}`);
  const cornerCount = first.value.corners.length;
  for (let i = 0; i < 500; i += 1) designConverter(SPEC);
  const samplesS: number[] = [];
  for (let i = 0; i < iterations; i += 1) {
    const start = process.hrtime.bigint();
    designConverter(SPEC);
    samplesS.push(Number(process.hrtime.bigint() - start) * 1e-9);
  }
  return { ...summarizeTimings(samplesS), label: `flyback design, ${cornerCount} corners` };
}
