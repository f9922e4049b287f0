import { describe, expect, it } from 'vitest';
import { designConverter } from '../../../../solvers/design/design-converter.js';
import { activeClampCircuit } from '../../../../solvers/topologies/active-clamp-forward/active-clamp-forward-circuit.js';
import { solveActiveClamp } from '../../../../solvers/topologies/active-clamp-forward/active-clamp-forward-state.js';
import { turnOffSwingFraction } from '../../../../solvers/topologies/buck-derived/turn-off-swing.js';
import { expectClose } from '../../../helpers/expect-close.js';
import { forwardHighInputSpec } from '../../../helpers/forward-specs.js';

describe('turnOffSwingFraction', () => {
  it('turnOffSwingFraction(C, V, I, T) is C·V/(I·T), held to its hold, 0 without C or I', () => {
    // ref: common practice, a capacitor charged at constant current: t = C·ΔV/I
    // (100 pF, 400 V, 0.5 A: 80 ns of a 5 µs period)
    expectClose(turnOffSwingFraction(100e-12, 400, 0.5, 5e-6, 0.5), 80e-9 / 5e-6, { rel: 1e-12 });
    expect(turnOffSwingFraction(100e-12, 400, 0.5, 5e-6, 0.01)).toBe(0.01);
    expect(turnOffSwingFraction(0, 400, 0.5, 5e-6, 0.5)).toBe(0);
    expect(turnOffSwingFraction(100e-12, 400, 0, 5e-6, 0.5)).toBe(0);
  });
});

// Invented 400 V scenario (see the helper): the active clamp's swing, cut by the dead time.
const SPEC = forwardHighInputSpec('active-clamp-forward');
const designed = designConverter(SPEC);
if (!designed.ok || designed.value.topology !== 'active-clamp-forward') {
  throw new Error('the invented scenario should be feasible');
}
const CHOICES = designed.value.choices;

describe('solveActiveClamp (turn-off swing)', () => {
  for (const loadFraction of [1, 0.5, 0.2]) {
    it(`solveActiveClamp(400 V, ${loadFraction} load) swings the drain for C·Vp/I, cut at the dead time`, () => {
      const circuit = activeClampCircuit(SPEC, CHOICES, {
        label: 'probe',
        inputVoltageV: 400,
        loadFraction,
      });
      const state = solveActiveClamp(circuit, 12);
      if (state === undefined) throw new Error('expected a solution');
      // ref: common practice (from memory), an inductive turn-off: the primary current, taken
      // constant, charges both switches' capacitance, t0 = C·Vp/I, until the auxiliary switch's
      // gate closes the clamp onto the drain at the dead time td
      const fullS =
        (circuit.switchNodeCapacitanceF * state.primaryVoltageV) /
        (state.magnetizingPeakA + state.reflectedPeakA);
      const deadS = circuit.deadTimeFraction * circuit.periodS;
      const swingS = Math.min(fullS, deadS);
      expect(state.offSwingFraction).toBeGreaterThan(0);
      expectClose(state.offSwingFraction * circuit.periodS, swingS, { rel: 1e-9 });
      // ref: the area of a linear fall from Vp over t0, cut at t: Vp·t·(1 − t/(2·t0)); the
      // stages see it added to the conduction after the turn-on commutation
      expectClose(
        state.stageDutyCycle,
        state.dutyCycle +
          state.leadFraction -
          state.onCommutationFraction +
          (swingS * (1 - swingS / (2 * fullS))) / circuit.periodS,
        { rel: 1e-9 },
      );
    });
  }
});
