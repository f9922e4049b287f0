import { describe, expect, it } from 'vitest';
import { heldOutputTrials, settledHeldOutputs } from './held-output-deck.js';

// The netlist tests' step from held runs to settled outputs, on outputs whose delivered current
// is linear in the held voltages (a made-up coupling, not a converter): one Newton step on the
// central differences is then exact (Newton's method on a linear system, common practice).
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
    const runs = heldOutputTrials(3, step).map((offsets) =>
      delivered(engineV.map((v, k) => v * (1 + (offsets[k] as number)))),
    );
    const result = settledHeldOutputs(engineV, loadOhm, step, runs);
    result.settledV.forEach((v, k) => expect(v).toBeCloseTo(settledV[k] as number, 9));
    // Output 1 settles 2.5 % above the engine's, outside the ±1.5 % trials; the others inside.
    expect(result.isBracketed).toEqual([false, true, true]);
  });
});
