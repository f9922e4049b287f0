import { PerformanceObserver, constants } from 'node:perf_hooks';
import { designConverter } from '../../solvers/index.js';
import { BENCH_SPECS, withMagneticsMode } from './design.bench.js';

// What one converter design (transformer assumed, as `npm run bench` times it) allocates, per
// topology: figures that a shared machine does not disturb, unlike times. Run as
//   node --expose-gc --min-semi-space-size=512 --max-semi-space-size=512 --import tsx \
//     test/bench/design-allocation.ts [designs per batch, 150]
// so that no collection falls inside a batch: the heap's growth over a batch, over its designs,
// is what they allocated (the median of 5 batches is printed; a batch that met a collection is
// not counted). It then counts the scavenges over 1000 designs with the young generation the
// process was given: run `npx tsx test/bench/design-allocation.ts` (no --expose-gc: the
// allocation is left out) for the default one. It asserts nothing.

const gc = (globalThis as { gc?: () => void }).gc;
const batch = Number(process.argv[2] ?? 150);
let collections = 0;
new PerformanceObserver((list) => {
  for (const entry of list.getEntries()) {
    const kind = (entry as { detail?: { kind?: number } }).detail?.kind;
    if (kind === constants.NODE_PERFORMANCE_GC_MINOR) collections += 1;
  }
}).observe({ entryTypes: ['gc'] });

const tick = () => new Promise((resolve) => setTimeout(resolve, 0));

async function allocationKiB(spec: (typeof BENCH_SPECS)[string]): Promise<number | undefined> {
  if (gc === undefined) return undefined;
  const perDesign: number[] = [];
  for (let round = 0; round < 5; round += 1) {
    gc();
    await tick();
    const before = collections;
    const heapBefore = process.memoryUsage().heapUsed;
    for (let i = 0; i < batch; i += 1) designConverter(spec);
    const heapAfter = process.memoryUsage().heapUsed;
    await tick();
    if (collections === before) perDesign.push((heapAfter - heapBefore) / batch / 1024);
  }
  perDesign.sort((a, b) => a - b);
  return perDesign[Math.floor(perDesign.length / 2)];
}

async function main(): Promise<void> {
  for (const [name, benchSpec] of Object.entries(BENCH_SPECS)) {
    const spec = withMagneticsMode(benchSpec, 'assume');
    for (let i = 0; i < 300; i += 1) designConverter(spec);
    const kib = await allocationKiB(spec);
    await tick();
    const before = collections;
    for (let i = 0; i < 1000; i += 1) designConverter(spec);
    await tick();
    const allocated =
      gc === undefined
        ? ''
        : kib === undefined
          ? 'a collection in every batch; '
          : `${kib.toFixed(0)} KiB allocated a design; `;
    console.log(`${name} design: ${allocated}${collections - before} scavenges over 1000 designs`);
  }
}

void main();
