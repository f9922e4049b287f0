import type { ForwardCorner } from '../../design/design-schema.js';
import { voltageRatingIssues } from '../../limits/voltage-rating-issues.js';
import type { Issue } from '../../result.js';
import type { Spec } from '../../spec/spec-schema.js';
import type { OperatingCorner } from '../topology.js';
import { forwardClampV } from './complete-forward-state.js';
import { forwardDutyCycleLimit } from './two-switch-forward-limits.js';
import type { AnyForwardChoices, TwoSwitchForwardCircuit } from './two-switch-forward-state.js';

/**
 * Returns every limit a corner violates, with its numbers: the duty cycle against the lower of
 * limits.dutyCycleMax and the topology's own (0.5, or 1/(1 + Nr/Np) with a reset winding) (for an unsolved corner, the lossless duty cycle
 * n·(Vo + Vf)/Vin it would need), the reset (D + Dr ≤ 1), and the switch and rectifier voltages
 * against their derated ratings.
 */
export function twoSwitchForwardIssues(
  spec: Spec,
  choices: AnyForwardChoices,
  corner: OperatingCorner,
  circuit: TwoSwitchForwardCircuit,
  solved: ForwardCorner | undefined,
): Issue[] {
  const issues: Issue[] = [];
  const at = corner.label;
  const ownLimit = forwardDutyCycleLimit(circuit.reset);
  const dutyLimit = Math.min(spec.limits.dutyCycleMax, ownLimit);
  const dutyPath =
    choices.origins.turnsRatio === 'spec'
      ? ['transformer', 'turnsRatio']
      : ['limits', 'dutyCycleMax'];
  const first = spec.outputs[0];
  const firstStage = circuit.stages[0];
  const losslessDuty =
    first === undefined || firstStage === undefined
      ? 1
      : (choices.turnsRatio * (first.voltageV + firstStage.rectifier.forwardVoltageV)) /
        corner.inputVoltageV;
  const dutyCycle = solved?.dutyCycle ?? losslessDuty;
  if (dutyCycle > dutyLimit) {
    issues.push({
      code: 'duty_cycle_limit',
      path: dutyPath,
      constraint:
        circuit.reset.kind === 'clamp-diodes'
          ? 'dutyCycle <= min(dutyCycleMax, 0.5)'
          : 'dutyCycle <= min(dutyCycleMax, 1 / (1 + resetTurnsRatio))',
      quantity: 'dutyCycle',
      required: dutyCycle,
      limit: dutyLimit,
      corner: at,
    });
  }
  if (solved !== undefined && solved.dutyCycle + solved.resetDutyCycle > 1) {
    issues.push({
      code: 'reset_incomplete',
      path: dutyPath,
      constraint: 'dutyCycle + resetDutyCycle <= 1',
      quantity: 'dutyCycle + resetDutyCycle',
      required: solved.dutyCycle + solved.resetDutyCycle,
      limit: 1,
      corner: at,
    });
  }
  // Ratings take the clamp, the most the reset can reach, even where the steady state's ring
  // stops short of it: a load step or the start-up raises the magnetizing current above its
  // steady value (DEVELOPERS.md, "The magnetizing ring"). Two-switch: each switch blocks Vin
  // plus one clamp diode drop, the winding is reset at Vin + 2·Vf. Reset winding: the winding
  // is reset at (Vin + Vf)·Np/Nr and the one switch blocks Vin more.
  const clampWindingV = forwardClampV(circuit);
  const switchPeakV =
    circuit.reset.kind === 'clamp-diodes'
      ? corner.inputVoltageV + circuit.clampDiodeV
      : corner.inputVoltageV + clampWindingV;
  // A forward rectifier blocks the clamp's winding voltage over n, plus the output where the
  // inductor current stops and the node sits at Vo (and at an unsolved corner, where the mode is
  // not known); the solved peaks count where higher.
  const rectifierPeaksV = spec.outputs.map((output, k) => {
    if (output.rectifier.voltageRatingV === undefined) return undefined;
    const n = choices.outputTurnsRatios[k] ?? 1;
    const idleV = solved?.outputInductorModes[k] === 'ccm' ? 0 : output.voltageV;
    return Math.max(
      clampWindingV / n + idleV,
      solved?.rectifiers[2 * k]?.voltagePeakV ?? 0,
      solved?.rectifiers[2 * k + 1]?.voltagePeakV ?? 0,
    );
  });
  issues.push(...voltageRatingIssues(spec, at, switchPeakV, rectifierPeaksV));
  return issues;
}
