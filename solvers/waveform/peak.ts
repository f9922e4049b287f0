import type { Waveform } from './waveform.js';

/**
 * Returns the largest value the waveform reaches, in its unit. A linear segment peaks at an end,
 * so this is the largest breakpoint value; at a jump both sides count.
 */
export function peak(w: Waveform): number {
  const { values } = w;
  let highest = -Infinity;
  // An indexed loop: for…of costs several times more here, and this runs per device per corner.
  for (let i = 0; i < values.length; i++) {
    const value = values[i] as number;
    if (value > highest) highest = value;
  }
  return highest;
}
