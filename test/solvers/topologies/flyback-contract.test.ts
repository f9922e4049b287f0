import { flyback } from '../../../solvers/topologies/flyback.js';
import { topologyContract } from '../../contracts/topology-contract.js';
import { busSpec, telecomSpec } from '../../helpers/flyback-specs.js';

topologyContract(flyback, [
  { name: 'invented 36-72 V to 12 V 2 A', spec: telecomSpec() },
  { name: 'invented 120-375 V to 24 V 1 A', spec: busSpec() },
  {
    name: 'invented 36-72 V to 12 V 2 A, synchronous',
    spec: telecomSpec({
      outputs: [
        { voltageV: 12, currentA: 2, rectifier: { kind: 'synchronous', onResistanceOhm: 0.008 } },
      ],
    }),
  },
  {
    name: 'invented 36-72 V to 12 V 2 A plus 5 V 0.5 A',
    spec: telecomSpec({
      outputs: [
        { voltageV: 12, currentA: 2, rectifier: { kind: 'diode', forwardVoltageV: 0.45 } },
        { voltageV: 5, currentA: 0.5, rectifier: { kind: 'diode', forwardVoltageV: 0.35 } },
      ],
    }),
  },
]);
