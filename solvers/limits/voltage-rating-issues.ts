import type { Issue } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';

/**
 * Returns the voltage-rating issues of one corner: the switch peak against its derated rating,
 * and each output rectifier's peak reverse voltage against its derated rating where the spec
 * gives one (`rectifierPeaksV[k]` undefined skips output k). Peaks in V.
 */
export function voltageRatingIssues(
  spec: Spec,
  corner: string,
  switchPeakV: number,
  rectifierPeaksV: readonly (number | undefined)[],
): Issue[] {
  const issues: Issue[] = [];
  const switchLimitV = spec.limits.switchVoltageDerating * spec.primarySwitch.voltageRatingV;
  if (switchPeakV > switchLimitV) {
    issues.push({
      code: 'switch_voltage_rating',
      path: ['primarySwitch', 'voltageRatingV'],
      constraint: 'switchVoltagePeakV <= switchVoltageDerating * voltageRatingV',
      quantity: 'switchVoltagePeakV',
      required: switchPeakV,
      limit: switchLimitV,
      corner,
    });
  }
  spec.outputs.forEach((output, k) => {
    const ratingV = output.rectifier.voltageRatingV;
    const peakV = rectifierPeaksV[k];
    if (ratingV === undefined || peakV === undefined) return;
    const limitV = spec.limits.rectifierVoltageDerating * ratingV;
    if (peakV <= limitV) return;
    issues.push({
      code: 'rectifier_voltage_rating',
      path: ['outputs', k, 'rectifier', 'voltageRatingV'],
      constraint: 'rectifierVoltagePeakV <= rectifierVoltageDerating * voltageRatingV',
      quantity: 'rectifierVoltagePeakV',
      required: peakV,
      limit: limitV,
      corner,
    });
  });
  return issues;
}
