import { deadTimeSwing, type DeadTimeSwing } from './dead-time-swing.js';

/**
 * Returns the dead time's drain swing ({@link deadTimeSwing}) with the output inductors' current
 * taken where the drain passes Vin, not at the valley. The stages' valley ΣIv/n is their current
 * where conduction starts, the equivalent lead L (the swing's area below Vin over Vin) before the
 * gate; the swing below Vin starts earlier, at tf = C·Vc/|Im,v| into the dead time td, and the
 * stages freewheel down to the valley over td − tf − L at `freewheelSlopeAPerS` (Σ of their
 * primary-referred falls). While the drain swings below Vin the winding rises from zero towards
 * the secondary's on-voltage, so their current stays near its value there (for a swing ending at
 * φ·Vin their mean voltage is Vo·(φ/(2·D) − 1) at duty D, about zero where the scan's case met it).
 * Taking the valley instead gave the engine a net current some 0.04 A too large on an 0.11 A
 * swing (ngspice, the scan's 36–72 V active clamp, seed 31 spec 23 at 72 V and 18 % load: the
 * drain at 41 V at the gate against the engine's 6 V, the outputs 2.3 % below the engine's with
 * the deck's snubbers at 30 pF; now 0.3 %). The held current depends on L and L on it:
 * L = lead(ΣIv/n + Im,v + slope·(td − tf − L)), in closed form on the swing's branches
 * ({@link selfConsistentLeadS}).
 */
export function deadTimeSwingHeld(
  inputVoltageV: number,
  clampVoltageV: number,
  magnetizingValleyA: number,
  valleyHeldA: number,
  freewheelSlopeAPerS: number,
  capacitanceF: number,
  deadTimeS: number,
): DeadTimeSwing {
  return deadTimeSwing(
    inputVoltageV,
    clampVoltageV,
    magnetizingValleyA,
    heldCurrentAtVinA(
      inputVoltageV,
      clampVoltageV,
      magnetizingValleyA,
      valleyHeldA,
      freewheelSlopeAPerS,
      capacitanceF,
      deadTimeS,
    ),
    capacitanceF,
    deadTimeS,
  );
}

/**
 * Returns the net current ΣIv/n + Im,v (A) that {@link deadTimeSwingHeld} takes where the drain
 * passes Vin: the valley's, or more where the continuous stages freewheel down to their valley
 * after that point.
 */
export function heldCurrentAtVinA(
  inputVoltageV: number,
  clampVoltageV: number,
  magnetizingValleyA: number,
  valleyHeldA: number,
  freewheelSlopeAPerS: number,
  capacitanceF: number,
  deadTimeS: number,
): number {
  const fallS =
    magnetizingValleyA < 0 ? (capacitanceF * clampVoltageV) / -magnetizingValleyA : Infinity;
  const restS = deadTimeS - fallS;
  // No swing below Vin (the drain never reaches it, or the inductors hold it even at the valley,
  // where they carry least): the valley's answer is the answer.
  if (!(restS > 0 && valleyHeldA < 0 && freewheelSlopeAPerS > 0)) return valleyHeldA;
  const leadS = selfConsistentLeadS(
    -valleyHeldA,
    freewheelSlopeAPerS,
    restS,
    capacitanceF * inputVoltageV,
  );
  return valleyHeldA + freewheelSlopeAPerS * (restS - leadS);
}

/**
 * Returns the lead L (s) that solves L = lead(|h|), |h| = |H0| − s·(R − L), with CV = C·Vin. Where
 * |H0| ≤ s·R the inductors hold the drain as it passes Vin: L = 0. A partial swing (CV/|h| ≥ R)
 * gives L = R²·|h|/(2·CV), linear in L; a complete one (the body diode after it)
 * L = R − CV/(2·|h|), a quadratic in |h| (the larger root is the slope-free answer). L − lead is
 * continuous, at most 0 at L = 0 and at least 0 at L = R, so one of those branches holds; only
 * round-off at their boundary |h| = CV/R (L = R/2) can miss both.
 */
function selfConsistentLeadS(
  valleyA: number,
  slopeAPerS: number,
  restS: number,
  chargeC: number,
): number {
  const a = valleyA - slopeAPerS * restS;
  if (!(a > 0)) return 0;
  const k = (restS * restS) / (2 * chargeC);
  if (k * slopeAPerS < 1) {
    const leadS = (k * a) / (1 - k * slopeAPerS);
    if ((a + slopeAPerS * leadS) * restS <= chargeC) return leadS;
  }
  const discriminant = valleyA * valleyA - 2 * slopeAPerS * chargeC;
  if (discriminant >= 0) {
    for (const sign of [1, -1]) {
      const heldA = (valleyA + sign * Math.sqrt(discriminant)) / 2;
      if (heldA * restS >= chargeC) return restS - chargeC / (2 * heldA);
    }
  }
  return restS / 2;
}
