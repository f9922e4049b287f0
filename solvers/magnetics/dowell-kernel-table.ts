import { writeDowellKernelSlopes, writeDowellKernels } from './dowell-kernels.js';

/**
 * Dowell's skin and proximity terms at the harmonics of one winding: at Δn = Δ1·√n for orders
 * n = 1, 2, …, each computed when first asked for (NaN until then). The terms do not depend on
 * the layer count, so windings of one conductor share a table; the factor of a portion of M
 * layers is skin + (2/3)(M² − 1)·proximity, as {@link dowellFactor} has it.
 */
export interface DowellKernelTable {
  /** Penetration ratio at the fundamental, Δ1. */
  delta1: number;
  /** Skin term at order n (index n; index 0 unused). */
  skin: Float64Array;
  /** Proximity term at order n (index n; index 0 unused). */
  proximity: Float64Array;
  /** d(skin)/dΔ at order n while slopeDelta1 is delta1; NaN until asked for (empty until then). */
  skinSlope: Float64Array;
  /** d(proximity)/dΔ at order n, likewise. */
  proximitySlope: Float64Array;
  /**
   * The Δ1 the slopes were computed for: a table reused for another Δ1 clears its slopes only
   * when they are next asked for (few tables ever are: those of a corner's first evaluation).
   */
  slopeDelta1: number;
}

/**
 * Tables kept, most recently used first: a winding's serve every corner and current evaluated at
 * its temperature. A table that falls out is reused for the next Δ1, so a search allocates none.
 */
const TABLE_CACHE_SIZE = 16;
const TABLE_CACHE: DowellKernelTable[] = [];

/** Returns the table of Δ1 with room for orders up to `orderMax`. */
export function dowellKernelTable(delta1: number, orderMax: number): DowellKernelTable {
  // A plain loop, not findIndex: no closure per call (a design asks for hundreds of tables).
  let index = -1;
  for (let i = 0; i < TABLE_CACHE.length && index < 0; i++) {
    if ((TABLE_CACHE[i] as DowellKernelTable).delta1 === delta1) index = i;
  }
  let table: DowellKernelTable;
  if (index >= 0) {
    table = TABLE_CACHE[index] as DowellKernelTable;
  } else if (TABLE_CACHE.length < TABLE_CACHE_SIZE) {
    table = {
      delta1,
      skin: new Float64Array(0),
      proximity: new Float64Array(0),
      skinSlope: new Float64Array(0),
      proximitySlope: new Float64Array(0),
      slopeDelta1: delta1,
    };
    index = TABLE_CACHE.push(table) - 1;
  } else {
    index = TABLE_CACHE.length - 1;
    table = TABLE_CACHE[index] as DowellKernelTable;
    table.delta1 = delta1;
    table.skin.fill(NaN);
    table.proximity.fill(NaN);
  }
  for (let i = index; i > 0; i--) TABLE_CACHE[i] = TABLE_CACHE[i - 1] as DowellKernelTable;
  TABLE_CACHE[0] = table;
  if (table.skin.length <= orderMax) {
    // Room for the usual 64 harmonics' orders (up to 130) at once, so tables rarely grow.
    const length = Math.max(orderMax + 1, 2 * table.skin.length, 132);
    table.skin = grownColumn(table.skin, length);
    table.proximity = grownColumn(table.proximity, length);
  }
  return table;
}

/** Computes the terms of order `order` (within the room the table was asked for) if not yet known. */
export function fillDowellKernels(table: DowellKernelTable, order: number): void {
  if (!Number.isNaN(table.skin[order])) return;
  writeDowellKernels(table.delta1 * Math.sqrt(order), table.skin, table.proximity, order);
}

/**
 * Computes the slopes in Δ of the terms of order `order` (see writeDowellKernelSlopes) if not
 * yet known, growing the slope columns to the table's room when needed.
 */
export function fillDowellKernelSlopes(table: DowellKernelTable, order: number): void {
  if (table.slopeDelta1 !== table.delta1) {
    table.skinSlope.fill(NaN);
    table.proximitySlope.fill(NaN);
    table.slopeDelta1 = table.delta1;
  }
  if (table.skinSlope.length <= order) {
    const length = Math.max(order + 1, table.skin.length);
    table.skinSlope = grownColumn(table.skinSlope, length);
    table.proximitySlope = grownColumn(table.proximitySlope, length);
  }
  if (!Number.isNaN(table.skinSlope[order])) return;
  writeDowellKernelSlopes(
    table.delta1 * Math.sqrt(order),
    table.skinSlope,
    table.proximitySlope,
    order,
  );
}

/** `column` copied into a new column of `length` entries, the rest NaN (not yet computed). */
function grownColumn(column: Float64Array, length: number): Float64Array {
  const grown = new Float64Array(length).fill(NaN);
  grown.set(column);
  return grown;
}
