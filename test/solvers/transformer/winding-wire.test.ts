import { describe, expect, it } from 'vitest';
import { wireDimensions } from '../../../solvers/transformer/winding-wire.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('wireDimensions', () => {
  const foil = { kind: 'foil', thicknessM: 0.2e-3, widthM: 20e-3, insulationThicknessM: 50e-6 };

  // ref: IEC 60028, ρ20 = 1/58 Ω·mm²/m: a 0.2 mm × 20 mm strip is 4 mm², 1/(58·4) Ω/m.
  it('wireDimensions(foil 0.2 × 20 mm) is 4 mm² of copper at ρ20/(t·w)', () => {
    const dimensions = wireDimensions({ ...foil, kind: 'foil' });
    expectClose(dimensions.copperAreaM2, 4e-6, { rel: 1e-12 });
    expectClose(dimensions.resistancePerLengthAt20COhmPerM, 1 / (58 * 4), { rel: 1e-12 });
  });

  // ref: common practice — a foil turn fills its layer's breadth, and the film between turns
  // adds to every layer's height: 0.2 mm copper + 50 µm film = 0.25 mm a layer.
  it('wireDimensions(foil) takes its width along the layer and thickness plus film across it', () => {
    const dimensions = wireDimensions({ ...foil, kind: 'foil' });
    expectClose(dimensions.pitchM, 20e-3, { rel: 1e-12 });
    expectClose(dimensions.layerHeightM, 0.25e-3, { rel: 1e-12 });
    expectClose(dimensions.outsideAreaM2, 20e-3 * 0.25e-3, { rel: 1e-12 });
    expectClose(dimensions.bareDiameterM, 0.2e-3, { rel: 1e-12 });
  });

  // ref: IEC 60028, ρ20 = 1/58 Ω·mm²/m over 0.1 mm × 15 mm = 1.5 mm².
  it('wireDimensions(foil without a width) spans the breadth it is given', () => {
    const spanning = { kind: 'foil', thicknessM: 0.1e-3, insulationThicknessM: 0 } as const;
    const dimensions = wireDimensions(spanning, 15e-3);
    expectClose(dimensions.pitchM, 15e-3, { rel: 1e-12 });
    expectClose(dimensions.resistancePerLengthAt20COhmPerM, 1 / (58 * 1.5), { rel: 1e-12 });
    expect(() => wireDimensions(spanning)).toThrow(RangeError);
  });

  it('wireDimensions rejects a foil of non-positive thickness or negative film', () => {
    expect(() => wireDimensions({ ...foil, kind: 'foil', thicknessM: 0 })).toThrow(RangeError);
    expect(() => wireDimensions({ ...foil, kind: 'foil', insulationThicknessM: -1e-6 })).toThrow(
      RangeError,
    );
  });
});
