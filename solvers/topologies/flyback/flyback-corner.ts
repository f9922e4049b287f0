import type { Corner, DeviceStress, FlybackDesign } from '../../design/design-schema.js';
import { failure, success, type Result } from '../../result.js';
import type { Spec } from '../../spec/spec-schema.js';
import { average } from '../../waveform/average.js';
import { peak } from '../../waveform/peak.js';
import { peakToPeak } from '../../waveform/peak-to-peak.js';
import { scaleWaveform } from '../../waveform/scale-waveform.js';
import { flybackCircuit } from './flyback-circuit.js';
import { flybackCornerIssues } from './flyback-corner-issues.js';
import { flybackCurrentStats, type CurrentStats } from './flyback-current-stats.js';
import { flybackCurrentWaveforms } from './flyback-current-waveforms.js';
import { flybackLosses } from './flyback-losses.js';
import { flybackOutputRippleV } from './flyback-output-ripple.js';
import { flybackOutputVoltages } from './flyback-output-voltages.js';
import { flybackRingTraces } from './flyback-ring-traces.js';
import { solveFlybackFloorState } from './flyback-floor-state.js';
import {
  solveFlybackSteadyState,
  type FlybackSteadyState,
  type FlybackSteadyStateOptions,
} from './flyback-steady-state.js';
import { flybackVoltageWaveforms } from './flyback-voltage-waveforms.js';
import { deviceStressOf, windingOf } from '../device-stress.js';
import type { OperatingCorner } from '../topology.js';

/**
 * Solves one flyback corner: steady state, waveforms, stresses, losses, ripple and feasibility.
 * Edge, gate and clamp losses are supplied from the input, so Pin = Pout + Σ losses and the
 * average input current is Pin/Vin.
 */
export function solveFlybackCorner(
  spec: Spec,
  choices: FlybackDesign['choices'],
  corner: OperatingCorner,
  options: FlybackSteadyStateOptions = {},
): Result<Corner> {
  const targetCircuit = flybackCircuit(spec, choices, corner);
  const outcome = solveFlybackSteadyState(targetCircuit, options);
  let circuit = targetCircuit;
  let state: FlybackSteadyState;
  // The regulated output's voltage: its target, or above it where the corner is solved at the
  // shortest pulse (summary.regulationMisses lists it).
  let regulatedV = spec.outputs[0]?.voltageV ?? 0;
  if (outcome.ok) state = outcome.state;
  else {
    const floor = solveFlybackFloorState(targetCircuit, outcome.reason, options);
    if (floor === undefined) {
      const unsolved = { solved: false, reason: outcome.reason } as const;
      return failure(flybackCornerIssues(spec, choices, corner, targetCircuit, unsolved, options));
    }
    circuit = floor.circuit;
    state = floor.state;
    regulatedV += floor.outputRiseV;
  }
  // The arcs are drawn once and read by both the current and the voltage waveforms.
  const traces = flybackRingTraces(circuit, state);
  const currents = flybackCurrentWaveforms(circuit, state, traces);
  const stats = flybackCurrentStats(circuit, currents);
  const secondariesA = circuit.outputs.map((path) =>
    scaleWaveform(currents.referredSecondaryA, path.currentShare),
  );
  const { outputVoltagesV } = flybackOutputVoltages(circuit, regulatedV, stats.referredSecondaryA);
  const voltages = flybackVoltageWaveforms(
    circuit,
    state,
    spec.primarySwitch.onResistanceOhm,
    outputVoltagesV,
    traces,
  );
  const losses = flybackLosses(spec, choices, circuit, state, stats, outputVoltagesV);
  let lossTotalW = 0;
  for (const item of losses) lossTotalW += item.powerW;
  let outputPowerW = 0;
  for (const [k, path] of circuit.outputs.entries()) {
    outputPowerW += (outputVoltagesV[k] ?? 0) * path.currentA;
  }
  const inputPowerW = outputPowerW + lossTotalW;
  const solved: Corner = {
    label: corner.label,
    inputVoltageV: corner.inputVoltageV,
    loadFraction: corner.loadFraction,
    conductionMode: state.mode,
    dutyCycle: state.dutyCycle,
    demagnetizingDutyCycle: state.demagnetizingDutyCycle,
    magnetizingCurrentAverageA: average(currents.magnetizingA),
    magnetizingCurrentPeakA: peak(currents.magnetizingA),
    magnetizingCurrentRippleA: peakToPeak(currents.magnetizingA),
    waveforms: {
      magnetizingCurrentA: currents.magnetizingA,
      primaryCurrentA: currents.switchA,
      primaryWindingCurrentA: currents.primaryWindingA,
      switchVoltageV: voltages.switchV,
      secondaryCurrentsA: secondariesA,
      rectifierVoltagesV: voltages.rectifiersV,
    },
    switches: [
      stress(
        'primary-switch',
        stats.switchA,
        peak(voltages.switchV),
        spec.primarySwitch.voltageRatingV,
      ),
    ],
    rectifiers: spec.outputs.map((output, k) =>
      stress(
        `rectifier-${k + 1}`,
        stats.secondariesA[k] ?? stats.referredSecondaryA,
        peak(voltages.rectifiersV[k] ?? voltages.switchV),
        output.rectifier.voltageRatingV,
      ),
    ),
    windings: [
      winding('primary', stats.primaryWindingA, choices.primaryResistanceOhm),
      ...circuit.outputs.map((path, k) =>
        winding(
          `secondary-${k + 1}`,
          stats.secondariesA[k] ?? stats.referredSecondaryA,
          path.windingResistanceOhm,
        ),
      ),
    ],
    clamp: {
      voltageV: circuit.clampVoltageV,
      powerW: losses.find((item) => item.mechanism === 'clamp')?.powerW ?? 0,
      leakageEnergyJ: 0.5 * circuit.leakageInductanceH * state.transitionEndCurrentA ** 2,
      commutationTimeS: state.leakageRingS + state.turnOffCommutationS,
    },
    losses,
    lossTotalW,
    outputPowerW,
    inputPowerW,
    inputCurrentAverageA: inputPowerW / corner.inputVoltageV,
    // The input capacitor carries the switch current's AC part: the source supplies its mean.
    inputCapacitorRippleCurrentRmsA: acPart(stats.switchA),
    efficiency: outputPowerW / inputPowerW,
    outputs: spec.outputs.map((output, k) => {
      const loadA = circuit.outputs[k]?.currentA ?? 0;
      return {
        voltageV: outputVoltagesV[k] ?? 0,
        currentA: loadA,
        // Capacitor charge balance: it carries the secondary current less its mean.
        capacitorRippleCurrentRmsA: acPart(stats.secondariesA[k] ?? stats.referredSecondaryA),
        rippleVoltagePeakToPeakV: flybackOutputRippleV(
          secondariesA[k] ?? currents.referredSecondaryA,
          loadA,
          output.capacitanceF,
          output.capacitorEsrOhm,
        ),
      };
    }),
  };
  // The largest reflected voltage is at the start of demagnetization: V0 + Rs·Ib.
  const reflectedPeakV =
    circuit.reflectedOffsetV + circuit.reflectedResistanceOhm * state.afterCommutationCurrentA;
  const issues = flybackCornerIssues(
    spec,
    choices,
    corner,
    circuit,
    { solved: true, corner: solved, reflectedPeakV },
    options,
  );
  return issues.length > 0 ? failure(issues) : success(solved);
}

/** √(Irms² − Iavg²), A: the RMS of the waveform's AC part. */
function acPart(stats: CurrentStats): number {
  return Math.sqrt(Math.max(0, stats.rmsA ** 2 - stats.averageA ** 2));
}

/** A device's stress from its current's stats (`deviceStressOf`, shared by every topology). */
function stress(
  name: string,
  current: CurrentStats,
  voltagePeakV: number,
  voltageRatingV: number | undefined,
): DeviceStress {
  return deviceStressOf(
    name,
    current.peakA,
    current.rmsA,
    current.averageA,
    voltagePeakV,
    voltageRatingV,
  );
}

/** A winding's stress and DC copper loss from its current's stats (`windingOf`, shared). */
function winding(
  name: string,
  current: CurrentStats,
  resistanceOhm: number,
): Corner['windings'][number] {
  return windingOf(name, current.rmsA, current.averageA, current.peakA, resistanceOhm);
}
