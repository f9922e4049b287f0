/**
 * Returns the gate-drive power of one MOSFET-class switch, W: Qg·Vdrive·fs with the total gate
 * charge Qg (C) at the drive voltage (V), at fs (Hz); all of it ends as heat in the drive path.
 * ref: common practice.
 */
export function gateDriveLoss(
  gateChargeC: number,
  driveVoltageV: number,
  frequencyHz: number,
): number {
  return gateChargeC * driveVoltageV * frequencyHz;
}
