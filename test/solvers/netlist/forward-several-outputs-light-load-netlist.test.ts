import { beforeAll, describe, expect, it } from 'vitest';
import {
  designConverter,
  SpecSchema,
  twoSwitchForwardNetlist,
  type ForwardCorner,
  type ForwardDesign,
  type ResetWindingForwardDesign,
  type Spec,
} from '../../../solvers/index.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import { threeOutputHighInputSpec, twoOutputHighInputSpec } from '../../helpers/forward-specs.js';
import {
  heldOutputExcessA,
  holdOutputs,
  settledHeldOutputs,
  towardSettledTrials,
} from '../../helpers/held-output-deck.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';

// Issue 3: the two-switch and the reset-winding forward with two and three outputs at 2–10 %
// load and the highest input, where the ring of Lm with the drain capacitance returns the
// winding while the output inductors are low and the magnetizing current drains into the outputs
// (DEVELOPERS.md, "Light load: the event period", several outputs). Each output settles over
// thousands of periods there, so ngspice runs with every output held by a source at trial
// voltages (as forward-high-input-light-load-netlist.test.ts does for one): at the engine's
// voltages first, then each output 1.5 % toward where its own current would meet its load, one
// at a time: N + 1 runs. The central differences' 2·N + 1 (1.5 % either side) took 44 % more
// time; on solver 0.17.0's designs the two ways agreed within 0.12 % on every settled output but
// one, the two-switch's 5 V output at 10 % load: 5.0353 V one-sided against 5.0072 V central
// (+0.78 % and +0.22 % against the engine), a difference of the excess's curvature over the
// step, inside the 2 % checked. The settled outputs are
// where every mean inductor current meets the load its voltage draws, found from those runs by
// one Newton step on the differences (`settledHeldOutputs`; the first output is regulated in the
// design; in the deck, with its duty cycle fixed, all are free, so the comparison covers the
// duty cycle too).

// 100 periods, the mean currents over the last 40 (200 before 2026-12-05, half the ngspice time):
// on solver 0.23.0's designs the settled outputs moved by at most 0.0298 V (the three-output
// reset winding's 24 V, 23.8480 → 23.8182 V, 0.13 % against the 2 % checked; every other output
// 0.0034 V or less), the switch peaks by at most 0.10 % (the reset winding's 702.1 → 702.8 V, of
// 5 %) and the magnetizing current at turn-on by at most 2.3e-5 A (about 1 % of its band, 5 % of
// the peak).
const PERIODS = 100;
const AVERAGED_PERIODS = 40;
// 1.5 %: at 2 % above the engine's first output the reset winding's 5 % case stopped with
// "timestep too small" at the magnetizing branch (the fragile reset-winding deck,
// DEVELOPERS.md); at 1, 1.5 and 2.5 % it ran.
const STEP = 0.015;

// The two-output 5 % corners (between the 2 and 10 % ones, on the same model) passed here
// through solver 0.16.0 and were dropped to keep the suite inside CI's time (10 ngspice runs).
const CASES = [
  { topology: 'two-switch-forward', corner: 'max-input/2pct-load', variant: 'two' },
  { topology: 'two-switch-forward', corner: 'max-input/10pct-load', variant: 'two' },
  // Here no duty cycle holds 12 V (the 100 ns floor; the engine reports the output it reaches).
  { topology: 'forward-reset-winding', corner: 'max-input/2pct-load', variant: 'two' },
  { topology: 'forward-reset-winding', corner: 'max-input/10pct-load', variant: 'two' },
  // The second output's inductor fixed at 2 mH: continuous beside the first's discontinuous one,
  // and its voltage well under 5 V (the duty cycle the discontinuous first output needs).
  { topology: 'two-switch-forward', corner: 'nominal-input/5pct-load', variant: 'mixed' },
  // Three outputs (the deck's abstol of 1 nA lets these run: without it every held three-output
  // deck tried stopped with "timestep too small"). The lead's scratch runs of 2026-12-04: the
  // two-switch at 2, 5 and 10 % within 1.4 %, the reset winding at 2, 5 and 10 % within 0.7 %,
  // switch peaks within 1.2 %; the two dearest of those six are here.
  { topology: 'two-switch-forward', corner: 'max-input/2pct-load', variant: 'three' },
  { topology: 'forward-reset-winding', corner: 'max-input/10pct-load', variant: 'three' },
] as const;

type Variant = (typeof CASES)[number]['variant'];

/** The invented scenario of `variant`: two outputs, the second's inductor fixed at 2 mH, or three. */
function caseSpec(topology: (typeof CASES)[number]['topology'], variant: Variant): Spec {
  const overrides = { loadFractions: [0.02, 0.05, 0.1, 1] };
  if (variant === 'three') return threeOutputHighInputSpec(topology, overrides);
  const spec = twoOutputHighInputSpec(topology, overrides);
  if (variant === 'two') return spec;
  return SpecSchema.parse({
    ...spec,
    outputs: spec.outputs.map((o, k) => (k === 1 ? { ...o, inductanceH: 2e-3 } : o)),
  });
}

interface Case {
  design: ForwardDesign | ResetWindingForwardDesign;
  corner: ForwardCorner;
  /** The trials' offsets (the first all zero) and their runs, in the same order. */
  held: Promise<{ trials: number[][]; runs: NgspiceRun[] }>;
}

/** Each output's mean inductor current in `run`, A. */
const deliveredOf = (run: NgspiceRun, count: number): number[] =>
  Array.from({ length: count }, (_v, k) => run.measures[`delivered_${k + 1}_a`] ?? NaN);

const cases = new Map<(typeof CASES)[number], Case>();

/** The deck with both outputs held (their capacitors sources, no loads). */
function heldDeck(
  spec: Spec,
  design: ForwardDesign | ResetWindingForwardDesign,
  label: string,
  heldV: readonly number[],
): string {
  const periodS = 1 / spec.switchingFrequencyHz;
  const fromS = (PERIODS - AVERAGED_PERIODS) * periodS;
  const toS = PERIODS * periodS;
  let deck = twoSwitchForwardNetlist(spec, design, {
    cornerLabel: label,
    periodsToSimulate: PERIODS,
    stepsPerPeriod: 2000,
  });
  deck = holdOutputs(
    deck,
    heldV.map((v, k) => ({ output: k + 1, heldV: v })),
    fromS,
    toS,
  );
  return (
    deck
      .replace(/^\.meas tran output_.*$/gm, '')
      // Saved from the start (the deck saves only its last windows).
      .replace(
        /^\.tran (\S+) (\S+) \S+ (\S+) uic$/m,
        (_line, step: string, stop: string, max: string) => `.tran ${step} ${stop} 0 ${max} uic`,
      )
  );
}

beforeAll(async () => {
  const designs = new Map<
    string,
    { spec: Spec; design: ForwardDesign | ResetWindingForwardDesign }
  >();
  for (const c of CASES) {
    const key = `${c.topology} ${c.variant}`;
    let entry = designs.get(key);
    if (entry === undefined) {
      const spec = caseSpec(c.topology, c.variant);
      const r = designConverter(spec);
      if (!r.ok) throw new Error(`invented scenario infeasible: ${JSON.stringify(r.issues)}`);
      const design = r.value;
      if (design.topology !== 'two-switch-forward' && design.topology !== 'forward-reset-winding') {
        throw new Error('not a forward design');
      }
      entry = { spec, design };
      designs.set(key, entry);
    }
    const { spec, design } = entry;
    const corner = design.corners.find((k) => k.label === c.corner) as ForwardCorner | undefined;
    if (corner === undefined) throw new Error(`no corner ${c.corner}`);
    const engineV = corner.outputs.map((o) => o.voltageV);
    const loadsOhm = corner.outputs.map((o) => o.voltageV / o.currentA);
    const runAt = (offsets: readonly number[]): Promise<NgspiceRun> =>
      runNgspice(
        heldDeck(
          spec,
          design,
          c.corner,
          engineV.map((v, k) => v * (1 + (offsets[k] ?? 0))),
        ),
        {
          timeoutMs: 240_000,
          expect: [
            ...engineV.map((_v, k) => `delivered_${k + 1}_a`),
            'switch_current_peak_a',
            'switch_voltage_peak_v',
            'magnetizing_current_end_a',
          ],
        },
      );
    const first = [engineV.map(() => 0)];
    const held = runAt(first[0] as number[]).then(async (atEngine) => {
      const [excessA] = heldOutputExcessA(engineV, loadsOhm, first, [
        deliveredOf(atEngine, engineV.length),
      ]);
      const toward = towardSettledTrials(excessA as number[], STEP);
      return {
        trials: [...first, ...toward],
        runs: [atEngine, ...(await Promise.all(toward.map(runAt)))],
      };
    });
    cases.set(c, { design, corner, held });
  }
  await Promise.allSettled([...cases.values()].map((k) => k.held));
}, 900_000);

const VARIANT_NAMES: Record<Variant, string> = {
  two: 'two outputs',
  mixed: 'two outputs, the second inductor continuous',
  three: 'three outputs',
};

describe('forwards with several outputs at 400 V and light load against ngspice with the outputs held', () => {
  for (const c of CASES) {
    it(`the ${c.topology} (${VARIANT_NAMES[c.variant]}) at ${c.corner}: every settled output within 2 %, switch peaks within 5 %`, async () => {
      const { corner, held } = cases.get(c) as Case;
      const engineV = corner.outputs.map((o) => o.voltageV);
      const loadsOhm = corner.outputs.map((o) => o.voltageV / o.currentA);
      const { trials, runs } = await held;
      const { settledV: settled, isBracketed } = settledHeldOutputs(
        engineV,
        loadsOhm,
        trials,
        runs.map((r) => deliveredOf(r, engineV.length)),
      );
      // Each output's current meets its load between the engine's voltage and 1.5 % toward it
      // (the others held at the engine's).
      expect(isBracketed).toEqual(engineV.map(() => true));
      settled.forEach((v, k) => {
        // ref: ngspice (Debian package), the same design simulated as a switched circuit with
        // every output held; the agreement target is 2 % on output voltage
        expectClose(v, engineV[k] ?? NaN, { rel: 0.02 });
      });
      const atEngine = runs[0]?.measures ?? {};
      // ref: ngspice (Debian package), at the engine's output voltages; the target is
      // 5 % on the switch current and voltage peaks
      expectSwitchPeaksClose(atEngine, corner.switches[0]);
      // ref: ngspice (Debian package): the magnetizing current just before the next turn-on,
      // within 5 % of its peak (the tolerance for peaks)
      const { values } = corner.waveforms.magnetizingCurrentA;
      expectClose(atEngine.magnetizing_current_end_a ?? NaN, values[0] ?? NaN, {
        abs: 0.05 * corner.magnetizingCurrentPeakA,
      });
      console.log(
        `${c.topology} ${c.corner}: settled ${settled.map((v) => v.toFixed(4)).join('/')} V against ${engineV.map((v) => v.toFixed(4)).join('/')} V; switch ${atEngine.switch_current_peak_a?.toFixed(5)}/${corner.switches[0]?.currentPeakA.toFixed(5)} A, ${atEngine.switch_voltage_peak_v?.toFixed(1)}/${corner.switches[0]?.voltagePeakV.toFixed(1)} V; magnetizing end ${atEngine.magnetizing_current_end_a?.toExponential(3)}/${values[0]?.toExponential(3)} A`,
      );
    });
  }
});
