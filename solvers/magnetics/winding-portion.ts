/**
 * The conductor of a winding portion, by kind: solid round wire, litz (round strands) or foil.
 * Dimensions are bare copper, m.
 */
export type WindingConductor =
  | { kind: 'round'; bareDiameterM: number }
  | { kind: 'litz'; strandBareDiameterM: number; strandCount: number }
  | { kind: 'foil'; thicknessM: number; widthM: number };

/**
 * A winding portion in Dowell's sense: layers stacked across the window, carrying one current
 * in series, from a field null (or the portion's edge) to the field peak. Plain data.
 */
export interface WindingPortion {
  /** Layers in the portion (M ≥ 0.5; 0.5 for one layer centred on a field null). */
  layerCount: number;
  /** Turns side by side in one layer (1 for a foil turn spanning the breadth). */
  turnsPerLayer: number;
  /** Winding breadth along the layer (window height available to the layer), m. */
  breadthM: number;
  conductor: WindingConductor;
}
