/**
 * A random scan of the engine against ngspice: `npx tsx test/bench/ngspice-scan.ts [options]`.
 * It draws invented specs (not any product: a 12 V output of 4–10 A, half the time a second
 * output of 5 V 1–3 A, diode rectifiers of 0.5 V and 10 mΩ, switches of 30 mΩ rated three times
 * the highest input, 100–300 kHz, leakage 0, 0.2 or 1 µH (ten times that at 200–400 V), loads
 * `light` and 100 %), designs each with the transformer assumed, runs the design's own netlist
 * (`designNetlist`) in ngspice at the lowest and the highest input, and prints, per corner,
 * ngspice's settled output against the engine's for every output (percent; the netlist tests'
 * three windows and `settledAverage`; the engine's voltage beside each) and the first switch's
 * current and voltage peaks (the engine's beside them), the start of the corner's `modelFallback`
 * where it has one (a flagged corner), and for a run whose windows did not settle the last
 * window against the engine; then the count of runs, of ngspice failures and the largest
 * differences. It asserts nothing; it is how the turn-off swing of the forwards and of the
 * push-pull and bridges was found (2026-12-03: 400 V designs 2–13 % off; DEVELOPERS.md), and the
 * audit of 2026-12-05 (seeds 31, 37, 41; DEVELOPERS.md, "The ngspice check").
 * Below some 10 % load the windows may not have settled; `light-load-probe.ts` holds the output
 * instead for the double-ended family.
 *
 *   --topologies a,b,…   topology ids, taken in turn (default: the three forwards)
 *   --count N            specs (10)
 *   --seed S             the random stream's seed (1)
 *   --input low|telecom|high|any   18–36 V, 36–72 V, 200–400 V, or any of them (any)
 *   --light-min F --light-span F   the light load drawn from [F, F + span) (0.03, 0.2)
 *   --only i,j,…         design and simulate only these of the drawn specs (all are printed)
 *   --ring-steps N       push-pull and bridge decks: N steps a period of the leakage's ring
 *                        (`leakageRingStepsMin`; 0 leaves it to the step; unset, the decks'
 *                        default: 32 on the push-pull, 0 on the bridges)
 *   --write-specs D      writes each spec it would simulate to D/ngspice-scan-<seed>-<i>.json
 *                        (for `light-load-probe.ts --spec-file` and the other probes) and
 *                        simulates none
 *
 * Each ngspice run takes 5–40 s; at most one runs per core (test/helpers/ngspice.ts).
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { designConverter, designNetlist, SpecSchema, TOPOLOGY_IDS } from '../../solvers/index.js';
import { runNgspice } from '../helpers/ngspice.js';
import { settledOutputV } from '../helpers/settled-average.js';
import { scanStream } from './scan-stream.js';

const { values: args } = parseArgs({
  options: {
    topologies: {
      type: 'string',
      default: 'two-switch-forward,forward-reset-winding,active-clamp-forward',
    },
    count: { type: 'string', default: '10' },
    seed: { type: 'string', default: '1' },
    input: { type: 'string', default: 'any' },
    'light-min': { type: 'string', default: '0.03' },
    'light-span': { type: 'string', default: '0.2' },
    only: { type: 'string' },
    'ring-steps': { type: 'string' },
    'write-specs': { type: 'string' },
  },
});

const topologies = (args.topologies ?? '').split(',');
for (const id of topologies) {
  if (!(TOPOLOGY_IDS as readonly string[]).includes(id)) {
    throw new Error(`ngspice-scan: unknown topology '${id}' (one of ${TOPOLOGY_IDS.join(', ')})`);
  }
}
const INPUTS: Record<string, number[][]> = {
  low: [[18, 24, 36]],
  telecom: [[36, 48, 72]],
  high: [[200, 300, 400]],
  any: [
    [36, 48, 72],
    [18, 24, 36],
    [200, 300, 400],
  ],
};
const inputs = INPUTS[args.input ?? 'any'];
if (inputs === undefined) throw new Error(`ngspice-scan: --input is low, telecom, high or any`);
const only = args.only?.split(',').map(Number);

// The same seed draws the same specs on any machine.
const { random, pick } = scanStream(Number(args.seed));

const rectifier = { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01, voltageRatingV: 100 };
let runs = 0;
let failures = 0;
let worst = 0;
let worstPeak = 0;
for (let i = 0; i < Number(args.count); i++) {
  const topology = topologies[i % topologies.length] as string;
  const vin = pick(inputs) as [number, number, number];
  const hasSecond = random() < 0.5;
  const light = Number(args['light-min']) + random() * Number(args['light-span']);
  const spec = SpecSchema.parse({
    topology,
    inputVoltageMinV: vin[0],
    inputVoltageNominalV: vin[1],
    inputVoltageMaxV: vin[2],
    outputs: [
      { voltageV: 12, currentA: 4 + random() * 6, capacitanceF: 100e-6, rectifier },
      ...(hasSecond
        ? [{ voltageV: 5, currentA: 1 + random() * 2, capacitanceF: 100e-6, rectifier }]
        : []),
    ],
    switchingFrequencyHz: 100e3 + random() * 200e3,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: vin[2] * 3 },
    loadFractions: [Number(light.toFixed(3)), 1],
    magnetics: { mode: 'assume' },
    transformer: { leakageInductanceH: pick([0, 0.2e-6, 1e-6]) * (vin[0] > 100 ? 10 : 1) },
  });
  console.log(
    `${i} ${topology}: ${vin.join('/')} V, ${(spec.switchingFrequencyHz / 1e3).toFixed(1)} kHz, ` +
      `leakage ${spec.transformer.leakageInductanceH} H, loads ${light.toFixed(3)} and 1, ` +
      `${spec.outputs.length} output(s)`,
  );
  if (only !== undefined && !only.includes(i)) continue;
  const writeDir = args['write-specs'];
  if (writeDir !== undefined) {
    mkdirSync(writeDir, { recursive: true });
    writeFileSync(`${writeDir}/ngspice-scan-${args.seed}-${i}.json`, JSON.stringify(spec, null, 2));
    continue;
  }
  const result = designConverter(spec);
  if (!result.ok) {
    console.log(`${i} infeasible: ${result.issues.map((issue) => issue.code).join(', ')}`);
    continue;
  }
  for (const corner of result.value.corners) {
    if (!/^(min|max)-input\//.test(corner.label)) continue;
    const netlist = designNetlist(spec, result.value, {
      cornerLabel: corner.label,
      ...(args['ring-steps'] === undefined
        ? {}
        : { leakageRingStepsMin: Number(args['ring-steps']) }),
    });
    runs += 1;
    let measures: Record<string, number> | undefined;
    try {
      const m = (await runNgspice(netlist, { timeoutMs: 300_000 })).measures;
      measures = m;
      const differences = corner.outputs.map((output, k) => {
        const simulatedV = settledOutputV(m, k + 1);
        return simulatedV / output.voltageV - 1;
      });
      worst = Math.max(worst, ...differences.map(Math.abs));
      const text = differences
        .map((d, k) => `${(100 * d).toFixed(2)} % (${corner.outputs[k]?.voltageV.toFixed(3)} V)`)
        .join(', ');
      // The first switch's peaks at the deck's (unheld) outputs, where the deck measures them.
      const switch0 = 'switches' in corner ? corner.switches[0] : undefined;
      const peakI = (m.switch_current_peak_a ?? NaN) / (switch0?.currentPeakA ?? NaN) - 1;
      const peakV = (m.switch_voltage_peak_v ?? NaN) / (switch0?.voltagePeakV ?? NaN) - 1;
      worstPeak = Math.max(worstPeak, ...[peakI, peakV].filter(Number.isFinite).map(Math.abs));
      const peaks = Number.isFinite(peakI + peakV)
        ? `; switch peaks ${(100 * peakI).toFixed(2)} % (current, engine ` +
          `${switch0?.currentPeakA.toFixed(2)} A), ${(100 * peakV).toFixed(2)} % (voltage, engine ` +
          `${switch0?.voltagePeakV.toFixed(1)} V)`
        : '';
      const flag =
        corner.modelFallback === undefined
          ? ''
          : `; flagged: ${corner.modelFallback.slice(0, 60)}…`;
      console.log(`${i} ${corner.label}: ngspice against the engine ${text}${peaks}${flag}`);
    } catch (error) {
      failures += 1;
      const reason = /Timestep too small[^\n]*|ran past[^\n]*|neither settle[^\n]*/.exec(
        String(error),
      )?.[0];
      // Where ngspice ran but the windows did not settle, the last window against the engine.
      const last = corner.outputs.map((output, k) => {
        const lastV = measures?.[`output_${k + 1}_voltage_v`] ?? NaN;
        return `${(100 * (lastV / output.voltageV - 1)).toFixed(2)} %`;
      });
      const lastText = measures === undefined ? '' : `; last window ${last.join(', ')}`;
      console.log(`${i} ${corner.label}: failed (${reason ?? 'see ngspice output'})${lastText}`);
    }
  }
}
console.log(
  `${runs} runs, ${failures} failed, largest difference ${(100 * worst).toFixed(2)} % of the output, ` +
    `${(100 * worstPeak).toFixed(2)} % of a switch peak`,
);
