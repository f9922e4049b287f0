import type { ActiveClampForwardCorner, Loss } from '../../design/design-schema.js';
import { bodyDiodeDeadTimeLoss } from '../../losses/body-diode-dead-time-loss.js';
import { gateDriveLoss } from '../../losses/gate-drive-loss.js';
import { outputCapacitanceLoss } from '../../losses/output-capacitance-loss.js';
import { resistiveLoss } from '../../losses/resistive-loss.js';
import { switchingOverlapLoss } from '../../losses/switching-overlap-loss.js';
import { failure, success, type Result } from '../../result.js';
import type { Spec } from '../../spec/spec-schema.js';
import { minimum } from '../../waveform/minimum.js';
import { peak } from '../../waveform/peak.js';
import { rms } from '../../waveform/rms.js';
import { valueAt } from '../../waveform/value-at.js';
import { outputStageLosses } from '../buck-derived/output-stage-losses.js';
import {
  outputStageWaveforms,
  type OutputStageDrive,
} from '../buck-derived/output-stage-waveforms.js';
import { forwardStageStresses, rectifierVoltages } from '../buck-derived/forward-stage-stresses.js';
import { stageOutput } from '../buck-derived/stage-output.js';
import { acRms } from '../../waveform/ac-rms.js';
import type { OperatingCorner } from '../topology.js';
import { deviceStress } from '../device-stress.js';
import {
  activeClampCircuit,
  auxiliarySwitchOf,
  type ActiveClampChoices,
} from './active-clamp-forward-circuit.js';
import { activeClampIssues } from './active-clamp-forward-issues.js';
import { activeClampPrimaryWaveforms } from './active-clamp-forward-primary-waveforms.js';
import { solveActiveClamp } from './active-clamp-forward-state.js';
import { rotateWaveform } from './rotate-waveform.js';

/**
 * Solves one active-clamp forward corner: steady state, waveforms, stresses, losses, ripple and
 * limits. Edge, gate and clamp losses are supplied from the input, so Pin = Pout + Σ losses; the
 * magnetizing and leakage energy circulate through the clamp capacitor and are not lost.
 */
export function solveActiveClampForwardCorner(
  spec: Spec,
  choices: ActiveClampChoices,
  corner: OperatingCorner,
): Result<ActiveClampForwardCorner> {
  const circuit = activeClampCircuit(spec, choices, corner);
  const state = solveActiveClamp(circuit, spec.outputs[0]?.voltageV ?? 0);
  if (state === undefined) return failure(activeClampIssues(spec, choices, corner, undefined));
  const fs = spec.switchingFrequencyHz;
  const periodS = circuit.periodS;
  const vin = corner.inputVoltageV;
  const d = state.dutyCycle;
  const main = spec.primarySwitch;
  const aux = auxiliarySwitchOf(spec);
  const primary = activeClampPrimaryWaveforms(circuit, state, {
    mainOnResistanceOhm: main.onResistanceOhm,
    auxiliaryOnResistanceOhm: aux.onResistanceOhm,
    auxiliaryRiseTimeS: aux.riseTimeS,
    clampCapacitanceF: choices.clampCapacitanceF,
    clampCapacitorEsrOhm: choices.clampCapacitorEsrOhm,
  });
  const capacitorPeakV = peak(primary.capacitorV);
  // The winding follows the clamp capacitor through the reset: scale the reset voltage to its peak.
  const windingResetPeakV = state.resetVoltageV * (capacitorPeakV / state.clampVoltageV);
  const bodyDiodeS = state.bodyDiodeFraction * periodS;
  // Each stage from its own conduction start: its lead before the gate (the swing's area above
  // its rectifier threshold where it is discontinuous).
  const stageLeadOf = (k: number) => state.stageLeadFractions[k] ?? state.leadFraction;
  const drives: OutputStageDrive[] = circuit.stages.map((_, k) => ({
    dutyCycle: d + stageLeadOf(k) + state.offExtensionFraction,
    onStartFraction: state.onCommutationFraction,
    resetEndFraction:
      d +
      stageLeadOf(k) +
      state.offSwingFraction +
      state.offCommutationFraction +
      state.resetDutyCycle,
    secondaryVoltageV: state.primaryVoltageV / (circuit.turnsRatios[k] ?? 1),
    secondaryResetVoltageV: windingResetPeakV / (circuit.turnsRatios[k] ?? 1),
    periodS,
  }));
  // The stages' waveforms start at conduction; advance them so that time 0 is the gate's turn-on.
  const stages = circuit.stages.map((stage, k) => {
    const w = outputStageWaveforms(
      stage,
      state.points[k] as (typeof state.points)[number],
      drives[k] as OutputStageDrive,
    );
    const leadS = stageLeadOf(k) * periodS;
    return {
      inductorA: rotateWaveform(w.inductorA, leadS),
      forwardA: rotateWaveform(w.forwardA, leadS),
      freewheelA: rotateWaveform(w.freewheelA, leadS),
      forwardReverseV: rotateWaveform(w.forwardReverseV, leadS),
      freewheelReverseV: rotateWaveform(w.freewheelReverseV, leadS),
    };
  });
  let reflectedValleyA = 0;
  state.points.forEach((p, k) => (reflectedValleyA += p.valleyA / (circuit.turnsRatios[k] ?? 1)));
  // The values just after turn-off come from the waveforms' builder, not from valueAt at D·T:
  // the advanced waveforms put that jump within round-off of D·T, on either side.
  const clampStartA = primary.clampStartA;
  const restV = valueAt(primary.capacitorV, 0);
  const clampRmsA = rms(primary.clampA);
  const turnOnV = state.turnOnVoltageV;
  const losses: Loss[] = [
    loss('main-switch', 'conduction', resistiveLoss(rms(primary.switchA), main.onResistanceOhm)),
    // Turn-on from the drain voltage the dead time left (Vin when the output inductors held the
    // winding, less or zero when the negative magnetizing current carried it on): overlap at the
    // reflected valley current, conservatively ignoring the magnetizing current's help, and
    // ½·(Coss,main + Coss,aux)·V² (the main's discharged, the auxiliary's charged by V more).
    loss(
      'main-switch',
      'turn-on',
      switchingOverlapLoss(turnOnV, Math.max(0, reflectedValleyA), main.riseTimeS, fs),
    ),
    loss(
      'main-switch',
      'dead-time',
      bodyDiodeDeadTimeLoss(
        main.bodyDiodeForwardVoltageV,
        Math.abs(valueAt(primary.switchA, periodS - bodyDiodeS)),
        bodyDiodeS,
        fs,
      ),
    ),
    loss(
      'main-switch',
      'turn-off',
      switchingOverlapLoss(primary.turnOffDrainV, primary.turnOffSwitchA, main.fallTimeS, fs),
    ),
    loss(
      'main-switch',
      'output-capacitance',
      outputCapacitanceLoss(main.outputCapacitanceF + aux.outputCapacitanceF, turnOnV, fs),
    ),
    loss('main-switch', 'gate-drive', gateDriveLoss(main.gateChargeC, main.gateDriveVoltageV, fs)),
    loss('auxiliary-switch', 'conduction', resistiveLoss(clampRmsA, aux.onResistanceOhm)),
    // Its body diode takes the clamp current once the drain reaches the clamp within the dead
    // time, and its gate turns on at zero voltage; where the dead time ends first, it turns on
    // hard across ΔV: overlap with the magnetizing current it takes over, and ½·C·ΔV² of the
    // switch node's capacitance (the clamp charges the main's, its own discharges in it).
    loss(
      'auxiliary-switch',
      'dead-time',
      bodyDiodeDeadTimeLoss(
        aux.bodyDiodeForwardVoltageV,
        Math.max(0, clampStartA),
        state.auxiliaryBodyDiodeS,
        fs,
      ),
    ),
    loss(
      'auxiliary-switch',
      'turn-on',
      switchingOverlapLoss(
        state.auxiliaryTurnOnVoltageV,
        Math.max(0, state.magnetizingPeakA),
        aux.riseTimeS,
        fs,
      ),
    ),
    loss(
      'auxiliary-switch',
      'output-capacitance',
      outputCapacitanceLoss(circuit.switchNodeCapacitanceF, state.auxiliaryTurnOnVoltageV, fs),
    ),
    loss(
      'auxiliary-switch',
      'turn-off',
      switchingOverlapLoss(restV, Math.abs(state.magnetizingValleyA), aux.fallTimeS, fs),
    ),
    loss(
      'auxiliary-switch',
      'gate-drive',
      gateDriveLoss(aux.gateChargeC, aux.gateDriveVoltageV, fs),
    ),
    loss('clamp-capacitor', 'esr', resistiveLoss(clampRmsA, choices.clampCapacitorEsrOhm)),
    loss('primary', 'copper', resistiveLoss(rms(primary.windingA), choices.primaryResistanceOhm)),
  ];
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
  state.points.forEach((p, k) => (outputPowerW += p.voltageV * (circuit.stages[k]?.loadA ?? 0)));
  const inputPowerW = outputPowerW + lossTotalW;
  const solved: ActiveClampForwardCorner = {
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
      switchVoltagesV: [primary.switchV],
      outputInductorCurrentsA: stages.map((w) => w.inductorA),
      rectifierVoltagesV: rectifierVoltages(stages),
      auxiliarySwitchCurrentA: primary.clampA,
      auxiliarySwitchVoltageV: primary.auxiliaryV,
      clampCapacitorVoltageV: primary.capacitorV,
    },
    switches: [deviceStress('main-switch', primary.switchA, primary.switchV, main.voltageRatingV)],
    ...forwardStageStresses(
      spec,
      circuit.stages,
      stages,
      primary.windingA,
      choices.primaryResistanceOhm,
    ),
    activeClamp: {
      capacitorVoltageV: state.clampVoltageV,
      capacitorVoltagePeakV: capacitorPeakV,
      capacitorRippleVoltagePeakToPeakV: capacitorPeakV - minimum(primary.capacitorV),
      capacitorCurrentRmsA: clampRmsA,
      magnetizingCurrentValleyA: state.magnetizingValleyA,
      auxiliarySwitch: deviceStress(
        'auxiliary-switch',
        primary.clampA,
        primary.auxiliaryV,
        aux.voltageRatingV,
      ),
    },
    losses,
    lossTotalW,
    outputPowerW,
    inputPowerW,
    inputCurrentAverageA: inputPowerW / vin,
    // High-side clamp: the clamp loop closes at the input rail, so the input (and its capacitor)
    // carries the main switch current only.
    inputCapacitorRippleCurrentRmsA: acRms(primary.switchA),
    efficiency: outputPowerW / inputPowerW,
    outputs: spec.outputs.map((output, k) =>
      stageOutput(
        output,
        state.points[k]?.voltageV ?? 0,
        circuit.stages[k]?.loadA ?? 0,
        stages[k]?.inductorA ?? primary.switchA,
      ),
    ),
  };
  const issues = activeClampIssues(spec, choices, corner, solved);
  return issues.length > 0 ? failure(issues) : success(solved);
}

function loss(component: string, mechanism: Loss['mechanism'], powerW: number): Loss {
  return { component, mechanism, powerW };
}
