import { describe, expect, it } from 'vitest';
import type { Corner, Design } from '../../solvers/design/design-schema.js';
import { operatingCorners } from '../../solvers/design/operating-corners.js';
import type { Spec } from '../../solvers/spec/spec-schema.js';
import type { Topology } from '../../solvers/topologies/topology.js';
import { average } from '../../solvers/waveform/average.js';
import { rms } from '../../solvers/waveform/rms.js';
import { peak } from '../../solvers/waveform/peak.js';
import { expectClose } from '../helpers/expect-close.js';

/** One feasible spec the suite runs the topology on, with a name for the test titles. */
export interface ContractCase {
  name: string;
  spec: Spec;
}

function solveAll(topology: Topology<Design['choices']>, spec: Spec): Corner[] {
  const chosen = topology.choose(spec);
  if (!chosen.ok) throw new Error(`choose failed: ${JSON.stringify(chosen.issues)}`);
  return operatingCorners(spec).map((corner) => {
    const solved = topology.solveCorner(spec, chosen.value, corner);
    if (!solved.ok) throw new Error(`${corner.label}: ${JSON.stringify(solved.issues)}`);
    return solved.value;
  });
}

/**
 * The claims every topology keeps at every corner of a feasible spec: periodic steady state,
 * charge balance, energy balance, and its stated limits. Run once per topology.
 */
export function topologyContract(topology: Topology<Design['choices']>, cases: ContractCase[]) {
  describe(`topologyContract(${topology.id})`, () => {
    for (const { name, spec } of cases) {
      const corners = solveAll(topology, spec);

      // ref: Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed., §2.2 (from
      // memory): in periodic steady state the inductor current ends the period where it began.
      it(`solveCorner(${name}) returns a magnetizing current that is periodic`, () => {
        for (const corner of corners) {
          const { values } = corner.waveforms.magnetizingCurrentA;
          const scale = Math.max(peak(corner.waveforms.magnetizingCurrentA), 1e-9);
          expectClose(values[values.length - 1] ?? NaN, values[0] ?? NaN, { abs: 1e-6 * scale });
        }
      });

      // ref: Erickson & Maksimović, 2nd ed., §2.3 (from memory): capacitor charge balance, the
      // average rectifier current equals the load current in steady state.
      it(`solveCorner(${name}) balances charge on every output capacitor`, () => {
        for (const corner of corners) {
          corner.outputs.forEach((output, index) => {
            const secondary = corner.waveforms.secondaryCurrentsA[index];
            if (secondary === undefined) throw new Error(`no secondary current ${index}`);
            expectClose(average(secondary), output.currentA, { rel: 1e-6 });
          });
        }
      });

      // ref: common practice — conservation of energy: what the input supplies is what the
      // loads take plus every loss.
      it(`solveCorner(${name}) balances energy: input power is output power plus losses`, () => {
        for (const corner of corners) {
          const lossSumW = corner.losses.reduce((sum, loss) => sum + loss.powerW, 0);
          expectClose(corner.lossTotalW, lossSumW, { rel: 1e-9 });
          expectClose(corner.inputPowerW, corner.outputPowerW + lossSumW, { rel: 1e-9 });
          expectClose(corner.inputPowerW, corner.inputVoltageV * corner.inputCurrentAverageA, {
            rel: 1e-9,
          });
          expect(corner.efficiency).toBeGreaterThan(0);
          expect(corner.efficiency).toBeLessThan(1);
          for (const loss of corner.losses) expect(loss.powerW).toBeGreaterThanOrEqual(0);
        }
      });

      // ref: common practice — a feasible design respects the limits it was held against.
      it(`solveCorner(${name}) keeps the stated duty-cycle and voltage limits`, () => {
        for (const corner of corners) {
          expect(corner.dutyCycle).toBeGreaterThan(0);
          expect(corner.dutyCycle).toBeLessThanOrEqual(spec.limits.dutyCycleMax + 1e-12);
          for (const device of corner.switches) {
            if (device.voltageUtilization === undefined) continue;
            expect(device.voltageUtilization).toBeLessThanOrEqual(
              spec.limits.switchVoltageDerating + 1e-12,
            );
          }
          for (const device of corner.rectifiers) {
            if (device.voltageUtilization === undefined) continue;
            expect(device.voltageUtilization).toBeLessThanOrEqual(
              spec.limits.rectifierVoltageDerating + 1e-12,
            );
          }
        }
      });

      // ref: common practice — stresses are read off the waveforms the design reports.
      it(`solveCorner(${name}) reports switch stresses that match its own waveforms`, () => {
        for (const corner of corners) {
          const [primarySwitch] = corner.switches;
          if (primarySwitch === undefined) throw new Error('no switch');
          const current = corner.waveforms.primaryCurrentA;
          expectClose(primarySwitch.currentRmsA, rms(current), { rel: 1e-9 });
          expectClose(primarySwitch.currentPeakA, peak(current), { rel: 1e-9 });
          expectClose(primarySwitch.voltagePeakV, peak(corner.waveforms.switchVoltageV), {
            rel: 1e-9,
          });
        }
      });
    }
  });
}
