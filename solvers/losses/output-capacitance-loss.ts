/**
 * Returns the power lost by discharging a switch's output capacitance at turn-on, W:
 * ½·C·V²·fs with the energy-equivalent capacitance C (F) charged to V (V), at fs (Hz).
 * ref: Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed., §4.3.3, device
 * capacitances (from memory).
 */
export function outputCapacitanceLoss(
  capacitanceF: number,
  voltageV: number,
  frequencyHz: number,
): number {
  return 0.5 * capacitanceF * voltageV * voltageV * frequencyHz;
}
