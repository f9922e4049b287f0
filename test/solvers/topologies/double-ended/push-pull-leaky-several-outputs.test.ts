import { describe, expect, it } from 'vitest';
import { designConverter } from '../../../../solvers/index.js';
import {
  runPushPullLeakyHalf,
  solvePushPullLeakyHalf,
  type PushPullLeakyCircuit,
  type PushPullLeakyOutput,
} from '../../../../solvers/topologies/double-ended/push-pull-leaky-half.js';
import { leakyHighInputPushPullSpec } from '../../../helpers/double-ended-specs.js';
import { expectClose } from '../../../helpers/expect-close.js';

// The push-pull's leaky light-load half with several outputs (`push-pull-leaky-half.ts`,
// `PushPullLeakyCircuit.others`). The circuit: the invented 200–400 V push-pull of
// `push-pull-leaky-half.test.ts` (not any product; `leakyHighInputPushPullSpec`: 10 µH of leakage
// a half, 100 pF switches, a 12 V output), at 400 V with its clamp at 600 V above the rail, the
// first output held at 12 V; 0.2 Ω in each half's loop here so that the circuit run forward
// settles (undamped, a flux offset would stay).
const SPEC = leakyHighInputPushPullSpec(0.061);
const result = designConverter(SPEC);
if (!result.ok || result.value.topology !== 'push-pull') {
  throw new Error('invented spec infeasible');
}
const choices = result.value.choices;
const n = choices.turnsRatio;
const inductanceH = choices.outputInductancesH[0] ?? NaN;

const circuit = (overrides: Partial<PushPullLeakyCircuit> = {}): PushPullLeakyCircuit => ({
  inputV: 400,
  leakageH: 10e-6,
  halfResistanceOhm: 0.2,
  capacitanceF: SPEC.primarySwitch.outputCapacitanceF,
  magnetizingH: choices.magnetizingInductanceH,
  turnsRatio: n,
  inductanceH,
  halfS: 1 / SPEC.switchingFrequencyHz / 2,
  clampV: 600,
  pathV: 12.5,
  pathOhm: 0.04,
  freewheelV: 12.5,
  freewheelOhm: 0.03,
  ...overrides,
});

/** A further output: 5 V class, turns ratio 2.4·n, a quarter of the first's inductance. */
const fiveVolt = (loadA: number): PushPullLeakyOutput => ({
  turnsRatio: 2.4 * n,
  inductanceH: inductanceH / 4,
  pathDropV: 0.5,
  pathOhm: 0.05,
  freewheelDropV: 0.5,
  freewheelOhm: 0.03,
  loadA,
  voltageGuessV: 5,
});

describe('the leaky half with several outputs', () => {
  for (const duty of [0.064, 0.145]) {
    it(`two identical outputs in parallel share one output's half at D = ${duty}`, () => {
      // ref: circuit theory (common practice): two identical branches (2L, 2R each) from one
      // winding into one voltage are one branch of L and R carrying the sum, each carrying half;
      // so the second output settles at the first's voltage, each inductor at half the one
      // output's mean, and the primary's half (switch peak, clamp) is the one output's.
      const one = solvePushPullLeakyHalf(circuit(), { dutyCycle: duty });
      const twin: PushPullLeakyOutput = {
        turnsRatio: n,
        inductanceH: 2 * inductanceH,
        pathDropV: 0.5,
        pathOhm: 0.08,
        freewheelDropV: 0.5,
        freewheelOhm: 0.06,
        loadA: (one?.meanInductorA ?? NaN) / 2,
        voltageGuessV: 11,
      };
      const split = circuit({
        inductanceH: 2 * inductanceH,
        pathOhm: 0.08,
        freewheelOhm: 0.06,
        others: [twin],
      });
      const two = solvePushPullLeakyHalf(split, { dutyCycle: duty });
      expectClose(two?.others[0]?.voltageV ?? NaN, 12, { rel: 1e-6 });
      expectClose(two?.meanInductorA ?? NaN, (one?.meanInductorA ?? NaN) / 2, { rel: 1e-6 });
      expectClose(two?.switchPeakA ?? NaN, one?.switchPeakA ?? NaN, { rel: 1e-6 });
      expectClose(two?.clampW ?? NaN, one?.clampW ?? NaN, { rel: 1e-6, abs: 1e-9 });
    });
  }

  it('a second output at near-zero load leaves the first output as it was', () => {
    // ref: circuit theory (common practice): an output that draws almost nothing takes almost
    // nothing from the winding, so the first output's mean current and the switch's peak are the
    // one-output half's to within that output's share (a microampere against 0.26 A).
    const one = solvePushPullLeakyHalf(circuit(), { dutyCycle: 0.064 });
    const two = solvePushPullLeakyHalf(circuit({ others: [fiveVolt(1e-6)] }), {
      dutyCycle: 0.064,
    });
    expectClose(two?.meanInductorA ?? NaN, one?.meanInductorA ?? NaN, { rel: 1e-3 });
    expectClose(two?.switchPeakA ?? NaN, one?.switchPeakA ?? NaN, { rel: 1e-3 });
    expectClose(two?.others[0]?.meanA ?? NaN, 1e-6, { rel: 1e-3 });
  });

  it('run forward from rest, the circuit settles on the periodic half: charge and flux balance', () => {
    // ref: Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed., §2.2–2.3 (from
    // memory): in steady state each inductor's mean current is its load's (capacitor charge
    // balance, here the held output's) and the magnetizing current ends a half where the mirrored
    // half starts it (volt-second balance). Neither is imposed on the halves run forward here
    // (the second output's voltage held at the periodic half's); the circuit's own settling over
    // 1500 halves reaches them.
    const k = circuit({ others: [fiveVolt(0.1)] });
    const periodic = solvePushPullLeakyHalf(k, { dutyCycle: 0.1 });
    const heldV = periodic?.others[0]?.voltageV ?? NaN;
    let u = [0, 0, 2 * k.inputV, 0, 0, 0, heldV];
    let run = runPushPullLeakyHalf(k, 0.1, u);
    for (let i = 0; i < 1500 && run !== undefined; i++) {
      const e = run.end;
      u = [e[0], e[1], e[3], e[4], e[5], e[6], e[7]] as number[];
      run = runPushPullLeakyHalf(k, 0.1, u);
    }
    // Charge balance: the second output's mean current is its load; the first's is the periodic
    // half's.
    expectClose(run?.otherMeansA[0] ?? NaN, 0.1, { rel: 1e-4 });
    expectClose(run?.meanInductorA ?? NaN, periodic?.meanInductorA ?? NaN, { rel: 1e-4 });
    // Flux balance: the magnetizing current at the half's end (mirrored) is its start.
    const startIm = u[4] ?? NaN;
    expect(Math.abs((run?.end[5] ?? NaN) - startIm)).toBeLessThan(1e-4 * Math.abs(startIm));
    expectClose(startIm, periodic?.start[4] ?? NaN, { rel: 1e-4 });
  });
});
