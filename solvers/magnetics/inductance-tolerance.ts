import type { GappedCore } from './gapped-core.js';
import { MU_0_H_PER_M } from './gapped-inductance.js';
import { fringingFactor } from './fringing-factor.js';

/** First-order spread of a gapped core's inductance. */
export interface InductanceTolerance {
  /** ∂ln L/∂ln lg, dimensionless (−1 for a gap-dominated core without fringing, ≤ 0). */
  gapSensitivity: number;
  /** ∂ln L/∂ln μr, dimensionless (0..1: the core's share of the total reluctance). */
  permeabilitySensitivity: number;
  /** Worst-case relative tolerance |S_lg|·δlg/lg + |S_μ|·δμ/μ, a fraction. */
  worstCaseTolerance: number;
  /** Root-sum-square relative tolerance of the same two terms, a fraction. */
  rssTolerance: number;
}

/**
 * Returns the relative inductance tolerance of a gapped core from a gap tolerance (m, ±) and the
 * material's relative permeability tolerance (fraction, ±), by first-order sensitivities of
 * L = N²/(Rc + Rg). ref: common practice (linearized tolerance analysis). Needs a gap > 0.
 */
export function inductanceTolerance(
  core: GappedCore,
  gapLengthM: number,
  gapToleranceM: number,
  permeabilityTolerance: number,
): InductanceTolerance {
  if (!(gapLengthM > 0 && gapToleranceM >= 0 && permeabilityTolerance >= 0)) {
    throw new RangeError('inductanceTolerance: need a gap > 0 and tolerances ≥ 0');
  }
  const { effectiveLengthM: le, effectiveAreaM2: ae, relativePermeability: mu } = core;
  const isFringing = core.fringing === 'mclyman';
  const factor = isFringing ? fringingFactor(gapLengthM, ae, core.windowHeightM) : 1;
  const coreReluctance = le / (MU_0_H_PER_M * mu * ae);
  const gapReluctance = gapLengthM / (MU_0_H_PER_M * ae * factor);
  const total = coreReluctance + gapReluctance;
  // ∂ln F/∂ln lg with F = 1 + (lg/√Ae)·ln(2G/lg): lg·F′/F, F′ = (ln(2G/lg) − 1)/√Ae.
  const logSlopeF = isFringing
    ? (gapLengthM * (Math.log((2 * core.windowHeightM) / gapLengthM) - 1)) /
      (Math.sqrt(ae) * factor)
    : 0;
  // ln L = 2 ln N − ln(Rc + Rg); ∂ln Rg/∂ln lg = 1 − ∂ln F/∂ln lg; ∂ln Rc/∂ln μ = −1.
  const gapSensitivity = -(gapReluctance / total) * (1 - logSlopeF);
  const permeabilitySensitivity = coreReluctance / total;
  const gapTerm = Math.abs(gapSensitivity) * (gapToleranceM / gapLengthM);
  const permeabilityTerm = permeabilitySensitivity * permeabilityTolerance;
  return {
    gapSensitivity,
    permeabilitySensitivity,
    worstCaseTolerance: gapTerm + permeabilityTerm,
    rssTolerance: Math.hypot(gapTerm, permeabilityTerm),
  };
}
