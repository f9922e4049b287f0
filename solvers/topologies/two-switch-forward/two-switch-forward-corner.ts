import type { ForwardCorner, Loss } from '../../design/design-schema.js';
import { diodeConductionLoss } from '../../losses/diode-conduction-loss.js';
import { gateDriveLoss } from '../../losses/gate-drive-loss.js';
import { outputCapacitanceLoss } from '../../losses/output-capacitance-loss.js';
import { resistiveLoss } from '../../losses/resistive-loss.js';
import { switchingOverlapLoss } from '../../losses/switching-overlap-loss.js';
import { failure, success, type Result } from '../../result.js';
import type { Spec } from '../../spec/spec-schema.js';
import { average } from '../../waveform/average.js';
import { rms } from '../../waveform/rms.js';
import { outputStageLosses } from '../buck-derived/output-stage-losses.js';
import {
  outputStageWaveforms,
  type OutputStageDrive,
} from '../buck-derived/output-stage-waveforms.js';
import { forwardStageStresses, rectifierVoltages } from '../buck-derived/forward-stage-stresses.js';
import { stageOutput } from '../buck-derived/stage-output.js';
import { acRms } from '../../waveform/ac-rms.js';
import type { OperatingCorner } from '../topology.js';
import { twoSwitchForwardIssues } from './two-switch-forward-issues.js';
import { deviceStress } from '../device-stress.js';
import {
  solveTwoSwitchForward,
  twoSwitchForwardCircuit,
  type AnyForwardChoices,
  type TwoSwitchForwardCircuit,
} from './two-switch-forward-state.js';
import { twoSwitchForwardPrimaryWaveforms } from './two-switch-forward-primary-waveforms.js';

/**
 * Solves one two-switch forward corner: steady state, waveforms, stresses, losses, ripple and
 * limits. Edge, gate and clamp-diode losses are supplied from the input, so Pin = Pout + Σ losses;
 * the magnetizing energy returns to the input through the clamp diodes (only their drop is lost).
 */
export function solveTwoSwitchForwardCorner(
  spec: Spec,
  choices: AnyForwardChoices,
  corner: OperatingCorner,
): Result<ForwardCorner> {
  const circuit = twoSwitchForwardCircuit(spec, choices, corner);
  const state = solveTwoSwitchForward(circuit, spec.outputs[0]?.voltageV ?? 0);
  if (state === undefined) {
    return failure(twoSwitchForwardIssues(spec, choices, corner, circuit, undefined));
  }
  const fs = spec.switchingFrequencyHz;
  const periodS = circuit.periodS;
  const vin = corner.inputVoltageV;
  const d = state.dutyCycle;
  // The winding is reversed from the swing's end until the ring brings it back to zero.
  const resetEnd = d + state.turnOffSwingFraction + state.ring.ringEndS / periodS;
  // The stages' on-interval: the commutation, then the on-voltage up to the equivalent end of
  // the turn-off swing.
  const drives: OutputStageDrive[] = circuit.stages.map((_, k) => ({
    dutyCycle: d + state.turnOffSwingFraction / 2,
    onStartFraction: state.commutationFraction,
    resetEndFraction: resetEnd,
    secondaryVoltageV: state.primaryVoltageV / (circuit.turnsRatios[k] ?? 1),
    secondaryResetVoltageV: state.resetVoltageV / (circuit.turnsRatios[k] ?? 1),
    periodS,
  }));
  const stages = circuit.stages.map((stage, k) =>
    outputStageWaveforms(
      stage,
      state.points[k] as (typeof state.points)[number],
      drives[k] as OutputStageDrive,
    ),
  );
  const primary = twoSwitchForwardPrimaryWaveforms(
    circuit,
    state,
    spec.primarySwitch.onResistanceOhm,
  );
  const device = spec.primarySwitch;
  let reflectedValleyA = 0;
  let reflectedPeakA = 0;
  state.points.forEach((point, k) => {
    reflectedValleyA += point.valleyA / (circuit.turnsRatios[k] ?? 1);
    reflectedPeakA += point.peakA / (circuit.turnsRatios[k] ?? 1);
  });
  // Turn-on from where the ring leaves the node (the idle interval once it is over, where the
  // equal switch capacitances share Vin); turn-off at the node's peak: the clamp at Vin + Vf
  // (two-switch) or Vin + Vr, or the ring's (or the leakage's spike's) peak short of it.
  const isTwoSwitch = circuit.reset.kind === 'clamp-diodes';
  const turnOnV = switchVoltageAt(circuit, state.ring.turnOnWindingV);
  // With leakage the node goes on past the ring's peak: the spike's top (the clamp, or the
  // node's LC peak), as the flyback takes its leakage's spike (flyback-losses.ts).
  const turnOffV = switchVoltageAt(
    circuit,
    Math.max(state.resetVoltageV, primary.leakageSpike?.topV ?? 0),
  );
  const switchNames = isTwoSwitch ? ['high-side-switch', 'low-side-switch'] : ['primary-switch'];
  const losses: Loss[] = [];
  for (const name of switchNames) {
    losses.push(
      {
        component: name,
        mechanism: 'conduction',
        powerW: resistiveLoss(rms(primary.switchA), device.onResistanceOhm),
      },
      {
        component: name,
        mechanism: 'turn-on',
        powerW: switchingOverlapLoss(turnOnV, reflectedValleyA, device.riseTimeS, fs),
      },
      {
        component: name,
        mechanism: 'turn-off',
        powerW: switchingOverlapLoss(
          turnOffV,
          state.magnetizingPeakA + reflectedPeakA,
          device.fallTimeS,
          fs,
        ),
      },
      {
        component: name,
        mechanism: 'output-capacitance',
        powerW: outputCapacitanceLoss(device.outputCapacitanceF, turnOnV, fs),
      },
      {
        component: name,
        mechanism: 'gate-drive',
        powerW: gateDriveLoss(device.gateChargeC, device.gateDriveVoltageV, fs),
      },
    );
  }
  const clampMeanA = average(primary.clampA);
  losses.push(
    {
      component: isTwoSwitch ? 'primary-clamp-diodes' : 'reset-diode',
      mechanism: 'conduction',
      powerW:
        (isTwoSwitch ? 2 : 1) *
        diodeConductionLoss(circuit.clampDiodeV, 0, clampMeanA, rms(primary.clampA)),
    },
    {
      component: 'primary',
      mechanism: 'copper',
      powerW: resistiveLoss(rms(primary.windingA), choices.primaryResistanceOhm),
    },
  );
  spec.outputs.forEach((output, k) => {
    const stage = circuit.stages[k];
    const point = state.points[k];
    const drive = drives[k];
    const waves = stages[k];
    if (stage && point && drive && waves)
      losses.push(...outputStageLosses(k + 1, output, stage, point, drive, waves));
  });
  let lossTotalW = 0;
  for (const item of losses) lossTotalW += item.powerW;
  let outputPowerW = 0;
  state.points.forEach(
    (point, k) => (outputPowerW += point.voltageV * (circuit.stages[k]?.loadA ?? 0)),
  );
  const inputPowerW = outputPowerW + lossTotalW;
  const switchVoltageV = primary.switchV;
  const solved: ForwardCorner = {
    label: corner.label,
    inputVoltageV: vin,
    loadFraction: corner.loadFraction,
    dutyCycle: d,
    resetDutyCycle: state.resetDutyCycle,
    outputInductorModes: state.points.map((point) => point.mode),
    magnetizingCurrentPeakA: state.magnetizingPeakA,
    outputInductorCurrentRipplesA: state.points.map((point) => point.peakA - point.valleyA),
    waveforms: {
      magnetizingCurrentA: primary.magnetizingA,
      primaryCurrentA: primary.switchA,
      primaryWindingCurrentA: primary.windingA,
      secondaryCurrentsA: stages.map((w) => w.forwardA),
      ...(isTwoSwitch ? {} : { resetWindingCurrentA: primary.clampA }),
      switchVoltagesV: switchNames.map(() => switchVoltageV),
      outputInductorCurrentsA: stages.map((w) => w.inductorA),
      rectifierVoltagesV: rectifierVoltages(stages),
    },
    switches: switchNames.map((name) =>
      deviceStress(name, primary.switchA, switchVoltageV, device.voltageRatingV),
    ),
    ...forwardStageStresses(
      spec,
      circuit.stages,
      stages,
      primary.windingA,
      choices.primaryResistanceOhm,
    ),
    losses,
    lossTotalW,
    outputPowerW,
    inputPowerW,
    inputCurrentAverageA: inputPowerW / vin,
    // The source supplies the mean; the capacitor carries the rest of the switch current less the
    // magnetizing current the clamp diodes return.
    inputCapacitorRippleCurrentRmsA: acRms(primary.inputA),
    efficiency: outputPowerW / inputPowerW,
    outputs: spec.outputs.map((output, k) =>
      stageOutput(
        output,
        state.points[k]?.voltageV ?? 0,
        circuit.stages[k]?.loadA ?? 0,
        stages[k]?.inductorA ?? primary.switchA,
      ),
    ),
    ...(state.modelFallback === undefined ? {} : { modelFallback: state.modelFallback }),
  };
  const issues = twoSwitchForwardIssues(spec, choices, corner, circuit, solved);
  return issues.length > 0 ? failure(issues) : success(solved);
}

/**
 * Each switch's voltage (V) with the winding reversed by `windingV`: Vin/2 + v/2 for the two
 * equal switches in series, at most Vin + Vf at the clamp; Vin + v for the one switch.
 */
function switchVoltageAt(circuit: TwoSwitchForwardCircuit, windingV: number): number {
  const vin = circuit.inputVoltageV;
  return circuit.reset.kind === 'clamp-diodes'
    ? Math.min(vin / 2 + windingV / 2, vin + circuit.clampDiodeV)
    : vin + windingV;
}
