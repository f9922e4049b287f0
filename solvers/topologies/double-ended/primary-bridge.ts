/** The three double-ended primaries: their ids. */
export type DoubleEndedKind = 'push-pull' | 'half-bridge' | 'full-bridge';

/** What distinguishes the three double-ended primaries in the steady state and the stresses. */
export interface PrimaryBridge {
  kind: DoubleEndedKind;
  /**
   * Voltage applied to the primary winding (one half of a push-pull's) over the input voltage
   * while a switch pair is on: 1 for the push-pull and the full bridge, ½ for the half bridge,
   * whose capacitor divider holds the winding's far end at Vin/2.
   */
  driveFraction: number;
  /** Switches in series with the winding while it is driven: 1, 1, 2. */
  switchesInPath: number;
  /**
   * Drain capacitance across the winding (one half of a push-pull's) in units of one switch's:
   * 2 for the push-pull (both drains move with the winding) and the half bridge (both switches
   * at the switch node), 1 for the full bridge (two legs of 2 in series).
   */
  nodeCapacitanceFactor: number;
  /** Each switch's name, in the order of the design's switch lists. */
  switchNames: readonly string[];
  /** The half-period (0: positive winding voltage, 1: negative) each switch conducts in. */
  switchHalves: readonly (0 | 1)[];
}

const BRIDGES: Readonly<Record<DoubleEndedKind, PrimaryBridge>> = {
  'push-pull': {
    kind: 'push-pull',
    driveFraction: 1,
    switchesInPath: 1,
    nodeCapacitanceFactor: 2,
    switchNames: ['switch-a', 'switch-b'],
    switchHalves: [0, 1],
  },
  'half-bridge': {
    kind: 'half-bridge',
    driveFraction: 0.5,
    switchesInPath: 1,
    nodeCapacitanceFactor: 2,
    switchNames: ['high-side-switch', 'low-side-switch'],
    switchHalves: [0, 1],
  },
  'full-bridge': {
    kind: 'full-bridge',
    driveFraction: 1,
    switchesInPath: 2,
    nodeCapacitanceFactor: 1,
    switchNames: [
      'leg-a-high-side-switch',
      'leg-b-low-side-switch',
      'leg-b-high-side-switch',
      'leg-a-low-side-switch',
    ],
    switchHalves: [0, 0, 1, 1],
  },
};

/** Returns the primary of `kind`: drive voltage fraction, switches in the path, switch names. */
export function primaryBridge(kind: DoubleEndedKind): PrimaryBridge {
  return BRIDGES[kind];
}

/**
 * Each switch's own duty-cycle limit: the two half-periods must not overlap (a push-pull's
 * overlap shorts the core's volt-seconds, a bridge leg's shoots through), so D ≤ 0.5 with D the
 * switch's on-time over the switching period.
 * ref: Mohan, Undeland, Robbins, 3rd ed. (from memory), §10-5; common practice.
 */
export const DOUBLE_ENDED_DUTY_CYCLE_MAX = 0.5;
