import type { AnyCorner, Design } from '../design/design-schema.js';
import type { Spec } from '../spec/spec-schema.js';
import { activeClampForward } from './active-clamp-forward.js';
import { flyback } from './flyback.js';
import { forwardResetWinding } from './forward-reset-winding.js';
import { fullBridge } from './full-bridge.js';
import { halfBridge } from './half-bridge.js';
import { pushPull } from './push-pull.js';
import type { Topology } from './topology.js';
import { twoSwitchForward } from './two-switch-forward.js';

/**
 * Every topology the engine solves, by id; adding one is one file and one line here. Each entry
 * pairs its id with its own choices and corners (the interface's methods are bivariant).
 */
export const TOPOLOGIES: Readonly<
  Record<Spec['topology'], Topology<Design['choices'], AnyCorner>>
> = {
  flyback,
  'two-switch-forward': twoSwitchForward,
  'forward-reset-winding': forwardResetWinding,
  'active-clamp-forward': activeClampForward,
  'push-pull': pushPull,
  'half-bridge': halfBridge,
  'full-bridge': fullBridge,
};

/**
 * Returns the topology registered under `id`.
 * @throws RangeError for an id that is not registered (the spec schema admits only known ids).
 */
export function topologyById(id: Spec['topology']): Topology<Design['choices'], AnyCorner> {
  const topology = TOPOLOGIES[id];
  if (topology === undefined) throw new RangeError(`topologyById: unknown topology '${id}'`);
  return topology;
}
