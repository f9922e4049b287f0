import type { RectifierModel } from '../../devices/rectifier-model.js';
import { brentRoot } from '../../root-finding/brent-root.js';

/**
 * One buck-derived output stage: a secondary winding, a forward rectifier, a freewheeling
 * rectifier (both of the output's rectifier class) and an output inductor into the load. The
 * forward family, the push-pull and the bridges share it.
 */
export interface OutputStage {
  /** Load current, A. */
  loadA: number;
  /** Output inductance, H. */
  inductanceH: number;
  /** Output inductor resistance, Ω. */
  inductorResistanceOhm: number;
  /** Secondary winding resistance, Ω. */
  windingResistanceOhm: number;
  /** Linear model of each of the two rectifiers. */
  rectifier: RectifierModel;
  /**
   * Linear model of the freewheeling path, when it differs from `rectifier`: for example both
   * halves of a center-tapped secondary sharing the freewheeling current. Omitted: `rectifier`.
   */
  freewheel?: RectifierModel;
}

/** The stage's periodic steady state at one duty cycle. */
export interface OutputStagePoint {
  mode: 'ccm' | 'dcm';
  /** Output voltage at the load, V. */
  voltageV: number;
  /** Inductor current at the start of the on-interval (0 in DCM), A. */
  valleyA: number;
  /** Inductor current at the end of the on-interval, A. */
  peakA: number;
  /** Freewheeling interval over the period: 1 − D in CCM, D2 in DCM. */
  freewheelDutyCycle: number;
  /** Mean inductor current during the on-interval, A (the current the primary reflects). */
  onMeanA: number;
}

/**
 * Returns the stage's steady state for duty cycle D, secondary open-circuit voltage Vs (V) during
 * the on-interval and period T (s). Volt-second balance on the inductor with the linear drops at
 * each interval's mean current; CCM when the ripple ΔIL ≤ 2·Io, otherwise DCM from the buck
 * relations Ipk = Von·D·T/L = Voff·D2·T/L and Io = Ipk·(D + D2)/2 (Erickson & Maksimović, 2nd
 * ed. (from memory), ch. 5 and §6.3.2; Mohan, Undeland, Robbins, 3rd ed. (from memory), §7-3).
 * A synchronous rectifier is taken to turn off at zero current, as a diode does.
 */
export function outputStagePoint(
  stage: OutputStage,
  dutyCycle: number,
  secondaryVoltageV: number,
  periodS: number,
): OutputStagePoint {
  const d = dutyCycle;
  const io = stage.loadA;
  const { forwardVoltageV: vf, resistanceOhm: rd } = stage.rectifier;
  const { forwardVoltageV: offVf, resistanceOhm: offRd } = stage.freewheel ?? stage.rectifier;
  const onOhm = stage.windingResistanceOhm + rd + stage.inductorResistanceOhm;
  const offOhm = offRd + stage.inductorResistanceOhm;
  const lOverT = stage.inductanceH / periodS;
  // CCM: D·(Vs − Vf − (Rw + Rd)·Io) − (1 − D)·(Vf + Rd·Io) − RL·Io = Vo (the freewheeling
  // path's own Vf and Rd in the second term when it has them).
  const ccmV =
    d * (secondaryVoltageV - vf - (stage.windingResistanceOhm + rd) * io) -
    (1 - d) * (offVf + offRd * io) -
    stage.inductorResistanceOhm * io;
  const rippleA = ((ccmV + offVf + offOhm * io) * (1 - d)) / lOverT;
  if (rippleA <= 2 * io || !(secondaryVoltageV - vf > 0)) {
    return {
      mode: 'ccm',
      voltageV: ccmV,
      valleyA: io - rippleA / 2,
      peakA: io + rippleA / 2,
      freewheelDutyCycle: 1 - d,
      onMeanA: io,
    };
  }
  const ceilingV = secondaryVoltageV - vf;
  const lOverTPlusOn = lOverT + (d * onOhm) / 2;
  const voltageV = dcmVoltageV(stage, d, secondaryVoltageV, lOverT, ccmV);
  const peakA = (d * (ceilingV - voltageV)) / lOverTPlusOn;
  return {
    mode: 'dcm',
    voltageV,
    valleyA: 0,
    peakA,
    freewheelDutyCycle: Math.min(
      1 - d,
      (peakA * lOverT) / (voltageV + offVf + (offOhm * peakA) / 2),
    ),
    onMeanA: peakA / 2,
  };
}

/**
 * The DCM output voltage, V: the root in [Vo,ccm, Vs − Vf] of the charge balance
 * Ipk·(D + D2)/2 = Io with Ipk = D·(Vs − Vf − Vo)/(L/T + D·Ron/2) and
 * D2 = Ipk·(L/T)/(Vo + Vf′ + Roff·Ipk/2) (Ron, Roff the on- and off-interval resistances, Vf′
 * the freewheeling path's drop). With S = Vs − Vf + Vf′ and c = (L/T)/D + (Ron − Roff)/2,
 * Vo + Vf′ + Roff·Ipk/2 = S − c·Ipk, so the balance is the quadratic
 * (D·(Ron − Roff)/2)·Ipk² − (D·S + 2·Io·c)·Ipk + 2·Io·S = 0, whose smaller root is the one with
 * D2 > 0; it is taken in the cancellation-free form. Brent's method on the balance remains for a
 * bracket that holds the pole Ipk = S/c; Vo,ccm is kept where the bracket holds no root.
 */
function dcmVoltageV(
  stage: OutputStage,
  d: number,
  secondaryVoltageV: number,
  lOverT: number,
  ccmV: number,
): number {
  const io = stage.loadA;
  const { forwardVoltageV: vf, resistanceOhm: rd } = stage.rectifier;
  const { forwardVoltageV: offVf, resistanceOhm: offRd } = stage.freewheel ?? stage.rectifier;
  const onOhm = stage.windingResistanceOhm + rd + stage.inductorResistanceOhm;
  const offOhm = offRd + stage.inductorResistanceOhm;
  const lOverTPlusOn = lOverT + (d * onOhm) / 2;
  const ceilingV = secondaryVoltageV - vf;
  const sumV = ceilingV + offVf;
  const differenceOhm = onOhm - offOhm;
  const c = lOverT / d + differenceOhm / 2;
  const poleA = sumV / c;
  const bracketPeakA = (d * (ceilingV - ccmV)) / lOverTPlusOn;
  if (c > 0 && bracketPeakA < poleA) {
    const b = d * sumV + 2 * io * c;
    const discriminant = b * b - 4 * d * differenceOhm * io * sumV;
    const peakA = (4 * io * sumV) / (b + Math.sqrt(discriminant));
    const voltageV = ceilingV - (lOverTPlusOn * peakA) / d;
    if (peakA <= bracketPeakA && voltageV <= ceilingV && Number.isFinite(voltageV)) {
      return Math.max(ccmV, voltageV);
    }
  }
  const peakAt = (vo: number) => (d * (ceilingV - vo)) / lOverTPlusOn;
  const charge = (vo: number) => {
    const peakA = peakAt(vo);
    return (peakA * (d + (peakA * lOverT) / (vo + offVf + (offOhm * peakA) / 2))) / 2 - io;
  };
  const voltageV = brentRoot(charge, ccmV, ceilingV, { absoluteTolerance: 1e-12 * ceilingV });
  return Number.isFinite(voltageV) ? voltageV : ccmV;
}
