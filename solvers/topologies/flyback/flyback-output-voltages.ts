import type { FlybackCircuit } from './flyback-circuit.js';
import type { CurrentStats } from './flyback-current-stats.js';

/** The charge-weighted reflected voltage and the output voltages of one corner. */
export interface FlybackOutputVoltages {
  /** W = V0 + Rs·⟨i'²⟩/⟨i'⟩: the reflected voltage weighted by the secondary charge, V. */
  reflectedVoltageV: number;
  /** Voltage of each output, V. */
  outputVoltagesV: number[];
}

/**
 * Returns each output's voltage at the corner: output 0 is regulated and exact; output k > 0 is
 * the cross-regulation estimate of the lumped model, W/nk minus its own rectifier, winding and
 * capacitor-ESR drops (Vfk + (Rk + ESRk)·⟨ik²⟩/⟨ik⟩ − ESRk·Ik). The charge weighting keeps
 * Σ (Vk·Ik + drops) equal to the power the magnetizing inductance hands over, so the energy
 * balance of the corner stays exact.
 */
export function flybackOutputVoltages(
  circuit: FlybackCircuit,
  regulatedVoltageV: number,
  referredSecondaryA: CurrentStats,
): FlybackOutputVoltages {
  const meanA = referredSecondaryA.averageA;
  const meanSquareA2 = referredSecondaryA.rmsA ** 2;
  const reflectedVoltageV =
    circuit.reflectedOffsetV + (circuit.reflectedResistanceOhm * meanSquareA2) / meanA;
  const outputVoltagesV = circuit.outputs.map((path, k) => {
    if (k === 0) return regulatedVoltageV;
    const resistanceOhm =
      path.rectifierResistanceOhm + path.windingResistanceOhm + path.capacitorEsrOhm;
    const share = path.currentShare;
    return (
      reflectedVoltageV / path.turnsRatio -
      path.forwardVoltageV -
      (resistanceOhm * share * share * meanSquareA2) / path.currentA +
      path.capacitorEsrOhm * path.currentA
    );
  });
  return { reflectedVoltageV, outputVoltagesV };
}
