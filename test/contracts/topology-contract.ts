import { describe, expect, it } from 'vitest';
import type { AnyCorner } from '../../solvers/design/design-schema.js';
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

function solveAll<C, K extends AnyCorner>(topology: Topology<C, K>, spec: Spec): K[] {
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
export function topologyContract<C, K extends AnyCorner>(
  topology: Topology<C, K>,
  cases: ContractCase[],
) {
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
            // A flyback's secondary current, or a buck-derived stage's output inductor current.
            const secondary =
              'outputInductorCurrentsA' in corner.waveforms
                ? corner.waveforms.outputInductorCurrentsA[index]
                : corner.waveforms.secondaryCurrentsA[index];
            if (secondary === undefined) throw new Error(`no secondary current ${index}`);
            expectClose(average(secondary), output.currentA, { rel: 1e-6 });
          });
        }
      });

      // ref: Mohan, Undeland, Robbins, 3rd ed., §10-4 (from memory): a forward converter's core
      // must reset every period, so its magnetizing current returns to zero before the next
      // on-time; past zero the ring of Lm with the drain capacitance (a lossless LC, common
      // practice) leaves it at most as far from zero as its peak, and the period ends where it
      // began. At light load that ring can outlast the off-time and swing back above zero by the
      // turn-on (the forwards' event period: at 400 V and 2 % load the engine starts the on-time
      // at +2.32 mA against a 24 mA peak, ngspice (Debian package) at +2.14 mA, and the outputs
      // agree within 0.2 %, forward-high-input-light-load-netlist.test.ts), so the reset is the
      // current reaching zero somewhere in the period, not its value at the turn-on.
      it(`solveCorner(${name}) returns the forward family's magnetizing current to zero`, () => {
        for (const corner of corners) {
          // An active clamp resets the flux past zero: its magnetizing current swings negative.
          if (!('resetDutyCycle' in corner) || 'activeClamp' in corner) continue;
          const { values } = corner.waveforms.magnetizingCurrentA;
          const scale = Math.max(peak(corner.waveforms.magnetizingCurrentA), 1e-9);
          const startA = values[0] ?? NaN;
          expect(Math.min(...values)).toBeLessThanOrEqual(1e-9 * scale);
          expect(Math.abs(startA)).toBeLessThanOrEqual(corner.magnetizingCurrentPeakA * (1 + 1e-9));
          expectClose(values[values.length - 1] ?? NaN, startA, { abs: 1e-9 * scale });
          expect(corner.dutyCycle + corner.resetDutyCycle).toBeLessThanOrEqual(1);
        }
      });

      // ref: Erickson & Maksimović, 2nd ed., §2.3 (from memory): capacitor charge balance on an
      // active clamp's capacitor, whose current is the auxiliary switch's, and volt-second balance
      // on Lm, so the clamp capacitor voltage ends the period where it began.
      it(`solveCorner(${name}) balances charge on an active clamp's capacitor`, () => {
        for (const corner of corners) {
          if (!('activeClamp' in corner)) continue;
          const clampA = corner.waveforms.auxiliarySwitchCurrentA;
          expectClose(average(clampA), 0, { abs: 1e-9 * peak(clampA) });
          const { values } = corner.waveforms.clampCapacitorVoltageV;
          expectClose(values[values.length - 1] ?? NaN, values[0] ?? NaN, {
            abs: 1e-9 * corner.activeClamp.capacitorVoltageV,
          });
          expectClose(corner.activeClamp.auxiliarySwitch.currentRmsA, rms(clampA), { rel: 1e-9 });
          expectClose(
            corner.activeClamp.auxiliarySwitch.voltagePeakV,
            peak(corner.waveforms.auxiliarySwitchVoltageV),
            { rel: 1e-9 },
          );
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
          if (corner.switches.length === 0) throw new Error('no switch');
          // A double-ended primary's switches each carry their own half-period of the current.
          const currents =
            'switchCurrentsA' in corner.waveforms ? corner.waveforms.switchCurrentsA : undefined;
          const voltages =
            'switchVoltageV' in corner.waveforms
              ? [corner.waveforms.switchVoltageV]
              : corner.waveforms.switchVoltagesV;
          corner.switches.forEach((device, index) => {
            const voltage = voltages[index];
            if (voltage === undefined) throw new Error(`no voltage waveform for switch ${index}`);
            const current = currents?.[index] ?? corner.waveforms.primaryCurrentA;
            expectClose(device.currentRmsA, rms(current), { rel: 1e-9 });
            expectClose(device.currentPeakA, peak(current), { rel: 1e-9 });
            expectClose(device.voltagePeakV, peak(voltage), { rel: 1e-9 });
          });
        }
      });
    }
  });
}
