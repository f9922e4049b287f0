import { fringingFactor } from './fringing-factor.js';
import type { GappedCore } from './gapped-core.js';

/** Magnetic constant μ0, H/m. ref: CODATA 2018, 1.25663706212e-6 H/m (from memory). */
export const MU_0_H_PER_M = 1.25663706212e-6;

/**
 * Returns the inductance, H, of a core with total gap `gapLengthM` (m, ≥ 0): L = N²/(Rc + Rg),
 * Rc = le/(μ0·μr·Ae), Rg = lg/(μ0·Ae·F). ref: magnetic circuit, Mohan, Undeland, Robbins, 3rd
 * ed., ch. 30; F on the gap's reluctance only (fringing widens the gap's area). McLyman applies F
 * to the whole L instead; the two agree when the gap dominates.
 */
export function gappedInductance(core: GappedCore, gapLengthM: number): number {
  const { turns, effectiveLengthM, effectiveAreaM2, relativePermeability } = core;
  if (!(turns > 0 && effectiveLengthM > 0 && effectiveAreaM2 > 0 && relativePermeability > 0)) {
    throw new RangeError('gappedInductance: turns, le, Ae and μr must be > 0');
  }
  const factor =
    core.fringing === 'mclyman'
      ? fringingFactor(gapLengthM, effectiveAreaM2, core.windowHeightM)
      : 1;
  const coreReluctance = effectiveLengthM / (MU_0_H_PER_M * relativePermeability * effectiveAreaM2);
  const gapReluctance = gapLengthM / (MU_0_H_PER_M * effectiveAreaM2 * factor);
  return (turns * turns) / (coreReluctance + gapReluctance);
}
