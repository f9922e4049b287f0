import { SpecSchema, type Spec, type SpecInput } from '../../solvers/spec/spec-schema.js';

type Overrides = Partial<Omit<SpecInput, 'topology'>>;

/**
 * Invented scenario: a 36–72 V telecom-style input, 12 V 2 A output, 100 kHz, with a diode
 * rectifier and realistic drops. Not any product; numbers chosen only to be plausible.
 */
export function telecomSpec(overrides: Overrides = {}): Spec {
  return SpecSchema.parse({
    topology: 'flyback',
    inputVoltageMinV: 36,
    inputVoltageNominalV: 48,
    inputVoltageMaxV: 72,
    outputs: [
      {
        voltageV: 12,
        currentA: 2,
        rectifier: { kind: 'diode', forwardVoltageV: 0.45, resistanceOhm: 0.02 },
        windingResistanceOhm: 0.006,
      },
    ],
    switchingFrequencyHz: 100e3,
    primarySwitch: { onResistanceOhm: 0.05, voltageRatingV: 200 },
    transformer: { primaryResistanceOhm: 0.06 },
    ...overrides,
  });
}

/**
 * Invented scenario: a 120–375 V DC bus (offline-ish), 24 V 1 A output, 65 kHz, with a
 * recovering diode. Not any product; numbers chosen only to be plausible.
 */
export function busSpec(overrides: Overrides = {}): Spec {
  return SpecSchema.parse({
    topology: 'flyback',
    inputVoltageMinV: 120,
    inputVoltageNominalV: 325,
    inputVoltageMaxV: 375,
    outputs: [
      {
        voltageV: 24,
        currentA: 1,
        rectifier: {
          kind: 'diode',
          forwardVoltageV: 0.7,
          resistanceOhm: 0.05,
          voltageRatingV: 200,
          reverseRecoveryChargeC: 30e-9,
        },
        windingResistanceOhm: 0.03,
      },
    ],
    switchingFrequencyHz: 65e3,
    primarySwitch: { onResistanceOhm: 0.9, voltageRatingV: 800, outputCapacitanceF: 60e-12 },
    transformer: { primaryResistanceOhm: 0.6 },
    ...overrides,
  });
}

/**
 * The telecom scenario with every drop and the leakage removed (the switch keeps 1 nΩ, since
 * the schema asks for a positive on-resistance), for the textbook lossless relations.
 */
export function losslessSpec(overrides: Overrides = {}): Spec {
  return telecomSpec({
    outputs: [
      {
        voltageV: 12,
        currentA: 2,
        rectifier: { kind: 'diode', forwardVoltageV: 0, resistanceOhm: 0 },
        windingResistanceOhm: 0,
        capacitorEsrOhm: 0,
      },
    ],
    primarySwitch: { onResistanceOhm: 1e-9, voltageRatingV: 400, outputCapacitanceF: 0 },
    transformer: { primaryResistanceOhm: 0, leakageInductanceH: 0 },
    ...overrides,
  });
}
