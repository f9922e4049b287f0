import { activeClampForward } from '../../../solvers/topologies/active-clamp-forward.js';
import { topologyContract } from '../../contracts/topology-contract.js';
import { activeClampTelecomSpec } from '../../helpers/active-clamp-specs.js';

topologyContract(activeClampForward, [
  { name: 'invented 36-72 V to 12 V 8 A, D = 0.6', spec: activeClampTelecomSpec() },
  {
    name: 'invented 36-72 V to 12 V 8 A, 1 µH leakage',
    spec: activeClampTelecomSpec({ transformer: { leakageInductanceH: 1e-6 } }),
  },
  {
    name: 'invented 36-72 V to 12 V 8 A, synchronous',
    spec: activeClampTelecomSpec({
      outputs: [
        { voltageV: 12, currentA: 8, rectifier: { kind: 'synchronous', onResistanceOhm: 0.006 } },
      ],
    }),
  },
  {
    name: 'invented 36-72 V to 12 V 8 A plus 5 V 2 A, own auxiliary switch',
    spec: activeClampTelecomSpec({
      outputs: [
        { voltageV: 12, currentA: 8, rectifier: { kind: 'diode', forwardVoltageV: 0.5 } },
        { voltageV: 5, currentA: 2, rectifier: { kind: 'diode', forwardVoltageV: 0.4 } },
      ],
      activeClamp: { auxiliarySwitch: { onResistanceOhm: 0.2, voltageRatingV: 150 } },
    }),
  },
]);
