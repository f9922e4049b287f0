import { describe, expect, it } from 'vitest';
import {
  outputStagePoint,
  type OutputStage,
} from '../../../../solvers/topologies/buck-derived/output-stage.js';
import { expectClose } from '../../../helpers/expect-close.js';

const PERIOD_S = 1e-5;

// Invented stages: a 12 V-class output at light load, lossless and with drops.
const LOSSLESS: OutputStage = {
  loadA: 0.4,
  inductanceH: 10e-6,
  inductorResistanceOhm: 0,
  windingResistanceOhm: 0,
  rectifier: { forwardVoltageV: 0, resistanceOhm: 0 },
};
const LOSSY: OutputStage = {
  loadA: 0.4,
  inductanceH: 10e-6,
  inductorResistanceOhm: 0.02,
  windingResistanceOhm: 0.05,
  rectifier: { forwardVoltageV: 0.5, resistanceOhm: 0.03 },
};

describe('outputStagePoint', () => {
  it('outputStagePoint(lossless, DCM) gives the buck DCM output Vo = D²·T·Vs²/(2·L·Io + D²·T·Vs)', () => {
    for (const [d, vs] of [
      [0.1, 30],
      [0.25, 40],
      [0.05, 100],
    ] as const) {
      const point = outputStagePoint(LOSSLESS, d, vs, PERIOD_S);
      expect(point.mode).toBe('dcm');
      // ref: Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed., §5.3 (from
      // memory): in DCM Ipk = (Vs − Vo)·D·T/L, D2 = Ipk·L/(Vo·T) and Io = Ipk·(D + D2)/2,
      // which for a current load solve to Vo = D²·T·Vs²/(2·L·Io + D²·T·Vs)
      const expectedV =
        (d * d * PERIOD_S * vs * vs) /
        (2 * LOSSLESS.inductanceH * LOSSLESS.loadA + d * d * PERIOD_S * vs);
      expectClose(point.voltageV, expectedV, { rel: 1e-12 });
      // ref: same, Ipk = (Vs − Vo)·D·T/L
      expectClose(point.peakA, ((vs - expectedV) * d * PERIOD_S) / LOSSLESS.inductanceH, {
        rel: 1e-12,
      });
    }
  });

  it('outputStagePoint(with drops, DCM) meets volt-second and charge balance with its drops', () => {
    for (const [d, vs] of [
      [0.1, 30],
      [0.3, 36],
      [0.02, 60],
    ] as const) {
      const point = outputStagePoint(LOSSY, d, vs, PERIOD_S);
      expect(point.mode).toBe('dcm');
      const { forwardVoltageV: vf, resistanceOhm: rd } = LOSSY.rectifier;
      const onOhm = LOSSY.windingResistanceOhm + rd + LOSSY.inductorResistanceOhm;
      const offOhm = rd + LOSSY.inductorResistanceOhm;
      const lOverT = LOSSY.inductanceH / PERIOD_S;
      // ref: Erickson & Maksimović, 2nd ed., §5.3 and ch. 3 (from memory): the DCM buck
      // relations with each interval's drops taken at its mean current Ipk/2
      expectClose(
        point.peakA,
        (d * (vs - vf - point.voltageV - (onOhm * point.peakA) / 2)) / lOverT,
        { rel: 1e-12 },
      );
      const d2 = (point.peakA * lOverT) / (point.voltageV + vf + (offOhm * point.peakA) / 2);
      expectClose(point.freewheelDutyCycle, d2, { rel: 1e-12 });
      // ref: same, charge balance on the output capacitor: Io = Ipk·(D + D2)/2
      expectClose((point.peakA * (d + d2)) / 2, LOSSY.loadA, { rel: 1e-12 });
    }
  });
});
