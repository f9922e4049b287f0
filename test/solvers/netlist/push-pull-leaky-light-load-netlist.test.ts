import { beforeAll, describe, expect, it } from 'vitest';
import { designConverter, doubleEndedNetlist, SpecSchema } from '../../../solvers/index.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import { holdFirstOutput, settledHeldOutputs } from '../../helpers/held-output-deck.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';

/*
 * The push-pull's light-load half with each drain behind its leakage (`push-pull-leaky-half.ts`;
 * DEVELOPERS.md, "The push-pull's leaky light-load half") against ngspice. An invented 200–400 V
 * push-pull (not any product; the lead's scan seed 23, spec 0, as `scan-push-pull-400` of
 * `test/bench/light-load-scenarios.ts`): 10 µH of leakage a half, 100 pF switches, 12 V at
 * 4.28 A, 188.6 kHz, at 400 V and 6.1 % load. Before, the lumped event solve did not converge
 * there and the older model answered (D = 0.145, flagged), where ngspice's held output settled
 * at 16.22 V (+35 %).
 *
 * The deck as the lead set it for this check: the clamp held by a source at the engine's clamp
 * level (600 V above the rail; the deck's RC clamp would float to where its resistor takes what
 * the circuit puts in, a second unknown), no resistor across the leakages (a real leakage has
 * none; the undamped deck converges, and 1000·√(Llk/C) across each moved the delivered current
 * by 0.2 % and the clamp's power by 0.7 %), 8000 steps a period (at 2000 the clamp's power read
 * 12 % low, at 16 000 within 0.2 % of 8000's), the output held by a source at the engine's 12 V
 * and 2 % above it, the mean inductor current and clamp current over periods 40–60 (the same to
 * 3e-6 over periods 80–120 and 200–240). Found (2026-12-04): delivered 0.26504 A against the
 * load's 0.26085 (+1.6 %), at 12.24 V 0.25810 against 0.26607, settled output 12.083 V
 * (+0.69 %); clamp 3.523 W against the engine's 3.604 W (engine +2.3 %); switch current peak
 * (the deck's window from three gate edges into the on-time) 0.7092 against 0.7125 A (−0.5 %;
 * 0.850 A, +20 %, while the engine drew the turn-on ring's current from its lumped ring), switch
 * voltage 1000.35 against 1000 V (the clamp), magnetizing peak 0.02427 against 0.02421 A.
 */

const rectifier = { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01, voltageRatingV: 100 };
const SPEC = SpecSchema.parse({
  topology: 'push-pull',
  inputVoltageMinV: 200,
  inputVoltageNominalV: 300,
  inputVoltageMaxV: 400,
  outputs: [{ voltageV: 12, currentA: 4.276219069957733, capacitanceF: 100e-6, rectifier }],
  switchingFrequencyHz: 188603.81841659546,
  primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 1200 },
  loadFractions: [0.061, 1],
  magnetics: { mode: 'assume' },
  transformer: { leakageInductanceH: 10e-6 },
});
const CORNER = 'max-input/6.1pct-load';
const PERIODS = 60;
const AVERAGED_PERIODS = 20;
const STEP = 0.02;

const result = designConverter(SPEC);
if (!result.ok || result.value.topology !== 'push-pull') {
  throw new Error('invented scenario infeasible or not a push-pull');
}
const design = result.value;
const corner = design.corners.find((k) => k.label === CORNER);
if (corner === undefined) throw new Error(`no corner ${CORNER}`);
const clampV = design.choices.clampVoltageV ?? NaN;

/** The corner's deck, output held at `heldV`, clamp held at the engine's level, undamped. */
function deck(heldV: number): string {
  const periodS = 1 / SPEC.switchingFrequencyHz;
  const fromS = (PERIODS - AVERAGED_PERIODS) * periodS;
  const toS = PERIODS * periodS;
  return holdFirstOutput(
    doubleEndedNetlist(SPEC, design, {
      cornerLabel: CORNER,
      periodsToSimulate: PERIODS,
      stepsPerPeriod: 8000,
    }),
    heldV,
    fromS,
    toS,
  )
    .replace(/^Rlk\S+ .*$/gm, '')
    .replace(
      /^Cclamp (\S+) (\S+) .*$/m,
      (_l, a: string, b: string) => `Vclampheld ${a} ${b} DC ${clampV}`,
    )
    .replace(/^Rclamp .*$/m, '')
    .replace(/^Vclamp held .*$/m, '')
    .replace(/^\.tran /m, `.meas tran clamp_a AVG i(Vclampheld) from=${fromS} to=${toS}\n.tran `);
}

let runs: Promise<NgspiceRun[]>;

beforeAll(() => {
  const engineV = corner.outputs[0]?.voltageV ?? NaN;
  runs = Promise.all(
    [0, STEP].map((offset) =>
      runNgspice(deck(engineV * (1 + offset)), {
        timeoutMs: 240_000,
        expect: ['delivered_a', 'clamp_a'],
      }),
    ),
  );
  runs.catch(() => undefined);
});

describe('the push-pull with leakage at light load against ngspice', () => {
  it('400 V, 10 µH, 6.1 % load: settled output and clamp power', async () => {
    // The engine's own claims: the leaky half took the corner (no fallback), at a duty cycle
    // well below the older model's 0.145.
    expect(corner.modelFallback).toBeUndefined();
    expect(corner.dutyCycle).toBeLessThan(0.1);
    const output = corner.outputs[0];
    if (output === undefined) throw new Error('no output');
    const [atEngine, above] = await runs;
    const deliveredA = [
      [atEngine?.measures.delivered_a ?? NaN],
      [above?.measures.delivered_a ?? NaN],
    ];
    const loadOhm = output.voltageV / output.currentA;
    // ref: ngspice (Debian package), the design's deck simulated as a switched circuit with its
    // output and its clamp held: the current delivered at the engine's output within 2 % of the
    // load, the settled output within 2 % of the engine's (the target)
    expectClose(deliveredA[0]?.[0] ?? NaN, output.currentA, { rel: 0.02 });
    const settled = settledHeldOutputs([output.voltageV], [loadOhm], [[0], [STEP]], deliveredA);
    expectClose(settled.settledV[0] ?? NaN, output.voltageV, { rel: 0.02 });
    // ref: ngspice (Debian package), the power the held clamp takes at the engine's output
    // against the engine's clamp loss, within 5 % (found 2.3 %)
    const clampW = (atEngine?.measures.clamp_a ?? NaN) * clampV;
    const engineClampW = corner.losses.find((l) => l.component === 'leakage-clamp')?.powerW;
    expectClose(clampW, engineClampW ?? NaN, { rel: 0.05 });
    // ref: ngspice (Debian package), the same run: the switch peaks within 5 % (the issue's
    // target)
    expectSwitchPeaksClose(atEngine?.measures ?? {}, corner.switches[0]);
  }, 300_000);
});
