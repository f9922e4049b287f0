/**
 * The push-pull's leaky light-load half with several outputs against ngspice at one corner:
 * `npx tsx test/bench/push-pull-leaky-several-probe.ts --spec-file F [--input min|nominal|max]
 * [--periods P] [--steps S] [--no-ngspice]`. F is a spec `model-fallback-scan.ts --write-specs`
 * wrote (invented, not any product); the corner is its light load at the input given (nominal
 * unless given). The engine's side: the corner's circuit (`doubleEndedCircuit`), its lumped
 * state (`solveDoubleEnded`, flagged where the drains ring slowly) and the leaky half from it
 * (`pushPullLeakyState`), at a slow-ring corner too (which the engine keeps flagged). The deck: the design's, at
 * the leaky half's duty cycle, every output held by a source at the half's voltage (the first at
 * its target, the others at their charge-balance voltages: so each output's delivered current is
 * compared with its load at the engine's voltages, as `holdOutputs` does for the netlist tests),
 * the clamp held at the engine's level, no resistor across the leakages (as
 * `push-pull-leaky-light-load-netlist.test.ts`), the means over the last 20 of `P` periods (60),
 * `S` steps a period (8000); `--drain-r R` puts each drain capacitance's series resistor at R Ω
 * (the deck's 1 Ω otherwise); `--lumped` runs the deck at the lumped state's duty cycle and
 * voltages instead. Prints one JSON line: the engine's numbers and ngspice's.
 */
import { readFileSync } from 'node:fs';
import { designConverter, doubleEndedNetlist, SpecSchema } from '../../solvers/index.js';
import { operatingCorners } from '../../solvers/design/operating-corners.js';
import {
  doubleEndedCircuit,
  pushPullLeakyState,
  solveDoubleEnded,
} from '../../solvers/topologies/double-ended/double-ended-state.js';
import { primaryBridge } from '../../solvers/topologies/double-ended/primary-bridge.js';
import type { DoubleEndedChoices } from '../../solvers/topologies/double-ended/double-ended-state.js';
import { holdOutputs, holdPushPullClamp } from '../helpers/held-output-deck.js';
import { runNgspice } from '../helpers/ngspice.js';

const args = process.argv.slice(2);
const argOf = (name: string): string | undefined => {
  const at = args.indexOf(name);
  return at >= 0 ? args[at + 1] : undefined;
};
const specFile = argOf('--spec-file');
if (specFile === undefined) throw new Error('push-pull-leaky-several-probe: --spec-file F');
const input = argOf('--input') ?? 'nominal';
const periods = Number(argOf('--periods') ?? 60);
const steps = Number(argOf('--steps') ?? 8000);
const drainRArg = argOf('--drain-r');
const drainR = drainRArg === undefined ? undefined : Number(drainRArg);

const spec = SpecSchema.parse(JSON.parse(readFileSync(specFile, 'utf8')));
const result = designConverter(spec);
if (!result.ok || result.value.topology !== 'push-pull') throw new Error('not a push-pull');
const design = result.value;
const choices = design.choices as DoubleEndedChoices;
const light = Math.min(...spec.loadFractions);
const operating = operatingCorners(spec).find(
  (c) => c.label.startsWith(`${input}-input/`) && c.loadFraction === light,
);
const corner = design.corners.find((c) => c.label === operating?.label);
if (operating === undefined || corner === undefined) throw new Error('no such corner');
const circuit = doubleEndedCircuit(spec, primaryBridge('push-pull'), choices, operating);
const regulatedV = spec.outputs[0]?.voltageV ?? NaN;
const lumped = solveDoubleEnded(circuit, regulatedV);
if (lumped === undefined) throw new Error('no lumped state');
const t0 = performance.now();
const leaky = pushPullLeakyState(circuit, regulatedV, lumped);
const leakyMs = performance.now() - t0;
const engine = {
  corner: corner.label,
  cornerDutyCycle: corner.dutyCycle,
  cornerFallback: corner.modelFallback?.slice(0, 40),
  cornerVoltagesV: corner.outputs.map((o) => o.voltageV),
  cornerSwitch: corner.switches[0],
  lumpedDutyCycle: lumped.dutyCycle,
  lumpedVoltagesV: lumped.points.map((p) => p.voltageV),
  leakyDutyCycle: leaky?.dutyCycle,
  leakyVoltagesV: leaky?.points.map((p) => p.voltageV),
  leakyHalf: leaky?.leakyHalf,
  leakyMs,
  loadsA: circuit.stages.map((s) => s.loadA),
};
if (leaky === undefined || args.includes('--no-ngspice')) {
  console.log(JSON.stringify({ engine }));
  process.exit(0);
}
const clampV = choices.clampVoltageV ?? NaN;
// `--lumped`: the deck at the lumped state's duty cycle and voltages instead (the flagged model's
// own check).
const held = args.includes('--lumped') ? lumped : leaky;
corner.dutyCycle = held.dutyCycle;
const periodS = 1 / spec.switchingFrequencyHz;
const fromS = (periods - 20) * periodS;
const toS = periods * periodS;
// `--drain-r R`: each drain capacitance's series resistor at R ohms (the deck's 1 Ω otherwise).
const deck = holdPushPullClamp(
  holdOutputs(
    doubleEndedNetlist(spec, design, {
      cornerLabel: corner.label,
      periodsToSimulate: periods,
      stepsPerPeriod: steps,
    }),
    held.points.map((p, k) => ({ output: k + 1, heldV: p.voltageV })),
    fromS,
    toS,
  ),
  clampV,
  { ...(drainR === undefined ? {} : { drainOhm: drainR }), clampMeanS: { fromS, toS } },
);
const names = held.points.map((_p, k) => `delivered_${k + 1}_a`);
const run = await runNgspice(deck, { timeoutMs: 1_800_000, expect: [...names, 'clamp_a'] });
const m = run.measures;
const pct = (a: number, b: number): number => 100 * (a / b - 1);
console.log(
  JSON.stringify({
    engine,
    deckAt: args.includes('--lumped') ? 'lumped' : 'leaky',
    drainR: drainR ?? 1,
    ngspice: {
      deliveredA: names.map((n) => m[n]),
      deliveredAgainstLoadPct: names.map((n, k) => pct(m[n] ?? NaN, engine.loadsA[k] ?? NaN)),
      clampW: (m.clamp_a ?? NaN) * clampV,
      switchCurrentPeakA: m.switch_current_peak_a,
      switchVoltagePeakV: m.switch_voltage_peak_v,
      engineSwitchPeakAgainstNgspicePct: pct(
        leaky.leakyHalf?.switchPeakA ?? NaN,
        m.switch_current_peak_a ?? NaN,
      ),
      engineDrainPeakAgainstNgspicePct: pct(
        leaky.leakyHalf?.drainPeakV ?? NaN,
        m.switch_voltage_peak_v ?? NaN,
      ),
    },
  }),
);
