import { brentRoot } from '../../root-finding/brent-root.js';
import type { OutputStage } from '../buck-derived/output-stage.js';

/**
 * The buck-derived stage's relations (those of `outputStagePoint`) solved the other way round,
 * so that a regulated output needs no search over the duty cycle: CCM when the ripple ΔIL ≤ 2·Io,
 * else the DCM relations Ipk = D·(Vs − Vf − Vo)/(L/T + D·Ron/2), D2 = Ipk·(L/T)/(Vo + Vf +
 * Roff·Ipk/2), Io = Ipk·(D + D2)/2 (Erickson & Maksimović, 2nd ed. (from memory), ch. 5).
 */

/** Returns the stage's on-interval duty cycle (0..1) that gives `outputV` from `secondaryV`; NaN if none. */
export function stageDutyFor(
  stage: OutputStage,
  secondaryV: number,
  outputV: number,
  periodS: number,
): number {
  const io = stage.loadA;
  const { forwardVoltageV: vf, resistanceOhm: rd } = stage.rectifier;
  const offOhm = rd + stage.inductorResistanceOhm;
  // CCM: D·(Vs − Rw·Io) = Vo + Vf + (Rd + RL)·Io.
  const ccmD = (outputV + vf + offOhm * io) / (secondaryV - stage.windingResistanceOhm * io);
  if (!(ccmD > 0)) return NaN;
  const lOverT = stage.inductanceH / periodS;
  const rippleA = ((outputV + vf + offOhm * io) * (1 - ccmD)) / lOverT;
  if (rippleA <= 2 * io || ccmD >= 1) return ccmD;
  const onOhm = stage.windingResistanceOhm + offOhm;
  const headroomV = secondaryV - vf - outputV;
  if (!(headroomV > 0)) return NaN;
  const current = dcmCurrentExcess(headroomV, lOverT, onOhm, offOhm, outputV + vf, io);
  return brentRoot(current, 1e-12, ccmD, { absoluteTolerance: 1e-14 });
}

/**
 * The DCM stage's mean current less the load as a function of its duty cycle (`stageDutyFor`):
 * a returned arrow, not a named one in the caller, since under tsx esbuild's keepNames wraps each
 * named arrow in an Object.defineProperty call, paid at every fixed-point pass of a DCM corner.
 */
function dcmCurrentExcess(
  headroomV: number,
  lOverT: number,
  onOhm: number,
  offOhm: number,
  offV: number,
  io: number,
): (d: number) => number {
  return (d) => {
    const peakA = (d * headroomV) / (lOverT + (d * onOhm) / 2);
    const freewheel = (peakA * lOverT) / (offV + (offOhm * peakA) / 2);
    return (peakA * (d + freewheel)) / 2 - io;
  };
}

/** Returns the secondary on-voltage (V) that gives `outputV` at on-interval duty cycle `dutyCycle`. */
export function stageSecondaryVoltageFor(
  stage: OutputStage,
  dutyCycle: number,
  outputV: number,
  periodS: number,
): number {
  const d = dutyCycle;
  const io = stage.loadA;
  const { forwardVoltageV: vf, resistanceOhm: rd } = stage.rectifier;
  const offOhm = rd + stage.inductorResistanceOhm;
  const lOverT = stage.inductanceH / periodS;
  const rippleA = ((outputV + vf + offOhm * io) * (1 - d)) / lOverT;
  if (rippleA <= 2 * io) {
    return (outputV + vf + offOhm * io) / d + stage.windingResistanceOhm * io;
  }
  const onOhm = stage.windingResistanceOhm + offOhm;
  // Io·2 = Ipk·(D + D2(Ipk)) rises with Ipk; the peak is at most 2·Io/D.
  const charge = (peakA: number) =>
    peakA * (d + (peakA * lOverT) / (outputV + vf + (offOhm * peakA) / 2)) - 2 * io;
  const peakA = brentRoot(charge, 0, (2 * io) / d, { absoluteTolerance: 1e-14 * io });
  return vf + outputV + (peakA * (lOverT + (d * onOhm) / 2)) / d;
}
