/**
 * Steinmetz coefficients of a core material: Pv = k·f^α·B^β, with Pv in W/m³, f in Hz and B the
 * peak flux density (half the peak-to-peak swing) in T, for sinusoidal excitation.
 * ref: C. P. Steinmetz, "On the law of hysteresis", 1892 (the power law; the frequency term is
 * common practice for ferrites).
 */
export interface SteinmetzCoefficients {
  /** k, in W/m³ per Hz^α per T^β (its unit depends on α and β; SI base only). */
  k: number;
  /** Frequency exponent α, typically 1 to 2. */
  alpha: number;
  /** Flux-density exponent β, typically 2 to 3. */
  beta: number;
}
