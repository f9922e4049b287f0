import { pushPull } from '../../../solvers/topologies/push-pull.js';
import { topologyContract } from '../../contracts/topology-contract.js';
import { pushPullSpec } from '../../helpers/double-ended-specs.js';

topologyContract(pushPull, [
  { name: 'invented 18-36 V to 12 V 10 A, center-tapped', spec: pushPullSpec() },
  {
    name: 'invented 18-36 V to 12 V 10 A, bridge rectifier, synchronous',
    spec: pushPullSpec({
      outputs: [
        {
          voltageV: 12,
          currentA: 10,
          secondaryArrangement: 'full-bridge',
          rectifier: { kind: 'synchronous', onResistanceOhm: 0.005 },
        },
      ],
    }),
  },
  {
    name: 'invented 18-36 V to 12 V 10 A plus 5 V 2 A',
    spec: pushPullSpec({
      outputs: [
        { voltageV: 12, currentA: 10, rectifier: { kind: 'diode', forwardVoltageV: 0.45 } },
        { voltageV: 5, currentA: 2, rectifier: { kind: 'diode', forwardVoltageV: 0.4 } },
      ],
    }),
  },
]);
