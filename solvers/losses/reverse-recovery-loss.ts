/**
 * Returns the reverse-recovery power of a rectifier, W: Qrr·Vr·fs, the recovered charge Qrr (C)
 * pulled through the reverse voltage Vr (V) at each turn-off, at fs (Hz).
 * ref: Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed., §4.3.2, diode recovered
 * charge (from memory).
 */
export function reverseRecoveryLoss(
  recoveryChargeC: number,
  reverseVoltageV: number,
  frequencyHz: number,
): number {
  return recoveryChargeC * reverseVoltageV * frequencyHz;
}
