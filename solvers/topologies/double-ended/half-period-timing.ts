import type { OutputStagePoint } from '../buck-derived/output-stage.js';

/** Where a period fraction falls: which half, its fraction within the half, and the interval. */
export interface HalfPeriodPlace {
  /** 0 for the half that drives the winding positive, 1 for the negative one. */
  half: 0 | 1;
  /** Fraction within the half, 0..1 (linear in the period fraction). */
  h: number;
  interval: 'commutation' | 'on' | 'freewheel' | 'idle';
}

/** The timing both halves share, as fractions of one half-period. */
export interface HalfPeriodTiming {
  /** End of the turn-on commutation: 2·tc. */
  start: number;
  /** End of the on-interval: 2·D. */
  onEnd: number;
  /** Where the inductor current reaches zero (DCM), or 1 + start (CCM: never inside the half). */
  zeroAt: number;
  /** Period fractions where any interval begins or ends, for the waveform builders. */
  breaks: number[];
  /** Where the period fraction `f`, inside an interval whose midpoint is `mid`, falls. */
  place(f: number, mid: number): HalfPeriodPlace;
}

/**
 * Returns the timing of a double-ended period at duty cycle D (each switch's on-time over the
 * period) with a turn-on commutation of tc (over the period) and the first stage's point.
 */
export function halfPeriodTiming(
  dutyCycle: number,
  commutationFraction: number,
  points: readonly OutputStagePoint[],
): HalfPeriodTiming {
  const start = 2 * commutationFraction;
  const onEnd = 2 * dutyCycle;
  const zeroAts = points.map((p) => stageZeroAt(p, start, onEnd));
  const zeroAt = Math.max(...zeroAts, onEnd);
  const breaks: number[] = [0.5];
  for (const offset of [0, 0.5]) {
    for (const h of [start, onEnd, ...zeroAts]) if (h < 1) breaks.push(offset + h / 2);
  }
  return {
    start,
    onEnd,
    zeroAt,
    breaks,
    place(f, mid) {
      const half = mid < 0.5 ? 0 : 1;
      const h = 2 * (f - 0.5 * half);
      const midH = 2 * (mid - 0.5 * half);
      const interval =
        midH < start ? 'commutation' : midH < onEnd ? 'on' : midH < zeroAt ? 'freewheel' : 'idle';
      return { half, h, interval };
    },
  };
}

/**
 * Returns a stage's inductor current at half-fraction `h` (A): valley → peak over the
 * on-interval, down to the valley (CCM, through the next half's commutation) or to zero (DCM).
 */
export function inductorCurrentAt(
  point: OutputStagePoint,
  timing: HalfPeriodTiming,
  h: number,
  midH: number,
): number {
  const { start, onEnd } = timing;
  const isDcm = point.mode === 'dcm';
  const zeroAt = stageZeroAt(point, start, onEnd);
  const offRamp = (x: number) =>
    point.peakA + (((isDcm ? 0 : point.valleyA) - point.peakA) * (x - onEnd)) / (zeroAt - onEnd);
  if (midH < start) return isDcm ? 0 : offRamp(h + 1);
  if (midH < onEnd) {
    return point.valleyA + ((point.peakA - point.valleyA) * (h - start)) / (onEnd - start);
  }
  return midH < zeroAt ? offRamp(h) : 0;
}

/**
 * Returns where a stage's inductor current reaches zero, as a fraction of the half-period: the
 * end of its freewheeling interval (DCM), or 1 + start (CCM: not inside the half).
 */
export function stageZeroAt(point: OutputStagePoint, start: number, onEnd: number): number {
  return point.mode === 'dcm' ? Math.min(1, onEnd + point.freewheelDutyCycle) : 1 + start;
}
