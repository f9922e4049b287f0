import { EXAMPLE_SPECS } from './example-specs.js';

/** A documented example spec with its topology left out, as a comparison request sends it. */
function withoutTopology<T extends { topology: string }>(spec: T): Omit<T, 'topology'> {
  const { topology: _ignored, ...rest } = spec;
  return rest;
}

/**
 * Invented scenarios for the documented comparison requests (product rule 3), built from the
 * invented design examples with their topology left out.
 */
export const EXAMPLE_COMPARISONS = {
  /** invented: the 48 V sensor-rack supply, every topology, ranked by nominal efficiency. */
  sensorRack: { spec: withoutTopology(EXAMPLE_SPECS.sensorRack) },
  /** invented: the 400 V conveyor-controls supply with 20 ms hold-up, ranked by largest loss. */
  conveyorHoldUp: {
    spec: { ...withoutTopology(EXAMPLE_SPECS.conveyorControls), holdUp: { timeS: 0.02 } },
    rankBy: 'loss-largest',
  },
  /** invented: the sensor-rack supply, two forward variants only, ranked by switch voltage. */
  sensorRackForwards: {
    spec: withoutTopology(EXAMPLE_SPECS.sensorRack),
    topologies: ['two-switch-forward', 'forward-reset-winding'],
    rankBy: 'switch-voltage-utilization',
  },
  /** invented: an unknown figure, an unknown topology and a hold-up end above its start. */
  badFields: {
    spec: {
      ...withoutTopology(EXAMPLE_SPECS.sensorRack),
      holdUp: { timeS: 0.01, startVoltageV: 40, endVoltageV: 44 },
    },
    topologies: ['buck'],
    rankBy: 'cheapest',
  },
} as const;
