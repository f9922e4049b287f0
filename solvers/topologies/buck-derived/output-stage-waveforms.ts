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
  const isDcm = point.mode === 'dcm';
  const c: StageShape = {
    stage,
    point,
    drive,
    d,
    start: drive.onStartFraction,
    isDcm,
    // CCM: the off ramp runs from D through the period end to the next on-start.
    zeroAt: isDcm ? d + point.freewheelDutyCycle : 1 + drive.onStartFraction,
  };
  // Put in order once for the five waveforms.
  const breaks = intervalBreaks([c.start, d, Math.min(c.zeroAt, 1), drive.resetEndFraction]);
  const { periodS } = drive;
  // The value functions live at module level and are handed over as anonymous arrows: under
  // tsx (the service's and the bench's runtime) esbuild's keepNames gave each named closure an
  // Object.defineProperty call, five a stage and corner (about 1 % of a forward evaluation).
  return {
    inductorA: intervalWaveform(periodS, breaks, (f, mid) => inductorAt(c, f, mid)),
    forwardA: intervalWaveform(periodS, breaks, (f, mid) => forwardAt(c, f, mid)),
    freewheelA: intervalWaveform(
      periodS,
      breaks,
      (f, mid) => inductorAt(c, f, mid) - forwardAt(c, f, mid),
    ),
    forwardReverseV: intervalWaveform(periodS, breaks, (f, mid) => {
      if (mid < d) return 0;
      const resetV = mid < drive.resetEndFraction ? drive.secondaryResetVoltageV : 0;
      return resetV + cathodeAt(c, f, mid);
    }),
    freewheelReverseV: intervalWaveform(periodS, breaks, (f, mid) =>
      (mid >= c.start && mid < d) || mid >= c.zeroAt ? cathodeAt(c, f, mid) : 0,
    ),
  };
}

/** What the stage's value functions read: the stage, its point, its drive and the fractions. */
interface StageShape {
  stage: OutputStage;
  point: OutputStagePoint;
  drive: OutputStageDrive;
  /** The duty cycle D. */
  d: number;
  /** The on-interval's start (after the commutation). */
  start: number;
  isDcm: boolean;
  /** Where the inductor current reaches zero (DCM), or the next on-start a period on (CCM). */
  zeroAt: number;
}

function offRamp(c: StageShape, f: number): number {
  const { point, d } = c;
  // DCM ramps to its valley too: zero, or the forward's light-load event period's start (where
  // the drain holds the inductor up to the turn-on).
  return point.peakA + ((point.valleyA - point.peakA) * (f - d)) / (c.zeroAt - d);
}

function inductorAt(c: StageShape, f: number, mid: number): number {
  const { point, d, start } = c;
  if (mid < start) return c.isDcm ? point.valleyA : offRamp(c, f + 1);
  if (mid < d) return point.valleyA + ((point.peakA - point.valleyA) * (f - start)) / (d - start);
  return mid < c.zeroAt ? offRamp(c, f) : point.valleyA;
}

/** During the commutation the forward rectifier takes the inductor current over linearly. */
function forwardAt(c: StageShape, f: number, mid: number): number {
  if (mid < c.start) return (inductorAt(c, f, mid) * f) / c.start;
  return mid < c.d ? inductorAt(c, f, mid) : 0;
}

/** The cathode node: rectified secondary while on, 0 while freewheeling, Vo when idle (DCM). */
function cathodeAt(c: StageShape, f: number, mid: number): number {
  if (mid < c.start) return 0;
  if (mid < c.d) {
    const { stage } = c;
    const { forwardVoltageV: vf, resistanceOhm: rd } = stage.rectifier;
    return (
      c.drive.secondaryVoltageV - vf - (stage.windingResistanceOhm + rd) * inductorAt(c, f, mid)
    );
  }
  return mid < c.zeroAt ? 0 : c.point.voltageV;
}
