import type { Loss } from '../../design/design-schema.js';
import { bodyDiodeDeadTimeLoss } from '../../losses/body-diode-dead-time-loss.js';
import { diodeConductionLoss } from '../../losses/diode-conduction-loss.js';
import { gateDriveLoss } from '../../losses/gate-drive-loss.js';
import { outputCapacitanceLoss } from '../../losses/output-capacitance-loss.js';
import { resistiveLoss } from '../../losses/resistive-loss.js';
import { reverseRecoveryLoss } from '../../losses/reverse-recovery-loss.js';
import { switchingOverlapLoss } from '../../losses/switching-overlap-loss.js';
import type { Output, Spec } from '../../spec/spec-schema.js';
import { average } from '../../waveform/average.js';
import { peak } from '../../waveform/peak.js';
import { rms } from '../../waveform/rms.js';
import type { Waveform } from '../../waveform/waveform.js';
import type { WaveformStatsMemo } from '../../waveform/waveform-stats.js';
import type { OutputStage } from '../buck-derived/output-stage.js';
import type { DoubleEndedCircuit } from './double-ended-state.js';
import type { DoubleEndedStagePoint } from './light-load-point.js';
import type { PrimaryWaveforms } from './primary-waveforms.js';
import type { PushPullTurnOffSpike } from './push-pull-clamp.js';
import type { SecondaryWaveforms } from './secondary-waveforms.js';

/**
 * Returns the primary losses, W: per switch conduction, turn-on and turn-off overlap, output
 * capacitance and gate drive; the push-pull's leakage energy at each turn-off (½·Llk·I² twice a
 * period), split by `spike` between its RCD clamp and the drain capacitance's ring where there is
 * leakage (the bridges return it to the input through the body diodes); the primary copper. Turn-on is from the idle voltage (Vin for the push-pull, Vin/2 for
 * the bridges) at the current the switch takes over; turn-off is into Vin at the peak current.
 * `bodyDiodeMeanA`, where a bridge's leakage decay outlasts the off-time (`leakageCarryA`): the
 * mean current of each switch's body diode over the period, which adds its drop
 * (the switch's `bodyDiodeForwardVoltageV`) to the switch's conduction; its turn-on is then at zero voltage (its body
 * diode conducts), without overlap or output-capacitance loss (the leakage swung the node, and
 * that energy returns to the input).
 */
export function primaryLosses(
  spec: Spec,
  circuit: DoubleEndedCircuit,
  primary: PrimaryWaveforms,
  turnOnA: number,
  spike?: PushPullTurnOffSpike,
  bodyDiodeMeanA = 0,
  memo?: WaveformStatsMemo,
): Loss[] {
  const device = spec.primarySwitch;
  const fs = spec.switchingFrequencyHz;
  const vin = circuit.inputVoltageV;
  const isPushPull = circuit.bridge.kind === 'push-pull';
  const isSoftOn = bodyDiodeMeanA > 0;
  const turnOnV = isPushPull ? vin : vin / 2;
  const losses: Loss[] = [];
  let turnOffA = 0;
  circuit.bridge.switchNames.forEach((name, index) => {
    const current = primary.switchesA[index];
    if (current === undefined) return;
    turnOffA = Math.max(turnOffA, peakOf(current, memo));
    losses.push(
      loss(
        name,
        'conduction',
        resistiveLoss(rmsOf(current, memo), device.onResistanceOhm) +
          device.bodyDiodeForwardVoltageV * bodyDiodeMeanA,
      ),
      loss(
        name,
        'turn-on',
        isSoftOn ? 0 : switchingOverlapLoss(turnOnV, turnOnA, device.riseTimeS, fs),
      ),
      loss(
        name,
        'turn-off',
        switchingOverlapLoss(vin, peakOf(current, memo), device.fallTimeS, fs),
      ),
      loss(
        name,
        'output-capacitance',
        isSoftOn ? 0 : outputCapacitanceLoss(device.outputCapacitanceF, turnOnV, fs),
      ),
      loss(name, 'gate-drive', gateDriveLoss(device.gateChargeC, device.gateDriveVoltageV, fs)),
    );
  });
  if (isPushPull) {
    losses.push(
      // With its clamp (leakage > 0) the clamp takes the leakage current left as the drain's
      // ring reaches it, the drain capacitance the rest (push-pull-clamp.ts); without leakage
      // this is 0 and the ring's row is left out, so such designs keep their shape.
      loss(
        'leakage-clamp',
        'clamp',
        spike === undefined ? circuit.leakageInductanceH * turnOffA ** 2 * fs : spike.clampW,
      ),
      ...(spike === undefined ? [] : [loss('leakage-ring', 'output-capacitance', spike.ringW)]),
      ...primary.switchesA.map((current, index) =>
        loss(
          `primary-${index === 0 ? 'a' : 'b'}`,
          'copper',
          resistiveLoss(rmsOf(current, memo), circuit.primaryResistanceOhm),
        ),
      ),
    );
  } else {
    losses.push(
      loss(
        'primary',
        'copper',
        resistiveLoss(rmsOf(primary.primaryA, memo), circuit.primaryResistanceOhm),
      ),
    );
  }
  return losses;
}

/**
 * Returns the losses of output `index` (1-based names), W: each rectifier's conduction, then
 * recovery (diode, CCM without a shared fall only: each turns off once a period against its
 * blocking voltage) or gate
 * drive and its share of the body-diode conduction over the dead times (synchronous: four edges a
 * period, at the valley and the peak, through one body diode or, in a bridge, two in series);
 * each secondary winding's copper; the inductor's copper; the output capacitor's ESR.
 */
export function secondaryLosses(
  index: number,
  output: Output,
  stage: OutputStage,
  point: DoubleEndedStagePoint,
  waves: SecondaryWaveforms,
  names: { rectifiers: readonly string[]; windings: readonly string[] },
  fs: number,
  memo?: WaveformStatsMemo,
): Loss[] {
  const losses: Loss[] = [];
  const rectifier = output.rectifier;
  const count = waves.rectifiersA.length;
  const deadTimeTotalW =
    rectifier.kind === 'synchronous'
      ? bodyDiodeDeadTimeLoss(
          (count / 2) * rectifier.bodyDiodeForwardVoltageV,
          (point.valleyA + point.peakA) / 2,
          rectifier.deadTimeS,
          2 * fs,
        )
      : 0;
  waves.rectifiersA.forEach((current, r) => {
    const name = names.rectifiers[r] ?? `rectifier-${index}`;
    const meanA = memo === undefined ? average(current) : memo.of(current).average;
    const rmsA = rmsOf(current, memo);
    if (rectifier.kind === 'diode') {
      const reverseV = peak(waves.rectifiersV[r] ?? current);
      losses.push(
        loss(
          name,
          'conduction',
          diodeConductionLoss(rectifier.forwardVoltageV, rectifier.resistanceOhm, meanA, rmsA),
        ),
        loss(
          name,
          'reverse-recovery',
          // After a shared fall the rectifier's current has fallen to zero: no recovery.
          point.mode === 'ccm' && point.sharedFall === undefined
            ? reverseRecoveryLoss(rectifier.reverseRecoveryChargeC, reverseV, fs)
            : 0,
        ),
      );
    } else {
      losses.push(
        loss(name, 'conduction', resistiveLoss(rmsA, rectifier.onResistanceOhm)),
        loss(
          name,
          'gate-drive',
          gateDriveLoss(rectifier.gateChargeC, rectifier.gateDriveVoltageV, fs),
        ),
        loss(name, 'dead-time', deadTimeTotalW / count),
      );
    }
  });
  waves.windingsA.forEach((current, w) => {
    losses.push(
      loss(
        names.windings[w] ?? `secondary-${index}`,
        'copper',
        resistiveLoss(rmsOf(current, memo), stage.windingResistanceOhm),
      ),
    );
  });
  const inductorRmsA = rmsOf(waves.inductorA, memo);
  losses.push(
    loss(
      `output-inductor-${index}`,
      'copper',
      resistiveLoss(inductorRmsA, stage.inductorResistanceOhm),
    ),
    // Charge balance: the capacitor carries the inductor current less the load current.
    loss(
      `output-capacitor-${index}`,
      'esr',
      output.capacitorEsrOhm * Math.max(0, inductorRmsA ** 2 - stage.loadA ** 2),
    ),
  );
  return losses;
}

/** rms(w), or the same number from `memo`. */
function rmsOf(w: Waveform, memo: WaveformStatsMemo | undefined): number {
  return memo === undefined ? rms(w) : memo.of(w).rms;
}

/** peak(w), or the same number from `memo`. */
function peakOf(w: Waveform, memo: WaveformStatsMemo | undefined): number {
  return memo === undefined ? peak(w) : memo.of(w).peak;
}

function loss(component: string, mechanism: Loss['mechanism'], powerW: number): Loss {
  return { component, mechanism, powerW };
}
