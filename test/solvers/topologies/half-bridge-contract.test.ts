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
    // The leakage's turn-off decay outlasts the off-time at the lowest input and full load.
    name: 'invented low-input half bridge, 12 V 5.7 A, 1 µH leakage at 227 kHz',
    spec: leakyLowInputBridgeSpec('half-bridge'),
  },
]);
