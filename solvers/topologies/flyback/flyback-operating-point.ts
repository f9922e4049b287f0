/**
 * One candidate operating point of the lumped flyback at a trial duty cycle D, primary-referred.
 * The period splits into intervals (t = 0 at turn-on):
 *  1. [0, t1]   turn-on commutation (CCM only): the switch current rises through the leakage
 *               while the secondary still conducts; the magnetizing current falls from Iv to Ia.
 *  2. [t1, DT]  on-interval: the magnetizing current rises from Ia to the peak Ipk.
 *  3. [DT, DT+tc] the drain's rise: Lm + Llk lift the drain capacitance to Vin + V0.
 *  4. [.., +tb] the leakage ring: the secondary conducts, the leakage current rings with the
 *               drain capacitance about Vin + Vr until the drain reaches Vin + Vc (or peaks below
 *               it); i_m falls at Vr/Lm (flyback-turn-off.ts).
 *  5. [.., +ts] turn-off commutation: the clamp holds the switch at Vin + Vc, the leakage
 *               current falls to zero and the secondary current rises; i_m falls to Ib.
 *  6. [.., end] demagnetization into the outputs; CCM ends at T with i_m back at Iv, DCM at
 *               the time i_m reaches zero, followed by an idle interval in which Lm + Llk rings
 *               with the drain capacitance (flyback-idle-ring.ts) and ends at T with i_m at I0.
 * Interval voltages use interval-average currents in the resistive drops, which is exact for
 * linear ramps (Erickson & Maksimović, 2nd ed., §2.2 small ripple, §3.1 equivalent circuit;
 * from memory).
 */
export interface OperatingPoint {
  /** CCM: end-of-period current minus Iv; DCM: delivered minus required referred current; A. */
  residualA: number;
  /** Iv: magnetizing current at turn-on, A (in DCM the idle ring's I0, of either sign). */
  valleyCurrentA: number;
  /** Drain-source voltage just before turn-on, V (in DCM the idle ring's). */
  turnOnDrainV: number;
  /** Ia: magnetizing (= switch) current when the turn-on commutation ends, A. */
  onsetCurrentA: number;
  /** Ipk: magnetizing (= switch) current at turn-off, A. */
  peakCurrentA: number;
  /** Ib: magnetizing (= referred secondary) current when the turn-off commutation ends, A. */
  afterCommutationCurrentA: number;
  /**
   * Time the turn-off current takes to lift the drain capacitance from 0 to Vin + V0 before the
   * secondary conducts, s (0 without drain capacitance).
   */
  turnOffTransitionS: number;
  /** Magnetizing current at the end of that transition, A (Ipk without drain capacitance). */
  transitionEndCurrentA: number;
  /**
   * tb: time the leakage current rings with the drain capacitance before the clamp conducts (or
   * until the drain peaks below the clamp), s (0 without drain capacitance or leakage).
   */
  leakageRingS: number;
  /** Leakage current when the clamp diode starts to conduct, A (0 when it never does). */
  clampOnsetCurrentA: number;
  /**
   * Peak of the leakage ring above the ring's centre Vin + Vr, V: Vc − Vr when the clamp
   * conducts, else the ring's amplitude (0 without drain capacitance or leakage).
   */
  leakageRingPeakV: number;
  /**
   * Time the leakage ring takes, after the leakage current first reaches zero, to return the
   * drain to the ring's centre (a quarter of its period, or less if conduction ends first), s.
   */
  leakageRingReturnS: number;
  /** t1: duration of the turn-on commutation, s. */
  turnOnCommutationS: number;
  /** ts: duration of the turn-off commutation (the clamp's conduction), s. */
  turnOffCommutationS: number;
  /** Time the secondary current reaches zero: the period in CCM, s. */
  conductionEndS: number;
  /** Reflected voltage during the turn-off commutation, V (sets ts and the clamp power). */
  turnOffReflectedV: number;
  /** False when a commutation does not finish inside its interval. */
  isValid: boolean;
  /** True when the clamp voltage does not exceed the reflected voltage during commutation. */
  isClampBelowReflected: boolean;
}

/** A zeroed operating point to be filled by the evaluators (one allocation per solve). */
export function newOperatingPoint(): OperatingPoint {
  return {
    residualA: 0,
    valleyCurrentA: 0,
    turnOnDrainV: 0,
    turnOffTransitionS: 0,
    transitionEndCurrentA: 0,
    leakageRingS: 0,
    clampOnsetCurrentA: 0,
    leakageRingPeakV: 0,
    leakageRingReturnS: 0,
    onsetCurrentA: 0,
    peakCurrentA: 0,
    afterCommutationCurrentA: 0,
    turnOnCommutationS: 0,
    turnOffCommutationS: 0,
    conductionEndS: 0,
    turnOffReflectedV: 0,
    isValid: true,
    isClampBelowReflected: false,
  };
}
