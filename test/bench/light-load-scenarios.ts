/**
 * The invented scenarios of the light-load checks (`light-load-probe.ts`, ngspice with the
 * output held; `light-load-reference.ts`, the idealized time-stepped circuit). Not any product.
 */
import { SpecSchema, type Spec } from '../../solvers/index.js';
import { fullBridgeSpec, halfBridgeSpec, pushPullSpec } from '../helpers/double-ended-specs.js';

export interface LightLoadScenario {
  spec: (load: number) => Spec;
  input: 'min' | 'nominal' | 'max';
  loads: number[];
}

const NO_LEAKAGE = { leakageInductanceH: 0, primaryResistanceOhm: 0.1 };
const ASSUMED = { mode: 'assume' } as const;
const dumpLight = (spec: Spec): Spec =>
  SpecSchema.parse({
    ...spec,
    magnetics: { ...spec.magnetics, mode: 'design' },
    loadFractions: [0.05, 0.2, 1.2],
  });
export const LIGHT_LOAD_SCENARIOS: Record<string, LightLoadScenario> = {
  'scan-full-bridge': {
    spec: (load) =>
      fullBridgeSpec({
        loadFractions: [load, 1.01],
        switchingFrequencyHz: 138.3e3,
        magnetics: ASSUMED,
        transformer: NO_LEAKAGE,
      }),
    input: 'max',
    loads: [0.0336, 0.045, 0.07, 0.1],
  },
  'dump-full-bridge': { spec: () => dumpLight(fullBridgeSpec()), input: 'min', loads: [0.05] },
  'dump-push-pull': { spec: () => dumpLight(pushPullSpec()), input: 'min', loads: [0.05] },
  // The test scenarios with loads `load`/100 %, the converter's own Lm, no leakage, at the
  // highest input (the decks' rectifier snubbers at 1 pF where the inductor runs discontinuous).
  'push-pull': {
    spec: (load) =>
      pushPullSpec({
        loadFractions: [load, 1],
        magnetics: ASSUMED,
        transformer: { leakageInductanceH: 0 },
      }),
    input: 'max',
    loads: [0.03, 0.04, 0.05],
  },
  'half-bridge': {
    spec: (load) =>
      halfBridgeSpec({
        loadFractions: [load, 1],
        magnetics: ASSUMED,
        transformer: { leakageInductanceH: 0 },
      }),
    input: 'max',
    loads: [0.03, 0.04, 0.05],
  },
  'full-bridge': {
    spec: (load) =>
      fullBridgeSpec({ loadFractions: [load, 1], magnetics: ASSUMED, transformer: NO_LEAKAGE }),
    input: 'max',
    loads: [0.03, 0.04, 0.05],
  },
  'scan-half-bridge': {
    spec: (load) =>
      halfBridgeSpec({
        loadFractions: [load, 0.812],
        switchingFrequencyHz: 108.2e3,
        magnetics: ASSUMED,
        transformer: { leakageInductanceH: 0 },
      }),
    input: 'min',
    loads: [0.0427],
  },
};
