import { failure, steinmetzFit, success, type Result } from '../../solvers/index.js';
import type { MaterialRequest } from '../schemas/material-request-schema.js';
import type { UserMaterialContent } from '../stores/material-store.js';

const span = (values: number[]) => ({ min: Math.min(...values), max: Math.max(...values) });

/**
 * Fits Steinmetz coefficients to a material request's loss points and returns what the store
 * keeps, stamped with the current time. Too few points or a singular fit: the engine's issues,
 * their paths rewritten from the engine's `points` to the body's `lossPoints`.
 */
export function userMaterialContent(request: MaterialRequest): Result<UserMaterialContent> {
  const { lossPoints, ...extras } = request;
  const fitted = steinmetzFit(lossPoints);
  if (!fitted.ok) {
    return failure(
      fitted.issues.map((issue) => ({
        ...issue,
        path: issue.path[0] === 'points' ? ['lossPoints', ...issue.path.slice(1)] : issue.path,
      })),
    );
  }
  const frequency = span(lossPoints.map((point) => point.frequencyHz));
  const fluxDensity = span(lossPoints.map((point) => point.peakFluxDensityT));
  return success({
    ...extras,
    lossPoints,
    fit: fitted.value,
    frequencyMinHz: frequency.min,
    frequencyMaxHz: frequency.max,
    peakFluxDensityMinT: fluxDensity.min,
    peakFluxDensityMaxT: fluxDensity.max,
    createdAt: new Date().toISOString(),
  });
}
