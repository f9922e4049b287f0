import type { TransformerCorner } from '../transformer/evaluate-transformer.js';
import type { TransformerDuty } from '../transformer/transformer-duty.js';
import { cornerWithWoundCores } from './corner-with-wound-cores.js';
import type { AnyCorner } from './design-schema.js';

/** Name of the core-loss line a designed transformer adds to each corner's budget. */
export const TRANSFORMER_CORE_COMPONENT = 'transformer-core';

/**
 * Returns `corner` with one designed wound core's losses in its budget (cornerWithWoundCores of
 * that core alone): each winding's copper line takes the evaluated loss, a core-loss line named
 * `coreComponent` is added, and input power, input current and efficiency follow. The
 * transformer uses it, and each output inductor (its one winding named as the corner's inductor
 * copper line, its core line under the same name).
 */
export function cornerWithTransformer<Corner extends AnyCorner>(
  corner: Corner,
  duty: TransformerDuty,
  transformer: TransformerCorner,
  coreComponent: string = TRANSFORMER_CORE_COMPONENT,
): Corner {
  return cornerWithWoundCores(corner, [{ duty, losses: transformer, coreComponent }]);
}
