import { dowellKernels } from './dowell-kernels.js';

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
}

/** Tables kept: a winding's serve every corner and current evaluated at its temperature. */
const TABLE_CACHE_SIZE = 16;
const TABLE_CACHE: DowellKernelTable[] = [];

/**
 * Returns the table of Δ1 with room for orders up to `orderMax`, remembered for the last few Δ1
 * (most recently used first).
 */
export function dowellKernelTable(delta1: number, orderMax: number): DowellKernelTable {
  let table: DowellKernelTable | undefined;
  for (let i = 0; i < TABLE_CACHE.length; i++) {
    const entry = TABLE_CACHE[i] as DowellKernelTable;
    if (entry.delta1 === delta1) {
      table = entry;
      if (i > 0) {
        TABLE_CACHE.splice(i, 1);
        TABLE_CACHE.unshift(entry);
      }
      break;
    }
  }
  if (table === undefined) {
    table = {
      delta1,
      skin: new Float64Array(orderMax + 1).fill(NaN),
      proximity: new Float64Array(orderMax + 1).fill(NaN),
    };
    TABLE_CACHE.unshift(table);
    if (TABLE_CACHE.length > TABLE_CACHE_SIZE) TABLE_CACHE.pop();
  } else if (table.skin.length <= orderMax) {
    const skin = new Float64Array(orderMax + 1).fill(NaN);
    const proximity = new Float64Array(orderMax + 1).fill(NaN);
    skin.set(table.skin);
    proximity.set(table.proximity);
    table.skin = skin;
    table.proximity = proximity;
  }
  return table;
}

/** Computes the terms of order `order` (within the room the table was asked for) if not yet known. */
export function fillDowellKernels(table: DowellKernelTable, order: number): void {
  if (!Number.isNaN(table.skin[order])) return;
  const { skin, proximity } = dowellKernels(table.delta1 * Math.sqrt(order));
  table.skin[order] = skin;
  table.proximity[order] = proximity;
}
