/**
 * The push-pull's leaky light-load half (`push-pull-leaky-half.ts`) at the reference's circuit:
 * `npx tsx test/bench/push-pull-leaky-half-check.ts [scenario] [--duty D ...] [--vo V]
 * [--clamp-v V] [--regulate] [--solve] [--input min|nominal|max]`, the scenarios of
 * `light-load-probe.ts` (default `scan-push-pull-400`; its first load at its input corner, or
 * `--input`'s). Prints one JSON line per duty cycle:
 * the periodic half's mean inductor current at the held output (no primary resistance, drops at
 * the current, as `push-pull-leakage-reference.ts`, whose numbers it is to be read against), its
 * clamp power and Newton steps; `--regulate`: the duty cycle that delivers the load instead, by
 * Newton's method from each `--duty`; `--solve`: the regulated search the engine runs
 * (`solvePushPullLeakyRegulated`, from the engine's duty cycle).
 */
import {
  solvePushPullLeakyHalf,
  solvePushPullLeakyRegulated,
} from '../../solvers/topologies/double-ended/push-pull-leaky-half.js';
import {
  LIGHT_LOAD_SCENARIOS as SCENARIOS,
  flagNumbers,
  lightLoadCorner,
  type LightLoadScenario as Scenario,
} from './light-load-scenarios.js';

const args = process.argv.slice(2);
const valuesOf = (flag: string): number[] => flagNumbers(args, flag);
const valuesOfText = (flag: string): string | undefined => {
  const at = args.indexOf(flag);
  return at < 0 ? undefined : args[at + 1];
};
const name = args[0] !== undefined && args[0] in SCENARIOS ? args[0] : 'scan-push-pull-400';
const scenario = SCENARIOS[name] as Scenario;
const load = scenario.loads[0] as number;
const { spec, design, corner, output, inputV } = lightLoadCorner(
  scenario,
  load,
  (valuesOfText('--input') as Scenario['input'] | undefined) ?? scenario.input,
);
if (design.topology !== 'push-pull') throw new Error(`${name} is not a push-pull`);
const choices = design.choices;
const rectifier = spec.outputs[0]?.rectifier;
if (rectifier?.kind !== 'diode') throw new Error(`${name}: diode rectifiers only`);
const heldV = valuesOf('--vo')[0] ?? output.voltageV;
const clampV = valuesOf('--clamp-v')[0] ?? choices.clampVoltageV ?? Infinity;
const windingOhm = choices.outputWindingResistancesOhm[0] ?? 0;
const inductorOhm = choices.outputInductorResistancesOhm[0] ?? 0;
const loadA = (heldV / output.voltageV) * output.currentA;
const circuit = {
  inputV,
  leakageH: choices.leakageInductanceH,
  halfResistanceOhm: 0,
  capacitanceF: spec.primarySwitch.outputCapacitanceF,
  magnetizingH: choices.magnetizingInductanceH,
  turnsRatio: choices.turnsRatio,
  inductanceH: choices.outputInductancesH[0] as number,
  halfS: 1 / spec.switchingFrequencyHz / 2,
  clampV,
  pathV: heldV + rectifier.forwardVoltageV,
  pathOhm: rectifier.resistanceOhm + windingOhm + inductorOhm,
  freewheelV: heldV + rectifier.forwardVoltageV,
  freewheelOhm: (rectifier.resistanceOhm + windingOhm) / 2 + inductorOhm,
};
const duties = valuesOf('--duty');
let last: number[] | undefined;
for (const duty of duties.length > 0
  ? duties
  : args.includes('--solve')
    ? []
    : [corner.dutyCycle]) {
  const started = performance.now();
  const half = solvePushPullLeakyHalf(
    circuit,
    { dutyCycle: duty, ...(last === undefined ? {} : { start: last }) },
    args.includes('--regulate') ? loadA : undefined,
  );
  last = undefined;
  console.log(
    JSON.stringify({
      scenario: name,
      corner: corner.label,
      dutyCycle: half?.dutyCycle ?? duty,
      heldV,
      clampV: inputV + clampV,
      meanInductorA: half?.meanInductorA ?? 'not converged',
      loadA,
      clampW: half?.clampW,
      steps: half?.steps,
      start: half?.start,
      ms: Math.round(performance.now() - started),
    }),
  );
}
if (args.includes('--solve')) {
  const started = performance.now();
  const half = solvePushPullLeakyRegulated(circuit, loadA, corner.dutyCycle);
  console.log(
    JSON.stringify({
      regulated: true,
      dutyCycle: half?.dutyCycle,
      meanInductorA: half?.meanInductorA,
      loadA,
      clampW: half?.clampW,
      isSettling: half?.isSettling,
      switchPeakA: half?.switchPeakA,
      magnetizingPeakA: half?.magnetizingPeakA,
      ms: Math.round(performance.now() - started),
    }),
  );
}
