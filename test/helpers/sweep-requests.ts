import type { SweepRequestInput } from '../../solvers/index.js';

/**
 * Invented scenario (not a real product): an auxiliary flyback supply for an imagined
 * packaging machine, 36-72 V in, 12 V 2 A out, diode rectifier, generic 200 V switch.
 */
export const INVENTED_FLYBACK_SPEC = {
  topology: 'flyback',
  inputVoltageMinV: 36,
  inputVoltageNominalV: 48,
  inputVoltageMaxV: 72,
  outputs: [{ voltageV: 12, currentA: 2, rectifier: { kind: 'diode', forwardVoltageV: 0.45 } }],
  switchingFrequencyHz: 100e3,
  primarySwitch: { onResistanceOhm: 0.04, voltageRatingV: 200 },
} satisfies SweepRequestInput['spec'];

/** `count` evenly spaced values from `from` to `to` (just `from` when count is 1). */
export function evenSteps(from: number, to: number, count: number): number[] {
  if (count === 1) return [from];
  return Array.from({ length: count }, (_, i) => from + ((to - from) * i) / (count - 1));
}

/**
 * A sweep of a handful of points: two frequencies x the spec's inputs x two loads, 12 points in
 * chunks of 5 (so three chunks, the last short, one spanning both frequencies).
 */
export function smallSweepRequest(): SweepRequestInput {
  return {
    spec: INVENTED_FLYBACK_SPEC,
    grid: { switchingFrequenciesHz: [80e3, 120e3], loadFractions: [0.5, 1] },
    chunkPointCount: 5,
  };
}

/**
 * A sweep long enough to be seen running (each point a real corner solve, each frequency a
 * real choice): `frequencyCount` frequencies x `inputCount` input voltages x the spec's loads.
 */
export function largeSweepRequest(
  options: { frequencyCount?: number; inputCount?: number; chunkPointCount?: number } = {},
): SweepRequestInput {
  const { frequencyCount = 1000, inputCount = 20, chunkPointCount = 200 } = options;
  return {
    spec: INVENTED_FLYBACK_SPEC,
    grid: {
      switchingFrequenciesHz: evenSteps(50e3, 250e3, frequencyCount),
      inputVoltagesV: evenSteps(36, 72, inputCount),
    },
    chunkPointCount,
  };
}
