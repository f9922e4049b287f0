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
  const peakAt = (vo: number) => (d * (secondaryVoltageV - vf - vo)) / (lOverT + (d * onOhm) / 2);
  const freewheelAt = (vo: number, peakA: number) =>
    (peakA * lOverT) / (vo + offVf + (offOhm * peakA) / 2);
  const charge = (vo: number) => {
    const peakA = peakAt(vo);
    return (peakA * (d + freewheelAt(vo, peakA))) / 2 - io;
  };
  const ceilingV = secondaryVoltageV - vf;
  let voltageV = brentRoot(charge, ccmV, ceilingV, { absoluteTolerance: 1e-12 * ceilingV });
  if (!Number.isFinite(voltageV)) voltageV = ccmV;
  const peakA = peakAt(voltageV);
  return {
    mode: 'dcm',
    voltageV,
    valleyA: 0,
    peakA,
    freewheelDutyCycle: Math.min(1 - d, freewheelAt(voltageV, peakA)),
    onMeanA: peakA / 2,
  };
}
