/** Which empirical relation {@link temperatureRise} uses, with its inputs (SI units). */
export type TemperatureRiseInput =
  | { method: 'surface-dissipation'; totalLossW: number; surfaceAreaM2: number }
  | { method: 'volume-thermal-resistance'; totalLossW: number; effectiveVolumeM3: number };

/**
 * Returns the temperature rise of a wound core above ambient, K (≥ 0), from its total loss:
 * 'surface-dissipation' by McLyman's ΔT = 450·ψ^0.826 with ψ = P/At in W/cm² (natural
 * convection); 'volume-thermal-resistance' by Rth = 53·Ve^−0.54 °C/W with Ve in cm³.
 */
export function temperatureRise(input: TemperatureRiseInput): number {
  if (input.method === 'surface-dissipation') {
    return surfaceRiseK(input.totalLossW, input.surfaceAreaM2);
  }
  checkLoss(input.totalLossW);
  if (!(input.effectiveVolumeM3 > 0)) throw new RangeError('temperatureRise: volume must be > 0');
  // ref: S. Maniktala, Switching Power Supplies A to Z, 2nd ed. (thermal resistance of a ferrite
  // transformer from its core volume, Ve in cm³, Rth in °C/W) (from memory).
  const volumeCm3 = input.effectiveVolumeM3 * 1e6;
  const thermalResistanceKPerW = 53 * volumeCm3 ** -0.54;
  return thermalResistanceKPerW * input.totalLossW;
}

/**
 * McLyman's surface-dissipation rise of `totalLossW` on `surfaceAreaM2`, K: `temperatureRise`'s
 * 'surface-dissipation' relation without its input object, for the loops that call it for every
 * corner and candidate (the evaluation's thermal fixed point, the core search's bounds).
 */
export function surfaceRiseK(totalLossW: number, surfaceAreaM2: number): number {
  checkLoss(totalLossW);
  if (!(surfaceAreaM2 > 0)) throw new RangeError('temperatureRise: area must be > 0');
  // ref: C. W. T. McLyman, Transformer and Inductor Design Handbook, 4th ed., ch. 6
  // (temperature rise versus surface dissipation; At in cm², ΔT in °C) (from memory).
  const surfaceAreaCm2 = surfaceAreaM2 * 1e4;
  return 450 * (totalLossW / surfaceAreaCm2) ** 0.826;
}

function checkLoss(totalLossW: number): void {
  if (!(totalLossW >= 0 && Number.isFinite(totalLossW))) {
    throw new RangeError(`temperatureRise: loss must be finite and ≥ 0, got ${totalLossW}`);
  }
}
