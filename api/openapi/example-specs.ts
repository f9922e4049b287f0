import type { SpecInput } from '../../solvers/index.js';

/**
 * Invented scenarios for the documented examples (product rule 3): representative numbers for
 * generic device classes, no real product behind any of them.
 */
export const EXAMPLE_SPECS = {
  /** invented: auxiliary supply for a packaging machine, 36–72 V in, 12 V 2 A out. */
  packagingAux: {
    topology: 'flyback',
    inputVoltageMinV: 36,
    inputVoltageNominalV: 48,
    inputVoltageMaxV: 72,
    outputs: [
      {
        name: 'aux-12V',
        voltageV: 12,
        currentA: 2,
        rectifier: { kind: 'diode', forwardVoltageV: 0.5, voltageRatingV: 100 },
      },
    ],
    switchingFrequencyHz: 200e3,
    primarySwitch: { onResistanceOhm: 0.05, voltageRatingV: 200 },
  },
  /** invented: logic supply on a 24 V machine bus, 18–32 V in, 5 V 3 A out, synchronous. */
  logicSupply: {
    topology: 'flyback',
    inputVoltageMinV: 18,
    inputVoltageNominalV: 24,
    inputVoltageMaxV: 32,
    outputs: [
      {
        voltageV: 5,
        currentA: 3,
        rectifier: { kind: 'synchronous', onResistanceOhm: 0.01, voltageRatingV: 40 },
      },
    ],
    loadFractions: [0.25, 1],
    switchingFrequencyHz: 150e3,
    ambientTemperatureC: 50,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 150 },
  },
  /** invented: a 400 V bus supply for a conveyor drive's controls, 24 V 10 A out, two-switch forward. */
  conveyorControls: {
    topology: 'two-switch-forward',
    inputVoltageMinV: 330,
    inputVoltageNominalV: 400,
    inputVoltageMaxV: 420,
    outputs: [
      {
        name: 'controls-24V',
        voltageV: 24,
        currentA: 10,
        rectifier: {
          kind: 'diode',
          forwardVoltageV: 0.7,
          resistanceOhm: 0.01,
          voltageRatingV: 200,
        },
      },
    ],
    switchingFrequencyHz: 80e3,
    primarySwitch: { onResistanceOhm: 0.4, voltageRatingV: 500, outputCapacitanceF: 80e-12 },
    transformer: { primaryResistanceOhm: 0.3 },
  },
  /** invented: a 48 V rack supply for sensor heads, 12 V 4 A out, forward with a reset winding. */
  sensorRack: {
    topology: 'forward-reset-winding',
    inputVoltageMinV: 36,
    inputVoltageNominalV: 48,
    inputVoltageMaxV: 60,
    outputs: [
      {
        name: 'sensors-12V',
        voltageV: 12,
        currentA: 4,
        rectifier: {
          kind: 'diode',
          forwardVoltageV: 0.5,
          resistanceOhm: 0.01,
          voltageRatingV: 100,
        },
      },
    ],
    switchingFrequencyHz: 150e3,
    primarySwitch: { onResistanceOhm: 0.05, voltageRatingV: 200 },
    forward: { resetTurnsRatio: 1 },
  },
  /** invented: a 24 V vehicle-bus supply for a cab display, 18–36 V in, 12 V 10 A out, push-pull. */
  cabDisplay: {
    topology: 'push-pull',
    inputVoltageMinV: 18,
    inputVoltageNominalV: 24,
    inputVoltageMaxV: 36,
    outputs: [
      {
        name: 'display-12V',
        voltageV: 12,
        currentA: 10,
        secondaryArrangement: 'center-tapped',
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
  },
  /** invented: a 400 V bus supply for a test bench's loads, 24 V 20 A out, half bridge. */
  benchLoads: {
    topology: 'half-bridge',
    inputVoltageMinV: 360,
    inputVoltageNominalV: 390,
    inputVoltageMaxV: 410,
    outputs: [
      {
        name: 'loads-24V',
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
  },
  /** invented: a 300–400 V supply for a kiln controller, 48 V 10 A out, full bridge, bridge rectifier. */
  kilnController: {
    topology: 'full-bridge',
    inputVoltageMinV: 300,
    inputVoltageNominalV: 360,
    inputVoltageMaxV: 400,
    outputs: [
      {
        name: 'controller-48V',
        voltageV: 48,
        currentA: 10,
        secondaryArrangement: 'full-bridge',
        rectifier: {
          kind: 'diode',
          forwardVoltageV: 0.8,
          resistanceOhm: 0.01,
          voltageRatingV: 150,
        },
      },
    ],
    switchingFrequencyHz: 100e3,
    primarySwitch: { onResistanceOhm: 0.25, voltageRatingV: 500, outputCapacitanceF: 100e-12 },
    transformer: { primaryResistanceOhm: 0.1 },
  },
  /** invented: a 48 V telecom shelf's fan and logic supply, 36–72 V in, 12 V 8 A out, active clamp. */
  fanShelf: {
    topology: 'active-clamp-forward',
    inputVoltageMinV: 36,
    inputVoltageNominalV: 48,
    inputVoltageMaxV: 72,
    outputs: [
      {
        name: 'fans-12V',
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
  },
} satisfies Record<string, SpecInput>;

/** invented: the packaging-machine supply forced to a turns ratio of 6, too high for 36 V in. */
export const INFEASIBLE_SPEC: SpecInput = {
  ...EXAMPLE_SPECS.packagingAux,
  transformer: { turnsRatio: 6 },
};

/** invented: the packaging-machine supply with a negative output voltage and no frequency. */
export const INVALID_SPEC: unknown = {
  ...Object.fromEntries(
    Object.entries(EXAMPLE_SPECS.packagingAux).filter(([key]) => key !== 'switchingFrequencyHz'),
  ),
  outputs: [{ ...EXAMPLE_SPECS.packagingAux.outputs[0], voltageV: -12 }],
};

/**
 * invented: the packaging-machine supply wound on a material sent inline (numbers invented,
 * no product's data): the shape a design's spec has after a user material was filled in.
 */
export const INLINE_MATERIAL_SPEC: SpecInput = {
  ...EXAMPLE_SPECS.packagingAux,
  magnetics: {
    material: {
      id: 'invented-lab-ferrite',
      steinmetz: { k: 4, alpha: 1.35, beta: 2.55 },
      lossTemperatureFactor: { ct2: 0, ct1: 0, ct0: 1 },
      saturation: {
        lowTemperatureC: 25,
        lowFluxDensityT: 0.36,
        highTemperatureC: 100,
        highFluxDensityT: 0.36,
      },
      initialPermeability: 2000,
      initialPermeabilityTolerance: 0.25,
      frequencyMinHz: 50e3,
      frequencyMaxHz: 300e3,
    },
  },
};

/** invented: the packaging-machine supply naming a material id nothing has. */
export const UNKNOWN_MATERIAL_SPEC: SpecInput = {
  ...EXAMPLE_SPECS.packagingAux,
  magnetics: { materialId: 'no-such-material' },
};

/** invented: the packaging-machine supply wound on a PQ 20/16 pair named in the spec. */
export const PQ_CORE_SPEC: SpecInput = {
  ...EXAMPLE_SPECS.packagingAux,
  magnetics: { coreShape: 'PQ 20/16' },
};

/**
 * invented: the packaging-machine supply on an EFD 20/10/7 pair with its winding hot spot held
 * to 40 °C at a 25 °C ambient; that pair's windings run hotter inside (422 hot_spot_limit).
 */
export const HOT_SPOT_LIMIT_SPEC: SpecInput = {
  ...EXAMPLE_SPECS.packagingAux,
  magnetics: { coreShape: 'EFD 20/10/7', hotSpotTemperatureMaxC: 40 },
};

/**
 * invented: the fan-shelf supply with magnetics fixed in the spec (a build an earlier version
 * of its design chose): the transformer (core, material, primary turns; the wires left to the
 * engine) and the output inductor with its build and a
 * ground gap of 0.37 mm (the inductance follows from the gap); evaluated without a search.
 */
export const FIXED_INDUCTOR_SPEC: SpecInput = {
  ...EXAMPLE_SPECS.fanShelf,
  magnetics: {
    coreShape: 'PQ 20/20',
    materialId: 'mnzn-power-high-frequency',
    primaryTurns: 8,
    outputInductors: [
      {
        outputIndex: 0,
        coreShape: 'PQ 20/20',
        materialId: 'mnzn-power-high-frequency',
        turns: 9,
        wire: { kind: 'litz', strandAwg: 28, strandCount: 23 },
        gapLengthM: 0.37e-3,
      },
    ],
  },
};

/**
 * invented: the fan-shelf supply on a PQ 20/20 pair with both windings fixed as copper foil
 * across the window's breadth (0.1 mm primary, 0.15 mm secondary, 50 µm film when omitted).
 */
export const FOIL_WINDING_SPEC: SpecInput = {
  ...EXAMPLE_SPECS.fanShelf,
  magnetics: {
    coreShape: 'PQ 20/20',
    wires: [
      { kind: 'foil', thicknessM: 0.1e-3 },
      { kind: 'foil', thicknessM: 0.15e-3 },
    ],
  },
};

/**
 * invented: the fan-shelf supply with its output inductor on a ferrite ring and no gap given;
 * the inductance would need a cut gap, which a ring cannot take (422 non_physical_value).
 */
export const RING_INDUCTOR_SPEC: SpecInput = {
  ...EXAMPLE_SPECS.fanShelf,
  magnetics: {
    outputInductors: [
      {
        outputIndex: 0,
        coreShape: 'R 25/15/10',
        materialId: 'mnzn-power-high-frequency',
        turns: 9,
      },
    ],
  },
};
