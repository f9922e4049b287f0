import { describe, expect, it } from 'vitest';
import { assertFiniteNumbers } from '../../../solvers/design/assert-finite-numbers.js';

describe('assertFiniteNumbers', () => {
  it('assertFiniteNumbers passes finite numbers in nested objects and arrays', () => {
    // ref: common practice, JSON carries only finite numbers (RFC 8259 §6)
    expect(() => assertFiniteNumbers({ a: [1, { b: -2.5 }], c: 'x', d: null })).not.toThrow();
  });

  it('assertFiniteNumbers throws naming the path of NaN or Infinity', () => {
    // ref: common practice, JSON has no NaN or Infinity (RFC 8259 §6)
    expect(() =>
      assertFiniteNumbers({ corners: [{ dutyCycle: 0.4 }, { dutyCycle: NaN }] }),
    ).toThrow('$.corners[1].dutyCycle');
    expect(() => assertFiniteNumbers({ a: { b: [0, -Infinity] } })).toThrow('$.a.b[1]');
  });
});
