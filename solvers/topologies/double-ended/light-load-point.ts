import { brentRoot } from '../../root-finding/brent-root.js';
import {
  outputStagePoint,
  type OutputStage,
  type OutputStagePoint,
} from '../buck-derived/output-stage.js';

/**
 * The interval in which one rectifier has stopped and the magnetizing current, referred to the
 * secondary, carries the inductor current (fractions of a half-period, currents referred to the
 * secondary: n·Im, A).
 */
export interface SharedFall {
  /** Referred magnetizing current at the start of the half (its magnitude; it starts negative). */
  magnetizingStartA: number;
  /** Referred magnetizing current at the end of the on-interval. */
  magnetizingEndOfOnA: number;
  /** Inductor (and referred magnetizing) current as the shared fall starts. */
  startA: number;
  /** Inductor current as it ends: the next half's valley, or zero. */
  endA: number;
  startFraction: number;
  endFraction: number;
  /** Magnitude of the secondary winding voltage during the shared fall: Lr·(Vo + Vf)/(L + Lr), V. */
  windingVoltageV: number;
}

/** A double-ended stage's steady state over half a period, with the shared fall if it occurs. */
export interface DoubleEndedStagePoint extends OutputStagePoint {
  sharedFall?: SharedFall;
}

/**
 * Returns the stage's steady state over half a period (duty cycle D over the half, secondary
 * open-circuit voltage Vs, half-period Th) when the magnetizing inductance referred to the
 * secondary, Lr = Lm/n², is in play. While the secondary freewheels, its rectifiers carry the
 * inductor current IL plus and minus half the referred magnetizing current n·Im (ampere-turn
 * balance with the primary open); once the falling IL meets n·Im, the rectifier of the half just
 * driven stops, the winding leaves zero, and IL and n·Im fall together at
 * (Vo + Vf)/(L + Lr) (the two inductances in series through the other rectifier) to the
 * half's end (its value there is the next valley and, over n, the next half's magnetizing start)
 * or to zero. Volt-second balance then no longer fixes Vo: charge balance over the half does,
 * solved for Vo by Brent's method; the drops are taken at the load current, as in continuous
 * conduction, so the two meet where the shared fall shrinks to nothing. Without that fall
 * (valley ≥ n·Im,pk) the result is `outputStagePoint`'s, unchanged. If IL ends the on-interval
 * below n·Im, the excess magnetizing current is taken to return to the input at once (through
 * the body diodes, at −Vd) and the shared fall starts at the peak.
 * ref: Mohan, Undeland, Robbins, 3rd ed. (from memory), §10-5 and §10-4-2 (the magnetizing
 * current through a freewheeling center-tapped rectifier); Erickson & Maksimović, 2nd ed.
 * (from memory), §2.3 (volt-second and charge balance).
 */
export function lightLoadPoint(
  stage: OutputStage,
  dutyCycle: number,
  secondaryVoltageV: number,
  halfS: number,
  referredMagnetizingH: number,
  voltageHintV?: number,
): DoubleEndedStagePoint {
  const onS = dutyCycle * halfS;
  const lr = referredMagnetizingH;
  const riseA = (Math.max(0, secondaryVoltageV) * onS) / lr;
  const io = stage.loadA;
  const l = stage.inductanceH;
  const { forwardVoltageV: vf, resistanceOhm: rd } = stage.rectifier;
  const { forwardVoltageV: offVf, resistanceOhm: offRd } = stage.freewheel ?? stage.rectifier;
  const rl = stage.inductorResistanceOhm;
  const onDropV = vf + (stage.windingResistanceOhm + rd + rl) * io;
  const offDropV = offVf + (offRd + rl) * io;
  // Continuous conduction's volt-second balance: there the shared fall is empty; below the
  // boundary the mean current there exceeds the load, since the valley lies below n·Im,pk.
  const d = dutyCycle;
  const floorV =
    d * (secondaryVoltageV - onDropV + rl * io) - (1 - d) * (offDropV - rl * io) - rl * io;
  const ccmValleyA = io - ((floorV + offDropV) * (1 - d) * halfS) / (2 * l);
  if (!(lr > 0) || !(riseA > 0) || !(secondaryVoltageV - vf > 0) || ccmValleyA >= riseA / 2) {
    return outputStagePoint(stage, dutyCycle, secondaryVoltageV, halfS);
  }
  const fall: FallContext = {
    loadA: io,
    inductanceH: l,
    referredMagnetizingH: lr,
    secondaryVoltageV,
    onDropV,
    offDropV,
    riseA,
    halfS,
    onS,
    restS: halfS - onS,
  };
  // One closure per call (module-level helpers below): Brent's method evaluates it.
  const excess = (vo: number) => excessAt(fall, vo);
  const ceilingV = secondaryVoltageV - onDropV;
  const lowV = Math.min(floorV, ceilingV);
  const rootOptions = { absoluteTolerance: 1e-12 * Math.max(1, Math.abs(ceilingV)) };
  // Warm start: a Vo from a nearby solve (the last fixed-point pass or duty-cycle trial) is
  // bracketed within 1e-6 of the ceiling first; the same tolerance, so the same root to it.
  let voltageV = NaN;
  if (voltageHintV !== undefined && voltageHintV > lowV && voltageHintV < ceilingV) {
    const spanV = 1e-6 * Math.max(1, Math.abs(ceilingV));
    voltageV = brentRoot(
      excess,
      Math.max(lowV, voltageHintV - spanV),
      Math.min(ceilingV, voltageHintV + spanV),
      rootOptions,
    );
  }
  if (!Number.isFinite(voltageV)) voltageV = brentRoot(excess, lowV, ceilingV, rootOptions);
  if (!Number.isFinite(voltageV)) voltageV = floorV;
  let s = shapeAt(fall, voltageV);
  if (!(Math.abs(s.mean - io) <= 1e-6 * io)) {
    // The root sits where the clamped fall just spans the rest of the half (ΔIL = g·rest): the
    // whole freewheel is the shared fall, Vo is fixed by volt-seconds and the valley by charge
    // balance, Iv = Io − ΔIL/2, as in continuous conduction.
    s = halfShape(fall, voltageV, Math.max(0, io - riseAt(fall, voltageV) / 2));
  }
  const isContinuous = s.valleyA > 0;
  return {
    mode: isContinuous ? 'ccm' : 'dcm',
    voltageV,
    valleyA: s.valleyA,
    peakA: s.peakA,
    freewheelDutyCycle: (s.firstS + s.sharedS) / halfS,
    onMeanA: (s.valleyA + s.peakA) / 2,
    sharedFall: {
      magnetizingStartA: s.valleyA,
      magnetizingEndOfOnA: riseA - s.valleyA,
      startA: s.startA,
      endA: s.endA,
      startFraction: dutyCycle + s.firstS / halfS,
      endFraction: isContinuous ? 1 : dutyCycle + (s.firstS + s.sharedS) / halfS,
      windingVoltageV: (lr * (voltageV + onDropV)) / (l + lr),
    },
  };
}

/** What the shared-fall shape of one `lightLoadPoint` call is built from (SI units). */
interface FallContext {
  loadA: number;
  inductanceH: number;
  referredMagnetizingH: number;
  secondaryVoltageV: number;
  onDropV: number;
  offDropV: number;
  /** Referred magnetizing rise over the on-interval, A. */
  riseA: number;
  halfS: number;
  onS: number;
  restS: number;
}

/** The half-period's current shape at a trial Vo and valley, and its mean (A). */
interface HalfShape {
  valleyA: number;
  peakA: number;
  startA: number;
  endA: number;
  firstS: number;
  sharedS: number;
  mean: number;
}

/** The shared fall runs through the driven path's rectifier and winding: g = Vj/(L + Lr), A/s. */
function slopeAt(c: FallContext, vo: number): number {
  return (vo + c.onDropV) / (c.inductanceH + c.referredMagnetizingH);
}

/** The inductor current's rise over the on-interval at a trial Vo, A. */
function riseAt(c: FallContext, vo: number): number {
  return (Math.max(0, c.secondaryVoltageV - c.onDropV - vo) * c.onS) / c.inductanceH;
}

function halfShape(c: FallContext, vo: number, valleyA: number): HalfShape {
  const l = c.inductanceH;
  const lAtOnA = riseAt(c, vo);
  const offV = vo + c.offDropV;
  const g = slopeAt(c, vo);
  const peakA = valleyA + lAtOnA;
  // Clamped: IL ends the on-time below n·Im; the excess returns through the body diodes.
  const startA = Math.min(c.riseA - valleyA, peakA);
  const firstS = (l * (peakA - startA)) / offV;
  const sharedS = Math.min(Math.max(0, c.restS - firstS), (startA - valleyA) / g);
  const endA = Math.max(valleyA, startA - g * sharedS);
  const chargeAS =
    ((valleyA + peakA) / 2) * c.onS +
    ((peakA + startA) / 2) * firstS +
    ((startA + endA) / 2) * sharedS;
  return { valleyA, peakA, startA, endA, firstS, sharedS, mean: chargeAS / c.halfS };
}

/**
 * For a trial Vo the valley follows from periodicity: Ib − Iv = g·t2 with Ib = rise − Iv,
 * t1 = L·(Iv + ΔIL − Ib)/Voff and t2 = rest − t1 (the shared fall reaching the half's end); a
 * negative value means both reach zero first (valley 0).
 */
function shapeAt(c: FallContext, vo: number): HalfShape {
  const l = c.inductanceH;
  const riseA = c.riseA;
  const lAtOnA = riseAt(c, vo);
  const offV = vo + c.offDropV;
  const g = slopeAt(c, vo);
  const valleyA = Math.max(
    0,
    (riseA - g * c.restS + (g * l * (lAtOnA - riseA)) / offV) / (2 * (1 - (g * l) / offV)),
  );
  return halfShape(c, vo, riseA - valleyA > valleyA + lAtOnA ? 0 : valleyA);
}

/**
 * The half's mean current less the load at a trial Vo. Where no valley makes the half periodic
 * (the clamped fall cannot reach the valley in time) the current would build up: the mean is
 * then taken as above the load.
 */
function excessAt(c: FallContext, vo: number): number {
  const shape = shapeAt(c, vo);
  const isPeriodic = shape.endA <= shape.valleyA + 1e-9 * shape.peakA;
  return isPeriodic ? shape.mean - c.loadA : c.loadA;
}
