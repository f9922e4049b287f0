/**
 * How often the double-ended family falls back from its light-load event model:
 * `npx tsx test/bench/model-fallback-scan.ts [--count N] [--seed S] [--magnetics design|assume]`.
 * It draws invented specs (not any product: push-pull, half and full bridge in turn, an
 * 18–36, 36–72 or 200–400 V input, 12 V 4–10 A and 5 V 1–3 A, half the time a third output of
 * 24 V 0.5–2 A, diode rectifiers of 0.5 V and 10 mΩ rated 200 V, switches of 30 mΩ rated three
 * times the highest input, 70–300 kHz, one light load in 2–42 % and 100 %, no or the default
 * leakage), designs each and prints every corner with a `modelFallback` (the start of its
 * reason), then the counts. It asserts nothing and runs no ngspice (a few seconds for 60 specs);
 * for a fallback rate before and after a change to the event solve (DEVELOPERS.md, "Light load
 * with several outputs: the event model", fallbacks flagged).
 *
 *   --count N        specs (60)
 *   --seed S         the random stream's seed (7)
 *   --magnetics M    `design` (default: the wound core's Lm, where most fall back) or `assume`
 *   --outputs 1      the first output alone (the same draws otherwise): the push-pull's leaky
 *                    light-load half takes one-output corners only
 *   --write-specs D  writes each spec with a fallback to D/scan-<seed>-<i>.json, for
 *                    `light-load-probe.ts --spec-file` (ngspice with the output held)
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { designConverter, SpecSchema } from '../../solvers/index.js';
import { scanStream } from './scan-stream.js';

const { values: args } = parseArgs({
  options: {
    count: { type: 'string', default: '60' },
    seed: { type: 'string', default: '7' },
    magnetics: { type: 'string', default: 'design' },
    outputs: { type: 'string', default: 'all' },
    'write-specs': { type: 'string' },
  },
});
if (args.magnetics !== 'design' && args.magnetics !== 'assume') {
  throw new Error('model-fallback-scan: --magnetics is design or assume');
}

// The same seed draws the same specs on any machine.
const { random, pick } = scanStream(Number(args.seed));

const rectifier = { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01, voltageRatingV: 200 };
const TOPOLOGIES = ['push-pull', 'half-bridge', 'full-bridge'] as const;
const INPUTS = [
  [36, 48, 72],
  [18, 24, 36],
  [200, 300, 400],
] as const;

let designs = 0;
let infeasible = 0;
let lightCorners = 0;
const fallbacks = new Map<string, number>();
for (let i = 0; i < Number(args.count); i++) {
  const topology = TOPOLOGIES[i % TOPOLOGIES.length] as string;
  const vin = pick(INPUTS);
  const hasThird = random() >= 0.5;
  const light = 0.02 + random() * 0.4;
  const spec = SpecSchema.parse({
    topology,
    inputVoltageMinV: vin[0],
    inputVoltageNominalV: vin[1],
    inputVoltageMaxV: vin[2],
    outputs: [
      { voltageV: 12, currentA: 4 + random() * 6, capacitanceF: 100e-6, rectifier },
      { voltageV: 5, currentA: 1 + random() * 2, capacitanceF: 100e-6, rectifier },
      ...(hasThird
        ? [{ voltageV: 24, currentA: 0.5 + random() * 1.5, capacitanceF: 100e-6, rectifier }]
        : []),
    ].slice(0, args.outputs === '1' ? 1 : 3),
    switchingFrequencyHz: 70e3 + random() * 230e3,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: vin[2] * 3 },
    loadFractions: [Number(light.toFixed(4)), 1],
    magnetics: { mode: args.magnetics },
    ...(random() < 0.5 ? { transformer: { leakageInductanceH: 0 } } : {}),
  });
  const result = designConverter(spec);
  if (!result.ok) {
    infeasible += 1;
    continue;
  }
  designs += 1;
  const writeDir = args['write-specs'];
  if (writeDir !== undefined && result.value.corners.some((k) => k.modelFallback !== undefined)) {
    mkdirSync(writeDir, { recursive: true });
    writeFileSync(`${writeDir}/scan-${args.seed}-${i}.json`, JSON.stringify(spec, null, 2));
  }
  for (const corner of result.value.corners) {
    if (corner.loadFraction < 1) lightCorners += 1;
    if (corner.modelFallback === undefined) continue;
    const reason = corner.modelFallback.slice(0, 40);
    fallbacks.set(reason, (fallbacks.get(reason) ?? 0) + 1);
    console.log(
      `${i} ${topology} ${vin.join('/')} V, ${spec.outputs.length} outputs, ` +
        `${(spec.switchingFrequencyHz / 1e3).toFixed(1)} kHz, leakage ` +
        `${spec.transformer.leakageInductanceH ?? 'default'}: ${corner.label}: ${reason}…`,
    );
  }
}
const total = [...fallbacks.values()].reduce((a, b) => a + b, 0);
console.log(
  `${designs} designs (${infeasible} infeasible), ${total} of ${lightCorners} light-load corners ` +
    `fell back: ${[...fallbacks].map(([reason, n]) => `${n} "${reason}…"`).join(', ')}`,
);
