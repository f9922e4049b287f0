import type { Design } from '../design/design-schema.js';
import type { Spec } from '../spec/spec-schema.js';
import { flyback } from './flyback.js';
import type { Topology } from './topology.js';

/** Every topology the engine solves, by id; adding one is one file and one line here. */
export const TOPOLOGIES: Readonly<Record<Spec['topology'], Topology<Design['choices']>>> = {
  flyback,
};

/**
 * Returns the topology registered under `id`.
 * @throws RangeError for an id that is not registered (the spec schema admits only known ids).
 */
export function topologyById(id: Spec['topology']): Topology<Design['choices']> {
  const topology = TOPOLOGIES[id];
  if (topology === undefined) throw new RangeError(`topologyById: unknown topology '${id}'`);
  return topology;
}
