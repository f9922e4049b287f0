import type { WindingPortion } from '../magnetics/winding-portion.js';
import type { WindingLayout } from './winding-layout.js';

/**
 * A laid-out winding as Dowell's method sees it: its equivalent layer count, turns per layer
 * (parallel round strands side by side), the window breadth and the conductor.
 */
export function layoutPortion(
  layout: WindingLayout,
  layerCount: number,
  breadthM: number,
): WindingPortion {
  const { wire, dimensions } = layout;
  return wire.kind === 'round'
    ? {
        layerCount,
        turnsPerLayer: layout.turnsPerLayer * wire.parallelCount,
        breadthM,
        conductor: { kind: 'round', bareDiameterM: dimensions.bareDiameterM },
      }
    : {
        layerCount,
        turnsPerLayer: layout.turnsPerLayer,
        breadthM,
        conductor: {
          kind: 'litz',
          strandBareDiameterM: dimensions.bareDiameterM,
          strandCount: wire.strandCount,
        },
      };
}
