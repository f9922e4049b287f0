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

  it('assertFiniteNumbers finds NaN in arrays of numbers, of objects and of both', () => {
    // ref: common practice, JSON has no NaN or Infinity (RFC 8259 §6)
    expect(() => assertFiniteNumbers({ w: [[0, 1, 2, Infinity]] })).toThrow('$.w[0][3]');
    expect(() => assertFiniteNumbers([1, { b: [NaN] }])).toThrow('$[1].b[0]');
    expect(() => assertFiniteNumbers([{ b: 1 }, 2, NaN])).toThrow('$[2]');
    expect(() => assertFiniteNumbers(['x', [3, 4], -Infinity])).toThrow('$[2]');
    expect(() => assertFiniteNumbers([[], [0.5, -0.5], { c: [[1e308]] }])).not.toThrow();
  });
});
