import { wireDimensions, type WindingWire, type WireDimensions } from './winding-wire.js';

/** A wire as laid: a foil carries the width it was laid at. */
export type LaidWire =
  | Exclude<WindingWire, { kind: 'foil' }>
  | (Extract<WindingWire, { kind: 'foil' }> & { widthM: number });

/** How one winding's turns lie in the window: layers across it, turns along each layer. */
export interface WindingLayout {
  turns: number;
  wire: LaidWire;
  dimensions: WireDimensions;
  /** Turns side by side in a full layer. */
  turnsPerLayer: number;
  /** Layers the turns need (the last may be partly filled). */
  layerCount: number;
  /** Height of the winding across the window, m. */
  heightM: number;
  /** Outside cross-section of all turns, m² (for the fill factor). */
  outsideAreaM2: number;
}

/**
 * Lays `turns` turns of `wire` in layers of breadth `breadthM` (m); undefined when not even one
 * turn fits the breadth. Foil lies one turn to a layer (a foil without a width of its own spans
 * the breadth), however narrow it is.
 */
export function windingLayout(
  turns: number,
  wire: WindingWire,
  breadthM: number,
): WindingLayout | undefined {
  if (!(Number.isInteger(turns) && turns >= 1)) {
    throw new RangeError(`windingLayout: turns must be an integer ≥ 1, got ${turns}`);
  }
  const dimensions = wireDimensions(wire, breadthM);
  const fitting = Math.floor(breadthM / dimensions.pitchM + 1e-9);
  const turnsPerLayer = wire.kind === 'foil' ? Math.min(1, fitting) : fitting;
  if (turnsPerLayer < 1) return undefined;
  const layerCount = Math.ceil(turns / turnsPerLayer);
  return {
    turns,
    // A foil spanning the breadth carries the width it was laid at, so a design reports it.
    wire: wire.kind === 'foil' ? { ...wire, widthM: dimensions.pitchM } : wire,
    dimensions,
    turnsPerLayer: Math.min(turnsPerLayer, turns),
    layerCount,
    heightM: layerCount * dimensions.layerHeightM,
    outsideAreaM2: turns * dimensions.outsideAreaM2,
  };
}
