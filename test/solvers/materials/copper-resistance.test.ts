import { describe, expect, it } from 'vitest';
import {
  COPPER_RESISTIVITY_20C_OHM_M,
  COPPER_TEMPERATURE_COEFFICIENT_20C,
  copperResistance,
} from '../../../solvers/materials/copper-resistance.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('copperResistance', () => {
  it('COPPER_RESISTIVITY_20C_OHM_M is the annealed-copper standard, 1/58 Ω·mm²/m', () => {
    // ref: IEC 60028, resistivity of standard annealed copper at 20 °C, 0.017241 Ω·mm²/m
    expectClose(COPPER_RESISTIVITY_20C_OHM_M, 1.7241e-8, { rel: 3e-5 });
  });

  it('COPPER_TEMPERATURE_COEFFICIENT_20C is 0.00393 per kelvin', () => {
    // ref: IEC 60028, constant-mass temperature coefficient at 20 °C, 0.00393 /K
    expectClose(COPPER_TEMPERATURE_COEFFICIENT_20C, 0.00393, { rel: 1e-12 });
  });

  it('copperResistance(R, 20) returns R unchanged', () => {
    // ref: IEC 60028, values are stated at 20 °C
    expectClose(copperResistance(0.125, 20), 0.125, { rel: 1e-15 });
  });

  it('copperResistance(R, 75)/R matches the inferred-zero rule (234.5 + 75)/(234.5 + 20)', () => {
    // ref: common practice, copper resistance ratio (234.5 + T2)/(234.5 + T1) (from memory);
    // 1/0.00393 − 20 = 234.45 K, so the two differ by about 2e-5 relative.
    expectClose(copperResistance(1, 75), (234.5 + 75) / (234.5 + 20), { rel: 1e-4 });
  });

  it('copperResistance(R, −234.45) falls to zero, the intercept of the linear law', () => {
    // ref: IEC 60028, α20 = 0.00393 /K: R(T) = R20·(1 + α20·(T − 20)) vanishes at 20 − 1/α20
    expectClose(copperResistance(1, 20 - 1 / 0.00393), 0, { abs: 1e-15 });
    expect(copperResistance(1, 100)).toBeGreaterThan(copperResistance(1, 25));
  });
});
