import { SpecSchema, type Spec, type SpecInput } from '../../solvers/spec/spec-schema.js';
import { SCAN_DIODE_RECTIFIER } from './scan-specs.js';

type Overrides = Partial<Omit<SpecInput, 'topology'>>;

/**
 * Invented scenario: a 36–72 V telecom-style input, 12 V 8 A output, 100 kHz, two-switch forward
 * with a diode rectifier. Not any product; numbers chosen only to be plausible.
 */
export function forwardTelecomSpec(overrides: Overrides = {}): Spec {
  return SpecSchema.parse({
    topology: 'two-switch-forward',
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
    switchingFrequencyHz: 100e3,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 100 },
    // The converter model alone: tests of its choice rules hold the transformer as given.
    magnetics: { mode: 'assume' },
    ...overrides,
  });
}

/**
 * Invented scenario: a 400 V bus (330–420 V), 24 V 10 A output, 80 kHz, two-switch forward with a
 * recovering diode. Not any product; numbers chosen only to be plausible.
 */
export function forwardBusSpec(overrides: Overrides = {}): Spec {
  return SpecSchema.parse({
    topology: 'two-switch-forward',
    inputVoltageMinV: 330,
    inputVoltageNominalV: 400,
    inputVoltageMaxV: 420,
    outputs: [
      {
        voltageV: 24,
        currentA: 10,
        rectifier: {
          kind: 'diode',
          forwardVoltageV: 0.7,
          resistanceOhm: 0.01,
          voltageRatingV: 200,
          reverseRecoveryChargeC: 30e-9,
        },
      },
    ],
    switchingFrequencyHz: 80e3,
    primarySwitch: { onResistanceOhm: 0.4, voltageRatingV: 500, outputCapacitanceF: 80e-12 },
    transformer: { primaryResistanceOhm: 0.3 },
    ...overrides,
  });
}

/**
 * The telecom scenario with every drop removed (the switch keeps 1 nΩ, as the schema asks) and
 * ideal switches without capacitance, so no turn-off swing.
 */
export function forwardLosslessSpec(overrides: Overrides = {}): Spec {
  return forwardTelecomSpec({
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
    primarySwitch: { onResistanceOhm: 1e-9, voltageRatingV: 200, outputCapacitanceF: 0 },
    transformer: { primaryResistanceOhm: 0, leakageInductanceH: 0 },
    primaryClampDiode: { forwardVoltageV: 0 },
    ...overrides,
  });
}

/**
 * The telecom scenario as a forward with a reset winding of Nr/Np = `resetTurnsRatio`, a 250 V
 * switch (it blocks Vin·(1 + Np/Nr)), and the given overrides. Invented, as the others.
 */
export function resetWindingSpec(resetTurnsRatio: number, overrides: Overrides = {}): Spec {
  const base = forwardTelecomSpec({
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 250 },
    ...overrides,
  });
  return SpecSchema.parse({
    ...base,
    topology: 'forward-reset-winding',
    forward: { resetTurnsRatio },
  });
}

/**
 * Invented scenario: the telecom input (36–72 V) with two outputs, 12 V 8 A and a 5 V 2 A
 * auxiliary, 200 kHz, 0.5 µH of leakage, loads of 10, 50 and 100 %: at 10 % both output
 * inductors run discontinuous. `topology` is any of the forward family (a 200 V switch, which
 * the reset winding's Vin·(1 + Np/Nr) needs). Not any product.
 */
export function twoOutputForwardSpec(
  topology: 'two-switch-forward' | 'forward-reset-winding' | 'active-clamp-forward',
): Spec {
  const rectifier = SCAN_DIODE_RECTIFIER;
  return SpecSchema.parse({
    topology,
    inputVoltageMinV: 36,
    inputVoltageNominalV: 48,
    inputVoltageMaxV: 72,
    outputs: [
      // 100 µF each, so that the outputs settle in fewer simulated periods.
      { voltageV: 12, currentA: 8, capacitanceF: 100e-6, rectifier },
      { voltageV: 5, currentA: 2, capacitanceF: 100e-6, rectifier },
    ],
    switchingFrequencyHz: 200e3,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 200 },
    loadFractions: [0.1, 0.5, 1],
    magnetics: { mode: 'assume' },
    transformer: { leakageInductanceH: 0.5e-6 },
  });
}

/** The high-input scenario's output: 12 V, 5 A, 100 µF, a 0.5 V diode of 10 mΩ (invented). */
const HIGH_INPUT_OUTPUT = {
  voltageV: 12,
  currentA: 5,
  capacitanceF: 100e-6,
  rectifier: { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01, voltageRatingV: 100 },
} as const;

/**
 * Invented scenario for the ngspice comparison at a high input: a 200–400 V input, 12 V output
 * (5 A unless overridden) with 100 µF, 200 kHz, switches of 100 pF, full and half load. There the
 * drain's swing at turn-off is a visible share of the on-time. Not any product.
 */
export function forwardHighInputSpec(
  topology: 'two-switch-forward' | 'forward-reset-winding' | 'active-clamp-forward',
  overrides: Overrides = {},
): Spec {
  return SpecSchema.parse({
    topology,
    inputVoltageMinV: 200,
    inputVoltageNominalV: 300,
    inputVoltageMaxV: 400,
    outputs: [HIGH_INPUT_OUTPUT],
    switchingFrequencyHz: 200e3,
    primarySwitch: { onResistanceOhm: 0.3, voltageRatingV: 1200, outputCapacitanceF: 100e-12 },
    loadFractions: [0.5, 1],
    magnetics: { mode: 'assume' },
    transformer: { leakageInductanceH: 0 },
    ...overrides,
  });
}

/**
 * {@link forwardHighInputSpec} as the 400 V netlist comparisons take it (invented, not any
 * product): its output at `currentA`, 250 kHz; `overrides` on top (load fractions, say).
 */
export function forward400VComparisonSpec(
  topology: 'two-switch-forward' | 'forward-reset-winding',
  currentA: number,
  overrides: Overrides = {},
): Spec {
  return forwardHighInputSpec(topology, {
    outputs: [{ ...HIGH_INPUT_OUTPUT, currentA }],
    switchingFrequencyHz: 250e3,
    ...overrides,
  });
}

/**
 * Invented scenario (not any product): {@link forwardHighInputSpec} (200–400 V, 200 kHz,
 * switches of 100 pF) with two outputs, 12 V 5 A and a 5 V 2 A auxiliary, 100 µF each;
 * `overrides` on top (load fractions, say). At a few percent load both inductors run
 * discontinuous and the ring of Lm with the node returns while they are low.
 */
export function twoOutputHighInputSpec(
  topology: 'two-switch-forward' | 'forward-reset-winding',
  overrides: Overrides = {},
): Spec {
  return forwardHighInputSpec(topology, {
    outputs: [HIGH_INPUT_OUTPUT, { ...HIGH_INPUT_OUTPUT, voltageV: 5, currentA: 2 }],
    ...overrides,
  });
}

/**
 * Invented scenario (not any product): {@link twoOutputHighInputSpec} with a third output,
 * 24 V 0.5 A, its rectifier rated 200 V (it blocks about 134 V at 400 V); `overrides` on top.
 */
export function threeOutputHighInputSpec(
  topology: 'two-switch-forward' | 'forward-reset-winding',
  overrides: Overrides = {},
): Spec {
  return forwardHighInputSpec(topology, {
    outputs: [
      HIGH_INPUT_OUTPUT,
      { ...HIGH_INPUT_OUTPUT, voltageV: 5, currentA: 2 },
      {
        ...HIGH_INPUT_OUTPUT,
        voltageV: 24,
        currentA: 0.5,
        rectifier: { ...HIGH_INPUT_OUTPUT.rectifier, voltageRatingV: 200 },
      },
    ],
    ...overrides,
  });
}

/**
 * Invented scenario (not any product): {@link forwardHighInputSpec} (200–400 V, 12 V, switches
 * of 100 pF) with 10 µH of leakage, 30 mΩ switches, 210 kHz and the output at `currentA`, loads
 * 20 and 100 %: the audit of 2026-12-05's hard-reset forwards in round numbers (seed 53, specs 0
 * and 19 of `ngspice-scan.ts --input high`), where the leakage's spike at turn-off carries the
 * drain to the clamp at 400 V and full load.
 */
export function leakyHighInputSpec(
  topology: 'two-switch-forward' | 'forward-reset-winding',
  currentA: number,
  overrides: Overrides = {},
): Spec {
  return forwardHighInputSpec(topology, {
    outputs: [{ ...HIGH_INPUT_OUTPUT, currentA }],
    switchingFrequencyHz: 210e3,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 1200, outputCapacitanceF: 100e-12 },
    transformer: { leakageInductanceH: 10e-6 },
    loadFractions: [0.2, 1],
    ...overrides,
  });
}
