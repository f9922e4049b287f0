import type { DeviceStress, DoubleEndedCorner } from '../../design/design-schema.js';
import type { Waveform } from '../../waveform/waveform.js';
import { WaveformStatsMemo } from '../../waveform/waveform-stats.js';
import { REGULATION_TOLERANCE } from '../../design/design-summary.js';
import { rectifierModel } from '../../devices/rectifier-model.js';
import { failure, success, type Result } from '../../result.js';
import type { Spec } from '../../spec/spec-schema.js';
import { stageOutput } from '../buck-derived/stage-output.js';
import { acRms } from '../../waveform/ac-rms.js';
import { peak } from '../../waveform/peak.js';
import type { OperatingCorner } from '../topology.js';
import {
  deviceStress,
  deviceStressAs,
  windingStress,
  windingStressOfDevice,
} from '../device-stress.js';
import { primaryLosses, secondaryLosses } from './double-ended-losses.js';
import { doubleEndedIssues } from './double-ended-issues.js';
import {
  doubleEndedCircuit,
  isPhysicalState,
  solveDoubleEnded,
  stateTurnOffA,
  turnOnCurrentA,
  type DoubleEndedChoices,
  type DoubleEndedState,
} from './double-ended-state.js';
import { bridgeDecayPlateau } from './bridge-decay-plateau.js';
import { halfPeriodGrid } from './half-period-grid.js';
import type { DoubleEndedStagePoint } from './light-load-point.js';
import type { PrimaryBridge } from './primary-bridge.js';
import { primaryWaveforms } from './primary-waveforms.js';
import {
  pushPullTurnOffSpike,
  pushPullTurnOnRing,
  withTurnOffSpike,
  withTurnOnRingCurrent,
  type PushPullTurnOffSpike,
} from './push-pull-clamp.js';
import { valueAt } from '../../waveform/value-at.js';
import { carriedTurnOnRing, pushPullCarriedHalf } from './push-pull-carried-ring.js';
import { LEAKAGE_DAMPING_RATIO } from './leakage-damping.js';
import { secondaryWaveforms, type SecondaryWaveforms } from './secondary-waveforms.js';

/** The stats of one corner's waveforms (see `WaveformStatsMemo`); one corner at a time. */
const STATS = new WaveformStatsMemo();

/** |Vo − target| of the first output of `state`, V. */
function regulationMissV(state: DoubleEndedState, regulatedV: number): number {
  return Math.abs((state.points[0]?.voltageV ?? Infinity) - regulatedV);
}

/**
 * Solves one push-pull or bridge corner: steady state, waveforms, stresses, losses, ripple and
 * limits. Edge, gate and clamp losses are supplied from the input, so Pin = Pout + Σ losses.
 */
export function solveDoubleEndedCorner(
  spec: Spec,
  bridge: PrimaryBridge,
  choices: DoubleEndedChoices,
  corner: OperatingCorner,
): Result<DoubleEndedCorner> {
  const circuit = doubleEndedCircuit(spec, bridge, choices, corner);
  const regulatedV = spec.outputs[0]?.voltageV ?? 0;
  let state = solveDoubleEnded(circuit, regulatedV);
  // At light load the fixed point can settle on more than one state at one duty cycle (the
  // node ring's cases; DEVELOPERS.md, "Light load"), and a solve whose trials start from each
  // other can end on a branch that misses the regulated voltage (a half bridge at 25.1 V for
  // 24 V, where ngspice gives 24.3 V at that duty cycle and the states started afresh 24.0 V).
  // Such a corner is solved again with every trial started afresh, and the closer kept; not one
  // solved at the shortest on-time, whose output rises by the model, not by the solve's path.
  if (
    state !== undefined &&
    state.floorRiseV === undefined &&
    regulationMissV(state, regulatedV) > REGULATION_TOLERANCE * regulatedV
  ) {
    const cold = solveDoubleEnded(circuit, regulatedV, undefined, true);
    if (
      cold !== undefined &&
      regulationMissV(cold, regulatedV) < regulationMissV(state, regulatedV)
    ) {
      state = cold;
    }
  }
  // A state whose fixed point ran away (`isPhysicalState`) is no steady state to draw.
  if (state === undefined || !isPhysicalState(circuit, state)) {
    return failure(doubleEndedIssues(spec, choices, corner, circuit, undefined));
  }
  const periodS = circuit.periodS;
  const vin = corner.inputVoltageV;
  // The grid's on-interval ends at D + t_s/(2·T): the swing's volt-seconds as drive, so the
  // currents keep their balances; the voltages ramp over the swing itself (`swingShare`).
  const grid = halfPeriodGrid(
    state.dutyCycle + state.turnOffSwingFraction / 2,
    state.commutationFraction,
    state.points,
    state.turnOffSwingFraction,
  );
  const primary = primaryWaveforms(circuit, state, grid, spec.primarySwitch.onResistanceOhm);
  // The bridges' leakage decay after each turn-off (the continuous model: the event model's node
  // ring carries its own): the switch just turned off blocks Vin plus the conducting body
  // diode's drop while the decay lasts (`bridgeDecayPlateau`), from the swing's end on, within
  // the switch's own half.
  const plateau =
    bridge.kind === 'push-pull' || grid.ring !== undefined || state.points[0]?.sharedFall
      ? undefined
      : bridgeDecayPlateau(
          circuit,
          stateTurnOffA(circuit, state),
          state.leakageCarryA ?? 0,
          state.turnOffSwingFraction * periodS,
        );
  if (plateau !== undefined) {
    const halfS = periodS / 2;
    const fromS = (grid.swing?.to ?? grid.onEnd) * halfS;
    for (let index = 0; index < primary.switchesV.length; index++) {
      const side = bridge.switchHalves[index] ?? 0;
      const wave = primary.switchesV[index];
      if (wave === undefined || fromS >= halfS) continue;
      primary.switchesV[index] = withTurnOffSpike(
        wave,
        plateau,
        vin / 2,
        fromS + side * halfS,
        (side + 1) * halfS,
      );
    }
  }
  const outputs: SecondaryWaveforms[] = [];
  const rectifierNames: string[][] = [];
  const windingNames: string[][] = [];
  // Plain loops over the outputs and points, not forEach callbacks (each closed over the
  // corner's locals, a context allocated per corner).
  const { points } = state;
  for (let k = 0; k < spec.outputs.length; k++) {
    const output = spec.outputs[k] as Spec['outputs'][number];
    const stage = circuit.stages[k];
    const point = points[k];
    if (stage === undefined || point === undefined) continue;
    const arrangement = circuit.arrangements[k] ?? 'center-tapped';
    outputs.push(
      secondaryWaveforms(
        arrangement,
        stage,
        point,
        grid,
        k,
        state.primaryVoltageV / (circuit.turnsRatios[k] ?? 1),
        periodS,
        rectifierModel(output.rectifier),
      ),
    );
    const id = k + 1;
    rectifierNames.push(
      arrangement === 'center-tapped'
        ? [`rectifier-${id}-half-a`, `rectifier-${id}-half-b`]
        : [
            `rectifier-${id}-a-upper`,
            `rectifier-${id}-a-lower`,
            `rectifier-${id}-b-upper`,
            `rectifier-${id}-b-lower`,
          ],
    );
    windingNames.push(
      arrangement === 'center-tapped'
        ? [`secondary-${id}-half-a`, `secondary-${id}-half-b`]
        : [`secondary-${id}`],
    );
  }
  // The push-pull's leakage spike at each turn-off, held by its RCD clamp (push-pull-clamp.ts):
  // from the gate's turn-off, within the switch's own half.
  let spike: PushPullTurnOffSpike | undefined;
  const clampV = choices.clampVoltageV;
  if (bridge.kind === 'push-pull' && circuit.leakageInductanceH > 0 && clampV !== undefined) {
    let turnOffA = 0;
    for (const current of primary.switchesA) turnOffA = Math.max(turnOffA, peak(current));
    spike = pushPullTurnOffSpike({
      leakageH: circuit.leakageInductanceH,
      turnOffA,
      magnetizingA: state.magnetizingPeakA,
      switchCapacitanceF: spec.primarySwitch.outputCapacitanceF,
      clampV,
      inputV: vin,
      windingV: state.primaryVoltageV,
      frequencyHz: spec.switchingFrequencyHz,
      dampingRatio: LEAKAGE_DAMPING_RATIO,
    });
    // The leaky light-load half knows its drains' highest voltage (the clamp, or the rings'
    // own crest below it): the spike and the turn-on ring are drawn to it.
    const leakyAboveRailV =
      state.leakyHalf === undefined
        ? undefined
        : Math.min(clampV, Math.max(0, state.leakyHalf.drainPeakV - vin));
    if (leakyAboveRailV !== undefined) {
      spike = { ...spike, aboveRailV: Math.min(spike.aboveRailV, leakyAboveRailV) };
    }
    const halfS = periodS / 2;
    const startS = (grid.swing?.from ?? grid.onEnd) * halfS;
    for (let index = 0; index < primary.switchesV.length; index++) {
      const side = bridge.switchHalves[index] ?? 0;
      const wave = primary.switchesV[index];
      if (wave === undefined) continue;
      primary.switchesV[index] = withTurnOffSpike(
        wave,
        spike,
        vin,
        startS + side * halfS,
        (side + 1) * halfS,
      );
    }
    // The off switch's ring as the other turns on (push-pull-clamp.ts), from the winding's
    // release (the commutation's end): on the off drain, and its current in the driven switch.
    const releaseS = grid.start * halfS;
    const firstV = primary.switchesV[0];
    // Where the dead time is shorter than the off drain's ring takes to die, the half stepped
    // with both drains behind their leakages (push-pull-short-dead-time.ts) gives the turn-on
    // ring's start and its peaks.
    const carried = pushPullCarriedHalf(spec, circuit, state, outputs, releaseS);
    const lumpedRing =
      firstV === undefined
        ? undefined
        : pushPullTurnOnRing({
            leakageH: circuit.leakageInductanceH,
            switchCapacitanceF: spec.primarySwitch.outputCapacitanceF,
            clampV,
            windingV: state.primaryVoltageV,
            // Switch a (driven in the first half) as switch b's winding is released.
            startAboveRailV:
              carried === undefined
                ? valueAt(firstV, halfS + releaseS - 1e-6 * halfS) - vin
                : carried.releaseDrainV - vin,
            frequencyHz: spec.switchingFrequencyHz,
          });
    const ring =
      carried !== undefined
        ? carriedTurnOnRing(lumpedRing, carried, circuit, spec, clampV, state.primaryVoltageV)
        : lumpedRing === undefined || leakyAboveRailV === undefined
          ? lumpedRing
          : { ...lumpedRing, aboveRailV: leakyAboveRailV };
    if (ring !== undefined) {
      for (let index = 0; index < primary.switchesV.length; index++) {
        const side = bridge.switchHalves[index] ?? 0;
        const other = 1 - side;
        const wave = primary.switchesV[index];
        if (wave !== undefined) {
          primary.switchesV[index] = withTurnOffSpike(
            wave,
            ring,
            vin,
            other * halfS + releaseS,
            (other + 1) * halfS,
          );
        }
        const current = primary.switchesA[index];
        if (current !== undefined) {
          // The leaky light-load half knows the driven switch's highest current (the off drain's
          // ring through both leakages, from where that half left it): the half sine is drawn
          // to reach it at its crest.
          const peakA = carried?.switchPeakA ?? state.leakyHalf?.switchPeakA;
          const amplitudeA =
            peakA === undefined
              ? ring.currentA
              : peakA - valueAt(current, side * halfS + releaseS + ring.quarterS);
          primary.switchesA[index] = withTurnOnRingCurrent(
            current,
            amplitudeA,
            side * halfS + releaseS,
            2 * ring.quarterS,
            side * halfS + startS,
          );
        }
      }
      spike = { ...spike, clampW: spike.clampW + ring.clampW, ringW: spike.ringW + ring.ringW };
    }
    // The leaky light-load half holds both rings, undamped: its clamp's power replaces theirs,
    // and what they rang away stays in the circuit (the drain discharged at turn-on is the
    // switch's capacitance loss).
    if (state.leakyHalf !== undefined) {
      spike = { ...spike, clampW: state.leakyHalf.clampW, ringW: 0 };
    }
  }
  let reflectedValleyA = 0;
  for (let k = 0; k < points.length; k++) {
    reflectedValleyA +=
      (points[k] as DoubleEndedStagePoint).valleyA / (circuit.turnsRatios[k] ?? 1);
  }
  // Where a bridge's leakage decay outlasts the off-time, each switch's body diode carries it
  // once a period, from the turn-off current down to the rest (`leakageCarryA`), over the
  // off-stretch after the turn-off swing.
  const carryA = state.leakageCarryA ?? 0;
  let bodyDiodeMeanA = 0;
  if (carryA > 0) {
    let turnOffA = state.magnetizingPeakA;
    for (let k = 0; k < points.length; k++) {
      turnOffA += (points[k] as DoubleEndedStagePoint).peakA / (circuit.turnsRatios[k] ?? 1);
    }
    const decayShare = (1 - (grid.swing?.to ?? grid.onEnd)) / 2;
    bodyDiodeMeanA = ((turnOffA + carryA) / 2) * Math.max(0, decayShare);
  }
  // The waveforms are final from here on: the losses and the stresses read each current's
  // peak, RMS and mean from one pass (`STATS`, the same numbers as peak, rms and average).
  const memo = STATS;
  memo.clear();
  const losses = primaryLosses(
    spec,
    circuit,
    primary,
    turnOnCurrentA(reflectedValleyA, state.magnetizingStartA),
    spike,
    bodyDiodeMeanA,
    memo,
  );
  for (let k = 0; k < spec.outputs.length; k++) {
    const output = spec.outputs[k] as Spec['outputs'][number];
    const stage = circuit.stages[k];
    const point = points[k];
    const waves = outputs[k];
    if (stage === undefined || point === undefined || waves === undefined) continue;
    const names = { rectifiers: rectifierNames[k] ?? [], windings: windingNames[k] ?? [] };
    losses.push(
      ...secondaryLosses(
        k + 1,
        output,
        stage,
        point,
        waves,
        names,
        spec.switchingFrequencyHz,
        memo,
      ),
    );
  }
  let lossTotalW = 0;
  for (const item of losses) lossTotalW += item.powerW;
  let outputPowerW = 0;
  for (let k = 0; k < points.length; k++) {
    outputPowerW += (points[k] as DoubleEndedStagePoint).voltageV * (circuit.stages[k]?.loadA ?? 0);
  }
  const inputPowerW = outputPowerW + lossTotalW;
  const switchRatingV = spec.primarySwitch.voltageRatingV;
  const isPushPull = bridge.kind === 'push-pull';
  const switches = bridge.switchNames.map((name, index) =>
    deviceStress(
      name,
      primary.switchesA[index] ?? primary.primaryA,
      primary.switchesV[index] ?? primary.primaryA,
      switchRatingV,
      memo,
    ),
  );
  // Each rectifier's stress; a bridge rectifier that carries and blocks the very waveforms of
  // the one before it (its partner on the same side) takes its numbers, renamed.
  const rectifierStresses: DeviceStress[][] = [];
  const rectifiers: DeviceStress[] = [];
  for (let k = 0; k < outputs.length; k++) {
    const w = outputs[k] as SecondaryWaveforms;
    const ratingV = spec.outputs[k]?.rectifier.voltageRatingV;
    const stresses: DeviceStress[] = [];
    for (let r = 0; r < w.rectifiersA.length; r++) {
      const current = w.rectifiersA[r] as Waveform;
      const voltage = w.rectifiersV[r] ?? current;
      const name = rectifierNames[k]?.[r] ?? `rectifier-${k + 1}`;
      const before = stresses[r - 1];
      stresses.push(
        before !== undefined &&
          w.rectifiersA[r - 1] === current &&
          (w.rectifiersV[r - 1] ?? current) === voltage
          ? deviceStressAs(name, before)
          : deviceStress(name, current, voltage, ratingV, memo),
      );
    }
    rectifierStresses.push(stresses);
    for (const stress of stresses) rectifiers.push(stress);
  }
  const solved: DoubleEndedCorner = {
    label: corner.label,
    inputVoltageV: vin,
    loadFraction: corner.loadFraction,
    dutyCycle: state.dutyCycle,
    outputInductorModes: state.points.map((point) => point.mode),
    // The event model's ring keeps moving Im after the on-time (the swing and the clamp raise
    // it): its peak is the waveform's.
    magnetizingCurrentPeakA:
      state.isEvent === true
        ? Math.max(state.magnetizingPeakA, largestMagnitude(primary.magnetizingA.values))
        : state.magnetizingPeakA,
    outputInductorCurrentRipplesA: state.points.map((point) => point.peakA - point.valleyA),
    waveforms: {
      magnetizingCurrentA: primary.magnetizingA,
      primaryCurrentA: primary.primaryA,
      switchCurrentsA: primary.switchesA,
      windingCurrentsA: [
        ...(isPushPull ? primary.switchesA : [primary.primaryA]),
        ...joined(outputs, (w) => w.windingsA),
      ],
      switchVoltagesV: primary.switchesV,
      outputInductorCurrentsA: outputs.map((w) => w.inductorA),
      rectifierVoltagesV: joined(outputs, (w) => w.rectifiersV),
    },
    switches,
    rectifiers,
    windings: [
      ...(isPushPull
        ? // Each primary half carries its switch's current: the switch's stress, read again.
          primary.switchesA.map((current, index) => {
            const name = `primary-${index === 0 ? 'a' : 'b'}`;
            const device = switches[index];
            return device === undefined
              ? windingStress(name, current, circuit.primaryResistanceOhm, memo)
              : windingStressOfDevice(name, device, circuit.primaryResistanceOhm);
          })
        : [windingStress('primary', primary.primaryA, circuit.primaryResistanceOhm, memo)]),
      ...joined(outputs, (w, k) =>
        w.windingsA.map((current, index) => {
          const name = windingNames[k]?.[index] ?? `secondary-${k + 1}`;
          const resistanceOhm = circuit.stages[k]?.windingResistanceOhm ?? 0;
          // A center-tapped half carries its rectifier's very current: that stress, read again.
          const device = rectifierStresses[k]?.[w.rectifiersA.indexOf(current)];
          return device === undefined
            ? windingStress(name, current, resistanceOhm, memo)
            : windingStressOfDevice(name, device, resistanceOhm);
        }),
      ),
      ...outputs.map((w, k) =>
        windingStress(
          `output-inductor-${k + 1}`,
          w.inductorA,
          circuit.stages[k]?.inductorResistanceOhm ?? 0,
          memo,
        ),
      ),
    ],
    losses,
    lossTotalW,
    outputPowerW,
    inputPowerW,
    inputCurrentAverageA: inputPowerW / vin,
    // Push-pull and full bridge: the input capacitor carries the rail current less its mean. Half
    // bridge: each divider capacitor carries the high-side switch current less its mean.
    inputCapacitorRippleCurrentRmsA: acRms(primary.railA, memo),
    efficiency: outputPowerW / inputPowerW,
    // The charge the capacitor gives and takes back repeats every half-period.
    outputs: spec.outputs.map((output, k) => {
      const inductorA = outputs[k]?.inductorA ?? primary.primaryA;
      return stageOutput(
        output,
        state.points[k]?.voltageV ?? 0,
        circuit.stages[k]?.loadA ?? 0,
        inductorA,
        outputs[k]?.inductorHalfA ?? inductorA,
        memo,
      );
    }),
    ...(state.modelFallback === undefined ? {} : { modelFallback: state.modelFallback }),
  };
  const issues = doubleEndedIssues(spec, choices, corner, circuit, solved);
  memo.clear();
  return issues.length > 0 ? failure(issues) : success(solved);
}

/**
 * `outputs.flatMap(pick)` for `pick` that returns arrays, as a plain loop: `Array.prototype.flatMap`
 * took about 2 µs a call in a micro-benchmark under Node 20 (the loop a sixth of that), four
 * calls a corner; a double-ended design took some 3–5 % less CPU without them.
 */
function joined<T>(
  outputs: readonly SecondaryWaveforms[],
  pick: (waves: SecondaryWaveforms, k: number) => readonly T[],
): T[] {
  const all: T[] = [];
  for (let k = 0; k < outputs.length; k++) {
    const items = pick(outputs[k] as SecondaryWaveforms, k);
    for (let i = 0; i < items.length; i++) all.push(items[i] as T);
  }
  return all;
}

/** The largest |value| of a list of numbers (0 for none). */
function largestMagnitude(values: readonly number[]): number {
  let largest = 0;
  for (let k = 0; k < values.length; k++) {
    const v = Math.abs(values[k] as number);
    if (v > largest) largest = v;
  }
  return largest;
}
