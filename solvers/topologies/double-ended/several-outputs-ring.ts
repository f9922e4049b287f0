import type { OutputStage } from '../buck-derived/output-stage.js';
import type { DoubleEndedStagePoint, SharedFall } from './light-load-point.js';
import { ringAdvance, simulateRing } from './node-ring.js';
import { stageDrops, type ReferredOutputs } from './referred-outputs.js';

/**
 * The outputs under the equivalent's shared fall with the node ring: the equivalent's current
 * I and winding voltage v (output 0's secondary) ring as one output's do, and output k follows
 * them, L_k·dIL_k/dt = c_k·v − (Vo_k + Von_k) with Leq·dI/dt = v − Eeq, so
 * IL_k(t) = IL_k(start) + (c_k·Leq/L_k)·(I(t) − I(start)) + ((c_k·Eeq − Vo_k − Von_k)/L_k)·t while
 * every output conducts through its driven path (the ring's `shared`, `clamp` and `settled`
 * stretches). Volt-second balance over the half gives Vo_k (∫v dt = Leq·ΔI + Eeq·t over the
 * fall) and charge balance its valley (∫I dt over the ring's samples, as the waveforms take it).
 * Undefined where the ring leaves those stretches (both rectifiers back in, or the equivalent's
 * current at zero) or an output's current would go below zero at a stretch's end: the shared
 * fall without the ring then answers.
 */
export function ringedOutputs(
  stages: readonly OutputStage[],
  referred: ReferredOutputs,
  equivalent: DoubleEndedStagePoint,
  secondaryVoltageV: number,
  dutyCycle: number,
): DoubleEndedStagePoint[] | undefined {
  const fall = equivalent.sharedFall as SharedFall;
  const ring = fall.ring;
  if (ring === undefined) return undefined;
  const halfS = ring.halfS;
  const onS = dutyCycle * halfS;
  const startS = fall.startFraction * halfS;
  const run = simulateRing(ring.constants, ring.start, halfS - startS, true);
  if (!run.isComplete || run.segments === undefined) return undefined;
  const leq = ring.constants.c.inductanceH;
  const pathV = ring.constants.c.pathV;
  // Per stretch: its length, the equivalent's current at its start and ∫I dt over it.
  const spans: { durationS: number; startA: number; chargeAS: number }[] = [];
  let fallS = 0;
  for (const segment of run.segments) {
    if (segment.mode !== 'shared' && segment.mode !== 'clamp' && segment.mode !== 'settled') {
      return undefined;
    }
    const step = ringAdvance(
      ring.constants,
      segment.mode,
      segment.side,
      segment.start,
      segment.durationS,
    );
    spans.push({
      durationS: segment.durationS,
      startA: segment.start.inductorA,
      chargeAS: step.chargeAS,
    });
    fallS += segment.durationS;
  }
  // ∫v dt over the fall, output 0's secondary: Leq·(I(end) − I(start)) + Eeq·t.
  const fallVoltS = leq * (equivalent.valleyA - ring.start.inductorA) + pathV * fallS;
  const firstS = startS - onS;
  const points: DoubleEndedStagePoint[] = [];
  for (let k = 0; k < stages.length; k++) {
    const stage = stages[k] as OutputStage;
    const c = referred.factors[k] as number;
    const l = stage.inductanceH;
    const drops = stageDrops(stage);
    const voltageV =
      (c * (secondaryVoltageV * onS + fallVoltS) -
        drops.onV * (onS + fallS) -
        drops.offV * firstS) /
      halfS;
    const perRingA = (c * leq) / l;
    const perS = (c * pathV - voltageV - drops.onV) / l;
    // The current from a valley of zero: the on-interval, the freewheel, the ring's stretches.
    const peakA = ((c * secondaryVoltageV - drops.onV - voltageV) * onS) / l;
    const startA = peakA - ((voltageV + drops.offV) * firstS) / l;
    let chargeAS = (peakA / 2) * onS + ((peakA + startA) / 2) * firstS;
    let lowestA = Math.min(0, startA);
    let elapsedS = 0;
    for (const span of spans) {
      const atA = startA + perRingA * (span.startA - ring.start.inductorA) + perS * elapsedS;
      chargeAS +=
        atA * span.durationS +
        perRingA * (span.chargeAS - span.startA * span.durationS) +
        (perS * span.durationS * span.durationS) / 2;
      lowestA = Math.min(lowestA, atA);
      elapsedS += span.durationS;
    }
    const valleyA = stage.loadA - chargeAS / halfS;
    if (!(valleyA > 0) || !(valleyA + lowestA >= 0)) return undefined;
    points.push({
      mode: 'ccm',
      voltageV,
      valleyA,
      peakA: peakA + valleyA,
      freewheelDutyCycle: equivalent.freewheelDutyCycle,
      onMeanA: valleyA + peakA / 2,
      sharedFall: {
        magnetizingStartA: fall.magnetizingStartA / c,
        magnetizingEndOfOnA: fall.magnetizingEndOfOnA / c,
        startA: startA + valleyA,
        endA: valleyA,
        startFraction: fall.startFraction,
        endFraction: fall.endFraction,
        windingVoltageV: c * fall.windingVoltageV,
        freewheelMagnetizingA: startA + valleyA,
        ring,
        followsRing: { perRingA, perS, windingFactor: c },
      },
    });
  }
  return points;
}
