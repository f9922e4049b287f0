import { describe, expect, it } from 'vitest';
import { operatingCorners } from '../../../../solvers/design/operating-corners.js';
import type { Spec } from '../../../../solvers/spec/spec-schema.js';
import { flyback } from '../../../../solvers/topologies/flyback.js';
import { flybackCircuit } from '../../../../solvers/topologies/flyback/flyback-circuit.js';
import type { IdleRingTrace } from '../../../../solvers/topologies/flyback/flyback-idle-ring.js';
import { flybackRingTraces } from '../../../../solvers/topologies/flyback/flyback-ring-traces.js';
import { solveFlybackSteadyState } from '../../../../solvers/topologies/flyback/flyback-steady-state.js';
import { expectClose } from '../../../helpers/expect-close.js';
import { busSpec, telecomSpec } from '../../../helpers/flyback-specs.js';

/** The trapezoids under an arc's currents from its start (`fromS`, `fromA`), A·s. */
function chordChargeAS(trace: IdleRingTrace, fromS: number, fromA: number): number {
  let chargeAS = 0;
  let timeS = fromS;
  let currentA = fromA;
  for (const [k, nextS] of trace.timesS.entries()) {
    const nextA = trace.currentsA[k] ?? NaN;
    chargeAS += ((currentA + nextA) * (nextS - timeS)) / 2;
    timeS = nextS;
    currentA = nextA;
  }
  return chargeAS;
}

// Invented scenarios of the test helpers: the 36–72 V telecom flyback and the 120–375 V bus
// flyback at 500 kHz, where the ring is a larger part of the period.
const SPECS: Array<[string, Spec]> = [
  ['telecom', telecomSpec()],
  ['bus at 500 kHz', busSpec({ switchingFrequencyHz: 500e3 })],
];

describe('flybackRingTraces', () => {
  for (const [name, spec] of SPECS) {
    it(`flybackRingTraces(${name}) draws the leakage ring's arcs with the charge C·Δv of the drain`, () => {
      const chosen = flyback.choose(spec);
      if (!chosen.ok) throw new Error(`choose failed: ${JSON.stringify(chosen.issues)}`);
      let arcs = 0;
      for (const corner of operatingCorners(spec)) {
        const circuit = flybackCircuit(spec, chosen.value, corner);
        const outcome = solveFlybackSteadyState(circuit);
        if (!outcome.ok) throw new Error(`${corner.label}: ${outcome.reason}`);
        const state = outcome.state;
        const traces = flybackRingTraces(circuit, state);
        const capacitanceF = circuit.drainCapacitanceF;
        const risenS = state.dutyCycle * circuit.periodS + state.turnOffTransitionS;
        const rise = traces.leakageRise;
        const riseEndV = rise.drainV[rise.drainV.length - 1];
        if (riseEndV !== undefined) {
          arcs += 1;
          // ref: common practice (the ring's current charges the drain capacitance: ∫i dt = C·Δv),
          // from the drain at Vin + V0, where the secondary starts to conduct
          expectClose(
            chordChargeAS(rise, risenS, state.transitionEndCurrentA),
            capacitanceF * (riseEndV - circuit.inputVoltageV - circuit.reflectedOffsetV),
            { rel: 1e-9 },
          );
        }
        const back = traces.leakageReturn;
        const backEndV = back.drainV[back.drainV.length - 1];
        if (backEndV !== undefined) {
          arcs += 1;
          const fromS = risenS + state.leakageRingS + state.turnOffCommutationS;
          const fromV = circuit.inputVoltageV + state.turnOffReflectedV + state.leakageRingPeakV;
          // ref: common practice (∫i dt = C·Δv), from zero current at the ring's peak
          expectClose(chordChargeAS(back, fromS, 0), capacitanceF * (backEndV - fromV), {
            rel: 1e-9,
          });
        }
      }
      expect(arcs).toBeGreaterThan(0);
    });
  }
});
