import type { DoubleEndedCorner, DoubleEndedDesign } from '../design/design-schema.js';
import { chooseDoubleEnded } from './double-ended/double-ended-choices.js';
import { solveDoubleEndedCorner } from './double-ended/double-ended-corner.js';
import { primaryBridge } from './double-ended/primary-bridge.js';
import { doubleEndedTransformerDuty } from './double-ended/double-ended-transformer-duty.js';
import type { Topology } from './topology.js';

const BRIDGE = primaryBridge('half-bridge');

/**
 * The half bridge: two switches and a capacitor divider drive the winding at ±Vin/2, each switch
 * blocking Vin; D (each switch's on-time over the period) ≤ 0.5, Vo = D·Vin/n lossless;
 * center-tapped or bridge secondaries into a buck-derived output stage at 2·fs (Mohan, Undeland,
 * Robbins, 3rd ed. (from memory), §10-5-2).
 */
export const halfBridge: Topology<DoubleEndedDesign['choices'], DoubleEndedCorner> = {
  id: 'half-bridge',
  choose: (spec) => chooseDoubleEnded(spec, BRIDGE),
  solveCorner: (spec, choices, corner) => solveDoubleEndedCorner(spec, BRIDGE, choices, corner),
  transformerDuty: (spec, choices, corners) => doubleEndedTransformerDuty(spec, choices, corners),
};
