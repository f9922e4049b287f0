import { doubleEndedNetlist, type DoubleEndedDesign, type Spec } from '../../solvers/index.js';
import { holdFirstOutput } from './held-output-deck.js';
import { runNgspice, type NgspiceRun } from './ngspice.js';

/** A double-ended design's light-load corner to be held in ngspice. */
export interface HeldCorner {
  spec: Spec;
  design: DoubleEndedDesign;
  /** The corner's label, e.g. 'max-input/2pct-load'. */
  label: string;
}

/**
 * Periods each held deck runs, and the last of them its delivered current is averaged over. 50
 * since 2026-12-05 (80 before; some 35 % less ngspice time): on solver 0.23.0's designs every
 * settled output of `double-ended-light-load-netlist.test.ts` and
 * `double-ended-light-load-floor-netlist.test.ts` moved by at most 0.00017 V (0.001 %, of the 2 %
 * checked), the switch current peak at the engine's output by at most 0.028 % and the voltage
 * peak by at most 0.094 % (of 5 %). Half the time step (1000 steps a period) was tried and
 * dropped: the long-leakage-ring full bridge's settled output moved 1.05 %, its current peak
 * 1.2 %.
 */
const PERIODS = 50;
const AVERAGED_PERIODS = 20;

/** The deck of `c` with its first output held at `heldV` (no load), the mean inductor current measured. */
function heldDeck(c: HeldCorner, heldV: number): string {
  const periodS = 1 / c.spec.switchingFrequencyHz;
  return holdFirstOutput(
    doubleEndedNetlist(c.spec, c.design, {
      cornerLabel: c.label,
      periodsToSimulate: PERIODS,
      stepsPerPeriod: 2000,
    }),
    heldV,
    (PERIODS - AVERAGED_PERIODS) * periodS,
    PERIODS * periodS,
  );
}

/**
 * Starts, for every corner, ngspice runs of its deck with the first output held at each of
 * `ratios` times the engine's output voltage there (delivered current and switch peaks
 * measured), and waits until every run has ended or failed. Each corner's runs, in the order of
 * `ratios`, are in the map (a failed run rejects its corner's promise, which its test awaits).
 */
export async function heldFirstOutputRuns<C extends HeldCorner>(
  corners: readonly C[],
  ratios: readonly number[],
): Promise<Map<C, Promise<NgspiceRun[]>>> {
  const runs = new Map<C, Promise<NgspiceRun[]>>();
  for (const c of corners) {
    const corner = c.design.corners.find((k) => k.label === c.label);
    const engineV = corner?.outputs[0]?.voltageV ?? NaN;
    runs.set(
      c,
      Promise.all(
        ratios.map((r) =>
          runNgspice(heldDeck(c, r * engineV), {
            timeoutMs: 240_000,
            expect: ['delivered_a', 'switch_current_peak_a', 'switch_voltage_peak_v'],
          }),
        ),
      ),
    );
  }
  await Promise.allSettled(runs.values());
  return runs;
}

/**
 * The held voltages of a corner's runs (`ratios` times the engine's output `voltageV`) and what
 * each run delivered beyond the load's current at that voltage (the load a resistor drawing
 * `currentA` at `voltageV`), A: the settled output is where it crosses zero.
 */
export function heldExcessCurrents(
  trials: readonly NgspiceRun[],
  ratios: readonly number[],
  output: { voltageV: number; currentA: number },
): { heldV: number[]; excessA: number[] } {
  const heldV = ratios.map((r) => r * output.voltageV);
  const loadOhm = output.voltageV / output.currentA;
  const excessA = trials.map((run, i) => (run.measures.delivered_a ?? NaN) - heldV[i]! / loadOhm);
  return { heldV, excessA };
}
