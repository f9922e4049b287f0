import type { Loss } from '../../design/design-schema.js';
import { bodyDiodeDeadTimeLoss } from '../../losses/body-diode-dead-time-loss.js';
import { diodeConductionLoss } from '../../losses/diode-conduction-loss.js';
import { gateDriveLoss } from '../../losses/gate-drive-loss.js';
import { resistiveLoss } from '../../losses/resistive-loss.js';
import { reverseRecoveryLoss } from '../../losses/reverse-recovery-loss.js';
import type { Output } from '../../spec/spec-schema.js';
import { average } from '../../waveform/average.js';
import { rms } from '../../waveform/rms.js';
import type { OutputStage, OutputStagePoint } from './output-stage.js';
import type { OutputStageDrive, OutputStageWaveforms } from './output-stage-waveforms.js';

/**
 * Returns the losses of output stage `index` (1-based names), W, in a fixed order: forward and
 * freewheeling rectifier (conduction, then recovery for diodes or gate drive and dead time for
 * synchronous rectifiers), secondary copper, inductor copper, output capacitor ESR. Recovery is
 * Qrr·Vr·fs in CCM only: in DCM the diode current has fallen to zero before reverse bias.
 */
export function outputStageLosses(
  index: number,
  output: Output,
  stage: OutputStage,
  point: OutputStagePoint,
  drive: OutputStageDrive,
  waves: OutputStageWaveforms,
): Loss[] {
  const fs = 1 / drive.periodS;
  const losses: Loss[] = [];
  const rectifier = output.rectifier;
  const isContinuous = point.mode === 'ccm';
  const devices = [
    {
      name: `forward-rectifier-${index}`,
      current: waves.forwardA,
      reverseV: drive.secondaryResetVoltageV,
    },
    {
      name: `freewheel-rectifier-${index}`,
      current: waves.freewheelA,
      reverseV: drive.secondaryVoltageV,
    },
  ];
  for (const device of devices) {
    const meanA = average(device.current);
    const rmsA = rms(device.current);
    if (rectifier.kind === 'diode') {
      losses.push(
        loss(
          device.name,
          'conduction',
          diodeConductionLoss(rectifier.forwardVoltageV, rectifier.resistanceOhm, meanA, rmsA),
        ),
        loss(
          device.name,
          'reverse-recovery',
          isContinuous
            ? reverseRecoveryLoss(rectifier.reverseRecoveryChargeC, device.reverseV, fs)
            : 0,
        ),
      );
    } else {
      losses.push(
        loss(device.name, 'conduction', resistiveLoss(rmsA, rectifier.onResistanceOhm)),
        loss(
          device.name,
          'gate-drive',
          gateDriveLoss(rectifier.gateChargeC, rectifier.gateDriveVoltageV, fs),
        ),
      );
    }
  }
  if (rectifier.kind === 'synchronous') {
    // The freewheeling body diode carries the inductor current at both edges: valley and peak.
    const edgeMeanA = (point.valleyA + point.peakA) / 2;
    losses.push(
      loss(
        `freewheel-rectifier-${index}`,
        'dead-time',
        bodyDiodeDeadTimeLoss(
          rectifier.bodyDiodeForwardVoltageV,
          edgeMeanA,
          rectifier.deadTimeS,
          fs,
        ),
      ),
    );
  }
  const inductorRmsA = rms(waves.inductorA);
  losses.push(
    loss(
      `secondary-${index}`,
      'copper',
      resistiveLoss(rms(waves.forwardA), stage.windingResistanceOhm),
    ),
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

function loss(component: string, mechanism: Loss['mechanism'], powerW: number): Loss {
  return { component, mechanism, powerW };
}
