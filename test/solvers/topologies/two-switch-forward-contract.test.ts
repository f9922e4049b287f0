import { twoSwitchForward } from '../../../solvers/topologies/two-switch-forward.js';
import { topologyContract } from '../../contracts/topology-contract.js';
import {
  forwardBusSpec,
  forwardTelecomSpec,
  twoOutputForwardSpec,
  twoOutputHighInputSpec,
} from '../../helpers/forward-specs.js';

topologyContract(twoSwitchForward, [
  { name: 'invented 36-72 V to 12 V 8 A', spec: forwardTelecomSpec() },
  { name: 'invented 330-420 V to 24 V 10 A', spec: forwardBusSpec() },
  {
    name: 'invented 36-72 V to 12 V 8 A, synchronous',
    spec: forwardTelecomSpec({
      outputs: [
        { voltageV: 12, currentA: 8, rectifier: { kind: 'synchronous', onResistanceOhm: 0.006 } },
      ],
    }),
  },
  {
    name: 'invented 36-72 V to 12 V 8 A plus 5 V 2 A',
    spec: forwardTelecomSpec({
      outputs: [
        { voltageV: 12, currentA: 8, rectifier: { kind: 'diode', forwardVoltageV: 0.5 } },
        { voltageV: 5, currentA: 2, rectifier: { kind: 'diode', forwardVoltageV: 0.4 } },
      ],
    }),
  },
  // The light-load event period with two outputs (the second cross-regulating).
  {
    name: 'invented 200-400 V to 12 V 5 A plus 5 V 2 A, 2-10 % load',
    spec: twoOutputHighInputSpec('two-switch-forward', { loadFractions: [0.02, 0.05, 0.1, 1] }),
  },
  {
    name: 'invented 36-72 V to 12 V 8 A plus 5 V 2 A, 200 kHz, 10-100 % load',
    spec: twoOutputForwardSpec('two-switch-forward'),
  },
]);
