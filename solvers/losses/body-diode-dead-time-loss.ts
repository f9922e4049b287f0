/**
 * Returns the body-diode loss of a synchronous rectifier over its dead times, W:
 * Vbd·I·tdead·fs with the body-diode voltage Vbd (V), the mean current over those times I (A),
 * the total dead time per period tdead (s), at fs (Hz).
 * ref: common practice.
 */
export function bodyDiodeDeadTimeLoss(
  bodyDiodeVoltageV: number,
  currentA: number,
  deadTimeS: number,
  frequencyHz: number,
): number {
  return bodyDiodeVoltageV * currentA * deadTimeS * frequencyHz;
}
