import { broydenUpdateThree, solveThreeByThree } from '../../root-finding/three-unknowns.js';
import {
  forwardEventPeriod,
  type ForwardEventCircuit,
  type ForwardEventPeriod,
  type ForwardEventStart,
} from './light-load-period.js';

/** A periodic light-load period: the unknown solved (D or Vo), its start and its events. */
export interface ForwardEventSolution {
  /** The duty cycle, or the output voltage (V) where the duty cycle is given. */
  unknown: number;
  start: ForwardEventStart;
  period: ForwardEventPeriod;
  /** Newton steps taken. */
  steps: number;
}

/** Newton steps before the solve gives up. */
const NEWTON_STEPS = 40;

/**
 * Returns the periodic steady state of {@link forwardEventPeriod} that delivers `loadA` (A), or
 * undefined where Newton's method does not converge. Unknowns: the duty cycle D with the output
 * held, or the output voltage at a given D (`build` makes the circuit and D of either), and IL
 * and the referred magnetizing current at the turn-on; residuals: the period's end
 * state less its start (periodicity, solved directly rather than by stepping periods: the
 * lossless ring settles over many), and its mean IL less the load (charge balance on the
 * output capacitor: Erickson & Maksimović, 2nd ed. (from memory), §2.3). The Jacobian is taken
 * by forward differences, then carried by Broyden's updates (a fresh one where a step fails); a
 * step is halved until the residual falls.
 */
export function solveForwardEventPeriod(
  build: (unknown: number) => { circuit: ForwardEventCircuit; dutyCycle: number },
  loadA: number,
  guess: { unknown: number; start: ForwardEventStart },
  bounds: { lo: number; hi: number },
): ForwardEventSolution | undefined {
  let x = [guess.unknown, Math.max(0, guess.start.inductorA), guess.start.magnetizingA];
  const scaleA = Math.max(loadA, 1e-9);
  const tolerance = 1e-9 * scaleA;
  let r = residuals(build, loadA, x);
  if (r === undefined) return undefined;
  let jacobian: number[] | undefined;
  let isFresh = false;
  for (let step = 0; step < NEWTON_STEPS; step++) {
    const norm = maxAbs(r.values);
    if (norm <= tolerance) {
      return {
        unknown: x[0] as number,
        start: { inductorA: x[1] as number, magnetizingA: x[2] as number },
        period: r.period,
        steps: step,
      };
    }
    if (jacobian === undefined) {
      jacobian = finiteDifferenceJacobian(build, loadA, x, r.values, scaleA);
      if (jacobian === undefined) return undefined;
      isFresh = true;
    }
    const dx = solveThreeByThree(
      jacobian,
      -(r.values[0] as number),
      -(r.values[1] as number),
      -(r.values[2] as number),
    );
    let lambda = 1;
    let accepted = false;
    for (let halving = 0; dx !== undefined && halving < 12; halving++) {
      const trial = [
        Math.min(Math.max((x[0] as number) + lambda * (dx[0] as number), bounds.lo), bounds.hi),
        Math.max(0, (x[1] as number) + lambda * (dx[1] as number)),
        (x[2] as number) + lambda * (dx[2] as number),
      ];
      const rt = residuals(build, loadA, trial);
      if (rt !== undefined && maxAbs(rt.values) < norm) {
        // Broyden's update of the Jacobian along the step taken (Broyden, 1965; Press et al.,
        // Numerical Recipes, 3rd ed. (from memory), §9.7): one period run a step instead of four.
        broydenUpdateThree(
          jacobian,
          (trial[0] as number) - (x[0] as number),
          (trial[1] as number) - (x[1] as number),
          (trial[2] as number) - (x[2] as number),
          (rt.values[0] as number) - (r.values[0] as number),
          (rt.values[1] as number) - (r.values[1] as number),
          (rt.values[2] as number) - (r.values[2] as number),
        );
        x = trial;
        r = rt;
        accepted = true;
        isFresh = false;
        break;
      }
      lambda /= 2;
    }
    if (!accepted) {
      // A stale Jacobian: take a fresh one once before giving up.
      if (isFresh) return undefined;
      jacobian = undefined;
    }
  }
  return undefined;
}

/** The Jacobian of the residuals at x by forward differences, or undefined where a run fails. */
function finiteDifferenceJacobian(
  build: (unknown: number) => { circuit: ForwardEventCircuit; dutyCycle: number },
  loadA: number,
  x: number[],
  values: number[],
  scaleA: number,
): number[] | undefined {
  const h = [1e-7 * Math.max(Math.abs(x[0] as number), 1e-3), 1e-6 * scaleA, 1e-6 * scaleA];
  const jacobian: number[] = [0, 0, 0, 0, 0, 0, 0, 0, 0];
  for (let j = 0; j < 3; j++) {
    const xj = x.slice();
    xj[j] = (xj[j] as number) + (h[j] as number);
    const rj = residuals(build, loadA, xj);
    if (rj === undefined) return undefined;
    for (let i = 0; i < 3; i++) {
      jacobian[3 * i + j] = ((rj.values[i] as number) - (values[i] as number)) / (h[j] as number);
    }
  }
  return jacobian;
}

function residuals(
  build: (unknown: number) => { circuit: ForwardEventCircuit; dutyCycle: number },
  loadA: number,
  x: number[],
): { values: number[]; period: ForwardEventPeriod } | undefined {
  const start = { inductorA: x[1] as number, magnetizingA: x[2] as number };
  const { circuit: c, dutyCycle } = build(x[0] as number);
  const period = forwardEventPeriod(c, dutyCycle, start);
  if (period === undefined) return undefined;
  return {
    values: [
      period.end.inductorA - start.inductorA,
      period.end.magnetizingA - start.magnetizingA,
      period.chargeAS / c.periodS - loadA,
    ],
    period,
  };
}

function maxAbs(values: number[]): number {
  let m = 0;
  for (const v of values) m = Math.max(m, Math.abs(v));
  return m;
}
