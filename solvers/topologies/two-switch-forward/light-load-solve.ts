import { broydenUpdateThree, solveThreeByThree } from '../../root-finding/three-unknowns.js';
import { broydenUpdate, solveLinear } from '../../root-finding/linear-unknowns.js';
import {
  forwardEventPeriod,
  type ForwardEventCircuit,
  type ForwardEventPeriod,
  type ForwardEventStart,
} from './light-load-period.js';

/** A periodic light-load period: the unknown solved (D or Vo), its start and its events. */
export interface ForwardEventSolution {
  /** The duty cycle, or the first output's voltage (V) where the duty cycle is given. */
  unknown: number;
  /** The other outputs' voltages, V (cross-regulated: solved, not held). */
  otherOutputsV: number[];
  start: ForwardEventStart;
  period: ForwardEventPeriod;
  /** Newton steps taken. */
  steps: number;
}

/** Makes the circuit and the duty cycle for the unknown and the other outputs' voltages. */
export type ForwardEventBuild = (
  unknown: number,
  otherOutputsV: readonly number[],
) => { circuit: ForwardEventCircuit; dutyCycle: number };

/** Newton steps before the solve gives up. */
const NEWTON_STEPS = 40;

/**
 * Returns the periodic steady state of {@link forwardEventPeriod} that delivers every output's
 * `loadsA` (A, referred as the period's currents are), or undefined where Newton's method does
 * not converge. Unknowns: the duty cycle D with the first output held, or its voltage at a given
 * D (`build` makes the circuit and D of either); each other output's voltage (cross-regulation);
 * each inductor current and the referred magnetizing current at the turn-on. Residuals: the
 * period's end state less its start (periodicity, solved directly rather than by stepping
 * periods: the lossless ring settles over many), and each output's mean IL less its load (charge
 * balance on each output capacitor: Erickson & Maksimović, 2nd ed. (from memory), §2.3). The
 * Jacobian is taken by forward differences, then carried by Broyden's updates (a fresh one where
 * a step fails); a step is halved until the residual falls. Unknowns in the order (u, IL1, i,
 * then V and IL of each other output); with one output the three-unknown algebra.
 */
export function solveForwardEventPeriod(
  build: ForwardEventBuild,
  loadsA: readonly number[],
  guess: { unknown: number; otherOutputsV: readonly number[]; start: ForwardEventStart },
  bounds: { lo: number; hi: number },
): ForwardEventSolution | undefined {
  let x = [guess.unknown, Math.max(0, guess.start.inductorsA[0] ?? 0), guess.start.magnetizingA];
  for (let k = 1; k < loadsA.length; k++) {
    x.push(guess.otherOutputsV[k - 1] ?? NaN, Math.max(0, guess.start.inductorsA[k] ?? 0));
  }
  const size = x.length;
  let scaleA = 0;
  for (const load of loadsA) scaleA = Math.max(scaleA, load);
  scaleA = Math.max(scaleA, 1e-9);
  const tolerance = 1e-9 * scaleA;
  let r = residuals(build, loadsA, x);
  if (r === undefined) return undefined;
  let jacobian: number[] | undefined;
  let isFresh = false;
  for (let step = 0; step < NEWTON_STEPS; step++) {
    const norm = maxAbs(r.values);
    if (norm <= tolerance) {
      return {
        unknown: x[0] as number,
        otherOutputsV: otherVoltages(x).slice(),
        start: startOf(x),
        period: r.period,
        steps: step,
      };
    }
    if (jacobian === undefined) {
      jacobian = finiteDifferenceJacobian(build, loadsA, x, r.values, scaleA);
      if (jacobian === undefined) return undefined;
      isFresh = true;
    }
    const dx =
      size === 3
        ? solveThreeByThree(
            jacobian,
            -(r.values[0] as number),
            -(r.values[1] as number),
            -(r.values[2] as number),
          )
        : solveLinear(
            jacobian,
            r.values.map((value) => -value),
          );
    let lambda = 1;
    let accepted = false;
    for (let halving = 0; dx !== undefined && halving < 12; halving++) {
      const trial = x.map((xi, j) => {
        const moved = xi + lambda * (dx[j] as number);
        if (j === 0) return Math.min(Math.max(moved, bounds.lo), bounds.hi);
        // The inductor currents (1, 4, 6, …) stay at or above zero, the voltages (3, 5, …) above.
        if (j === 2) return moved;
        return j === 1 || j % 2 === 0 ? Math.max(0, moved) : Math.max(moved, 1e-6 * Math.abs(xi));
      });
      const rt = residuals(build, loadsA, trial);
      if (rt !== undefined && maxAbs(rt.values) < norm) {
        // Broyden's update of the Jacobian along the step taken (Broyden, 1965; Press et al.,
        // Numerical Recipes, 3rd ed. (from memory), §9.7): one period run a step instead of
        // one per unknown.
        if (size === 3) {
          broydenUpdateThree(
            jacobian,
            (trial[0] as number) - (x[0] as number),
            (trial[1] as number) - (x[1] as number),
            (trial[2] as number) - (x[2] as number),
            (rt.values[0] as number) - (r.values[0] as number),
            (rt.values[1] as number) - (r.values[1] as number),
            (rt.values[2] as number) - (r.values[2] as number),
          );
        } else {
          broydenUpdate(
            jacobian,
            trial.map((ti, j) => ti - (x[j] as number)),
            rt.values.map((value, j) => value - (r as { values: number[] }).values[j]!),
          );
        }
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

/** No other outputs: one shared empty list (this runs for every period of a one-output solve). */
const NONE: readonly number[] = [];

/** The other outputs' voltages in x. */
function otherVoltages(x: readonly number[]): readonly number[] {
  if (x.length <= 3) return NONE;
  const v: number[] = [];
  for (let j = 3; j < x.length; j += 2) v.push(x[j] as number);
  return v;
}

/** The turn-on state in x. */
function startOf(x: readonly number[]): ForwardEventStart {
  const inductorsA = [x[1] as number];
  for (let j = 4; j < x.length; j += 2) inductorsA.push(x[j] as number);
  return { inductorsA, magnetizingA: x[2] as number };
}

/** The Jacobian of the residuals at x by forward differences, or undefined where a run fails. */
function finiteDifferenceJacobian(
  build: ForwardEventBuild,
  loadsA: readonly number[],
  x: number[],
  values: number[],
  scaleA: number,
): number[] | undefined {
  const size = x.length;
  const h = x.map((xj, j) =>
    j === 0 || (j >= 3 && j % 2 === 1) ? 1e-7 * Math.max(Math.abs(xj), 1e-3) : 1e-6 * scaleA,
  );
  const jacobian: number[] = new Array<number>(size * size).fill(0);
  for (let j = 0; j < size; j++) {
    const xj = x.slice();
    xj[j] = (xj[j] as number) + (h[j] as number);
    const rj = residuals(build, loadsA, xj);
    if (rj === undefined) return undefined;
    for (let i = 0; i < size; i++) {
      jacobian[size * i + j] =
        ((rj.values[i] as number) - (values[i] as number)) / (h[j] as number);
    }
  }
  return jacobian;
}

function residuals(
  build: ForwardEventBuild,
  loadsA: readonly number[],
  x: number[],
): { values: number[]; period: ForwardEventPeriod } | undefined {
  const start = startOf(x);
  const { circuit: c, dutyCycle } = build(x[0] as number, otherVoltages(x));
  const period = forwardEventPeriod(c, dutyCycle, start);
  if (period === undefined) return undefined;
  const values = [
    (period.end.inductorsA[0] as number) - (start.inductorsA[0] as number),
    period.end.magnetizingA - start.magnetizingA,
    (period.chargesAS[0] as number) / c.periodS - (loadsA[0] as number),
  ];
  for (let k = 1; k < loadsA.length; k++) {
    values.push(
      (period.end.inductorsA[k] as number) - (start.inductorsA[k] as number),
      (period.chargesAS[k] as number) / c.periodS - (loadsA[k] as number),
    );
  }
  return { values, period };
}

function maxAbs(values: number[]): number {
  let m = 0;
  for (const v of values) m = Math.max(m, Math.abs(v));
  return m;
}
