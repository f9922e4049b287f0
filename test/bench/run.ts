import { cpus } from 'node:os';
import { benchComparison } from './comparison.bench.js';
import { BENCH_SPECS, benchDesign } from './design.bench.js';
import { benchHttpDesigns } from './http-designs.bench.js';

// `npm run bench`: prints figures; it asserts nothing. The targets (issue tracker) are read off.
const us = (s: number) => `${(s * 1e6).toFixed(0)} µs`;

console.log(
  `machine: ${cpus().length} cores, ${cpus()[0]?.model ?? 'unknown cpu'}, Node ${process.version}`,
);

for (const [name, spec] of Object.entries(BENCH_SPECS)) {
  const design = benchDesign(name, spec);
  console.log(
    `${design.label}: median ${us(design.medianS)}, p90 ${us(design.p90S)}, p99 ${us(design.p99S)} over ${design.count} runs`,
  );
}

const comparison = benchComparison();
console.log(
  `${comparison.label}: median ${us(comparison.medianS)}, p90 ${us(comparison.p90S)}, p99 ${us(comparison.p99S)} over ${comparison.count} runs`,
);

const load = await benchHttpDesigns({ durationS: Number(process.env.BENCH_DURATION_S ?? 10) });
console.log(
  `${load.label}: ${load.requestsPerSecond.toFixed(0)} requests/s, p50 ${load.latencyP50Ms} ms, p99 ${load.latencyP99Ms} ms, ${load.non2xx} non-2xx, ${load.errors} errors`,
);
