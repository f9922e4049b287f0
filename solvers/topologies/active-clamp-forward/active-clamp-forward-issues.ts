import type { ActiveClampForwardCorner } from '../../design/design-schema.js';
import { voltageRatingIssues } from '../../limits/voltage-rating-issues.js';
import type { Issue } from '../../result.js';
import type { Spec } from '../../spec/spec-schema.js';
import type { OperatingCorner } from '../topology.js';
import type { ActiveClampChoices } from './active-clamp-forward-circuit.js';

/**
 * Returns every limit a corner violates, with its numbers: the duty cycle against
 * limits.dutyCycleMax (the topology itself allows D above 0.5; for an unsolved corner, the
 * lossless n·(Vo + Vf)/Vin it would need), the main switch's peak voltage (about Vin/(1 − D))
 * and the auxiliary switch's against their derated ratings (one check when the auxiliary is the
 * main switch's device), and each rectifier's peak reverse voltage.
 */
export function activeClampIssues(
  spec: Spec,
  choices: ActiveClampChoices,
  corner: OperatingCorner,
  solved: ActiveClampForwardCorner | undefined,
): Issue[] {
  const issues: Issue[] = [];
  const at = corner.label;
  const vin = corner.inputVoltageV;
  const first = spec.outputs[0];
  const losslessDuty =
    first === undefined
      ? 1
      : (choices.turnsRatio *
          (first.voltageV +
            (first.rectifier.kind === 'diode' ? first.rectifier.forwardVoltageV : 0))) /
        vin;
  const dutyCycle = solved?.dutyCycle ?? losslessDuty;
  if (dutyCycle > spec.limits.dutyCycleMax) {
    issues.push({
      code: 'duty_cycle_limit',
      path:
        choices.origins.turnsRatio === 'spec'
          ? ['transformer', 'turnsRatio']
          : ['limits', 'dutyCycleMax'],
      constraint: 'dutyCycle <= dutyCycleMax',
      quantity: 'dutyCycle',
      required: dutyCycle,
      limit: spec.limits.dutyCycleMax,
      corner: at,
    });
  }
  // Unsolved: the lossless high-side clamp, Vc = Vin·D/(1 − D), switch Vin/(1 − D).
  const estimateD = Math.min(losslessDuty, 0.99);
  const clampV = solved?.activeClamp.capacitorVoltagePeakV ?? (vin * estimateD) / (1 - estimateD);
  const mainPeakV = solved?.switches[0]?.voltagePeakV ?? vin + clampV;
  const auxPeakV = solved?.activeClamp.auxiliarySwitch.voltagePeakV ?? vin + clampV;
  const ownAuxiliary = spec.activeClamp?.auxiliarySwitch;
  const switchPeakV = ownAuxiliary === undefined ? Math.max(mainPeakV, auxPeakV) : mainPeakV;
  const rectifierPeaksV = spec.outputs.map((output, k) => {
    if (output.rectifier.voltageRatingV === undefined) return undefined;
    const n = choices.outputTurnsRatios[k] ?? 1;
    return solved === undefined
      ? clampV / n + output.voltageV
      : Math.max(
          solved.rectifiers[2 * k]?.voltagePeakV ?? 0,
          solved.rectifiers[2 * k + 1]?.voltagePeakV ?? 0,
        );
  });
  issues.push(...voltageRatingIssues(spec, at, switchPeakV, rectifierPeaksV));
  if (ownAuxiliary !== undefined) {
    const limitV = spec.limits.switchVoltageDerating * ownAuxiliary.voltageRatingV;
    if (auxPeakV > limitV) {
      issues.push({
        code: 'switch_voltage_rating',
        path: ['activeClamp', 'auxiliarySwitch', 'voltageRatingV'],
        constraint: 'auxiliarySwitchVoltagePeakV <= switchVoltageDerating * voltageRatingV',
        quantity: 'auxiliarySwitchVoltagePeakV',
        required: auxPeakV,
        limit: limitV,
        corner: at,
      });
    }
  }
  return issues;
}
