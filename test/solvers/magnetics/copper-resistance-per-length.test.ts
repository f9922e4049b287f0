import { describe, expect, it } from 'vitest';
import { copperResistancePerLength } from '../../../solvers/magnetics/copper-resistance-per-length.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('copperResistancePerLength', () => {
  it('copperResistancePerLength(1 mm²) is 1/58 Ω/m at 20 °C', () => {
    // ref: IEC 60028, annealed copper 1/58 Ω·mm²/m at 20 °C
    expectClose(copperResistancePerLength(1e-6), 1 / 58, { rel: 1e-14 });
  });

  it('copperResistancePerLength at 100 °C is 1 + 0.00393·80 times the 20 °C value', () => {
    // ref: IEC 60028, α20 = 0.00393 /K, linear law
    expectClose(copperResistancePerLength(1e-6, { temperatureC: 100 }), (1 / 58) * 1.3144, {
      rel: 1e-12,
    });
  });

  it('copperResistancePerLength scales with the take-up factor', () => {
    // ref: IEC 60028, R = ρ·l/A with the strand length l = takeUp per metre of conductor
    expectClose(copperResistancePerLength(2e-6, { takeUpFactor: 1.03 }), 1.03 / 116, {
      rel: 1e-14,
    });
  });

  it('copperResistancePerLength rejects a zero area and a take-up below 1', () => {
    expect(() => copperResistancePerLength(0)).toThrow(RangeError);
    expect(() => copperResistancePerLength(1e-6, { takeUpFactor: 0.9 })).toThrow(RangeError);
    expect(() => copperResistancePerLength(1e-6, { temperatureC: -300 })).toThrow(RangeError);
  });
});
