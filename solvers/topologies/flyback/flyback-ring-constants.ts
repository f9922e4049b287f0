/**
 * What the leakage ring's formulas (flyback-turn-off.ts, flyback-leakage-arcs.ts) take from Llk
 * and C alone, and the last return's cosine.
 */
export interface RingConstants {
  leakageH: number;
  capacitanceF: number;
  /** Z = √(Llk/C), Ω. */
  impedanceOhm: number;
  /** ω = 1/√(Llk·C), rad/s. */
  angularFrequency: number;
  /** 1/ω = √(Llk·C), s: the time the ring takes to advance one radian (not its period). */
  secondsPerRadian: number;
  /** The quarter period (π/2)·√(Llk·C), s. */
  quarterS: number;
  /** The return time the fraction below belongs to, s (NaN: none yet). */
  returnS: number;
  /** 1 − cos ωτ for that return time τ. */
  returnFraction: number;
}

/**
 * The constants of the last (Llk, C) asked for. Every corner and every trial of a design shares
 * one leakage and one drain capacitance, so they are computed once, by the same expressions the
 * formulas used inline; a module variable rather than a cache of many, since only equal values
 * hit.
 */
const lastConstants: RingConstants = {
  leakageH: NaN,
  capacitanceF: NaN,
  impedanceOhm: NaN,
  angularFrequency: NaN,
  secondsPerRadian: NaN,
  quarterS: NaN,
  returnS: NaN,
  returnFraction: NaN,
};

/**
 * The ring constants of the leakage `leakageH` (H) with the drain capacitance `capacitanceF` (F):
 * the last pair's, kept (see above).
 */
export function ringConstantsOf(leakageH: number, capacitanceF: number): RingConstants {
  const constants = lastConstants;
  if (constants.leakageH === leakageH && constants.capacitanceF === capacitanceF) return constants;
  constants.leakageH = leakageH;
  constants.capacitanceF = capacitanceF;
  constants.impedanceOhm = Math.sqrt(leakageH / capacitanceF);
  constants.angularFrequency = 1 / Math.sqrt(leakageH * capacitanceF);
  constants.secondsPerRadian = Math.sqrt(leakageH * capacitanceF);
  constants.quarterS = (Math.PI / 2) * Math.sqrt(leakageH * capacitanceF);
  constants.returnS = NaN;
  return constants;
}
