import { cpus, loadavg } from 'node:os';
import { benchComparison } from './comparison.bench.js';
import {
  BENCH_SPECS,
  DESIGN_TARGET_S,
  MAGNETICS_DESIGN_TARGET_S,
  benchDesign,
  withMagneticsMode,
} from './design.bench.js';
import { benchHttpDesigns } from './http-designs.bench.js';
import { targetVerdict } from './timing-summary.js';
import { TOLERANCE_BENCH_SPECS, benchTolerance } from './tolerance.bench.js';

// `npm run bench`: prints figures and verdicts against the targets (issue tracker); it asserts
// nothing. `npm run bench -- --skip-http` leaves out the HTTP load (BENCH_DURATION_S shortens it);
// BENCH_ITERATIONS sets the timed designs per topology (default 3000).
const isHttpSkipped = process.argv.includes('--skip-http');
const iterations = Number(process.env.BENCH_ITERATIONS ?? 3000);
const us = (s: number) => `${(s * 1e6).toFixed(0)} µs`;

console.log(
  `machine: ${cpus().length} cores, ${cpus()[0]?.model ?? 'unknown cpu'}, Node ${process.version}, load average ${loadavg()
    .map((l) => l.toFixed(1))
    .join(' ')} (1, 5, 15 min)`,
);

// The converter alone (transformer assumed: issue 3's 1 ms), then with its designed transformer
// (issue 4's 2 ms); a tenth of the iterations for the slower second set.
const modes = [
  { mode: 'assume', label: 'converter', targetS: DESIGN_TARGET_S, count: iterations },
  {
    mode: 'design',
    label: 'with transformer',
    targetS: MAGNETICS_DESIGN_TARGET_S,
    count: Math.max(100, Math.round(iterations / 10)),
  },
] as const;
for (const { mode, label, targetS, count } of modes) {
  for (const [name, spec] of Object.entries(BENCH_SPECS)) {
    const design = benchDesign(`${name} (${label})`, withMagneticsMode(spec, mode), {
      iterations: count,
    });
    console.log(
      `${design.label}: median ${us(design.medianS)}, p90 ${us(design.p90S)}, p99 ${us(design.p99S)} over ${design.count} runs (CPU median ${us(design.cpu.medianS)}, p99 ${us(design.cpu.p99S)}); ${targetVerdict(design, targetS)}`,
    );
  }
}

const comparison = benchComparison();
console.log(
  `${comparison.label}: median ${us(comparison.medianS)}, p90 ${us(comparison.p90S)}, p99 ${us(comparison.p99S)} over ${comparison.count} runs`,
);

// Monte Carlo samples per second of the tolerance job (issue 5), one process, default tolerances;
// BENCH_TOLERANCE_SAMPLES sets the samples per spec (default 2000).
const toleranceSamples = Number(process.env.BENCH_TOLERANCE_SAMPLES ?? 2000);
for (const [name, spec] of Object.entries(TOLERANCE_BENCH_SPECS)) {
  const figures = benchTolerance(name, spec, { sampleCount: toleranceSamples });
  console.log(
    `${figures.label}: ${figures.samplesPerSecond.toFixed(0)} samples/s (${figures.samplesPerCpuSecond.toFixed(0)} per CPU second), reduce with worst case ${(figures.reduceS * 1e3).toFixed(0)} ms (${figures.worstCaseEvaluations} evaluations)`,
  );
}

if (!isHttpSkipped) {
  const load = await benchHttpDesigns({ durationS: Number(process.env.BENCH_DURATION_S ?? 10) });
  console.log(
    `${load.label}: ${load.requestsPerSecond.toFixed(0)} requests/s, p50 ${load.latencyP50Ms} ms, p99 ${load.latencyP99Ms} ms, ${load.non2xx} non-2xx, ${load.errors} errors`,
  );
}
