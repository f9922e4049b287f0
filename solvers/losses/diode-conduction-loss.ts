/**
 * Returns the conduction loss of a diode with the linear model v = Vf + Rd·i, W:
 * Vf·Iavg + Rd·Irms², exact for any current waveform with that average (A) and RMS (A).
 * ref: Mohan, Undeland, Robbins, Power Electronics, 3rd ed., ch. 2, diode forward model (from
 * memory).
 */
export function diodeConductionLoss(
  forwardVoltageV: number,
  slopeResistanceOhm: number,
  currentAverageA: number,
  currentRmsA: number,
): number {
  return forwardVoltageV * currentAverageA + slopeResistanceOhm * currentRmsA * currentRmsA;
}
