import type { WindingPortion } from '../magnetics/winding-portion.js';
import type { WindingLayout } from './winding-layout.js';

/**
 * A laid-out winding as Dowell's method sees it: its equivalent layer count, turns per layer
 * (parallel round strands side by side), the window breadth and the conductor (a foil of its
 * laid width, so its porosity is width over breadth).
 */
export function layoutPortion(
  layout: WindingLayout,
  layerCount: number,
  breadthM: number,
): WindingPortion {
  const { wire, dimensions } = layout;
  switch (wire.kind) {
    case 'round':
      return {
        layerCount,
        turnsPerLayer: layout.turnsPerLayer * wire.parallelCount,
        breadthM,
        conductor: { kind: 'round', bareDiameterM: dimensions.bareDiameterM },
      };
    case 'litz':
      return {
        layerCount,
        turnsPerLayer: layout.turnsPerLayer,
        breadthM,
        conductor: {
          kind: 'litz',
          strandBareDiameterM: dimensions.bareDiameterM,
          strandCount: wire.strandCount,
        },
      };
    case 'foil':
      return {
        layerCount,
        turnsPerLayer: 1,
        breadthM,
        conductor: { kind: 'foil', thicknessM: wire.thicknessM, widthM: dimensions.pitchM },
      };
  }
}
