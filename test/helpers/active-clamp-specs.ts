import { SpecSchema, type Spec, type SpecInput } from '../../solvers/spec/spec-schema.js';

type Overrides = Partial<Omit<SpecInput, 'topology'>>;

/**
 * Invented scenario: a 36–72 V telecom-style input, 12 V 8 A output, 200 kHz, active-clamp
 * forward with a diode rectifier, aiming at D = 0.6 at the lowest input (above the 0.5 a clamp-
 * diode forward could reach). Not any product; numbers chosen only to be plausible.
 */
export function activeClampTelecomSpec(overrides: Overrides = {}): Spec {
  return SpecSchema.parse({
    topology: 'active-clamp-forward',
    inputVoltageMinV: 36,
    inputVoltageNominalV: 48,
    inputVoltageMaxV: 72,
    outputs: [
      {
        voltageV: 12,
        currentA: 8,
        rectifier: {
          kind: 'diode',
          forwardVoltageV: 0.5,
          resistanceOhm: 0.01,
          voltageRatingV: 100,
        },
      },
    ],
    switchingFrequencyHz: 200e3,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 150 },
    targets: { dutyCycleTarget: 0.6 },
    // The converter model alone: tests of its choice rules hold the transformer as given.
    magnetics: { mode: 'assume' },
    ...overrides,
  });
}

/**
 * The telecom scenario with every drop and the dead time removed (the switches keep 1 nΩ) and
 * ideal switches without capacitance, so no turn-off swing.
 */
export function activeClampLosslessSpec(overrides: Overrides = {}): Spec {
  return activeClampTelecomSpec({
    outputs: [
      {
        voltageV: 12,
        currentA: 8,
        rectifier: { kind: 'diode', forwardVoltageV: 0, resistanceOhm: 0 },
        windingResistanceOhm: 0,
        inductorResistanceOhm: 0,
        capacitorEsrOhm: 0,
      },
    ],
    primarySwitch: { onResistanceOhm: 1e-9, voltageRatingV: 400, outputCapacitanceF: 0 },
    transformer: { primaryResistanceOhm: 0, leakageInductanceH: 0 },
    activeClamp: { capacitorEsrOhm: 0, deadTimeS: 0 },
    ...overrides,
  });
}

/**
 * The telecom scenario for the ngspice comparison: 100 µF of output capacitance, so that the
 * output filter settles in fewer simulated periods, and the given leakage (H). Invented.
 */
export function activeClampSimulationSpec(leakageInductanceH: number): Spec {
  return activeClampTelecomSpec({
    outputs: [
      {
        voltageV: 12,
        currentA: 8,
        capacitanceF: 100e-6,
        rectifier: {
          kind: 'diode',
          forwardVoltageV: 0.5,
          resistanceOhm: 0.01,
          voltageRatingV: 100,
        },
      },
    ],
    transformer: { leakageInductanceH },
  });
}
