import type { HoldUp } from './hold-up-schema.js';

/** The spec fields the hold-up voltages default to. */
export interface HoldUpVoltageBounds {
  inputVoltageMinV: number;
  inputVoltageNominalV: number;
}

/** Where each hold-up voltage came from: the request, or its default field of the spec. */
export type HoldUpVoltageOrigin = 'spec' | 'default';

/** The hold-up voltages with their defaults applied, V, and where each came from. */
export interface HoldUpVoltages {
  startVoltageV: number;
  endVoltageV: number;
  origins: { startVoltageV: HoldUpVoltageOrigin; endVoltageV: HoldUpVoltageOrigin };
}

/**
 * Returns the hold-up start and end voltages, V: the request's, or inputVoltageNominalV and
 * inputVoltageMinV when omitted (the bus sits at nominal when the source drops, and the
 * converter is designed to run down to its minimum input).
 */
export function holdUpVoltages(holdUp: HoldUp, spec: HoldUpVoltageBounds): HoldUpVoltages {
  return {
    startVoltageV: holdUp.startVoltageV ?? spec.inputVoltageNominalV,
    endVoltageV: holdUp.endVoltageV ?? spec.inputVoltageMinV,
    origins: {
      startVoltageV: holdUp.startVoltageV === undefined ? 'default' : 'spec',
      endVoltageV: holdUp.endVoltageV === undefined ? 'default' : 'spec',
    },
  };
}
