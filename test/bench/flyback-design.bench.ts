import { designConverter, SpecSchema } from '../../solvers/index.js';
import { summarizeTimings, type TimingSummary } from './timing-summary.js';

// Invented scenario: auxiliary supply for an imagined packaging machine, 36–72 V in, 12 V 2 A out.
const SPEC = SpecSchema.parse({
  topology: 'flyback',
  inputVoltageMinV: 36,
  inputVoltageNominalV: 48,
  inputVoltageMaxV: 72,
  outputs: [{ voltageV: 12, currentA: 2, rectifier: { kind: 'diode', forwardVoltageV: 0.45 } }],
  switchingFrequencyHz: 100e3,
  primarySwitch: { onResistanceOhm: 0.04, voltageRatingV: 200 },
});

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
