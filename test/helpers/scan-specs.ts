import { SpecSchema, TOPOLOGY_IDS, type Spec } from '../../solvers/index.js';

/** The scan's diode rectifier: 0.5 V and 10 mΩ, rated 100 V (invented). */
export const SCAN_DIODE_RECTIFIER = {
  kind: 'diode',
  forwardVoltageV: 0.5,
  resistanceOhm: 0.01,
  voltageRatingV: 100,
} as const;

/**
 * A spec as `test/bench/ngspice-scan.ts` draws it (invented by the scan, not any product): diode
 * rectifiers of 0.5 V and 10 mΩ, 30 mΩ switches rated three times the highest input, 100 µF on
 * every output, loads `lightLoad` and 1, the transformer assumed; `outputs` as [voltage, current].
 */
export function scanDrawnSpec(
  topology: (typeof TOPOLOGY_IDS)[number],
  input: [number, number, number],
  outputs: Array<[number, number]>,
  switchingFrequencyHz: number,
  lightLoad: number,
  leakageInductanceH: number,
): Spec {
  const rectifier = SCAN_DIODE_RECTIFIER;
  return SpecSchema.parse({
    topology,
    inputVoltageMinV: input[0],
    inputVoltageNominalV: input[1],
    inputVoltageMaxV: input[2],
    outputs: outputs.map(([voltageV, currentA]) => ({
      voltageV,
      currentA,
      capacitanceF: 100e-6,
      rectifier,
    })),
    switchingFrequencyHz,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: input[2] * 3 },
    loadFractions: [lightLoad, 1],
    magnetics: { mode: 'assume' },
    transformer: { leakageInductanceH },
  });
}
