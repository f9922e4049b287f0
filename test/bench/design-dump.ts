import { readFileSync, writeFileSync } from 'node:fs';
import {
  SpecSchema,
  compareTopologies,
  designConverter,
  evaluateSweepPoint,
  sweepPoints,
  SweepRequestSchema,
  type Spec,
} from '../../solvers/index.js';
import { busSpec, telecomSpec } from '../helpers/flyback-specs.js';
import { forwardBusSpec, resetWindingSpec } from '../helpers/forward-specs.js';
import { smallSweepRequest } from '../helpers/sweep-requests.js';
import { BENCH_SPECS, evaluationSpec, withMagneticsMode } from './design.bench.js';

// A before/after check for engine changes meant to keep every number: `tsx
// test/bench/design-dump.ts out.json` writes whole designs of the bench scenarios and their
// variants (designed, evaluated with the transformer fixed, stacked windings, hold-up, other
// inputs and frequencies, a comparison and a small sweep); `--compare a.json b.json` lists every
// number that differs by more than 1e-9 relative (or 1e-15 absolute) and every other difference,
// and counts the numbers that are not bit-identical.

/** The scenarios dumped, by name: invented specs of the test helpers and variants of them. */
function scenarios(): Record<string, Spec> {
  const out: Record<string, Spec> = {};
  for (const [name, benchSpec] of Object.entries(BENCH_SPECS)) {
    const spec = withMagneticsMode(benchSpec, 'design');
    out[`${name}/assume`] = withMagneticsMode(benchSpec, 'assume');
    out[`${name}/design`] = spec;
    const designed = designConverter(spec);
    if (designed.ok) out[`${name}/evaluate`] = evaluationSpec(spec, designed.value);
    out[`${name}/stacked`] = SpecSchema.parse({
      ...spec,
      magnetics: { ...spec.magnetics, arrangement: 'stacked' },
    });
    out[`${name}/hold-up`] = SpecSchema.parse({ ...spec, holdUp: { timeS: 0.01 } });
    out[`${name}/250kHz`] = SpecSchema.parse({ ...spec, switchingFrequencyHz: 250e3 });
    out[`${name}/hot`] = SpecSchema.parse({ ...spec, ambientTemperatureC: 70 });
    out[`${name}/light`] = SpecSchema.parse({ ...spec, loadFractions: [0.05, 0.2, 1.2] });
  }
  out['flyback-bus/design'] = busSpec();
  out['flyback-bus/500kHz'] = busSpec({ switchingFrequencyHz: 500e3 });
  out['flyback-two-outputs/design'] = telecomSpec({
    outputs: [
      {
        voltageV: 12,
        currentA: 2,
        rectifier: { kind: 'diode', forwardVoltageV: 0.45, resistanceOhm: 0.02 },
      },
      {
        voltageV: 5,
        currentA: 1,
        rectifier: { kind: 'diode', forwardVoltageV: 0.4, resistanceOhm: 0.02 },
      },
    ],
  });
  out['forward-bus/design'] = withMagneticsMode(forwardBusSpec(), 'design');
  out['forward-reset-1.5/design'] = withMagneticsMode(resetWindingSpec(1.5), 'design');
  out['flyback/fixed-lm'] = telecomSpec({ transformer: { magnetizingInductanceH: 60e-6 } });
  out['flyback/powdered-iron'] = telecomSpec({
    magnetics: { materialId: 'powdered-iron' },
  });
  return out;
}

function dump(): unknown {
  const designs: Record<string, unknown> = {};
  for (const [name, spec] of Object.entries(scenarios())) designs[name] = designConverter(spec);
  const sweepRequest = SweepRequestSchema.parse(smallSweepRequest());
  const cache = new Map();
  return {
    designs,
    comparison: compareTopologies(telecomSpec()),
    sweep: sweepPoints(sweepRequest).map((point) => evaluateSweepPoint(sweepRequest, point, cache)),
  };
}

/** Numbers that differ at all, within the tolerance or not. */
let inexactCount = 0;

function compare(a: unknown, b: unknown, path: string, out: string[]): void {
  if (typeof a === 'number' && typeof b === 'number') {
    if (a !== b) inexactCount += 1;
    const scale = Math.max(Math.abs(a), Math.abs(b));
    if (a !== b && Math.abs(a - b) > Math.max(1e-9 * scale, 1e-15)) {
      out.push(`${path}: ${a} → ${b} (${((b - a) / (scale || 1)).toExponential(2)} rel)`);
    }
    return;
  }
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) {
    if (a !== b) out.push(`${path}: ${JSON.stringify(a)} → ${JSON.stringify(b)}`);
    return;
  }
  const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
  for (const key of keys) {
    compare(
      (a as Record<string, unknown>)[key],
      (b as Record<string, unknown>)[key],
      `${path}.${key}`,
      out,
    );
  }
}

const [mode, first, second] = process.argv.slice(2);
if (mode === '--compare' && first !== undefined && second !== undefined) {
  const differences: string[] = [];
  compare(
    JSON.parse(readFileSync(first, 'utf8')),
    JSON.parse(readFileSync(second, 'utf8')),
    '$',
    differences,
  );
  console.log(differences.slice(0, 200).join('\n'));
  console.log(
    `${differences.length} differences beyond 1e-9 relative; ${inexactCount} numbers not bit-identical`,
  );
  process.exitCode = differences.length === 0 ? 0 : 1;
} else if (mode !== undefined) {
  writeFileSync(mode, JSON.stringify(dump()));
} else {
  console.error('usage: design-dump.ts out.json | --compare a.json b.json');
  process.exitCode = 2;
}
