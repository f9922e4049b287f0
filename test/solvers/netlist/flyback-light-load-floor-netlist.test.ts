import { beforeAll, describe, expect, it } from 'vitest';
import {
  designConverter,
  flybackNetlist,
  type Corner,
  type FlybackDesign,
  type Spec,
} from '../../../solvers/index.js';
import { expectClose } from '../../helpers/expect-close.js';
import { telecomSpec } from '../../helpers/flyback-specs.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { quadraticRoot } from '../../helpers/quadratic-root.js';

// A flyback corner below the least power a pulse delivers (DEVELOPERS.md, flyback known gaps,
// "Light load below the least power a pulse delivers"): the engine solves it at the 100 ns
// floor for the output it reaches. Invented scenario (not any product): 300–400 V in, 5 V 3 A,
// 100 kHz, n = 40, Lm 2 mH, 5 µH leakage, 100 pF of switch capacitance, at 3 % load. At 400 V
// the drain capacitance alone hands the output about ½·C·(Vin² − V0²)·f ≈ 0.5 W a period
// against the 0.45 W drawn, so the output rises to some 5.6 V. The output (100 µF against
// some 60 Ω) settles over thousands of periods, so ngspice runs with it held by a source at
// trial voltages (as forward-high-input-light-load-netlist.test.ts does for the forwards): the
// settled output is where the mean current into the source meets the load that voltage draws.

const PERIODS = 200;
const AVERAGED_PERIODS = 40;
const TRIAL_RATIOS = [0.98, 1, 1.02];
const CORNER = 'max-input/3pct-load';

const spec: Spec = telecomSpec({
  inputVoltageMinV: 300,
  inputVoltageNominalV: 350,
  inputVoltageMaxV: 400,
  outputs: [
    {
      voltageV: 5,
      currentA: 3,
      rectifier: { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01 },
    },
  ],
  switchingFrequencyHz: 100e3,
  primarySwitch: { onResistanceOhm: 0.5, voltageRatingV: 1200, outputCapacitanceF: 100e-12 },
  transformer: { turnsRatio: 40, magnetizingInductanceH: 2e-3, leakageInductanceH: 5e-6 },
  loadFractions: [0.03, 1],
});

interface Trial {
  heldV: number;
  run: Promise<NgspiceRun>;
}

let design: FlybackDesign;
let corner: Corner;
let trials: Trial[] = [];

/** The deck at the corner with output 1 held at `heldV` (its capacitor a source, no load). */
function heldDeck(heldV: number): string {
  const periodS = 1 / spec.switchingFrequencyHz;
  const deck = flybackNetlist(spec, design, {
    cornerLabel: CORNER,
    periodsToSimulate: PERIODS,
    periodsToAverage: AVERAGED_PERIODS,
  });
  const held = deck
    .replace(
      /^Cout1 (\S+) (\S+) .*$/m,
      (_line, a: string, b: string) => `Vheld ${a} ${b} DC ${heldV}`,
    )
    .replace(/^Rload1 .*$/m, '');
  if (held === deck || !/^Vheld /m.test(held)) throw new Error('the deck has no Cout1 to hold');
  return held.replace(
    /^\.tran /m,
    `.meas tran delivered_a AVG i(Vheld) from=${(PERIODS - AVERAGED_PERIODS) * periodS} to=${PERIODS * periodS}\n.tran `,
  );
}

beforeAll(async () => {
  const result = designConverter(spec);
  if (!result.ok) throw new Error(`invented scenario infeasible: ${JSON.stringify(result.issues)}`);
  if (result.value.topology !== 'flyback') throw new Error('not a flyback design');
  design = result.value;
  const found = design.corners.find((c) => c.label === CORNER);
  if (found === undefined) throw new Error(`no corner ${CORNER}`);
  corner = found;
  const outputV = corner.outputs[0]?.voltageV ?? NaN;
  trials = TRIAL_RATIOS.map((ratio) => ({
    heldV: ratio * outputV,
    run: runNgspice(heldDeck(ratio * outputV), {
      timeoutMs: 240_000,
      expect: ['delivered_a', 'switch_voltage_peak_v'],
    }),
  }));
  await Promise.allSettled(trials.map((t) => t.run));
}, 600_000);

describe('a flyback corner below the least power a pulse delivers, against ngspice', () => {
  it('is solved at the 100 ns floor and listed in summary.regulationMisses', () => {
    const periodS = 1 / spec.switchingFrequencyHz;
    // The engine's floor: 100 ns of leading-edge blanking (common practice (from memory)).
    expectClose(corner.dutyCycle * periodS, 100e-9, { rel: 1e-12 });
    const outputV = corner.outputs[0]?.voltageV ?? NaN;
    expect(outputV).toBeGreaterThan(5 * 1.001);
    expect(design.summary.regulationMisses).toContainEqual({
      corner: CORNER,
      outputVoltageV: outputV,
      targetVoltageV: 5,
    });
    // ref: common practice (charge balance on the output capacitor): the rectifier's mean
    // current at the floor state is the load's
    expectClose(corner.rectifiers[0]?.currentAverageA ?? NaN, 0.03 * 3, { rel: 1e-6 });
    // ref: common practice (a hard-switched flyback's least power per pulse is the drain
    // capacitance's energy ½·C·(Vin² − V0²)·f, V0 = n·(Vo + Vf) at the output reached), worked by
    // hand; within 15 % for the pulse's own ½·Lm·Ipk²·f, the idle ring's start current and the
    // leakage ring, which the estimate leaves out (this design: 0.50 W against 0.46 W)
    const v0 = 40 * (outputV + 0.5);
    const estimateW = 0.5 * 100e-12 * (400 ** 2 - v0 ** 2) * 100e3 * (outputV / (outputV + 0.5));
    expectClose(corner.outputPowerW, estimateW, { rel: 0.15 });
  });

  it('the settled output in ngspice is within 2 % of the output the engine reaches', async () => {
    const outputV = corner.outputs[0]?.voltageV ?? NaN;
    const loadOhm = outputV / (corner.outputs[0]?.currentA ?? NaN);
    const runs = await Promise.all(trials.map((t) => t.run));
    const excessA = runs.map(
      (run, i) => (run.measures.delivered_a ?? NaN) - (trials[i]?.heldV ?? NaN) / loadOhm,
    );
    // ngspice delivers more than the load below the band and less above it.
    expect(excessA[0]).toBeGreaterThan(0);
    expect(excessA[2]).toBeLessThan(0);
    const settledV = quadraticRoot(
      trials.map((t) => t.heldV),
      excessA,
    );
    // ref: ngspice (Debian package), the exported deck at the engine's duty cycle with the output
    // held at trial voltages and the load a resistor (Vo/Io at the engine's output); the issue's
    // agreement target is 2 % on output voltage (this design: 5.61 V against the engine's 5.58 V)
    expectClose(settledV, outputV, { rel: 0.02 });
    // ref: ngspice (Debian package), at the engine's output; the target is 5 % on the
    // switch voltage peak (this design: 656.8 V against 661.5 V)
    expectClose(
      runs[1]?.measures.switch_voltage_peak_v ?? NaN,
      corner.switches[0]?.voltagePeakV ?? NaN,
      { rel: 0.05 },
    );
  });
});
