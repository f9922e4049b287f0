import { failure, steinmetzFit, success, type Result } from '../../solvers/index.js';
import type { MaterialRequest } from '../schemas/material-request-schema.js';
import type { UserMaterialContent } from '../stores/material-store.js';

const span = (values: number[]) => ({ min: Math.min(...values), max: Math.max(...values) });

/**
 * Fits Steinmetz coefficients to a material request's loss points and returns what the store
 * keeps, stamped with the current time. Too few points or a singular fit: the engine's issues,
 * their paths rewritten from the engine's `points` to the body's `lossPoints`; a fitted exponent
 * α or β that is not positive (loss falling with frequency or flux): a non_physical_value issue.
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
  // ref: common practice — core loss rises with frequency and with flux density; a fit that says
  // otherwise cannot serve as a material (the design would divide by a zero slope).
  const exponents = (['alpha', 'beta'] as const).filter(
    (name) => !(fitted.value.coefficients[name] > 0),
  );
  if (exponents.length > 0) {
    return failure(
      exponents.map((name) => ({
        code: 'non_physical_value' as const,
        path: ['lossPoints'],
        constraint: `${name} > 0`,
        quantity: name === 'alpha' ? 'steinmetzAlpha' : 'steinmetzBeta',
        required: fitted.value.coefficients[name],
        limit: 0,
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
