import type { Corner, FlybackDesign } from '../../design/design-schema.js';
import { voltageRatingIssues } from '../../limits/voltage-rating-issues.js';
import type { Issue } from '../../result.js';
import type { Spec } from '../../spec/spec-schema.js';
import type { FlybackCircuit } from './flyback-circuit.js';
import { flybackDeliverablePowerW, flybackMinimumPowerW } from './flyback-deliverable-power.js';
import type {
  FlybackSteadyStateFailure,
  FlybackSteadyStateOptions,
} from './flyback-steady-state.js';
import type { OperatingCorner } from '../topology.js';

/** A solved corner, or the reason its steady state does not exist. */
export type FlybackCornerOutcome =
  | { solved: true; corner: Corner; reflectedPeakV: number }
  | { solved: false; reason: FlybackSteadyStateFailure };

/**
 * Returns every limit the corner violates, each with its numbers and the corner's label: duty
 * cycle (CCM) or deliverable power (DCM, or no steady state), switch and rectifier voltage
 * against their derated ratings, clamp voltage against the reflected voltage. An unsolved corner
 * is still checked for the stresses that need no steady state (Vin + Vc, Vo + Vin/n).
 */
export function flybackCornerIssues(
  spec: Spec,
  choices: FlybackDesign['choices'],
  corner: OperatingCorner,
  circuit: FlybackCircuit,
  outcome: FlybackCornerOutcome,
  options: FlybackSteadyStateOptions,
): Issue[] {
  const issues: Issue[] = [];
  const at = corner.label;
  const vin = corner.inputVoltageV;
  const { limits } = spec;
  const requiredPowerW = circuit.outputs.reduce(
    (sum, path, k) => sum + (spec.outputs[k]?.voltageV ?? 0) * path.currentA,
    0,
  );
  const inductancePath =
    choices.origins.magnetizingInductanceH === 'spec'
      ? ['transformer', 'magnetizingInductanceH']
      : ['targets', 'magnetizingRippleRatioTarget'];
  // Issues are built by the module functions below, not by named arrows here: under tsx (the
  // service's and the bench's runtime) esbuild's keepNames wraps every named arrow in an
  // Object.defineProperty call, paid at every corner whether an issue arises or not.
  const deliverable = { spec, choices, corner, options, requiredPowerW };
  const clampPath =
    choices.origins.clampVoltageV === 'spec'
      ? ['clamp', 'voltageV']
      : ['clamp', 'voltageToReflectedRatio'];
  let switchPeakV: number;
  let rectifierPeaksV: number[];
  if (outcome.solved) {
    const solved = outcome.corner;
    if (solved.dutyCycle > limits.dutyCycleMax) {
      if (solved.conductionMode === 'dcm') {
        issues.push(powerIssue(deliverable, 'dcm_power_limit', inductancePath));
      } else {
        issues.push({
          code: 'duty_cycle_limit',
          path:
            choices.origins.turnsRatio === 'spec'
              ? ['transformer', 'turnsRatio']
              : ['limits', 'dutyCycleMax'],
          constraint: 'dutyCycle <= dutyCycleMax',
          quantity: 'dutyCycle',
          required: solved.dutyCycle,
          limit: limits.dutyCycleMax,
          corner: at,
        });
      }
    }
    const reflectedPeakV = outcome.reflectedPeakV;
    if (!(circuit.clampVoltageV > reflectedPeakV))
      issues.push(clampIssue(clampPath, reflectedPeakV, circuit, at));
    switchPeakV = solved.switches[0]?.voltagePeakV ?? 0;
    rectifierPeaksV = solved.rectifiers.map((device) => device.voltagePeakV);
  } else {
    if (outcome.reason === 'clamp-below-reflected')
      issues.push(clampIssue(clampPath, circuit.reflectedOffsetV, circuit, at));
    else issues.push(unsolvedPowerIssue(deliverable, outcome.reason));
    switchPeakV =
      vin + (circuit.leakageInductanceH > 0 ? circuit.clampVoltageV : circuit.reflectedOffsetV);
    rectifierPeaksV = spec.outputs.map(
      (output, k) => output.voltageV + vin / (circuit.outputs[k]?.turnsRatio ?? 1),
    );
  }
  issues.push(...voltageRatingIssues(spec, at, switchPeakV, rectifierPeaksV));
  return issues;
}

/** What an output power issue is judged from: the corner and the power its outputs draw (W). */
interface DeliverableContext {
  spec: Spec;
  choices: FlybackDesign['choices'];
  corner: OperatingCorner;
  options: FlybackSteadyStateOptions;
  requiredPowerW: number;
}

/** The outputs draw more than the corner can deliver (in DCM, or at all). */
function powerIssue(
  context: DeliverableContext,
  code: 'dcm_power_limit' | 'power_not_deliverable',
  path: string[],
): Issue {
  const { spec, choices, corner, options } = context;
  return {
    code,
    path,
    constraint: 'outputPowerW <= deliverablePowerW',
    quantity: 'outputPowerW',
    required: context.requiredPowerW,
    limit: flybackDeliverablePowerW(spec, choices, corner, options),
    corner: corner.label,
  };
}

/**
 * A corner without a steady state: the outputs draw less than the converter delivers at its
 * shortest pulse (the solve's 'below-minimum-power', or no root at all where a larger load has
 * one: the DCM charge then exceeds the load's at every duty cycle that delivers) and the corner
 * solved at that pulse (flyback-floor-state.ts) does not settle below the clamp, or the outputs
 * draw more than it can deliver.
 */
function unsolvedPowerIssue(context: DeliverableContext, reason: FlybackSteadyStateFailure): Issue {
  const { spec, choices, corner, options } = context;
  const minimumW = flybackMinimumPowerW(spec, choices, corner, options);
  if (reason === 'below-minimum-power' || minimumW > context.requiredPowerW) {
    return {
      code: 'load_below_minimum_power',
      path: ['loadFractions'],
      constraint: 'outputPowerW >= minimumPowerW',
      quantity: 'outputPowerW',
      required: context.requiredPowerW,
      limit: minimumW,
      corner: corner.label,
    };
  }
  return powerIssue(context, 'power_not_deliverable', ['outputs']);
}

/** The clamp voltage does not exceed the reflected voltage `reflectedV` (V). */
function clampIssue(
  path: string[],
  reflectedV: number,
  circuit: FlybackCircuit,
  cornerLabel: string,
): Issue {
  return {
    code: 'clamp_voltage_too_low',
    path,
    constraint: 'reflectedVoltageV < clampVoltageV',
    quantity: 'reflectedVoltageV',
    required: reflectedV,
    limit: circuit.clampVoltageV,
    corner: cornerLabel,
  };
}
