import { halfBridge } from '../../../solvers/topologies/half-bridge.js';
import { topologyContract } from '../../contracts/topology-contract.js';
import { halfBridgeSpec, leakyLowInputBridgeSpec } from '../../helpers/double-ended-specs.js';

topologyContract(halfBridge, [
  { name: 'invented 360-410 V to 24 V 20 A, center-tapped', spec: halfBridgeSpec() },
  {
    name: 'invented 360-410 V to 24 V 20 A, center-tapped, synchronous',
    spec: halfBridgeSpec({
      outputs: [
        {
          voltageV: 24,
          currentA: 20,
          rectifier: { kind: 'synchronous', onResistanceOhm: 0.008, voltageRatingV: 100 },
        },
      ],
    }),
  },
  {
    // Two outputs: at 10 % load both follow the light-load event model's equivalent output.
    name: 'invented 360-410 V to 24 V 20 A plus 10 V 2 A, center-tapped',
    spec: halfBridgeSpec({
      outputs: [
        { voltageV: 24, currentA: 20, rectifier: { kind: 'diode', forwardVoltageV: 0.7 } },
        { voltageV: 10, currentA: 2, rectifier: { kind: 'diode', forwardVoltageV: 0.7 } },
      ],
    }),
  },
  {
    // At 72 V and 7.8 % load the outputs stop apart and each output's own events take the
    // corner (their own stretches drawn, `SharedFall.ring.stretches`): drawn by
    // `model-fallback-scan.ts --seed 11` (spec 16), the transformer and inductors fixed near
    // what its magnetics design chose.
    name: 'invented 36-72 V to 12 V 6.9 A plus 5 V 1.49 A, 101 kHz, outputs stopping apart',
    spec: halfBridgeSpec({
      inputVoltageMinV: 36,
      inputVoltageNominalV: 48,
      inputVoltageMaxV: 72,
      switchingFrequencyHz: 101068.61472129822,
      loadFractions: [0.0782, 1],
      primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 216 },
      transformer: {
        turnsRatio: 4 / 3,
        outputTurnsRatios: [4 / 3, 4],
        magnetizingInductanceH: 28.4e-6,
        leakageInductanceH: 30.6e-9,
        primaryResistanceOhm: 0.0011,
      },
      outputs: [
        {
          voltageV: 12,
          currentA: 6.893482863903046,
          inductanceH: 17.2e-6,
          inductorResistanceOhm: 0.0036,
          windingResistanceOhm: 0.0008,
          capacitanceF: 100e-6,
          rectifier: {
            kind: 'diode',
            forwardVoltageV: 0.5,
            resistanceOhm: 0.01,
            voltageRatingV: 200,
          },
        },
        {
          voltageV: 5,
          currentA: 1.4877684116363525,
          inductanceH: 34.9e-6,
          inductorResistanceOhm: 0.0126,
          windingResistanceOhm: 0.0028,
          capacitanceF: 100e-6,
          rectifier: {
            kind: 'diode',
            forwardVoltageV: 0.5,
            resistanceOhm: 0.01,
            voltageRatingV: 200,
          },
        },
      ],
    }),
  },
  {
    // The leakage's turn-off decay outlasts the off-time at the lowest input and full load.
    name: 'invented low-input half bridge, 12 V 5.7 A, 1 µH leakage at 227 kHz',
    spec: leakyLowInputBridgeSpec('half-bridge'),
  },
]);
