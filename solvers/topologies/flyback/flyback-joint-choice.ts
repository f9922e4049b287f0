import {
  CHOICE_CORNER_LABEL,
  updateChoiceDraft,
  type FlybackChoiceDraft,
} from './flyback-choice-draft.js';
import { flybackCircuit, type FlybackCircuit } from './flyback-circuit.js';
import { drainRiseTrace } from './flyback-idle-ring.js';
import { evaluateCcm, newOperatingPoint, type OperatingPoint } from './flyback-intervals.js';

/** Newton steps before the joint choice gives up and leaves it to the one-at-a-time search. */
const MAX_NEWTON_STEPS = 30;
/** Relative step of the finite-difference Jacobian. */
const DIFFERENCE_STEP = 1e-7;
/** Largest relative change of n or Lm in one Newton step. */
const MAX_RELATIVE_STEP = 0.3;

/**
 * Chooses n and Lm together when the spec leaves both open and the lowest input at full load
 * is continuous: with D held at the target, the CCM periodicity residual and the ripple ratio
 * are two equations in (n, Lm), solved by Newton's method with a finite-difference Jacobian.
 * Returns false (draft unchanged) when it does not converge to a valid CCM point.
 */
export function chooseJointly(
  draft: FlybackChoiceDraft,
  tolerance: number,
  iterations: number,
): boolean {
  const { spec, choices } = draft;
  const duty = spec.targets.dutyCycleTarget;
  const target = spec.targets.magnetizingRippleRatioTarget;
  const corner = {
    label: CHOICE_CORNER_LABEL,
    inputVoltageV: spec.inputVoltageMinV,
    loadFraction: 1,
  };
  const start = {
    turnsRatio: choices.turnsRatio,
    magnetizingInductanceH: choices.magnetizingInductanceH,
  };
  const point = newOperatingPoint();
  const residuals = (n: number, lm: number, out: number[]): boolean => {
    updateChoiceDraft(draft, { turnsRatio: n, magnetizingInductanceH: lm });
    const circuit = flybackCircuit(spec, choices, corner);
    evaluateCcm(circuit, duty, point, iterations);
    // Periodicity in units of the referred load current; the ripple ratio against its target.
    out[0] = point.residualA / circuit.referredLoadCurrentA;
    out[1] = rippleRatio(circuit, point, duty) / target - 1;
    return point.isValid && point.valleyCurrentA > 0 && Number.isFinite(out[0] + out[1]);
  };
  let n = start.turnsRatio;
  let lm = start.magnetizingInductanceH;
  const f = [0, 0];
  const fn = [0, 0];
  const fl = [0, 0];
  for (let step = 0; step < MAX_NEWTON_STEPS; step++) {
    const hn = DIFFERENCE_STEP * n;
    const hl = DIFFERENCE_STEP * lm;
    if (!residuals(n + hn, lm, fn) || !residuals(n, lm + hl, fl) || !residuals(n, lm, f)) break;
    const a = ((fn[0] as number) - (f[0] as number)) / hn;
    const b = ((fl[0] as number) - (f[0] as number)) / hl;
    const c = ((fn[1] as number) - (f[1] as number)) / hn;
    const d = ((fl[1] as number) - (f[1] as number)) / hl;
    const determinant = a * d - b * c;
    if (!(Math.abs(determinant) > 0)) break;
    let dn = (-(f[0] as number) * d + b * (f[1] as number)) / determinant;
    let dl = (-(f[1] as number) * a + c * (f[0] as number)) / determinant;
    // Damp a long step so that the linearization stays trustworthy.
    const longest = Math.max(Math.abs(dn / n), Math.abs(dl / lm));
    if (longest > MAX_RELATIVE_STEP) {
      dn *= MAX_RELATIVE_STEP / longest;
      dl *= MAX_RELATIVE_STEP / longest;
    }
    n += dn;
    lm += dl;
    if (!(n > 0 && lm > 0)) break;
    if (Math.abs(dn / n) <= tolerance && Math.abs(dl / lm) <= tolerance) {
      if (!residuals(n, lm, f)) break;
      return true;
    }
  }
  updateChoiceDraft(draft, start);
  return false;
}

/**
 * ΔIm/Im of a CCM point as its magnetizing-current waveform has it (flyback-current-waveforms.ts):
 * the highest less the lowest breakpoint over the mean by trapezoids between the breakpoints,
 * t = 0, t1, DT, the drain's rise at turn-off drawn along its arc (where the current first grows
 * past Ipk), DT + rise + tb + ts and T. Leaving the rise out put the chosen ratio some 2e-5 off the
 * waveform's.
 */
function rippleRatio(c: FlybackCircuit, p: OperatingPoint, duty: number): number {
  const periodS = c.periodS;
  const onS = duty * periodS;
  const t1 = p.turnOnCommutationS;
  const rise = drainRiseTrace(c, onS, p.peakCurrentA, p.turnOffTransitionS);
  let chargeAS =
    (p.valleyCurrentA + p.onsetCurrentA) * t1 + (p.onsetCurrentA + p.peakCurrentA) * (onS - t1);
  let highestA = Math.max(p.valleyCurrentA, p.onsetCurrentA, p.peakCurrentA);
  let lowestA = Math.min(p.valleyCurrentA, p.onsetCurrentA, p.peakCurrentA);
  let timeS = onS;
  let currentA = p.peakCurrentA;
  for (let k = 0; k < rise.timesS.length; k++) {
    const nextS = rise.timesS[k] as number;
    const nextA = rise.currentsA[k] as number;
    chargeAS += (currentA + nextA) * (nextS - timeS);
    highestA = Math.max(highestA, nextA);
    lowestA = Math.min(lowestA, nextA);
    timeS = nextS;
    currentA = nextA;
  }
  const after = p.afterCommutationCurrentA;
  const commutatedS = onS + p.turnOffTransitionS + p.leakageRingS + p.turnOffCommutationS;
  chargeAS +=
    (currentA + after) * (commutatedS - timeS) +
    (after + p.valleyCurrentA) * (periodS - commutatedS);
  highestA = Math.max(highestA, after);
  lowestA = Math.min(lowestA, after);
  return (highestA - lowestA) / (chargeAS / (2 * periodS));
}
