import { describe, expect, it } from 'vitest';
import type { OutputStage } from '../../../../solvers/topologies/buck-derived/output-stage.js';
import {
  solveDoubleEnded,
  type DoubleEndedCircuit,
} from '../../../../solvers/topologies/double-ended/double-ended-state.js';
import { primaryBridge } from '../../../../solvers/topologies/double-ended/primary-bridge.js';
import { expectClose } from '../../../helpers/expect-close.js';

// Invented circuit: a half bridge on 390 V (drive 195 V), 100 kHz, Lm 3 mH with 30 µH of
// leakage, 300 pF across the winding, n = 4; a 24 V-class output stage (40 µH, 0.7 V
// rectifier, 10 mΩ in each resistance).
const stage = (loadA: number, inductanceH: number, ohm: number): OutputStage => ({
  loadA,
  inductanceH,
  inductorResistanceOhm: ohm,
  windingResistanceOhm: ohm,
  rectifier: { forwardVoltageV: 0.7, resistanceOhm: ohm },
});

function circuit(stages: OutputStage[]): DoubleEndedCircuit {
  return {
    bridge: primaryBridge('half-bridge'),
    inputVoltageV: 390,
    driveVoltageV: 195,
    periodS: 1e-5,
    magnetizingInductanceH: 3e-3,
    leakageInductanceH: 30e-6,
    primaryLoopResistanceOhm: 0.5,
    primaryResistanceOhm: 0.1,
    nodeCapacitanceF: 300e-12,
    bodyDiodeVoltageV: 0.8,
    turnsRatios: stages.map(() => 4),
    arrangements: stages.map(() => 'center-tapped' as const),
    stages,
  };
}

describe('the several-output light-load event model', () => {
  it('solveDoubleEnded(two identical outputs) is one output of twice the load, half the inductance and half the resistances, each carrying half', () => {
    let idle = 0;
    for (const loadA of [0.05, 0.1, 0.3, 0.7, 0.8]) {
      const pair = solveDoubleEnded(
        circuit([stage(loadA, 40e-6, 0.01), stage(loadA, 40e-6, 0.01)]),
        24,
      );
      const single = solveDoubleEnded(circuit([stage(2 * loadA, 20e-6, 0.005)]), 24);
      if (pair === undefined || single === undefined) throw new Error('no state');
      // Both in the event model (its region: a shared fall of the magnetizing current).
      expect(pair.isEvent).toBe(true);
      expect(single.isEvent).toBe(true);
      const s = single.points[0];
      if (s === undefined) throw new Error('no point');
      if (s.mode === 'dcm') idle++;
      // ref: common practice: identical windings and output stages in parallel act as one with
      // twice the current and half the inductance and resistances, each carrying half (so their
      // currents reach zero together, where the model is exact)
      expectClose(pair.dutyCycle, single.dutyCycle, { rel: 1e-9 });
      expectClose(pair.magnetizingPeakA, single.magnetizingPeakA, { rel: 1e-7 });
      for (const p of pair.points) {
        expectClose(p.voltageV, 24, { rel: 1e-9 });
        expectClose(p.peakA, s.peakA / 2, { rel: 1e-7 });
        expectClose(p.valleyA, s.valleyA / 2, { abs: 1e-7 * s.peakA });
        expect(p.mode).toBe(s.mode);
      }
    }
    // The loads cover the ring reaching zero (an idle stretch) and not.
    expect(idle).toBeGreaterThan(0);
    expect(idle).toBeLessThan(5);
  });
});
