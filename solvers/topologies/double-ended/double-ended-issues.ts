import type { DoubleEndedCorner } from '../../design/design-schema.js';
import { voltageRatingIssues } from '../../limits/voltage-rating-issues.js';
import type { Issue } from '../../result.js';
import type { Spec } from '../../spec/spec-schema.js';
import type { OperatingCorner } from '../topology.js';
import { physicalOutputV } from '../power-not-deliverable.js';
import {
  doubleEndedStateAt,
  type DoubleEndedChoices,
  type DoubleEndedCircuit,
} from './double-ended-state.js';
import { DOUBLE_ENDED_DUTY_CYCLE_MAX } from './primary-bridge.js';

/**
 * Returns every limit a corner violates, with its numbers: the duty cycle against the lower of
 * limits.dutyCycleMax and 0.5 (for an unsolved corner, the lossless duty cycle
 * n·(Vo + Vf)/(2·Vd) it would need, or, when that fits but the drops do not, the output voltage
 * reached at D = 0.5), the push-pull's clamp voltage against the input (the other half's voltage,
 * which it must exceed), and the switch and rectifier voltages against their derated ratings.
 */
export function doubleEndedIssues(
  spec: Spec,
  choices: DoubleEndedChoices,
  corner: OperatingCorner,
  circuit: DoubleEndedCircuit,
  solved: DoubleEndedCorner | undefined,
): Issue[] {
  const issues: Issue[] = [];
  const at = corner.label;
  const dutyLimit = Math.min(spec.limits.dutyCycleMax, DOUBLE_ENDED_DUTY_CYCLE_MAX);
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
        (2 * circuit.driveVoltageV);
  const dutyCycle = solved?.dutyCycle ?? losslessDuty;
  if (dutyCycle > dutyLimit) {
    issues.push({
      code: 'duty_cycle_limit',
      path: dutyPath,
      constraint: 'dutyCycle <= min(dutyCycleMax, 0.5)',
      quantity: 'dutyCycle',
      required: dutyCycle,
      limit: dutyLimit,
      corner: at,
    });
  } else if (solved === undefined && first !== undefined) {
    // The output at D = 0.5 where the model gives a physical figure short of the target (at
    // least 0 V: the freewheeling rectifier holds it there); else the shortfall is the engine's.
    const reachedV = physicalOutputV(
      doubleEndedStateAt(circuit, DOUBLE_ENDED_DUTY_CYCLE_MAX).points[0]?.voltageV ?? NaN,
      circuit.driveVoltageV / (choices.outputTurnsRatios[0] ?? choices.turnsRatio),
    );
    issues.push(
      reachedV < first.voltageV
        ? {
            code: 'power_not_deliverable',
            path: dutyPath,
            constraint: 'outputVoltageV <= output voltage at dutyCycle 0.5',
            quantity: 'outputVoltageV',
            required: first.voltageV,
            limit: Math.max(0, reachedV),
            corner: at,
          }
        : {
            code: 'steady_state_not_found',
            path: dutyPath,
            constraint: 'a steady state with dutyCycle <= dutyCycleLimit holds outputVoltageV',
            quantity: 'dutyCycle',
            required: losslessDuty,
            limit: dutyLimit,
            corner: at,
          },
    );
  }
  // Push-pull: the off switch blocks Vin plus the driven half's voltage (about 2·Vin), and with
  // leakage its clamp holds the turn-off spike at Vin + Vc (push-pull-clamp.ts), which must
  // exceed the other half's voltage (at most Vin) or the clamp would conduct all through the
  // other half's drive; bridges: the input voltage.
  const isPushPull = circuit.bridge.kind === 'push-pull';
  const clampV = isPushPull ? choices.clampVoltageV : undefined;
  if (clampV !== undefined && !(clampV > corner.inputVoltageV)) {
    issues.push({
      code: 'clamp_voltage_too_low',
      path:
        choices.origins.clampVoltageV === 'spec'
          ? ['clamp', 'voltageV']
          : ['clamp', 'voltageToReflectedRatio'],
      constraint: 'reflectedVoltageV < clampVoltageV',
      quantity: 'reflectedVoltageV',
      required: corner.inputVoltageV,
      limit: clampV,
      corner: at,
    });
  }
  const switchPeakV =
    solved === undefined
      ? clampV !== undefined
        ? corner.inputVoltageV + clampV
        : (isPushPull ? 2 : 1) * corner.inputVoltageV
      : Math.max(...solved.switches.map((s) => s.voltagePeakV));
  let offset = 0;
  const rectifierPeaksV = spec.outputs.map((output, k) => {
    const count = choices.secondaryArrangements[k] === 'full-bridge' ? 4 : 2;
    const devices = solved?.rectifiers.slice(offset, offset + count) ?? [];
    offset += count;
    if (output.rectifier.voltageRatingV === undefined) return undefined;
    if (solved === undefined) {
      const secondaryV = circuit.driveVoltageV / (choices.outputTurnsRatios[k] ?? 1);
      return (count === 2 ? 2 : 1) * secondaryV;
    }
    return Math.max(...devices.map((d) => d.voltagePeakV));
  });
  issues.push(...voltageRatingIssues(spec, at, switchPeakV, rectifierPeaksV));
  return issues;
}
