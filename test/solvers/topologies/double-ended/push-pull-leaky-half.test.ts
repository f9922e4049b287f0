import { describe, expect, it } from 'vitest';
import { designConverter } from '../../../../solvers/index.js';
import {
  solvePushPullLeakyHalf,
  solvePushPullLeakyRegulated,
  type PushPullLeakyCircuit,
} from '../../../../solvers/topologies/double-ended/push-pull-leaky-half.js';
import { leakyHighInputPushPullSpec } from '../../../helpers/double-ended-specs.js';
import { expectClose } from '../../../helpers/expect-close.js';

// An invented 200–400 V push-pull (not any product; `leakyHighInputPushPullSpec`, the probe's
// `scan-push-pull-400`): 10 µH of leakage a half, 100 pF switches, 12 V, at 400 V and 6.1 %
// load, its output held at 12 V, no primary resistance, the drops at the current.
const SPEC = leakyHighInputPushPullSpec(0.061);
const result = designConverter(SPEC);
if (!result.ok || result.value.topology !== 'push-pull')
  throw new Error('invented spec infeasible');
const choices = result.value.choices;
const pathOhm =
  0.01 +
  (choices.outputWindingResistancesOhm[0] ?? 0) +
  (choices.outputInductorResistancesOhm[0] ?? 0);
const circuit = (clampV: number): PushPullLeakyCircuit => ({
  inputV: 400,
  leakageH: 10e-6,
  halfResistanceOhm: 0,
  capacitanceF: SPEC.primarySwitch.outputCapacitanceF,
  magnetizingH: choices.magnetizingInductanceH,
  turnsRatio: choices.turnsRatio,
  inductanceH: choices.outputInductancesH[0] ?? NaN,
  halfS: 1 / SPEC.switchingFrequencyHz / 2,
  clampV,
  pathV: 12.5,
  pathOhm,
  freewheelV: 12.5,
  freewheelOhm:
    (0.01 + (choices.outputWindingResistancesOhm[0] ?? 0)) / 2 +
    (choices.outputInductorResistancesOhm[0] ?? 0),
});

describe('solvePushPullLeakyHalf', () => {
  // ref: test/bench/push-pull-leakage-reference.ts (this repository's time-stepped RK4 of the same
  // idealized circuit, 0.25 ns over 160 periods from rest; independent of the exact stretches
  // here), which ngspice (Debian) followed within 1–1.8 % at the 721 V clamp (DEVELOPERS.md):
  // mean inductor current at D = 0.03 and 0.145, clamp 721 V above the rail 0.1591 and 0.4410 A,
  // at the design's 600 V 0.2390 and 0.5407 A.
  for (const [clampV, duty, referenceA] of [
    [721, 0.03, 0.1591],
    [721, 0.145, 0.441],
    [600, 0.03, 0.239],
    [600, 0.145, 0.5407],
  ] as const) {
    it(`delivers the reference's current at D = ${duty}, clamp ${clampV} V`, () => {
      const half = solvePushPullLeakyHalf(circuit(clampV), { dutyCycle: duty });
      expectClose(half?.meanInductorA ?? NaN, referenceA, { rel: 0.01 });
    });
  }

  it('finds the duty cycle that delivers the load, which the reference delivers there too', () => {
    const loadA = 4.276219069957733 * 0.061;
    const half = solvePushPullLeakyRegulated(circuit(600), loadA, 0.145);
    expect(half?.isSettling).toBe(true);
    expectClose(half?.meanInductorA ?? NaN, loadA, { rel: 1e-6 });
    // ref: test/bench/push-pull-leakage-reference.ts: 0.25990 A at D = 0.064066 and 0.26278 A at
    // 0.0645, so it delivers the load (0.26085 A) at D = 0.06421 (linear between the two)
    expectClose(half?.dutyCycle ?? NaN, 0.06421, { rel: 0.005 });
  });
});
