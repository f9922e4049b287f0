import type { SteinmetzCoefficients } from './steinmetz-coefficients.js';

/** A generic core-material class with representative numbers, SI units (temperatures in °C). */
export interface MaterialClass {
  id: string;
  /** Steinmetz coefficients at the minimum-loss temperature (where the factor below is 1). */
  steinmetz: SteinmetzCoefficients;
  /**
   * Loss temperature factor ct(T) = ct2·T² − ct1·T + ct0 (T in °C), which multiplies Pv;
   * normalized so its minimum is 1. ref: common practice for power ferrites.
   */
  lossTemperatureFactor: { ct2: number; ct1: number; ct0: number };
  /** Saturation flux density at two temperatures, linearly interpolated between them. */
  saturation: {
    lowTemperatureC: number;
    lowFluxDensityT: number;
    highTemperatureC: number;
    highFluxDensityT: number;
  };
  /** Initial relative permeability μi (dimensionless) and its relative tolerance (0..1). */
  initialPermeability: number;
  initialPermeabilityTolerance: number;
  /** Frequency range the Steinmetz fit is meant for, Hz. */
  frequencyMinHz: number;
  frequencyMaxHz: number;
}
