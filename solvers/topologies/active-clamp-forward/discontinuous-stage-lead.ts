import type { DeadTimeSwing } from './dead-time-swing.js';

/**
 * Returns the equivalent lead (s) of a discontinuous output stage over the dead time's swing below
 * Vin: the winding's area above the stage's rectifier threshold `thresholdV` = n·(Vo + Vf)
 * (primary-referred, V) over the on-interval's headroom Vp − n·(Vo + Vf). Its inductor carries
 * nothing until the ramping winding passes the threshold, so only that area lifts its current
 * before the gate, where Lm and a continuous stage take the whole area over Vin. The ramp is
 * linear from zero to the winding's voltage at the gate (Vin − the drain's), then any body-diode
 * interval, over which the circuit is the on-state's and counts whole; the part of a triangle
 * above a level scales with the square of its height there (similar triangles).
 */
export function discontinuousStageLeadS(
  swing: DeadTimeSwing,
  inputVoltageV: number,
  thresholdV: number,
  onVoltageV: number,
): number {
  const headroomV = onVoltageV - thresholdV;
  if (!(headroomV > 0)) return 0;
  const rampVs = swing.positiveVoltSecondsVs - inputVoltageV * swing.bodyDiodeS;
  const rampTopV = swing.bodyDiodeS > 0 ? inputVoltageV : inputVoltageV - swing.turnOnVoltageV;
  let aboveVs = 0;
  if (rampTopV > thresholdV && rampVs > 0) {
    const fraction = 1 - thresholdV / rampTopV;
    aboveVs += rampVs * fraction * fraction;
  }
  // Over the body diode's conduction the circuit is the on-state's: the stage sees its on-voltage.
  return aboveVs / headroomV + swing.bodyDiodeS;
}
