import { MU_0_H_PER_M } from '../magnetics/gapped-inductance.js';

/** One section of a winding stack: part of one winding, laid in whole layers. */
export interface StackSection {
  /** Index of the winding (0 = primary). */
  winding: number;
  /** Layers in this section. */
  layerCount: number;
  /** Height across the window, m. */
  heightM: number;
  /**
   * Ampere-turns this section adds per ampere of primary current (positive for primary
   * sections, negative for secondary ones; the power transfer's sections sum to zero; a reset
   * winding's, in its own interval, are positive).
   */
  ampereTurnsPerPrimaryA: number;
  /**
   * The interval of the period in which the section's winding conducts (0 when omitted: the
   * power transfer, primary and secondaries together; 1: a forward's reset, the reset winding
   * alone). Each interval's field is stacked from its own sections' ampere-turns; the windings
   * of other intervals are idle in it.
   */
  conductionInterval?: number;
}

/** What the magnetomotive-force profile of a stack gives. */
export interface StackField {
  /** Leakage inductance referred to the primary, H. */
  leakageInductanceH: number;
  /**
   * Dowell's equivalent layer count of each winding: the M whose portion factor equals the mean
   * of the winding's layer factors, from each layer's surface fields (≥ 0.5).
   */
  equivalentLayerCounts: number[];
}

/**
 * Returns the leakage inductance and each winding's Dowell layer count of a stack of sections
 * laid across the window from the centre leg out, `gapM` (m) of insulation between sections,
 * turns of mean length `meanTurnLengthM` (m) along a breadth `breadthM` (m). The field across
 * the window is the stacked ampere-turns over the breadth (a one-dimensional window field).
 * Leakage by the stored energy ½·Llk·Ip² = ½·μ0·(MLT/b)·∫F² dx: a linear rise across a section
 * gives h·(F0² + F0·F1 + F1²)/3, a gap g·F². For two windings this is the familiar
 * μ0·Np²·MLT·(hp/3 + g + hs/3)/b (McLyman, Transformer and Inductor Design Handbook, 4th ed.,
 * leakage inductance chapter (from memory); Kazimierczuk, High-Frequency Magnetic Components,
 * 2nd ed. (from memory)). Sections of another conduction interval (a reset winding) carry no
 * current in the power transfer's field, which gives the leakage; each winding's layer count
 * comes from the field of its own interval, where the windings of other intervals are idle.
 * An idle winding's eddy loss in another interval's field is not counted: lay such a winding
 * where that field is zero (transformerStack puts a reset winding next to the centre leg).
 */
export function stackField(
  sections: readonly StackSection[],
  windingCount: number,
  gapM: number,
  breadthM: number,
  meanTurnLengthM: number,
): StackField {
  // The power transfer's ampere-turns (interval 0), and those of any later interval by index.
  let mmf = 0;
  let otherMmf: number[] | undefined;
  let integral = 0;
  // Per winding: Σ over its layers of m(m − 1) and the layer count, for Dowell's M.
  const sums = Array.from({ length: windingCount }, () => ({ mm: 0, layers: 0 }));
  // A plain loop: a search lays a stack for every candidate it checks.
  for (let index = 0; index < sections.length; index++) {
    const section = sections[index] as StackSection;
    if (index > 0) integral += gapM * mmf * mmf;
    const interval = section.conductionInterval ?? 0;
    let start = mmf;
    if (interval === 0) {
      const end = start + section.ampereTurnsPerPrimaryA;
      integral += (section.heightM * (start * start + start * end + end * end)) / 3;
      mmf = end;
    } else {
      // Idle in the power transfer: the field crosses the section unchanged. Its own interval's
      // field starts from the ampere-turns of that interval's sections inside it.
      integral += section.heightM * mmf * mmf;
      otherMmf ??= [];
      start = otherMmf[interval] ?? 0;
      otherMmf[interval] = start + section.ampereTurnsPerPrimaryA;
    }
    const perLayer = section.ampereTurnsPerPrimaryA / section.layerCount;
    const sum = sums[section.winding];
    if (sum !== undefined && perLayer !== 0) {
      for (let layer = 0; layer < section.layerCount; layer++) {
        // Layer surfaces at a·s and (a + 1)·s; Dowell's m = a + 1, and m(m − 1) is the same
        // for m and 1 − m, so any real a works (a = −0.5 is a layer centred on a field null).
        const a = start / perLayer + layer;
        sum.mm += (a + 1) * a;
        sum.layers += 1;
      }
    }
  }
  return {
    leakageInductanceH: (MU_0_H_PER_M * meanTurnLengthM * integral) / breadthM,
    // Dowell: the portion mean of m(m − 1) over m = 1…M is (M² − 1)/3.
    equivalentLayerCounts: sums.map(({ mm, layers }) =>
      layers === 0 ? 0.5 : Math.max(0.5, Math.sqrt((3 * mm) / layers + 1)),
    ),
  };
}
