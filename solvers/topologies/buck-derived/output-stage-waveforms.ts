import type { Waveform } from '../../waveform/waveform.js';
import { intervalBreaks, intervalWaveform } from './interval-waveform.js';
import type { OutputStage, OutputStagePoint } from './output-stage.js';

/** The waveforms of one output stage over a period, A and V. */
export interface OutputStageWaveforms {
  inductorA: Waveform;
  /** Forward rectifier current, equal to the secondary winding current, A. */
  forwardA: Waveform;
  freewheelA: Waveform;
  /** Reverse (blocking) voltage of the forward rectifier, V; 0 while it conducts. */
  forwardReverseV: Waveform;
  /** Reverse (blocking) voltage of the freewheeling rectifier, V; 0 while it conducts. */
  freewheelReverseV: Waveform;
}

/** Where the primary side puts the stage: duty cycle, reset interval and winding voltages. */
export interface OutputStageDrive {
  dutyCycle: number;
  /**
   * Start of the stage's on-interval over the period (0..D): before it the switch current rises
   * through the leakage and both rectifiers share the inductor current (0 without leakage).
   */
  onStartFraction: number;
  /** End of the reset interval over the period (D + Dr); the winding is at zero after it. */
  resetEndFraction: number;
  /** Secondary open-circuit voltage during the on-interval, V. */
  secondaryVoltageV: number;
  /** Magnitude of the reversed secondary voltage during reset, V. */
  secondaryResetVoltageV: number;
  periodS: number;
}

/**
 * Returns the inductor, rectifier current and rectifier blocking-voltage waveforms of a stage:
 * the inductor current ramps valley → peak over D·T and back (CCM) or to zero at (D + D2)·T
 * (DCM); the freewheeling rectifier blocks the rectified secondary voltage during the on-interval
 * and Vo in the DCM idle interval; the forward rectifier blocks the reversed winding during reset
 * plus the cathode node (0 while freewheeling, Vo when the inductor current is zero).
 */
export function outputStageWaveforms(
  stage: OutputStage,
  point: OutputStagePoint,
  drive: OutputStageDrive,
): OutputStageWaveforms {
  const d = drive.dutyCycle;
  const start = drive.onStartFraction;
  const isDcm = point.mode === 'dcm';
  // CCM: the off ramp runs from D through the period end to the next on-start.
  const zeroAt = isDcm ? d + point.freewheelDutyCycle : 1 + start;
  const { forwardVoltageV: vf, resistanceOhm: rd } = stage.rectifier;
  const offRamp = (f: number) =>
    point.peakA + (((isDcm ? 0 : point.valleyA) - point.peakA) * (f - d)) / (zeroAt - d);
  const inductor = (f: number, mid: number): number => {
    if (mid < start) return isDcm ? 0 : offRamp(f + 1);
    if (mid < d) return point.valleyA + ((point.peakA - point.valleyA) * (f - start)) / (d - start);
    return mid < zeroAt ? offRamp(f) : 0;
  };
  // During the commutation the forward rectifier takes the inductor current over linearly.
  const forward = (f: number, mid: number): number => {
    if (mid < start) return (inductor(f, mid) * f) / start;
    return mid < d ? inductor(f, mid) : 0;
  };
  // Put in order once for the five waveforms.
  const breaks = intervalBreaks([start, d, Math.min(zeroAt, 1), drive.resetEndFraction]);
  const wave = (value: (f: number, mid: number) => number) =>
    intervalWaveform(drive.periodS, breaks, value);
  // The cathode node: rectified secondary while on, 0 while freewheeling, Vo when idle (DCM).
  const cathode = (f: number, mid: number): number => {
    if (mid < start) return 0;
    if (mid < d) {
      return drive.secondaryVoltageV - vf - (stage.windingResistanceOhm + rd) * inductor(f, mid);
    }
    return mid < zeroAt ? 0 : point.voltageV;
  };
  return {
    inductorA: wave(inductor),
    forwardA: wave(forward),
    freewheelA: wave((f, mid) => inductor(f, mid) - forward(f, mid)),
    forwardReverseV: wave((f, mid) => {
      if (mid < d) return 0;
      const resetV = mid < drive.resetEndFraction ? drive.secondaryResetVoltageV : 0;
      return resetV + cathode(f, mid);
    }),
    freewheelReverseV: wave((f, mid) =>
      (mid >= start && mid < d) || mid >= zeroAt ? cathode(f, mid) : 0,
    ),
  };
}
