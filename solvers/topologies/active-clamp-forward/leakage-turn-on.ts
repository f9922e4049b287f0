/**
 * Returns the leakage current as the main gate turns on, A, when the leakage inductance L (H)
 * carries the magnetizing valley current Im,v (A) into the dead time before turn-on: the current
 * the turn-on commutation starts from (it rises at Vin/L to Im,v + ΣIv/n once the gate is on).
 * `restS` is the time from the drain's reaching Vin (winding at zero, the rectifiers both
 * conducting) to the gate, s. Over it the leakage, still at Im,v, carries the switch node's
 * capacitance C (F) on below Vin: a resonance of L and C (current Im,v·cos ωt, drain
 * Vin − |Im,v|·Z·sin ωt, Z = √(L/C), ω = 1/√(L·C); common practice (from memory): the
 * zero-voltage transition of a phase-shifted bridge or active clamp through the leakage). Where
 * the drain reaches zero, the main switch's body diode holds it and the current rises at Vin/L
 * until it reaches `capA` (zero, where the body diode stops; the held current ΣIv/n + Im,v where
 * the output inductors take less than |Im,v|). Where |Im,v|·Z < Vin the drain does not reach zero
 * and the current is taken to stop at zero after a quarter of the resonance (the ring beyond is
 * left out). Without negative current (Im,v ≥ 0) or time the current stays at Im,v.
 */
export function leakageCurrentAtTurnOn(
  inputVoltageV: number,
  magnetizingValleyA: number,
  capA: number,
  capacitanceF: number,
  leakageInductanceH: number,
  restS: number,
): number {
  const valleyA = magnetizingValleyA;
  if (!(valleyA < 0) || !(restS > 0) || !(leakageInductanceH > 0)) return valleyA;
  const vin = inputVoltageV;
  const l = leakageInductanceH;
  const a = -valleyA;
  const reached = Math.min(capA, 0);
  // The usual case first, without the trigonometry (this runs at every pass of the steady
  // state): the drop takes at most a quarter of the resonance and the rise at most |Im,v|·L/Vin.
  const quarterS = capacitanceF > 0 ? (Math.PI / 2) * Math.sqrt(l * capacitanceF) : 0;
  if (quarterS + (a * l) / vin <= restS) return Math.max(valleyA, reached);
  let currentA: number;
  if (!(capacitanceF > 0)) {
    // No capacitance: the body diode takes the current at once.
    currentA = -a + (vin * restS) / l;
  } else {
    const z = Math.sqrt(l / capacitanceF);
    const omega = 1 / Math.sqrt(l * capacitanceF);
    if (a * z > vin) {
      const dropS = Math.asin(vin / (a * z)) / omega;
      currentA =
        restS <= dropS
          ? -a * Math.cos(omega * restS)
          : -Math.sqrt(a * a - (vin / z) ** 2) + (vin * (restS - dropS)) / l;
    } else {
      currentA = -a * Math.cos(omega * Math.min(restS, Math.PI / (2 * omega)));
    }
  }
  return Math.max(valleyA, Math.min(currentA, reached));
}
