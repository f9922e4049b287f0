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

describe('stackField', () => {
  // ref: McLyman, Transformer and Inductor Design Handbook, 4th ed., leakage inductance of two
  // concentric windings, Llk = μ0·N²·MLT·(a/3 + c + b/3)/b_w (from memory); also Kazimierczuk,
  // High-Frequency Magnetic Components, 2nd ed. (from memory).
  it('stackField(primary, secondary) gives the two-winding leakage μ0·Np²·MLT·(hp/3 + g + hs/3)/b', () => {
    const field = stackField(
      [
        { winding: 0, layerCount: 2, heightM: HP, ampereTurnsPerPrimaryA: NP },
        { winding: 1, layerCount: 1, heightM: HS, ampereTurnsPerPrimaryA: -NP },
      ],
      2,
      GAP,
      BREADTH,
      MLT,
    );
    const expected = (MU_0_H_PER_M * NP * NP * MLT * (HP / 3 + GAP + HS / 3)) / BREADTH;
    expectClose(field.leakageInductanceH, expected, { rel: 1e-12 });
  });

  // ref: common practice — splitting the primary around the secondary halves the ampere-turns
  // at each of two interfaces, so the winding terms fall to a quarter and the gap terms to half:
  // the energy integral ∫F² dx of the one-dimensional window field, worked by hand.
  it('stackField(P/2, S, P/2) cuts the winding terms to a quarter and the gap term to half', () => {
    const field = stackField(
      [
        { winding: 0, layerCount: 1, heightM: HP / 2, ampereTurnsPerPrimaryA: NP / 2 },
        { winding: 1, layerCount: 1, heightM: HS, ampereTurnsPerPrimaryA: -NP },
        { winding: 0, layerCount: 1, heightM: HP / 2, ampereTurnsPerPrimaryA: NP / 2 },
      ],
      2,
      GAP,
      BREADTH,
      MLT,
    );
    const expected = (MU_0_H_PER_M * NP * NP * MLT * (HP / 12 + GAP / 2 + HS / 12)) / BREADTH;
    expectClose(field.leakageInductanceH, expected, { rel: 1e-12 });
  });

  // ref: Dowell, Proc. IEE, 1966: a portion whose field rises from zero over M layers has the
  // portion factor of M layers; a layer centred on a field null counts as M = 0.5.
  it('stackField gives Dowell layer counts of M for stacked portions and M/2 when interleaved', () => {
    const stacked = stackField(
      [
        { winding: 0, layerCount: 4, heightM: HP, ampereTurnsPerPrimaryA: NP },
        { winding: 1, layerCount: 2, heightM: HS, ampereTurnsPerPrimaryA: -NP },
      ],
      2,
      GAP,
      BREADTH,
      MLT,
    );
    expectClose(stacked.equivalentLayerCounts[0] ?? NaN, 4, { rel: 1e-12 });
    expectClose(stacked.equivalentLayerCounts[1] ?? NaN, 2, { rel: 1e-12 });
    const interleaved = stackField(
      [
        { winding: 0, layerCount: 2, heightM: HP / 2, ampereTurnsPerPrimaryA: NP / 2 },
        { winding: 1, layerCount: 1, heightM: HS, ampereTurnsPerPrimaryA: -NP },
        { winding: 0, layerCount: 2, heightM: HP / 2, ampereTurnsPerPrimaryA: NP / 2 },
      ],
      2,
      GAP,
      BREADTH,
      MLT,
    );
    expectClose(interleaved.equivalentLayerCounts[0] ?? NaN, 2, { rel: 1e-12 });
    expectClose(interleaved.equivalentLayerCounts[1] ?? NaN, 0.5, { rel: 1e-12 });
    expect(interleaved.leakageInductanceH).toBeLessThan(stacked.leakageInductanceH);
  });
});
