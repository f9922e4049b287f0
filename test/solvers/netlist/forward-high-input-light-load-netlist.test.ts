import { beforeAll, describe, expect, it } from 'vitest';
import {
  designConverter,
  twoSwitchForwardNetlist,
  type ForwardCorner,
  type ForwardDesign,
  type ResetWindingForwardDesign,
  type Spec,
} from '../../../solvers/index.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import { forward400VComparisonSpec, forwardHighInputSpec } from '../../helpers/forward-specs.js';
import { holdFirstOutput } from '../../helpers/held-output-deck.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { quadraticRoot } from '../../helpers/quadratic-root.js';

// Issue 3: the two-switch and the reset-winding forward at 400 V and 5 or 10 % load, where the
// ring of Lm with the drain capacitance returns the winding while the output inductor is low and
// the magnetizing current drains into the output (DEVELOPERS.md, "Light load: the event
// period"). The output settles over thousands of periods there (100 µF against a high output
// resistance), so ngspice runs with the output held by a source at trial voltages (as
// test/bench/light-load-probe.ts does for the double-ended family) and the settled output is
// where its mean inductor current meets the load that voltage draws.

const PERIODS = 200;
const AVERAGED_PERIODS = 40;
const TRIAL_RATIOS = [0.98, 1, 1.02];

// Invented scenarios (not any product): the 400 V comparison's specs of
// two-switch-forward-netlist.test.ts, designed with loads of 5, 10 and 100 %.
const lightSpec = (
  topology: 'two-switch-forward' | 'forward-reset-winding',
  currentA: number,
): Spec => forward400VComparisonSpec(topology, currentA, { loadFractions: [0.05, 0.1, 1] });

// And the helpers' 200–400 V scenario (12 V 5 A, 200 kHz) at 2 % load, where the ring of Lm with
// the node outlasts the off-time: the two-switch forward starts its on-time with the magnetizing
// current above zero, and the reset-winding forward cannot hold 12 V at any duty cycle (the
// energy the node capacitance gives up at each turn-off exceeds the load's), so the engine
// reports the output it reaches at its shortest on-time, 100 ns.
const twoPercentSpec = (topology: 'two-switch-forward' | 'forward-reset-winding'): Spec =>
  forwardHighInputSpec(topology, { loadFractions: [0.02, 1] });

const CASES = [
  ...(
    [
      ['two-switch-forward', 3],
      ['forward-reset-winding', 4],
    ] as const
  ).flatMap(([topology, currentA]) =>
    ['max-input/5pct-load', 'max-input/10pct-load'].map((corner) => ({
      topology,
      key: `${topology} 250 kHz`,
      spec: () => lightSpec(topology, currentA),
      corner,
    })),
  ),
  ...(['two-switch-forward', 'forward-reset-winding'] as const).map((topology) => ({
    topology,
    key: `${topology} 200 kHz`,
    spec: () => twoPercentSpec(topology),
    corner: 'max-input/2pct-load',
  })),
];

interface Trial {
  heldV: number;
  run: Promise<NgspiceRun>;
}

interface Case {
  spec: Spec;
  design: ForwardDesign | ResetWindingForwardDesign;
  corner: ForwardCorner;
  trials: Trial[];
}

const cases = new Map<(typeof CASES)[number], Case>();

/** The deck with its output held at `heldV` (the capacitor a source, no load). */
function heldDeck(
  spec: Spec,
  design: ForwardDesign | ResetWindingForwardDesign,
  label: string,
  heldV: number,
): string {
  const periodS = 1 / spec.switchingFrequencyHz;
  return (
    holdFirstOutput(
      twoSwitchForwardNetlist(spec, design, {
        cornerLabel: label,
        periodsToSimulate: PERIODS,
        stepsPerPeriod: 2000,
      }),
      heldV,
      (PERIODS - AVERAGED_PERIODS) * periodS,
      PERIODS * periodS,
    )
      .replace(/^\.meas tran output_.*$/gm, '')
      // Saved from the start (the deck saves only its last windows).
      .replace(
        /^\.tran (\S+) (\S+) \S+ (\S+) uic$/m,
        (_line, step: string, stop: string, max: string) => `.tran ${step} ${stop} 0 ${max} uic`,
      )
  );
}

beforeAll(async () => {
  const designs = new Map<string, Extract<ReturnType<typeof designConverter>, { ok: true }>>();
  for (const c of CASES) {
    const { key } = c;
    const spec = c.spec();
    let result = designs.get(key);
    if (result === undefined) {
      const r = designConverter(spec);
      if (!r.ok) throw new Error(`invented scenario infeasible: ${JSON.stringify(r.issues)}`);
      result = r;
      designs.set(key, r);
    }
    const design = result.value;
    if (design.topology !== 'two-switch-forward' && design.topology !== 'forward-reset-winding') {
      throw new Error('not a forward design');
    }
    const corner = design.corners.find((k) => k.label === c.corner) as ForwardCorner | undefined;
    if (corner === undefined) throw new Error(`no corner ${c.corner}`);
    const outputV = corner.outputs[0]?.voltageV ?? NaN;
    const trials = TRIAL_RATIOS.map((ratio) => ({
      heldV: ratio * outputV,
      run: runNgspice(heldDeck(spec, design, c.corner, ratio * outputV), {
        timeoutMs: 240_000,
        expect: [
          'delivered_a',
          'switch_current_peak_a',
          'switch_voltage_peak_v',
          'magnetizing_current_end_a',
        ],
      }),
    }));
    cases.set(c, { spec, design, corner, trials });
  }
  await Promise.allSettled([...cases.values()].flatMap((k) => k.trials.map((t) => t.run)));
}, 600_000);

describe('forwards at 400 V and light load against ngspice with the output held', () => {
  for (const c of CASES) {
    it(`the ${c.topology} at ${c.corner}: settled output within 2 %, switch peaks within 5 %`, async () => {
      const { corner, trials } = cases.get(c) as Case;
      const outputV = corner.outputs[0]?.voltageV ?? NaN;
      const loadOhm = outputV / (corner.outputs[0]?.currentA ?? NaN);
      const runs = await Promise.all(trials.map((t) => t.run));
      const excessA = runs.map(
        (run, i) => (run.measures.delivered_a ?? NaN) - (trials[i]?.heldV ?? NaN) / loadOhm,
      );
      const settledV = quadraticRoot(
        trials.map((t) => t.heldV),
        excessA,
      );
      const atEngine = runs[1]?.measures ?? {};
      // ngspice delivers more than the load below the band and less above it: its settled
      // output is inside ±2 % of the engine's.
      expect(excessA[0]).toBeGreaterThan(0);
      expect(excessA[2]).toBeLessThan(0);
      // ref: ngspice (Debian package), the same design simulated as a switched circuit with the
      // output held; the agreement target is 2 % on output voltage
      expectClose(settledV, outputV, { rel: 0.02 });
      // ref: ngspice (Debian package), at the engine's output voltage; the target is 5 %
      // on the switch current and voltage peaks
      expectSwitchPeaksClose(atEngine, corner.switches[0]);
      // ref: ngspice (Debian package): the magnetizing current just before the next turn-on
      // (above zero where the ring outlasts the off-time, the two-switch case at 2 %), within 5 %
      // of its peak, the tolerance for peaks (the reset winding's at 5 and 10 % load sit
      // 0.7 mA, some 4 % of the peak, below the engine's; not traced)
      const { values } = corner.waveforms.magnetizingCurrentA;
      expectClose(atEngine.magnetizing_current_end_a ?? NaN, values[0] ?? NaN, {
        abs: 0.05 * corner.magnetizingCurrentPeakA,
      });
    });
  }
});
