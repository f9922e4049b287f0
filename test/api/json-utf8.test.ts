import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { jsonUtf8 } from '../../api/http/json-utf8.js';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { designConverter, SpecSchema } from '../../solvers/index.js';

// jsonUtf8 must give exactly the bytes of Buffer.from(JSON.stringify(value), 'utf8'): stored
// designs and answers are those bytes (ref: ECMA-262, JSON.stringify, and the WHATWG Encoding
// Standard's UTF-8 encoder, which Node's Buffer follows).

const reference = (value: unknown) => Buffer.from(JSON.stringify(value), 'utf8');

describe('jsonUtf8', () => {
  it('jsonUtf8(design content) equals the UTF-8 of JSON.stringify, notes beyond Latin-1 included', () => {
    const spec = SpecSchema.parse(EXAMPLE_SPECS.packagingAux);
    const designed = designConverter(spec);
    if (!designed.ok) throw new Error('the example must be feasible');
    const content = { spec, design: designed.value, meta: { note: 'Δ − ’ µ °' } };
    expect(jsonUtf8(content).equals(reference(content))).toBe(true);
  });

  it('jsonUtf8(any JSON-like value) equals the UTF-8 of JSON.stringify', () => {
    // Strings over all of Unicode (lone surrogates too), undefined members, nested objects.
    const leaf = fc.oneof(
      fc.string({ unit: 'binary' }),
      fc.string({ unit: 'grapheme' }),
      fc.double(),
      fc.boolean(),
      fc.constant(null),
      fc.constant(undefined),
    );
    const { value } = fc.letrec((tie) => ({
      value: fc.oneof(
        { depthSize: 'small' },
        leaf,
        fc.array(tie('value'), { maxLength: 4 }),
        fc.dictionary(fc.string({ unit: 'binary' }), tie('value'), { maxKeys: 5 }),
      ),
    }));
    fc.assert(
      fc.property(fc.dictionary(fc.string({ unit: 'binary' }), value, { maxKeys: 6 }), (object) => {
        expect(jsonUtf8(object).equals(reference(object))).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });

  it('jsonUtf8 leaves objects with toJSON, boxed values and functions to JSON.stringify', () => {
    const value = {
      at: new Date(0),
      boxed: new Number(3),
      custom: { toJSON: () => 'custom' },
      hidden: { toJSON: () => undefined },
      run: () => 1,
      nested: { map: new Map([[1, 2]]), sym: Symbol('s'), list: [undefined, () => 1] },
    };
    expect(jsonUtf8(value).equals(reference(value))).toBe(true);
    expect(jsonUtf8([1, 'Δ']).equals(reference([1, 'Δ']))).toBe(true);
    expect(jsonUtf8('text').equals(reference('text'))).toBe(true);
    expect(() => jsonUtf8(undefined)).toThrow(TypeError);
  });
});
