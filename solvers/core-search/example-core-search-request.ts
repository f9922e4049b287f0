import type { CoreSearchRequestInput } from './core-search-request-schema.js';

/**
 * INVENTED EXAMPLE, not any product: a 36–72 V telecom-style input to 12 V at 2 A, flyback at
 * 100 kHz, searching four E/ETD shapes with the default materials, 10 primary turn counts per
 * shape, three gap steps, the default wires and both arrangements (4 × 3 × 10 × 3 × 5 × 5 × 2
 * = 18,000 candidates before the defaults drop duplicate wires).
 */
export const EXAMPLE_CORE_SEARCH_REQUEST: CoreSearchRequestInput = {
  spec: {
    topology: 'flyback',
    inputVoltageMinV: 36,
    inputVoltageNominalV: 48,
    inputVoltageMaxV: 72,
    outputs: [
      {
        voltageV: 12,
        currentA: 2,
        rectifier: { kind: 'diode', forwardVoltageV: 0.45, resistanceOhm: 0.02 },
        windingResistanceOhm: 0.006,
      },
    ],
    switchingFrequencyHz: 100e3,
    primarySwitch: { onResistanceOhm: 0.05, voltageRatingV: 200 },
    transformer: { primaryResistanceOhm: 0.06 },
    magnetics: { temperatureRiseMaxK: 40, windowFillMax: 0.45 },
  },
  space: {
    coreShapes: ['E 25/13/7', 'ETD 29', 'ETD 34', 'EFD 25/13/9'],
    primaryTurnsCount: 10,
    gaps: { kind: 'inductance-steps', stepCount: 3, factorMin: 0.7, factorMax: 1.4 },
    arrangements: ['interleaved', 'stacked'],
  },
  topN: 10,
};
