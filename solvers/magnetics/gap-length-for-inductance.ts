import { failure, success, type Result } from '../result.js';
import { brentRoot } from '../root-finding/brent-root.js';
import type { GappedCore } from './gapped-core.js';
import { gappedInductance } from './gapped-inductance.js';

/** Options of {@link gapLengthForInductance}. */
export interface GapLengthOptions {
  /**
   * Largest gap accepted, as a fraction of the window height G (the fringing formula is meant
   * for gaps well below G).
   * @defaultValue 0.5
   */
  maxGapFraction?: number;
  /**
   * Absolute tolerance on the gap, m.
   * @defaultValue 1e-9
   */
  toleranceM?: number;
  /**
   * Iteration cap of the root search.
   * @defaultValue 100
   */
  maxIterations?: number;
}

const DEFAULTS = {
  maxGapFraction: 0.5,
  toleranceM: 1e-9,
  maxIterations: 100,
} satisfies Required<GapLengthOptions>;

/**
 * Returns the total gap, m, that gives the core `targetInductanceH` (H), solving
 * {@link gappedInductance} by Brent's method because the fringing factor depends on the gap.
 * Issues (non_physical_value) when even no gap is too little inductance, or the gap would exceed
 * maxGapFraction·G.
 */
export function gapLengthForInductance(
  core: GappedCore,
  targetInductanceH: number,
  options: GapLengthOptions = {},
): Result<number> {
  const { maxGapFraction, toleranceM, maxIterations } = { ...DEFAULTS, ...options };
  if (!(targetInductanceH > 0 && Number.isFinite(targetInductanceH))) {
    throw new RangeError(
      `gapLengthForInductance: target must be finite and > 0, got ${targetInductanceH}`,
    );
  }
  const ungappedH = gappedInductance(core, 0);
  if (targetInductanceH >= ungappedH) {
    return failure([
      {
        code: 'non_physical_value',
        path: ['targetInductanceH'],
        constraint: 'targetInductanceH < ungappedInductanceH',
        quantity: 'targetInductanceH',
        required: targetInductanceH,
        limit: ungappedH,
      },
    ]);
  }
  const maxGapM = maxGapFraction * core.windowHeightM;
  const atMaxGapH = gappedInductance(core, maxGapM);
  if (atMaxGapH > targetInductanceH) {
    return failure([
      {
        code: 'non_physical_value',
        path: ['targetInductanceH'],
        constraint:
          'targetInductanceH >= inductance at gapLengthM = maxGapFraction * windowHeightM',
        quantity: 'targetInductanceH',
        required: targetInductanceH,
        limit: atMaxGapH,
      },
    ]);
  }
  const gapM = brentRoot((lg) => gappedInductance(core, lg) - targetInductanceH, 0, maxGapM, {
    absoluteTolerance: toleranceM,
    maxIterations,
  });
  if (!Number.isFinite(gapM)) throw new Error('gapLengthForInductance: root not bracketed');
  return success(gapM);
}
