import { describe, expect, it } from 'vitest';
import { MU_0_H_PER_M } from '../../../solvers/magnetics/gapped-inductance.js';
import { stackField } from '../../../solvers/transformer/winding-stack.js';
import { expectClose } from '../../helpers/expect-close.js';

// Two windings of 20 turns (primary, 2 layers) and 5 turns (secondary, 1 layer), 0.2 mm of
// insulation, breadth 20 mm, mean turn 50 mm: plain geometry, no product.
const NP = 20;
const HP = 1.2e-3;
const HS = 0.8e-3;
const GAP = 0.2e-3;
const BREADTH = 20e-3;
const MLT = 50e-3;

/** The field of `sections` in this file's window (gap, breadth and mean turn above). */
function fieldOf(sections: Parameters<typeof stackField>[0], windingCount: number) {
  return stackField(sections, windingCount, GAP, BREADTH, MLT);
}

describe('stackField', () => {
  // ref: McLyman, Transformer and Inductor Design Handbook, 4th ed., leakage inductance of two
  // concentric windings, Llk = μ0·N²·MLT·(a/3 + c + b/3)/b_w (from memory); also Kazimierczuk,
  // High-Frequency Magnetic Components, 2nd ed. (from memory).
  it('stackField(primary, secondary) gives the two-winding leakage μ0·Np²·MLT·(hp/3 + g + hs/3)/b', () => {
    const field = fieldOf(
      [
        { winding: 0, layerCount: 2, heightM: HP, ampereTurnsPerPrimaryA: NP },
        { winding: 1, layerCount: 1, heightM: HS, ampereTurnsPerPrimaryA: -NP },
      ],
      2,
    );
    const expected = (MU_0_H_PER_M * NP * NP * MLT * (HP / 3 + GAP + HS / 3)) / BREADTH;
    expectClose(field.leakageInductanceH, expected, { rel: 1e-12 });
  });

  // ref: common practice — splitting the primary around the secondary halves the ampere-turns
  // at each of two interfaces, so the winding terms fall to a quarter and the gap terms to half:
  // the energy integral ∫F² dx of the one-dimensional window field, worked by hand.
  it('stackField(P/2, S, P/2) cuts the winding terms to a quarter and the gap term to half', () => {
    const field = fieldOf(
      [
        { winding: 0, layerCount: 1, heightM: HP / 2, ampereTurnsPerPrimaryA: NP / 2 },
        { winding: 1, layerCount: 1, heightM: HS, ampereTurnsPerPrimaryA: -NP },
        { winding: 0, layerCount: 1, heightM: HP / 2, ampereTurnsPerPrimaryA: NP / 2 },
      ],
      2,
    );
    const expected = (MU_0_H_PER_M * NP * NP * MLT * (HP / 12 + GAP / 2 + HS / 12)) / BREADTH;
    expectClose(field.leakageInductanceH, expected, { rel: 1e-12 });
  });

  // ref: Dowell, Proc. IEE, 1966: a portion whose field rises from zero over M layers has the
  // portion factor of M layers; a layer centred on a field null counts as M = 0.5.
  it('stackField gives Dowell layer counts of M for stacked portions and M/2 when interleaved', () => {
    const stacked = fieldOf(
      [
        { winding: 0, layerCount: 4, heightM: HP, ampereTurnsPerPrimaryA: NP },
        { winding: 1, layerCount: 2, heightM: HS, ampereTurnsPerPrimaryA: -NP },
      ],
      2,
    );
    expectClose(stacked.equivalentLayerCounts[0] ?? NaN, 4, { rel: 1e-12 });
    expectClose(stacked.equivalentLayerCounts[1] ?? NaN, 2, { rel: 1e-12 });
    const interleaved = fieldOf(
      [
        { winding: 0, layerCount: 2, heightM: HP / 2, ampereTurnsPerPrimaryA: NP / 2 },
        { winding: 1, layerCount: 1, heightM: HS, ampereTurnsPerPrimaryA: -NP },
        { winding: 0, layerCount: 2, heightM: HP / 2, ampereTurnsPerPrimaryA: NP / 2 },
      ],
      2,
    );
    expectClose(interleaved.equivalentLayerCounts[0] ?? NaN, 2, { rel: 1e-12 });
    expectClose(interleaved.equivalentLayerCounts[1] ?? NaN, 0.5, { rel: 1e-12 });
    expect(interleaved.leakageInductanceH).toBeLessThan(stacked.leakageInductanceH);
  });

  // ref: Dowell, Proc. IEE, 1966: a portion whose field rises from zero across its own M layers
  // has the portion factor of M layers; common practice: a winding next to the core with nothing
  // inside it sees only its own MMF. A reset winding (interval 1) laid first conducts alone, so
  // its 3 layers count 3; idle in the power transfer at zero field, it adds nothing to ∫F² dx,
  // so the leakage is the P/2, S, P/2 one worked by hand above.
  it('stackField(reset first, P/2, S, P/2) gives the reset winding its own M and keeps the leakage', () => {
    const resetTurns = 12;
    const field = fieldOf(
      [
        {
          winding: 2,
          layerCount: 3,
          heightM: HS,
          ampereTurnsPerPrimaryA: 0.05 * resetTurns,
          conductionInterval: 1,
        },
        { winding: 0, layerCount: 2, heightM: HP / 2, ampereTurnsPerPrimaryA: NP / 2 },
        { winding: 1, layerCount: 1, heightM: HS, ampereTurnsPerPrimaryA: -NP },
        { winding: 0, layerCount: 2, heightM: HP / 2, ampereTurnsPerPrimaryA: NP / 2 },
      ],
      3,
    );
    expectClose(field.equivalentLayerCounts[2] ?? NaN, 3, { rel: 1e-12 });
    expectClose(field.equivalentLayerCounts[0] ?? NaN, 2, { rel: 1e-12 });
    expectClose(field.equivalentLayerCounts[1] ?? NaN, 0.5, { rel: 1e-12 });
    const expected = (MU_0_H_PER_M * NP * NP * MLT * (HP / 12 + GAP / 2 + HS / 12)) / BREADTH;
    expectClose(field.leakageInductanceH, expected, { rel: 1e-12 });
  });

  // ref: Dowell, Proc. IEE, 1966, and common practice as above: the reset winding conducts while
  // the primary and secondary are idle, so wherever it lies its own interval's field rises from
  // zero across its own layers (here 2); in the power transfer it is idle and the field crosses
  // it unchanged: laid between P and S it adds h·F² (F = Np) to ∫F² dx, and its own gap another.
  it('stackField takes the reset winding’s field over its own interval wherever it lies', () => {
    const field = fieldOf(
      [
        { winding: 0, layerCount: 4, heightM: HP, ampereTurnsPerPrimaryA: NP },
        {
          winding: 2,
          layerCount: 2,
          heightM: HS,
          ampereTurnsPerPrimaryA: 0.6,
          conductionInterval: 1,
        },
        { winding: 1, layerCount: 2, heightM: HS, ampereTurnsPerPrimaryA: -NP },
      ],
      3,
    );
    expectClose(field.equivalentLayerCounts[2] ?? NaN, 2, { rel: 1e-12 });
    expectClose(field.equivalentLayerCounts[0] ?? NaN, 4, { rel: 1e-12 });
    expectClose(field.equivalentLayerCounts[1] ?? NaN, 2, { rel: 1e-12 });
    const expected = (MU_0_H_PER_M * NP * NP * MLT * (HP / 3 + 2 * GAP + HS + HS / 3)) / BREADTH;
    expectClose(field.leakageInductanceH, expected, { rel: 1e-12 });
  });
});
