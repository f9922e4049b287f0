import { beforeAll, describe, expect, it } from 'vitest';
import { designConverter, doubleEndedNetlist, SpecSchema } from '../../../solvers/index.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import { holdOutputs, holdPushPullClamp } from '../../helpers/held-output-deck.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';

/*
 * The push-pull's leaky light-load half with two outputs (`push-pull-leaky-half.ts`,
 * `PushPullLeakyCircuit.others`; DEVELOPERS.md, "The push-pull's leaky light-load half",
 * several outputs) against ngspice. An invented spec (not any product): the one
 * `model-fallback-scan.ts --seed 11 --count 150` draws as its spec 126, a 200–400 V push-pull at
 * 268.8 kHz with 12 V 4.78 A and 5 V 2.40 A outputs, 100 pF switches, the default leakage, its
 * transformer designed, at 400 V and 7.6 % load. There the lumped light-load solve does not
 * converge; before, the older model answered (D = 0.1126, the 12 V output at 12.36 V, the 5 V
 * one at 2.11 V, flagged); now the leaky half (D = 0.0804, the 5 V output at 3.27 V by its
 * charge balance).
 *
 * The deck as the one-output check (`push-pull-leaky-light-load-netlist.test.ts`): the clamp held
 * by a source at the engine's level, no resistor across the leakages, 8000 steps a period, means
 * over periods 40–60; every output held by a source at the engine's voltage (so each output's
 * delivered current is compared with its load at the engine's voltages); and each drain
 * capacitance's series resistor at 0.01 Ω instead of the deck's 1 Ω, as the engine's half has
 * none (it damps the drains' rings with the leakage, Z = √(2·Llk/C) some hundreds of ohms,
 * ring currents of amps). Found (2026-12-05, one run each): with 0.01 Ω delivered 0.36467 and
 * 0.17892 A against the loads 0.36368 and 0.18244 (+0.27 %, −1.93 %), switch peaks 1.0836 A and
 * 1000.34 V against the engine's 1.1016 A (+1.7 %) and 1000 V, clamp 0.710 W against the
 * engine's 0.852 W; with the deck's 1 Ω +3.3 % and +7.5 %, 1.138 A, clamp 1.090 W.
 */

const SPEC = SpecSchema.parse({
  topology: 'push-pull',
  inputVoltageMinV: 200,
  inputVoltageNominalV: 300,
  inputVoltageMaxV: 400,
  outputs: [
    {
      voltageV: 12,
      currentA: 4.778950870037079,
      rectifier: { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01, voltageRatingV: 200 },
      windingResistanceOhm: 0.005,
      capacitanceF: 0.0001,
      capacitorEsrOhm: 0.02,
    },
    {
      voltageV: 5,
      currentA: 2.397321581840515,
      rectifier: { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01, voltageRatingV: 200 },
      windingResistanceOhm: 0.005,
      capacitanceF: 0.0001,
      capacitorEsrOhm: 0.02,
    },
  ],
  loadFractions: [0.0761, 1],
  switchingFrequencyHz: 268781.5451622009,
  primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 1200, outputCapacitanceF: 1e-10 },
  transformer: { leakageInductanceFraction: 0.01, primaryResistanceOhm: 0.05 },
  magnetics: { mode: 'design' },
});
const PERIODS = 60;
const AVERAGED_PERIODS = 20;

const result = designConverter(SPEC);
if (!result.ok || result.value.topology !== 'push-pull') {
  throw new Error('invented scenario infeasible or not a push-pull');
}
const design = result.value;
const corner = design.corners.find((k) => k.label.startsWith('max-input/') && k.loadFraction < 1);
if (corner === undefined) throw new Error('no max-input light-load corner');
const clampV = design.choices.clampVoltageV ?? NaN;

/** The corner's deck: outputs and clamp held at the engine's, undamped, drains' R at 0.01 Ω. */
function deck(): string {
  const periodS = 1 / SPEC.switchingFrequencyHz;
  const fromS = (PERIODS - AVERAGED_PERIODS) * periodS;
  const toS = PERIODS * periodS;
  return holdPushPullClamp(
    holdOutputs(
      doubleEndedNetlist(SPEC, design, {
        cornerLabel: corner?.label ?? '',
        periodsToSimulate: PERIODS,
        stepsPerPeriod: 8000,
      }),
      (corner?.outputs ?? []).map((o, k) => ({ output: k + 1, heldV: o.voltageV })),
      fromS,
      toS,
    ),
    clampV,
    { drainOhm: 0.01 },
  );
}

let run: Promise<NgspiceRun>;

beforeAll(() => {
  run = runNgspice(deck(), { timeoutMs: 600_000, expect: ['delivered_1_a', 'delivered_2_a'] });
  run.catch(() => undefined);
});

describe('the push-pull with leakage and two outputs at light load against ngspice', () => {
  it('400 V, 7.6 % load: each output delivers its load, and the switch peaks', async () => {
    // The engine's own claims: the leaky half took the corner (no fallback), the 5 V output
    // cross-regulated well below its target.
    expect(corner.modelFallback).toBeUndefined();
    expect(corner.dutyCycle).toBeLessThan(0.1);
    expect(corner.outputs[1]?.voltageV).toBeLessThan(4);
    const measures = (await run).measures;
    // ref: ngspice (Debian package), the design's deck with its outputs and clamp held: each
    // output's delivered current within 2 % of its load at the engine's voltages (the issue's
    // target; found +0.27 % and −1.93 %)
    expectClose(measures.delivered_1_a ?? NaN, corner.outputs[0]?.currentA ?? NaN, { rel: 0.02 });
    expectClose(measures.delivered_2_a ?? NaN, corner.outputs[1]?.currentA ?? NaN, { rel: 0.02 });
    // ref: ngspice (Debian package), the same run: the switch peaks within 5 % (the issue's
    // target; found engine +1.7 % and −0.03 %)
    expectSwitchPeaksClose(measures, corner.switches[0]);
  }, 700_000);
});
