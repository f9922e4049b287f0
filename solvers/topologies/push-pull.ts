import type { DoubleEndedCorner, DoubleEndedDesign } from '../design/design-schema.js';
import { chooseDoubleEnded } from './double-ended/double-ended-choices.js';
import { solveDoubleEndedCorner } from './double-ended/double-ended-corner.js';
import { primaryBridge } from './double-ended/primary-bridge.js';
import { doubleEndedTransformerDuty } from './double-ended/double-ended-transformer-duty.js';
import type { Topology } from './topology.js';

const BRIDGE = primaryBridge('push-pull');

/**
 * The push-pull: a center-tapped primary whose halves two switches drive in turn at ±Vin, each
 * switch blocking about 2·Vin; D (each switch's on-time over the period) ≤ 0.5, Vo = 2·D·Vin/n
 * lossless; center-tapped or bridge secondaries into a buck-derived output stage at 2·fs (Mohan,
 * Undeland, Robbins, 3rd ed. (from memory), §10-5-1).
 */
export const pushPull: Topology<DoubleEndedDesign['choices'], DoubleEndedCorner> = {
  id: 'push-pull',
  choose: (spec) => chooseDoubleEnded(spec, BRIDGE),
  solveCorner: (spec, choices, corner) => solveDoubleEndedCorner(spec, BRIDGE, choices, corner),
  transformerDuty: (spec, choices, corners) => doubleEndedTransformerDuty(spec, choices, corners),
};
