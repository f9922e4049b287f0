/**
 * A light-load check of the double-ended model against ngspice that settles in some 80 periods:
 * `npx tsx test/bench/light-load-probe.ts [scenario] [load ...] [--duty D] [--input min|nominal|max] [--snubber-f F]`. Scenarios (invented,
 * the helpers' push-pull and bridges; not any product): `scan-full-bridge` (the default: the
 * netlist tests' full bridge with loads `load`/101 %, 138.3 kHz, no leakage, transformer
 * assumed, at its highest input: the one a scan of random load pairs found off at 3.4 % load;
 * loads default to 0.0336 0.045 0.07 0.1), `dump-full-bridge` and `dump-push-pull` (the design
 * dump's `light` variants: the bench spec designed with loads 0.05/0.2/1.2, at the lowest input;
 * load 0.05), `scan-half-bridge` (the helper's half bridge with loads `load`/81.2 %, 108.2 kHz,
 * no leakage, transformer assumed, at its lowest input; load 0.0427). `--duty D` runs the deck
 * at D instead of the engine's duty cycle (for an experimental engine whose design is not at
 * hand; the deck's start values stay the design's, which the held output forgets in a few
 * periods); `--input` takes another input corner than the scenario's; `--snubber-f F` puts every
 * rectifier snubber at F farads (the deck takes 30 pF where the inductor conducts throughout,
 * 1 pF where it runs discontinuous). `push-pull`, `half-bridge`
 * and `full-bridge`: the test scenarios (test/helpers/double-ended-specs.ts) with loads
 * `load`/100 %, the converter's own Lm, no leakage, at the highest input (loads default to 0.03,
 * 0.04, 0.05). `scan-push-pull-400`: a random scan's 200–400 V push-pull with 10 µH of leakage
 * (`leakyHighInputPushPullSpec`), at its highest input; load 0.061. `--spec-file F` takes
 * a spec that `model-fallback-scan.ts --write-specs DIR` wrote instead of a scenario (its
 * lowest input unless `--input`, its lightest load unless loads are given).
 *
 * Why not the netlist test's way (the deck's output capacitor and load, three windows of the
 * last quarter of 300 periods, `settledAverage`): at a few percent load the output settles with
 * a time constant of thousands of periods (470 µF against the converter's high output
 * resistance in DCM), so the windows still climb by 0.8 % each and the geometric tail is most
 * of the answer. Here the output is held by a voltage source (behind the ESR) at trial voltages
 * and ngspice's mean inductor current over the last 20 periods is compared with the load that
 * voltage draws; the settled output is the root of the difference (a quadratic through three
 * trials about its sign change, stepping out until there is one). Prints one JSON line per load: the engine's duty cycle, the trials, ngspice's settled
 * output and its difference from the engine's (ngspice against the engine, percent).
 */
import { readFileSync } from 'node:fs';
import {
  doubleEndedNetlist,
  SpecSchema,
  type DoubleEndedDesign,
  type Spec,
} from '../../solvers/index.js';
import {
  LIGHT_LOAD_SCENARIOS as SCENARIOS,
  lightLoadCorner,
  type LightLoadScenario as Scenario,
} from './light-load-scenarios.js';
import { holdFirstOutput } from '../helpers/held-output-deck.js';
import { runNgspice } from '../helpers/ngspice.js';
import { quadraticRoot } from '../helpers/quadratic-root.js';

/**
 * `--spec-file F`: a spec written by `model-fallback-scan.ts --write-specs`, at its lowest input
 * (or `--input`) and its lightest load (or the loads given).
 */
function specFileScenario(path: string): Scenario {
  const spec = SpecSchema.parse(JSON.parse(readFileSync(path, 'utf8')));
  return { spec: () => spec, input: 'min', loads: [Math.min(...spec.loadFractions)] };
}

const PERIODS = 80;
const AVERAGED_PERIODS = 20;
const TRIAL_RATIOS = [0.96, 1, 1.04];

/** ngspice's mean output-inductor current with the output held at `heldV`, A. */
async function deliveredA(
  design: DoubleEndedDesign,
  spec: Spec,
  label: string,
  heldV: number,
): Promise<number> {
  const periodS = 1 / spec.switchingFrequencyHz;
  const deck = holdFirstOutput(
    doubleEndedNetlist(spec, design, {
      cornerLabel: label,
      periodsToSimulate: PERIODS,
      stepsPerPeriod: 2000,
    }),
    heldV,
    (PERIODS - AVERAGED_PERIODS) * periodS,
    PERIODS * periodS,
  )
    // `--snubber-f F`: every rectifier snubber at F (the deck's own choice otherwise).
    .replace(/^(C\S+sn \S+ \S+) \S+$/gm, (line, head: string) =>
      snubberF === undefined ? line : `${head} ${snubberF}`,
    );
  const run = await runNgspice(deck, { expect: ['delivered_a'], timeoutMs: 240_000 });
  return run.measures.delivered_a ?? NaN;
}

async function probe(scenario: Scenario, load: number, duty: number | undefined): Promise<void> {
  const input = inputArg ?? scenario.input;
  const { spec, design, corner, output } = lightLoadCorner(scenario, load, input);
  if (duty !== undefined) corner.dutyCycle = duty;
  const loadOhm = output.voltageV / output.currentA;
  const excessAt = async (v: number) =>
    (await deliveredA(design, spec, corner.label, v)) - v / loadOhm;
  const heldV = TRIAL_RATIOS.map((r) => r * output.voltageV);
  const excessA = await Promise.all(heldV.map(excessAt));
  // Step out by the trials' spacing until the excess changes sign within them (at most 8 more).
  const stepV = (TRIAL_RATIOS[1]! - TRIAL_RATIOS[0]!) * output.voltageV;
  for (let extra = 0; extra < 8; extra++) {
    if (excessA.some((a) => a > 0) && excessA.some((a) => a <= 0)) break;
    const v = excessA[0]! > 0 ? heldV[heldV.length - 1]! + stepV : heldV[0]! - stepV;
    const a = await excessAt(v);
    if (v > heldV[0]!) {
      heldV.push(v);
      excessA.push(a);
    } else {
      heldV.unshift(v);
      excessA.unshift(a);
    }
  }
  // The three trials around the sign change.
  const change = Math.max(
    1,
    excessA.findIndex((a) => a <= 0),
  );
  const from = Math.min(Math.max(0, change - 1), heldV.length - 3);
  const settledV = quadraticRoot(heldV.slice(from, from + 3), excessA.slice(from, from + 3));
  console.log(
    JSON.stringify({
      scenario: name,
      input,
      load,
      corner: corner.label,
      dutyCycle: corner.dutyCycle,
      engineV: output.voltageV,
      heldV,
      excessA,
      ngspiceSettledV: settledV,
      ngspiceAgainstEnginePct: 100 * (settledV / output.voltageV - 1),
      isExtrapolated: !(settledV >= heldV[0]! && settledV <= heldV[heldV.length - 1]!),
    }),
  );
}

const args = process.argv.slice(2);
const dutyAt = args.indexOf('--duty');
const duty = dutyAt >= 0 ? Number(args[dutyAt + 1]) : undefined;
const snubberAt = args.indexOf('--snubber-f');
const snubberF = snubberAt >= 0 ? Number(args[snubberAt + 1]) : undefined;
const inputAt = args.indexOf('--input');
const inputArg = inputAt >= 0 ? (args[inputAt + 1] as Scenario['input']) : undefined;
const flagged = new Set(
  [dutyAt, dutyAt + 1, inputAt, inputAt + 1, snubberAt, snubberAt + 1].filter((_, i) =>
    i < 2 ? dutyAt >= 0 : i < 4 ? inputAt >= 0 : snubberAt >= 0,
  ),
);
const specFileAt = args.indexOf('--spec-file');
if (specFileAt >= 0) for (const i of [specFileAt, specFileAt + 1]) flagged.add(i);
const plain = args.filter((_, i) => !flagged.has(i));
const name =
  specFileAt >= 0
    ? `spec file ${args[specFileAt + 1]}`
    : plain[0] !== undefined && plain[0] in SCENARIOS
      ? plain[0]
      : 'scan-full-bridge';
const scenario = specFileAt >= 0 ? specFileScenario(args[specFileAt + 1]!) : SCENARIOS[name]!;
const loads = plain.filter((a) => !(a in SCENARIOS)).map(Number);
const unread = plain.filter((a) => !(a in SCENARIOS) && !(Number(a) > 0));
if (unread.length > 0) {
  throw new Error(
    `light-load-probe: '${unread.join("', '")}' is neither a scenario (${Object.keys(SCENARIOS).join(', ')}) nor a load fraction above 0`,
  );
}
for (const load of loads.length > 0 ? loads : scenario.loads) await probe(scenario, load, duty);
