/**
 * A light-load check of a double-ended design with several outputs against ngspice, every output
 * held: `npx tsx test/bench/several-outputs-probe.ts --spec-file F [--input min|nominal|max]
 * [--load L] [--step S]`. F is a spec that `model-fallback-scan.ts --write-specs DIR` wrote (or
 * any spec file of the schema); the corner is its lowest input (or `--input`) at its lightest load
 * (or `--load`). As `light-load-probe.ts` holds the first output, each output's capacitor here
 * becomes a voltage source at the engine's voltage (the loads go, `holdOutputs`), and ngspice's
 * mean inductor current of each over the last 20 of 80 periods is compared with the current its
 * load would draw; a second round moves each output alone by `--step` (0.03 of its voltage)
 * toward where its own excess vanishes, and one Newton step on those differences gives every
 * output's settled voltage (`settledHeldOutputs`). One ngspice run per output after the first,
 * run side by side. Prints one JSON line: the corner, its duty cycle, whether it carries a
 * modelFallback, the engine's outputs and ngspice's settled ones against them (percent). It
 * asserts nothing; for checking a corner the event model takes or falls back on (DEVELOPERS.md,
 * "Light load with several outputs: the event model").
 */
import { readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import {
  designConverter,
  doubleEndedNetlist,
  SpecSchema,
  type DoubleEndedDesign,
} from '../../solvers/index.js';
import {
  heldOutputExcessA,
  holdOutputs,
  settledHeldOutputs,
  towardSettledTrials,
} from '../helpers/held-output-deck.js';
import { runNgspice } from '../helpers/ngspice.js';

const { values: args } = parseArgs({
  options: {
    'spec-file': { type: 'string' },
    input: { type: 'string', default: 'min' },
    load: { type: 'string' },
    step: { type: 'string', default: '0.03' },
  },
});
if (args['spec-file'] === undefined) throw new Error('several-outputs-probe: --spec-file F');
const spec = SpecSchema.parse(JSON.parse(readFileSync(args['spec-file'], 'utf8')));
const result = designConverter(spec);
if (!result.ok) throw new Error('several-outputs-probe: the spec is infeasible');
const design = result.value as DoubleEndedDesign;
const inputV =
  args.input === 'max'
    ? spec.inputVoltageMaxV
    : args.input === 'nominal'
      ? spec.inputVoltageNominalV
      : spec.inputVoltageMinV;
const load = args.load === undefined ? Math.min(...spec.loadFractions) : Number(args.load);
const corner = design.corners.find(
  (k) => k.inputVoltageV === inputV && Math.abs(k.loadFraction - load) < 1e-12,
);
if (corner === undefined)
  throw new Error(`several-outputs-probe: no corner at ${inputV} V, ${load}`);

const PERIODS = 80;
const AVERAGED_PERIODS = 20;
const periodS = 1 / spec.switchingFrequencyHz;
const engineV = corner.outputs.map((o) => o.voltageV);
const loadOhm = corner.outputs.map((o) => o.voltageV / o.currentA);

/** ngspice's mean inductor current of every output, each held at the engine's × (1 + offset), A. */
async function deliveredA(offsets: readonly number[]): Promise<number[]> {
  const deck = holdOutputs(
    doubleEndedNetlist(spec, design, {
      cornerLabel: corner!.label,
      periodsToSimulate: PERIODS,
      stepsPerPeriod: 2000,
    }),
    engineV.map((v, k) => ({ output: k + 1, heldV: v * (1 + (offsets[k] ?? 0)) })),
    (PERIODS - AVERAGED_PERIODS) * periodS,
    PERIODS * periodS,
  );
  const run = await runNgspice(deck, {
    expect: engineV.map((_v, k) => `delivered_${k + 1}_a`),
    timeoutMs: 600_000,
  });
  return engineV.map((_v, k) => run.measures[`delivered_${k + 1}_a`] ?? NaN);
}

const first = await deliveredA(engineV.map(() => 0));
const excessAtEngine = heldOutputExcessA(engineV, loadOhm, [engineV.map(() => 0)], [first])[0]!;
const trials = [engineV.map(() => 0), ...towardSettledTrials(excessAtEngine, Number(args.step))];
const delivered = [first, ...(await Promise.all(trials.slice(1).map(deliveredA)))];
const settled = settledHeldOutputs(engineV, loadOhm, trials, delivered);
console.log(
  JSON.stringify({
    specFile: args['spec-file'],
    corner: corner.label,
    dutyCycle: corner.dutyCycle,
    modelFallback: corner.modelFallback?.slice(0, 60),
    engineV,
    ngspiceSettledV: settled.settledV,
    ngspiceAgainstEnginePct: settled.settledV.map((v, k) => 100 * (v / engineV[k]! - 1)),
  }),
);
