/**
 * A light-load check of a double-ended design with several outputs against ngspice, every output
 * held: `npx tsx test/bench/several-outputs-probe.ts --spec-file F [--input min|nominal|max]
 * [--load L] [--step S] [--central] [--rounds R] [--max-move M] [--steps-per-period N]`. F is a
 * spec that `model-fallback-scan.ts --write-specs DIR` wrote (or any spec file of the schema);
 * the corner is its lowest input (or `--input`) at its lightest load
 * (or `--load`). As `light-load-probe.ts` holds the first output, each output's capacitor here
 * becomes a voltage source at the engine's voltage (the loads go, `holdOutputs`), and ngspice's
 * mean inductor current of each over the last 20 of 80 periods is compared with the current its
 * load would draw; a second round moves each output alone by `--step` (0.03 of its voltage)
 * toward where its own excess vanishes, and one Newton step on those differences gives every
 * output's settled voltage (`settledHeldOutputs`). One ngspice run per output after the first,
 * run side by side. `--central` moves each output either side by the step (2·count runs after the
 * first) in place of toward its root; `--rounds R` repeats the Newton step from the last round's
 * outputs (`--max-move M` caps each output's move a round at M of its voltage); with outputs
 * that couple strongly (a diode that starts or stops within the step) the one-sided 0.03 step
 * can land far off (seed 7 spec 48 at 300 V: its 24 V output −37 % after one step, +0.36 % with
 * `--central --step 0.01 --rounds 3 --max-move 0.05`, every excess then under 0.3 % of its
 * load). `--steps-per-period N` sets ngspice's largest step (2000 a period). `--snubber-farads F`
 * puts F in place of the deck's 1 pF rectifier snubber capacitors (the light-load deck's; the
 * engine holds no rectifier capacitance, and referred to the primary, 4·C/n² a center-tapped
 * output, they move a low-ratio full bridge's cross-regulated output by up to 2 %: DEVELOPERS.md,
 * "The rectifiers' capacitance in the deck"). The first run's
 * switch peaks (every output at the engine's) are printed beside the engine's first switch's.
 * Prints one JSON line: the corner, its duty cycle, whether it carries a
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
  heldOutputTrials,
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
    'steps-per-period': { type: 'string', default: '2000' },
    rounds: { type: 'string', default: '1' },
    central: { type: 'boolean', default: false },
    'max-move': { type: 'string', default: '1' },
    'snubber-farads': { type: 'string' },
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

/** ngspice's mean inductor current of every output, each held at `baseV` × (1 + offset), A. */
const peaks: Record<string, number>[] = [];
/** The engine's deck, with `--snubber-farads` in place of its 1 pF rectifier snubber capacitors. */
function probedDeck(): string {
  const deck = doubleEndedNetlist(spec, design, {
    cornerLabel: corner!.label,
    periodsToSimulate: PERIODS,
    stepsPerPeriod: Number(args['steps-per-period']),
  });
  const farads = args['snubber-farads'];
  if (farads === undefined) return deck;
  const snubber = /^(C\w+sn \S+ \S+) 1e-12$/gm;
  // The 1 pF snubbers are the light-load deck's (a shared fall); a continuous corner has 30 pF.
  if (!snubber.test(deck)) throw new Error('several-outputs-probe: no 1 pF snubber in the deck');
  return deck.replace(snubber, `$1 ${Number(farads)}`);
}
async function deliveredA(baseV: readonly number[], offsets: readonly number[]): Promise<number[]> {
  const deck = holdOutputs(
    probedDeck(),
    baseV.map((v, k) => ({ output: k + 1, heldV: v * (1 + (offsets[k] ?? 0)) })),
    (PERIODS - AVERAGED_PERIODS) * periodS,
    PERIODS * periodS,
  );
  const run = await runNgspice(deck, {
    expect: baseV.map((_v, k) => `delivered_${k + 1}_a`),
    timeoutMs: 600_000,
  });
  if (offsets.every((o) => o === 0)) peaks.push(run.measures);
  return baseV.map((_v, k) => run.measures[`delivered_${k + 1}_a`] ?? NaN);
}

// `--rounds R`: each round after the first starts its Newton step from the last round's settled
// outputs (held there, with the loads of the engine's corner as resistances).
let baseV: number[] = [...engineV];
let settled = { settledV: engineV, isBracketed: engineV.map(() => false) };
const rounds: { baseV: number[]; excessAtBaseA: number[]; settledV: number[] }[] = [];
for (let r = 0; r < Number(args.rounds); r++) {
  const base = baseV;
  const first = await deliveredA(
    base,
    base.map(() => 0),
  );
  const excessAtBase = heldOutputExcessA(base, loadOhm, [base.map(() => 0)], [first])[0]!;
  // `--central`: each output moved either side of the base (2·count more runs), not toward its root.
  const trials = args.central
    ? heldOutputTrials(base.length, Number(args.step))
    : [base.map(() => 0), ...towardSettledTrials(excessAtBase, Number(args.step))];
  const delivered = [
    first,
    ...(await Promise.all(trials.slice(1).map((t) => deliveredA(base, t)))),
  ];
  settled = settledHeldOutputs(base, loadOhm, trials, delivered);
  rounds.push({ baseV: base, excessAtBaseA: excessAtBase, settledV: settled.settledV });
  // `--max-move M`: no output moves more than M of its base in a round (a damped Newton step).
  const maxMove = Number(args['max-move']);
  baseV = settled.settledV.map((v, k) =>
    Math.min(Math.max(v, base[k]! * (1 - maxMove)), base[k]! * (1 + maxMove)),
  );
}
console.log(
  JSON.stringify({
    specFile: args['spec-file'],
    corner: corner.label,
    dutyCycle: corner.dutyCycle,
    modelFallback: corner.modelFallback?.slice(0, 60),
    engineV,
    ngspiceSettledV: settled.settledV,
    isBracketed: settled.isBracketed,
    ngspiceAgainstEnginePct: settled.settledV.map((v, k) => 100 * (v / engineV[k]! - 1)),
    stepsPerPeriod: Number(args['steps-per-period']),
    snubberFarads: args['snubber-farads'] === undefined ? 1e-12 : Number(args['snubber-farads']),
    loadA: corner.outputs.map((o) => o.currentA),
    rounds,
    // The run with every output at the engine's: ngspice's switch peaks against the first switch's.
    engineSwitchCurrentPeakA: corner.switches[0]?.currentPeakA,
    ngspiceSwitchCurrentPeakA: peaks[0]?.switch_current_peak_a,
    engineSwitchVoltagePeakV: corner.switches[0]?.voltagePeakV,
    ngspiceSwitchVoltagePeakV: peaks[0]?.switch_voltage_peak_v,
  }),
);
