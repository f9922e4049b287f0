/** What the dead time before turn-on does to the winding and the drain (SI units). */
export interface DeadTimeSwing {
  /** ∫ of the winding voltage while it is below zero, V·s (a magnitude): it adds to the reset. */
  negativeVoltSecondsVs: number;
  /** ∫ of the winding voltage while it is above zero, V·s: it adds to the on-time. */
  positiveVoltSecondsVs: number;
  /** Drain voltage when the gate turns on, V (0: zero-voltage turn-on). */
  turnOnVoltageV: number;
  /** Time the main switch's body diode conducts before the gate, s. */
  bodyDiodeS: number;
}

/**
 * Returns the drain's swing in the dead time before turn-on, at constant currents (Lm ≫ the
 * swing's L·C): the negative magnetizing current |Im,v| carries the switch capacitance C from
 * Vin + Vc down to Vin (winding −Vc → 0); there the output inductors hold the winding at zero if
 * they carry more (ΣIv/n + Im,v ≥ 0); otherwise the rest |ΣIv/n + Im,v| carries the drain on to
 * zero (winding 0 → Vin), where the body diode conducts and the winding sees Vin. The areas of
 * that linear swing are exact for it (common practice (from memory): the resonant transition of
 * an active clamp, taken with the inductor current constant).
 */
export function deadTimeSwing(
  inputVoltageV: number,
  clampVoltageV: number,
  magnetizingValleyA: number,
  heldA: number,
  capacitanceF: number,
  deadTimeS: number,
): DeadTimeSwing {
  const vin = inputVoltageV;
  const vc = clampVoltageV;
  if (!(magnetizingValleyA < 0)) {
    // No current to move the drain: the winding stays at −Vc (the aux's body diode holds it).
    return {
      negativeVoltSecondsVs: vc * deadTimeS,
      positiveVoltSecondsVs: 0,
      turnOnVoltageV: vin + vc,
      bodyDiodeS: 0,
    };
  }
  const fallS = (capacitanceF * vc) / -magnetizingValleyA;
  const firstS = Math.min(deadTimeS, fallS);
  const negativeVoltSecondsVs = fallS > 0 ? vc * firstS * (1 - firstS / (2 * fallS)) : 0;
  if (deadTimeS <= fallS) {
    return {
      negativeVoltSecondsVs,
      positiveVoltSecondsVs: 0,
      // Without dead time (and so, here, without capacitance) the drain has not moved.
      turnOnVoltageV: deadTimeS > 0 ? vin + vc * (1 - deadTimeS / fallS) : vin + vc,
      bodyDiodeS: 0,
    };
  }
  const restS = deadTimeS - fallS;
  if (heldA >= 0) {
    return { negativeVoltSecondsVs, positiveVoltSecondsVs: 0, turnOnVoltageV: vin, bodyDiodeS: 0 };
  }
  const dropS = (capacitanceF * vin) / -heldA;
  const secondS = Math.min(restS, dropS);
  const bodyDiodeS = Math.max(0, restS - dropS);
  return {
    negativeVoltSecondsVs,
    positiveVoltSecondsVs:
      (dropS > 0 ? (vin * secondS * secondS) / (2 * dropS) : 0) + vin * bodyDiodeS,
    turnOnVoltageV: dropS > 0 ? vin * (1 - secondS / dropS) : 0,
    bodyDiodeS,
  };
}
