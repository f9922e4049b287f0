/**
 * A random scan for specs on which `designConverter` throws: `npx tsx test/bench/throw-scan.ts
 * [options]`. A well-formed spec must give a design or issues (a 422), never an exception (a 500
 * from the API); each throw is printed with its message and the spec as JSON, ready for a
 * regression test. It draws invented specs (not any product): one to three outputs (3.3–48 V,
 * the others 5 V and 24 V, down to tens of mA), diode or synchronous rectifiers, 18–36, 36–72 or
 * 200–400 V, 50–500 kHz, loads from 1 % to full, sometimes a leakage, an ambient, a duty-cycle
 * target or full-bridge rectifiers, the transformer designed two times in three. It asserts
 * nothing; it found the faults `test/solvers/design/scan-regressions.test.ts` holds
 * (2026-12-04: six in 4,000 specs). Some 600 specs a minute on one core.
 *
 *   --topologies a,b,…   topology ids, taken in turn (default: all)
 *   --count N            specs (400)
 *   --seed S             the random stream's seed (1)
 */
import { parseArgs } from 'node:util';
import { designConverter, SpecSchema, TOPOLOGY_IDS } from '../../solvers/index.js';
import { scanStream } from './scan-stream.js';

const { values: args } = parseArgs({
  options: {
    topologies: { type: 'string', default: TOPOLOGY_IDS.join(',') },
    count: { type: 'string', default: '400' },
    seed: { type: 'string', default: '1' },
  },
});

const topologies = (args.topologies ?? '').split(',');
for (const id of topologies) {
  if (!(TOPOLOGY_IDS as readonly string[]).includes(id)) {
    throw new Error(`throw-scan: unknown topology '${id}' (one of ${TOPOLOGY_IDS.join(', ')})`);
  }
}

// The same seed draws the same specs on any machine.
const { random, pick } = scanStream(Number(args.seed));

const DOUBLE_ENDED = ['push-pull', 'half-bridge', 'full-bridge'];
const INPUTS = [
  [36, 48, 72],
  [18, 24, 36],
  [200, 300, 400],
] as const;
const diode = { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01, voltageRatingV: 100 };

function rectifier(): object {
  return random() < 0.3
    ? { kind: 'synchronous', onResistanceOhm: 0.005 + random() * 0.02, voltageRatingV: 100 }
    : diode;
}

/** The raw (unparsed) invented spec of draw `i`. */
function drawSpec(i: number): Record<string, unknown> {
  const topology = topologies[i % topologies.length] as string;
  const vin = pick(INPUTS);
  const count = 1 + Math.floor(random() * 3);
  const outputs: Record<string, unknown>[] = [
    {
      voltageV: pick([3.3, 5, 12, 15, 48]),
      currentA: 1 + random() * 8,
      capacitanceF: 100e-6,
      rectifier: rectifier(),
    },
    { voltageV: 5, currentA: 0.05 + random() * 3, capacitanceF: 100e-6, rectifier: rectifier() },
    { voltageV: 24, currentA: 0.02 + random() * 1, capacitanceF: 47e-6, rectifier: rectifier() },
  ].slice(0, count);
  const arrangement = random() < 0.3 ? 'full-bridge' : 'center-tapped';
  if (DOUBLE_ENDED.includes(topology)) {
    for (const output of outputs) output.secondaryArrangement = arrangement;
  }
  return {
    topology,
    ...(random() < 0.2 ? { ambientTemperatureC: pick([-20, 25, 70]) } : {}),
    ...(random() < 0.2 ? { targets: { dutyCycleTarget: pick([0.3, 0.4, 0.6]) } } : {}),
    inputVoltageMinV: vin[0],
    inputVoltageNominalV: vin[1],
    inputVoltageMaxV: vin[2],
    outputs,
    switchingFrequencyHz: 50e3 + random() * 450e3,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: vin[2] * 3 },
    loadFractions: pick([
      [0.05, 0.2, 1],
      [0.02, 0.1, 1],
      [0.1, 1],
      [0.01, 0.5, 1],
    ]),
    magnetics: { mode: pick(['design', 'design', 'assume']) },
    ...(random() < 0.5
      ? {
          transformer: {
            leakageInductanceH: pick([0, 0.2e-6, 1e-6]) * (vin[0] > 100 ? 10 : 1),
          },
        }
      : {}),
  };
}

let designed = 0;
let infeasible = 0;
let thrown = 0;
let unparsed = 0;
for (let i = 0; i < Number(args.count); i++) {
  const raw = drawSpec(i);
  const parsed = SpecSchema.safeParse(raw);
  if (!parsed.success) {
    unparsed += 1;
    continue;
  }
  try {
    if (designConverter(parsed.data).ok) designed += 1;
    else infeasible += 1;
  } catch (error) {
    thrown += 1;
    console.log(`${i} threw: ${(error as Error).message}\n  ${JSON.stringify(raw)}`);
  }
}
console.log(
  `${designed} designed, ${infeasible} infeasible (422), ${thrown} threw, ${unparsed} did not parse`,
);
