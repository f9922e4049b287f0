import { describe, expect, it } from 'vitest';
import type { Corner } from '../../../../solvers/design/design-schema.js';
import { valueAt } from '../../../../solvers/waveform/value-at.js';
import { cornerAt, solveFlyback } from '../../../helpers/flyback-corners.js';
import { expectClose } from '../../../helpers/expect-close.js';
import { busSpec, telecomSpec } from '../../../helpers/flyback-specs.js';

function lossOf(corner: Corner, component: string, mechanism: string): number {
  const found = corner.losses.find(
    (loss) => loss.component === component && loss.mechanism === mechanism,
  );
  if (found === undefined) throw new Error(`no ${component} ${mechanism} loss`);
  return found.powerW;
}

describe('flybackLosses: edges', () => {
  const spec = busSpec();
  const { choices, corners } = solveFlyback(spec);
  const fs = spec.switchingFrequencyHz;
  const device = spec.primarySwitch;
  const continuous = corners.filter((corner) => corner.conductionMode === 'ccm');
  const discontinuous = corners.filter((corner) => corner.conductionMode === 'dcm');

  it('has continuous and discontinuous corners to compare (invented 120–375 V bus)', () => {
    // ref: Erickson & Maksimović, 2nd ed. (from memory), §5.1, light load turns a fixed-L converter
    // DCM
    expect(continuous.length > 0 && discontinuous.length > 0).toBe(true);
  });

  it('turns on hard in CCM at Vin + Vr with the valley current, in DCM where the idle ring left it', () => {
    for (const corner of continuous) {
      const switchV = corner.waveforms.switchVoltageV;
      const beforeTurnOnV = switchV.values[switchV.values.length - 1] ?? NaN;
      const valleyA = corner.waveforms.magnetizingCurrentA.values[0] ?? NaN;
      // ref: Mohan, Undeland, Robbins, 3rd ed., eq. 2-6 (from memory), ½·V·I·tc·fs per edge
      expectClose(
        lossOf(corner, 'primary-switch', 'turn-on'),
        0.5 * beforeTurnOnV * valleyA * device.riseTimeS * fs,
        {
          rel: 1e-12,
        },
      );
      // ref: Erickson & Maksimović, 2nd ed., §4.3.3 (from memory), ½·C·V² at hard turn-on
      expectClose(
        lossOf(corner, 'primary-switch', 'output-capacitance'),
        0.5 * device.outputCapacitanceF * beforeTurnOnV ** 2 * fs,
        { rel: 1e-12 },
      );
    }
    for (const corner of discontinuous) {
      // The drain voltage and magnetizing current the idle ring leaves at turn-on.
      const switchV = corner.waveforms.switchVoltageV;
      const beforeTurnOnV = switchV.values[switchV.values.length - 1] ?? NaN;
      const startA = corner.waveforms.magnetizingCurrentA.values[0] ?? NaN;
      // ref: Mohan, Undeland, Robbins, 3rd ed., eq. 2-6 (from memory), ½·V·I·tc·fs per edge; a
      // negative start current discharges the drain itself (common practice: no overlap loss)
      expectClose(
        lossOf(corner, 'primary-switch', 'turn-on'),
        0.5 * beforeTurnOnV * Math.max(0, startA) * device.riseTimeS * fs,
        { rel: 1e-12 },
      );
      // ref: Erickson & Maksimović, 2nd ed., §4.3.3 (from memory), ½·C·V² at hard turn-on
      expectClose(
        lossOf(corner, 'primary-switch', 'output-capacitance'),
        0.5 * device.outputCapacitanceF * beforeTurnOnV ** 2 * fs,
        { rel: 1e-12 },
      );
    }
    // ref: common practice (lossless LC ring): the drain rings within Vin ± V0 about the input
    const someRing = discontinuous.some((corner) => {
      const switchV = corner.waveforms.switchVoltageV;
      return (
        Math.abs((switchV.values[switchV.values.length - 1] ?? NaN) - corner.inputVoltageV) > 1
      );
    });
    expect(someRing).toBe(true);
  });

  it('turns off at Vin + Vc with the peak current', () => {
    for (const corner of corners) {
      // ref: Mohan, Undeland, Robbins, 3rd ed., eq. 2-6 (from memory); the clamp holds Vin + Vc
      expectClose(
        lossOf(corner, 'primary-switch', 'turn-off'),
        0.5 *
          (corner.inputVoltageV + choices.clampVoltageV) *
          // The switch's own peak: the drain capacitance takes the current from it at turn-off.
          (corner.switches[0]?.currentPeakA ?? NaN) *
          device.fallTimeS *
          fs,
        { rel: 1e-12 },
      );
      // ref: common practice, Qg·Vdrive·fs
      expectClose(
        lossOf(corner, 'primary-switch', 'gate-drive'),
        device.gateChargeC * device.gateDriveVoltageV * fs,
        {
          rel: 1e-12,
        },
      );
    }
  });

  it('recovers the diode at Vo + Vin/n in CCM and not at all in DCM', () => {
    const qrr = 30e-9;
    for (const corner of continuous) {
      const reverseV = corner.rectifiers[0]?.voltagePeakV ?? NaN;
      // ref: Erickson & Maksimović, 2nd ed., §4.3.2 (from memory), Qrr·Vr·fs
      expectClose(lossOf(corner, 'rectifier-1', 'reverse-recovery'), qrr * reverseV * fs, {
        rel: 1e-12,
      });
      // ref: common practice, the rectifier blocks Vo + Vin/n (within the 2 % of drops and leakage)
      expectClose(reverseV, 24 + corner.inputVoltageV / choices.turnsRatio, { rel: 2e-2 });
    }
    for (const corner of discontinuous) {
      // ref: common practice, in DCM the diode current has decayed to zero before reverse bias
      expectClose(lossOf(corner, 'rectifier-1', 'reverse-recovery'), 0, { abs: 0 });
    }
  });

  it('charges the conduction, copper and clamp losses from the waveforms', () => {
    for (const corner of corners) {
      const rectifier = corner.rectifiers[0];
      const primary = corner.windings[0];
      const secondary = corner.windings[1];
      if (rectifier === undefined || primary === undefined || secondary === undefined)
        throw new Error('devices');
      // ref: Mohan, Undeland, Robbins, 3rd ed., ch. 2, linear diode model (from memory)
      expectClose(
        lossOf(corner, 'rectifier-1', 'conduction'),
        0.7 * rectifier.currentAverageA + 0.05 * rectifier.currentRmsA ** 2,
        { rel: 1e-12 },
      );
      // ref: common practice (Joule's law), Irms²·R
      expectClose(
        lossOf(corner, 'primary-switch', 'conduction'),
        (corner.switches[0]?.currentRmsA ?? NaN) ** 2 * device.onResistanceOhm,
        { rel: 1e-12 },
      );
      expectClose(
        lossOf(corner, 'primary', 'copper'),
        primary.currentRmsA ** 2 * choices.primaryResistanceOhm,
        {
          rel: 1e-12,
        },
      );
      expectClose(
        lossOf(corner, 'secondary-1', 'copper'),
        secondary.currentRmsA ** 2 * secondary.resistanceOhm,
        {
          rel: 1e-12,
        },
      );
      // ref: common practice, the clamp power is the last entry and matches the clamp block
      expectClose(lossOf(corner, 'clamp', 'clamp'), corner.clamp.powerW, { rel: 1e-12 });
    }
  });
});

describe('flybackLosses: synchronous rectifier', () => {
  const spec = telecomSpec({
    outputs: [
      {
        voltageV: 12,
        currentA: 2,
        rectifier: {
          kind: 'synchronous',
          onResistanceOhm: 0.01,
          gateChargeC: 15e-9,
          gateDriveVoltageV: 8,
        },
        windingResistanceOhm: 0.006,
      },
    ],
  });
  const { corners } = solveFlyback(spec);

  it('charges Irms²·Rds(on), Qg·Vg·fs and Vbd·I·tdead·fs at the two edges', () => {
    for (const corner of corners) {
      const rectifier = corner.rectifiers[0];
      const secondaryA = corner.waveforms.secondaryCurrentsA[0];
      if (rectifier === undefined || secondaryA === undefined) throw new Error('rectifier');
      // ref: common practice (Joule's law), Irms²·Rds(on)
      expectClose(lossOf(corner, 'rectifier-1', 'conduction'), rectifier.currentRmsA ** 2 * 0.01, {
        rel: 1e-12,
      });
      // ref: common practice, Qg·Vdrive·fs
      expectClose(lossOf(corner, 'rectifier-1', 'gate-drive'), 15e-9 * 8 * 100e3, { rel: 1e-12 });
      // Edges: the current just after the turn-off commutation (when the leakage current is
      // first back at zero after turn-off) and the current at the next turn-on (its value at the
      // end of the period; zero in DCM).
      const endA =
        corner.conductionMode === 'dcm'
          ? 0
          : (secondaryA.values[secondaryA.values.length - 1] ?? NaN);
      const winding = corner.waveforms.primaryWindingCurrentA;
      const onS = corner.dutyCycle / 100e3;
      const commutatedS = winding.timesS.find((timeS, k) => timeS > onS && winding.values[k] === 0);
      if (commutatedS === undefined) throw new Error('no end of the turn-off commutation');
      const edgeMeanA = (valueAt(secondaryA, commutatedS) + endA) / 2;
      // ref: common practice, Vbd·I·tdead·fs with the defaults 0.8 V and 50 ns
      expectClose(lossOf(corner, 'rectifier-1', 'dead-time'), 0.8 * edgeMeanA * 50e-9 * 100e3, {
        rel: 1e-12,
      });
    }
  });

  it('is more efficient than the diode rectifier at full load', () => {
    const diode = cornerAt(solveFlyback(telecomSpec()).corners, 'nominal-input/100pct-load');
    const sync = cornerAt(corners, 'nominal-input/100pct-load');
    // ref: common practice, 2 A through 10 mΩ loses far less than through a 0.45 V diode
    expect(sync.efficiency).toBeGreaterThan(diode.efficiency);
  });
});
