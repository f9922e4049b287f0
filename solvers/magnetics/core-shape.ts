/**
 * Nominal dimensions of a core set (two halves, or one ring), m, named after the letters of the
 * standard drawings (IEC 62317 / IEC 63093): A overall width, B height of one half, C depth,
 * D window height of one half, E window span between the outer legs, F centre-leg width.
 */
export type CoreShape = EShape | EfdShape | RoundLegShape | PqShape | RingShape;

/** E core pair: rectangular centre leg F × C and rectangular outer legs. */
export interface EShape {
  family: 'e';
  designation: string;
  overallWidthM: number;
  halfHeightM: number;
  depthM: number;
  halfWindowHeightM: number;
  windowSpanM: number;
  centreLegWidthM: number;
}

/** EFD (flat) core pair: as E, but a rectangular centre leg thinner than the core (F × K). */
export interface EfdShape extends Omit<EShape, 'family'> {
  family: 'efd';
  centreLegDepthM: number;
}

/**
 * ETD or EQ core pair: round centre leg of diameter F, outer legs whose inner faces are arcs of
 * diameter E about the core axis.
 */
export interface RoundLegShape extends Omit<EShape, 'family' | 'centreLegWidthM'> {
  family: 'etd' | 'eq';
  centreLegDiameterM: number;
}

/**
 * PQ core pair: round centre leg of diameter F, two outer legs whose inner faces are arcs of the
 * winding-space diameter E, a back plate A × C, and wire exits G wide between the outer legs on
 * the two open sides (the legs lie where |x| ≥ G/2, x along A).
 */
export interface PqShape extends Omit<RoundLegShape, 'family'> {
  family: 'pq';
  /** G: width of the wire exit between the outer legs, m. */
  slotWidthM: number;
}

/** Ring (toroid) of rectangular section, edges not chamfered. */
export interface RingShape {
  family: 'ring';
  designation: string;
  outerDiameterM: number;
  innerDiameterM: number;
  heightM: number;
}
