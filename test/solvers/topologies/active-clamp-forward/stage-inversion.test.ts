import { describe, it } from 'vitest';
import {
  stageDutyFor,
  stageSecondaryVoltageFor,
} from '../../../../solvers/topologies/active-clamp-forward/stage-inversion.js';
import type { OutputStage } from '../../../../solvers/topologies/buck-derived/output-stage.js';
import { expectClose } from '../../../helpers/expect-close.js';

const PERIOD_S = 5e-6;
const lossless = (loadA: number): OutputStage => ({
  loadA,
  inductanceH: 20e-6,
  inductorResistanceOhm: 0,
  windingResistanceOhm: 0,
  rectifier: { forwardVoltageV: 0, resistanceOhm: 0 },
});

describe('stageDutyFor', () => {
  it('stageDutyFor(lossless, continuous) is the buck ratio Vo/Vs', () => {
    // ref: Erickson & Maksimović, 2nd ed., §2.2 (from memory): buck in CCM, M = D
    expectClose(stageDutyFor(lossless(8), 30, 12, PERIOD_S), 12 / 30, { rel: 1e-12 });
  });

  it('stageDutyFor(lossless, discontinuous) satisfies M = 2/(1 + √(1 + 4K/D²))', () => {
    const d = stageDutyFor(lossless(0.3), 30, 12, PERIOD_S);
    const k = (2 * 20e-6) / ((12 / 0.3) * PERIOD_S);
    // ref: Erickson & Maksimović, 2nd ed., eq. 5.26 (from memory): buck in DCM, K = 2L/(R·T)
    expectClose(12 / 30, 2 / (1 + Math.sqrt(1 + (4 * k) / d ** 2)), { rel: 1e-9 });
  });
});

describe('stageSecondaryVoltageFor', () => {
  it('stageSecondaryVoltageFor(lossless, continuous) is Vo/D', () => {
    // ref: Erickson & Maksimović, 2nd ed., §2.2 (from memory): buck in CCM, M = D
    expectClose(stageSecondaryVoltageFor(lossless(8), 0.4, 12, PERIOD_S), 30, { rel: 1e-12 });
  });

  it('stageSecondaryVoltageFor(lossless, discontinuous) satisfies M = 2/(1 + √(1 + 4K/D²))', () => {
    const secondaryV = stageSecondaryVoltageFor(lossless(0.3), 0.2, 12, PERIOD_S);
    const k = (2 * 20e-6) / ((12 / 0.3) * PERIOD_S);
    // ref: Erickson & Maksimović, 2nd ed., eq. 5.26 (from memory): buck in DCM, K = 2L/(R·T)
    expectClose(12 / secondaryV, 2 / (1 + Math.sqrt(1 + (4 * k) / 0.2 ** 2)), { rel: 1e-9 });
  });
});
