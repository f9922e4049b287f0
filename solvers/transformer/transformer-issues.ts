import type { Issue } from '../result.js';
import type { TransformerEvaluation } from './evaluate-transformer.js';
import type { TransformerEvaluationOptions } from './transformer-evaluation-options.js';

/**
 * Returns the limits an evaluated transformer breaks, as issues with numbers: window fill and
 * stack height, peak flux density against saturation at each corner's temperature, and the
 * temperature rise (or a loss–temperature iteration that never settles), and the winding's
 * estimated hot-spot temperature.
 */
export function transformerIssues(
  evaluation: TransformerEvaluation,
  settings: Required<TransformerEvaluationOptions>,
): Issue[] {
  const issues: Issue[] = [];
  const path = ['magnetics'];
  if (evaluation.windowFill > settings.windowFillMax) {
    issues.push({
      code: 'window_fill_limit',
      path,
      constraint: 'windowFill <= windowFillMax',
      quantity: 'windowFill',
      required: evaluation.windowFill,
      limit: settings.windowFillMax,
    });
  }
  if (evaluation.windowHeightFill > 1) {
    issues.push({
      code: 'window_fill_limit',
      path,
      constraint: 'windingStackHeightM <= windowWidthM',
      quantity: 'windingStackHeightM',
      required: evaluation.stack.stackHeightM,
      limit: evaluation.geometry.windowWidthM,
    });
  }
  for (const corner of evaluation.corners) {
    if (corner.fluxDensityUtilization > settings.fluxDensityUtilizationMax) {
      issues.push({
        code: 'flux_density_limit',
        path,
        constraint: 'peakFluxDensityT <= fluxDensityUtilizationMax * saturationFluxDensityT',
        quantity: 'peakFluxDensityT',
        required: corner.peakFluxDensityT,
        limit: settings.fluxDensityUtilizationMax * corner.saturationFluxDensityT,
        corner: corner.label,
      });
    }
    if (!corner.isThermallyStable || corner.temperatureRiseK > settings.temperatureRiseMaxK) {
      issues.push({
        code: 'temperature_rise_limit',
        path,
        constraint: corner.isThermallyStable
          ? 'temperatureRiseK <= temperatureRiseMaxK'
          : 'loss and temperature settle (no thermal runaway)',
        quantity: 'temperatureRiseK',
        required: corner.temperatureRiseK,
        limit: settings.temperatureRiseMaxK,
        corner: corner.label,
      });
    }
    if (corner.hotSpotTemperatureC > settings.hotSpotTemperatureMaxC) {
      issues.push({
        code: 'hot_spot_limit',
        path,
        constraint: 'hotSpotTemperatureC <= hotSpotTemperatureMaxC',
        quantity: 'hotSpotTemperatureC',
        required: corner.hotSpotTemperatureC,
        limit: settings.hotSpotTemperatureMaxC,
        corner: corner.label,
      });
    }
  }
  return issues;
}
