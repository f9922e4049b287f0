import { describe, expect, it } from 'vitest';
import {
  heldOutputExcessA,
  heldOutputTrials,
  settledHeldOutputs,
  towardSettledTrials,
} from './held-output-deck.js';

// The netlist tests' step from held runs to settled outputs, on outputs whose delivered current
// is linear in the held voltages (a made-up coupling, not a converter): one Newton step on the
// differences (central or one-sided) is then exact (Newton's method on a linear system, common practice).
describe('settledHeldOutputs', () => {
  const engineV = [12, 5, 24];
  const loadOhm = [24, 2.5, 48];
  const settledV = [12.3, 4.95, 23.9];
  // Delivered current of output k at held voltages v: its load's current at the settled point
  // less a coupling matrix times the departure from it.
  const coupling = [
    [0.4, 0.1, 0.05],
    [0.2, 0.9, 0.0],
    [0.05, 0.02, 0.3],
  ];
  const delivered = (v: readonly number[]): number[] =>
    settledV.map(
      (s, k) =>
        s / (loadOhm[k] as number) -
        (coupling[k] as number[]).reduce(
          (sum, c, j) => sum + c * ((v[j] as number) - (settledV[j] as number)),
          0,
        ),
    );

  const runAt = (offsets: readonly number[]): number[] =>
    delivered(engineV.map((v, k) => v * (1 + (offsets[k] as number))));

  it('orders its trials as the engine voltages, then each output below and above in turn', () => {
    expect(heldOutputTrials(2, 0.01)).toEqual([
      [0, 0],
      [-0.01, 0],
      [0.01, 0],
      [0, -0.01],
      [0, 0.01],
    ]);
  });

  it('finds where every delivered current meets its load from the 2·count + 1 held runs', () => {
    const step = 0.015;
    const trials = heldOutputTrials(3, step);
    const runs = trials.map(runAt);
    const result = settledHeldOutputs(engineV, loadOhm, trials, runs);
    result.settledV.forEach((v, k) => expect(v).toBeCloseTo(settledV[k] as number, 9));
    // Output 1 settles 2.5 % above the engine's, outside the ±1.5 % trials; the others inside.
    expect(result.isBracketed).toEqual([false, true, true]);
  });

  it('finds the same from count + 1 runs, each output moved once toward its settled voltage', () => {
    const step = 0.015;
    const first = [[0, 0, 0]];
    const [excessAtEngine] = heldOutputExcessA(engineV, loadOhm, first, first.map(runAt));
    const trials = [...first, ...towardSettledTrials(excessAtEngine as number[], step)];
    // Output 1 delivers more than its load at the engine's voltages (it settles above them), the
    // other two less.
    expect(trials.slice(1)).toEqual([
      [step, 0, 0],
      [0, -step, 0],
      [0, 0, -step],
    ]);
    const result = settledHeldOutputs(engineV, loadOhm, trials, trials.map(runAt));
    result.settledV.forEach((v, k) => expect(v).toBeCloseTo(settledV[k] as number, 9));
    expect(result.isBracketed).toEqual([false, true, true]);
  });
});
