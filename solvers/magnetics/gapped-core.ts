/** A wound core whose gap is to be found or evaluated; SI units. */
export interface GappedCore {
  /** Turns of the winding the inductance is seen from (> 0). */
  turns: number;
  effectiveLengthM: number;
  effectiveAreaM2: number;
  /** Relative permeability of the core material (dimensionless, > 0). */
  relativePermeability: number;
  /** Height G of the window beside the gapped leg, m (for the fringing factor). */
  windowHeightM: number;
  /** 'mclyman': McLyman's fringing factor on the gap; 'none': F = 1. */
  fringing: 'mclyman' | 'none';
}
