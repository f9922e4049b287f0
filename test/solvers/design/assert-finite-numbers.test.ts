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

  it('assertFiniteNumbers finds NaN in a waveform column, whatever the column holds', () => {
    // ref: common practice, JSON has no NaN or Infinity (RFC 8259 §6)
    const waveform = { periodS: 1e-5, timesS: [0, 5e-6, 1e-5], values: [1, 2, 1] };
    expect(() => assertFiniteNumbers({ waveforms: { a: waveform } })).not.toThrow();
    expect(() =>
      assertFiniteNumbers({ waveforms: { a: { ...waveform, values: [1, NaN, 1] } } }),
    ).toThrow('$.waveforms.a.values[1]');
    expect(() => assertFiniteNumbers({ w: { ...waveform, timesS: [0, Infinity, 1e-5] } })).toThrow(
      '$.w.timesS[1]',
    );
    // Wherever the non-finite number sits: an even or odd place, the last of an odd count, or
    // after an item that is not a number.
    expect(() => assertFiniteNumbers({ values: [NaN, 1, 2, 3] })).toThrow('$.values[0]');
    expect(() => assertFiniteNumbers({ values: [1, 2, 3, 4, -Infinity] })).toThrow('$.values[4]');
    expect(() => assertFiniteNumbers({ values: [1, 2, 3, 4, Infinity, 6] })).toThrow('$.values[4]');
    expect(() => assertFiniteNumbers({ timesS: [0, 'x', 2, NaN] })).toThrow('$.timesS[3]');
    expect(() => assertFiniteNumbers({ values: [0, -0, 1e308, -1e308, 5e-324] })).not.toThrow();
    // A waveform listed twice in a row (a bridge's pair of rectifiers) is caught at its first.
    const bad = { ...waveform, values: [1, NaN, 1] };
    expect(() => assertFiniteNumbers({ rectifiers: [waveform, bad, bad] })).toThrow(
      '$.rectifiers[1].values[1]',
    );
    // A column that is not numbers (never a waveform's) is still walked item by item.
    expect(() => assertFiniteNumbers({ values: [{ x: -Infinity }] })).toThrow('$.values[0].x');
    expect(() => assertFiniteNumbers({ values: 'text', timesS: null })).not.toThrow();
  });
});
