import { fullBridge } from '../../../solvers/topologies/full-bridge.js';
import { topologyContract } from '../../contracts/topology-contract.js';
import { fullBridgeSpec, leakyLowInputBridgeSpec } from '../../helpers/double-ended-specs.js';

topologyContract(fullBridge, [
  { name: 'invented 300-400 V to 48 V 10 A, bridge rectifier', spec: fullBridgeSpec() },
  {
    name: 'invented 300-400 V to 48 V 10 A, center-tapped',
    spec: fullBridgeSpec({
      outputs: [
        {
          voltageV: 48,
          currentA: 10,
          secondaryArrangement: 'center-tapped',
          rectifier: { kind: 'diode', forwardVoltageV: 0.8, voltageRatingV: 200 },
        },
      ],
    }),
  },
  {
    name: 'invented 300-400 V to 48 V 10 A plus 12 V 3 A, 1 µH leakage',
    spec: fullBridgeSpec({
      transformer: { leakageInductanceH: 1e-6 },
      outputs: [
        {
          voltageV: 48,
          currentA: 10,
          secondaryArrangement: 'full-bridge',
          rectifier: { kind: 'diode', forwardVoltageV: 0.8 },
        },
        { voltageV: 12, currentA: 3, rectifier: { kind: 'diode', forwardVoltageV: 0.5 } },
      ],
    }),
  },
  {
    // The leakage's turn-off decay outlasts the off-time at the lowest input and full load.
    name: 'invented low-input full bridge, 12 V 5.7 A, 1 µH leakage at 227 kHz',
    spec: leakyLowInputBridgeSpec('full-bridge'),
  },
]);
