/**
 * Returns the power an RCD clamp dissipates, W: ½·Llk·Ipk²·fs·Vc/(Vc − Vr), the leakage energy
 * at turn-off plus the magnetizing energy that flows into the clamp while the leakage current
 * commutates (it lasts ts = Llk·Ipk/(Vc − Vr)); Vc (V) across the clamp capacitor, Vr (V) the
 * reflected voltage, Ipk (A) the switch current at turn-off, at fs (Hz).
 * ref: Pressman, Billings, Morey, Switching Power Supply Design, 3rd ed., flyback leakage
 * clamp (from memory); widely published RCD-clamp relation (common practice).
 * @throws RangeError unless Vc > Vr (the clamp would conduct all through the off-time).
 */
export function rcdClampLoss(
  leakageInductanceH: number,
  peakCurrentA: number,
  clampVoltageV: number,
  reflectedVoltageV: number,
  frequencyHz: number,
): number {
  if (!(clampVoltageV > reflectedVoltageV)) {
    throw new RangeError(
      `rcdClampLoss: Vc ${clampVoltageV} V must exceed Vr ${reflectedVoltageV} V`,
    );
  }
  return (
    (0.5 * leakageInductanceH * peakCurrentA * peakCurrentA * frequencyHz * clampVoltageV) /
    (clampVoltageV - reflectedVoltageV)
  );
}
