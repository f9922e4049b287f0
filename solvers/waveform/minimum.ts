import type { Waveform } from './waveform.js';

/**
 * Returns the smallest value the waveform reaches, in its unit. A linear segment is lowest at an
 * end, so this is the smallest breakpoint value; at a jump both sides count.
 */
export function minimum(w: Waveform): number {
  const { values } = w;
  let lowest = Infinity;
  // An indexed loop: for…of costs several times more here, and this runs per device per corner.
  for (let i = 0; i < values.length; i++) {
    const value = values[i] as number;
    if (value < lowest) lowest = value;
  }
  return lowest;
}
