import { SpecSchema, type Spec, type SpecInput } from '../../solvers/spec/spec-schema.js';

type Overrides = Partial<Omit<SpecInput, 'topology'>>;

/**
 * Invented scenario: an 18–36 V vehicle-style input, 12 V 10 A output, 100 kHz push-pull with a
 * center-tapped Schottky-class diode rectifier. Not any product; numbers chosen to be plausible.
 */
export function pushPullSpec(overrides: Overrides = {}): Spec {
  return SpecSchema.parse({
    topology: 'push-pull',
    inputVoltageMinV: 18,
    inputVoltageNominalV: 24,
    inputVoltageMaxV: 36,
    outputs: [
      {
        voltageV: 12,
        currentA: 10,
        rectifier: {
          kind: 'diode',
          forwardVoltageV: 0.45,
          resistanceOhm: 0.01,
          voltageRatingV: 100,
        },
      },
    ],
    switchingFrequencyHz: 100e3,
    primarySwitch: { onResistanceOhm: 0.01, voltageRatingV: 100 },
    transformer: { primaryResistanceOhm: 0.01 },
    ...overrides,
  });
}

/**
 * Invented scenario: a 400 V bus (360–410 V), 24 V 20 A output, 100 kHz half bridge with a
 * center-tapped recovering diode rectifier. Not any product; numbers chosen to be plausible.
 */
export function halfBridgeSpec(overrides: Overrides = {}): Spec {
  return SpecSchema.parse({
    topology: 'half-bridge',
    inputVoltageMinV: 360,
    inputVoltageNominalV: 390,
    inputVoltageMaxV: 410,
    outputs: [
      {
        voltageV: 24,
        currentA: 20,
        rectifier: {
          kind: 'diode',
          forwardVoltageV: 0.7,
          resistanceOhm: 0.01,
          voltageRatingV: 200,
          reverseRecoveryChargeC: 30e-9,
        },
      },
    ],
    switchingFrequencyHz: 100e3,
    primarySwitch: { onResistanceOhm: 0.2, voltageRatingV: 500, outputCapacitanceF: 150e-12 },
    transformer: { primaryResistanceOhm: 0.1 },
    ...overrides,
  });
}

/**
 * Invented scenario: a 300–400 V input, 48 V 10 A output through a full-bridge rectifier, 100 kHz
 * full bridge. Not any product; numbers chosen only to be plausible.
 */
export function fullBridgeSpec(overrides: Overrides = {}): Spec {
  return SpecSchema.parse({
    topology: 'full-bridge',
    inputVoltageMinV: 300,
    inputVoltageNominalV: 360,
    inputVoltageMaxV: 400,
    outputs: [
      {
        voltageV: 48,
        currentA: 10,
        secondaryArrangement: 'full-bridge',
        rectifier: {
          kind: 'diode',
          forwardVoltageV: 0.8,
          resistanceOhm: 0.01,
          voltageRatingV: 150,
          reverseRecoveryChargeC: 20e-9,
        },
        windingResistanceOhm: 0.02,
      },
    ],
    switchingFrequencyHz: 100e3,
    primarySwitch: { onResistanceOhm: 0.25, voltageRatingV: 500, outputCapacitanceF: 100e-12 },
    transformer: { primaryResistanceOhm: 0.1 },
    ...overrides,
  });
}

/**
 * The same invented scenario as `base` with every drop and the leakage removed (the switch keeps
 * 1 nΩ, as the schema asks), and the given secondary arrangement.
 */
export function losslessDoubleEnded(
  base: (overrides: Overrides) => Spec,
  arrangement: 'center-tapped' | 'full-bridge',
  overrides: Overrides = {},
): Spec {
  const spec = base({});
  const output = spec.outputs[0];
  return base({
    outputs: [
      {
        voltageV: output?.voltageV ?? 12,
        currentA: output?.currentA ?? 1,
        secondaryArrangement: arrangement,
        rectifier: { kind: 'diode', forwardVoltageV: 0, resistanceOhm: 0 },
        windingResistanceOhm: 0,
        inductorResistanceOhm: 0,
        capacitorEsrOhm: 0,
      },
    ],
    // No drain capacitance: the textbook relations leave out the switch-node ring.
    primarySwitch: { onResistanceOhm: 1e-9, voltageRatingV: 1000, outputCapacitanceF: 0 },
    transformer: { primaryResistanceOhm: 0, leakageInductanceH: 0 },
    // Textbook relations hold the transformer ideal, as given: no designed windings.
    magnetics: { mode: 'assume' },
    ...overrides,
  });
}

/**
 * Invented scenario (as `test/bench/ngspice-scan.ts` draws them): a half bridge on 36–72 V or a
 * full bridge on 18–36 V (18 V of drive at the lowest input either way), 12 V 5.7 A, 227 kHz,
 * diode rectifiers of 0.5 V and 10 mΩ, switches of 30 mΩ, 1 µH of leakage, the converter's own
 * Lm: at the lowest input and full load the leakage's turn-off decay outlasts the off-time.
 */
export function leakyLowInputBridgeSpec(
  topology: 'half-bridge' | 'full-bridge',
  overrides: Overrides = {},
): Spec {
  const vin = topology === 'half-bridge' ? [36, 48, 72] : [18, 24, 36];
  return SpecSchema.parse({
    topology,
    inputVoltageMinV: vin[0],
    inputVoltageNominalV: vin[1],
    inputVoltageMaxV: vin[2],
    outputs: [
      {
        voltageV: 12,
        currentA: 5.7,
        capacitanceF: 100e-6,
        rectifier: {
          kind: 'diode',
          forwardVoltageV: 0.5,
          resistanceOhm: 0.01,
          voltageRatingV: 100,
        },
      },
    ],
    switchingFrequencyHz: 227e3,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 3 * (vin[2] ?? 0) },
    loadFractions: [0.5, 1],
    magnetics: { mode: 'assume' },
    transformer: { leakageInductanceH: 1e-6 },
    ...overrides,
  });
}

/**
 * Invented scenario (a random scan's spec, not any product: `ngspice-scan.ts --topologies
 * push-pull,half-bridge,full-bridge --seed 23`, spec 0): a 200–400 V push-pull with 10 µH of
 * leakage a half and 100 pF switches, 12 V at 4.28 A, 188.6 kHz, the transformer assumed, at
 * `loadFraction` and full load. Its 400 V light-load corner is the one whose drains ring behind
 * the leakage (DEVELOPERS.md, "The push-pull's leaky light-load half").
 */
export function leakyHighInputPushPullSpec(loadFraction: number): Spec {
  return SpecSchema.parse({
    topology: 'push-pull',
    inputVoltageMinV: 200,
    inputVoltageNominalV: 300,
    inputVoltageMaxV: 400,
    outputs: [
      {
        voltageV: 12,
        currentA: 4.276219069957733,
        capacitanceF: 100e-6,
        rectifier: {
          kind: 'diode',
          forwardVoltageV: 0.5,
          resistanceOhm: 0.01,
          voltageRatingV: 100,
        },
      },
    ],
    switchingFrequencyHz: 188603.81841659546,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 1200 },
    loadFractions: [loadFraction, 1],
    magnetics: { mode: 'assume' },
    transformer: { leakageInductanceH: 10e-6 },
  });
}
