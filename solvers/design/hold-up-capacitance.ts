/** What sizes a hold-up capacitor: the power it supplies, for how long, between which voltages. */
export interface HoldUpDuty {
  powerW: number;
  timeS: number;
  startVoltageV: number;
  endVoltageV: number;
}

/**
 * Returns the capacitance, F, that supplies `powerW` for `timeS` while its voltage falls from
 * `startVoltageV` to `endVoltageV`: C = 2·P·t / (Vstart² − Vend²).
 * @throws RangeError unless 0 < endVoltageV < startVoltageV, powerW ≥ 0 and timeS ≥ 0.
 */
export function holdUpCapacitance({
  powerW,
  timeS,
  startVoltageV,
  endVoltageV,
}: HoldUpDuty): number {
  if (!(endVoltageV > 0 && startVoltageV > endVoltageV && powerW >= 0 && timeS >= 0)) {
    throw new RangeError(
      `holdUpCapacitance: needs 0 < end < start, P ≥ 0, t ≥ 0 (got end ${endVoltageV} V, start ${startVoltageV} V, P ${powerW} W, t ${timeS} s)`,
    );
  }
  // The energy drawn, P·t, is what the capacitor gives up between the two voltages:
  // ½·C·Vstart² − ½·C·Vend² (stored energy of a capacitor, ½·C·V²; common practice).
  return (2 * powerW * timeS) / (startVoltageV ** 2 - endVoltageV ** 2);
}
