import { deadTimeSwing, type DeadTimeSwing } from './dead-time-swing.js';

/** The dead time before turn-on with the output inductors' current at the swing's start (SI units). */
export interface DeadTimeSwingHeld {
  swing: DeadTimeSwing;
  /** Σ iL/n + Im,v as the drain passes Vin, A: what carries it below Vin (negative), or holds it. */
  heldA: number;
}

const BISECTIONS = 60;

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
 * drain at 41 V at the gate against the engine's 6 V, the outputs 2 % below the engine's with the
 * deck's snubbers at 1 pF). The held current depends on L and L on it: bisection on
 * L = lead(ΣIv/n + Im,v + slope·(td − tf − L)) over [0, td − tf], whose left side rises from zero
 * and whose right side stays within it.
 */
export function deadTimeSwingHeld(
  inputVoltageV: number,
  clampVoltageV: number,
  magnetizingValleyA: number,
  valleyHeldA: number,
  freewheelSlopeAPerS: number,
  capacitanceF: number,
  deadTimeS: number,
): DeadTimeSwingHeld {
  const at = (leadS: number, restS: number): DeadTimeSwingHeld => {
    const heldA = valleyHeldA + freewheelSlopeAPerS * Math.max(0, restS - leadS);
    const swing = deadTimeSwing(
      inputVoltageV,
      clampVoltageV,
      magnetizingValleyA,
      heldA,
      capacitanceF,
      deadTimeS,
    );
    return { swing, heldA };
  };
  const fallS =
    magnetizingValleyA < 0 ? (capacitanceF * clampVoltageV) / -magnetizingValleyA : Infinity;
  const restS = deadTimeS - fallS;
  // No swing below Vin (the drain never reaches it, or the inductors hold it even at the valley,
  // where they carry least): the valley's answer is the answer.
  if (!(restS > 0) || !(valleyHeldA < 0) || !(freewheelSlopeAPerS > 0)) return at(restS, restS);
  let lo = 0;
  let hi = restS;
  for (let i = 0; i < BISECTIONS && hi - lo > 1e-12 * restS; i++) {
    const mid = (lo + hi) / 2;
    const leadS = at(mid, restS).swing.positiveVoltSecondsVs / inputVoltageV;
    if (leadS > mid) lo = mid;
    else hi = mid;
  }
  return at(hi, restS);
}
