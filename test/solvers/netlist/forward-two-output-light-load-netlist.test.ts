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
import { expectClose } from '../../helpers/expect-close.js';
import { twoOutputHighInputSpec } from '../../helpers/forward-specs.js';
import { holdOutputs } from '../../helpers/held-output-deck.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';

// Issue 3: the two-switch and the reset-winding forward with two outputs at 2–10 % load and the
// highest input, where the ring of Lm with the drain capacitance returns the winding while the
// output inductors are low and the magnetizing current drains into the outputs (DEVELOPERS.md,
// "Light load: the event period", several outputs). Each output settles over thousands of
// periods there, so ngspice runs with both outputs held by sources at trial voltages (as
// forward-high-input-light-load-netlist.test.ts does for one): at the engine's two voltages and
// 1.5 % either side of each, one at a time. The settled outputs are where both mean inductor
// currents meet the loads those voltages draw, found from the five runs by one Newton step on
// the central differences (the first output is regulated in the design; in the deck, with its
// duty cycle fixed, both are free, so the comparison covers the duty cycle too).

const PERIODS = 200;
const AVERAGED_PERIODS = 40;
// 1.5 %: at 2 % above the engine's first output the reset winding's 5 % case stopped with
// "timestep too small" at the magnetizing branch (the fragile reset-winding deck,
// DEVELOPERS.md); at 1, 1.5 and 2.5 % it ran.
const STEP = 0.015;
/** Trial offsets of (V1, V2) relative to the engine's: centre, V1 ±, V2 ±. */
const TRIALS = [
  [0, 0],
  [-STEP, 0],
  [STEP, 0],
  [0, -STEP],
  [0, STEP],
] as const;

const CASES = [
  { topology: 'two-switch-forward', corner: 'max-input/2pct-load', isMixed: false },
  { topology: 'two-switch-forward', corner: 'max-input/5pct-load', isMixed: false },
  { topology: 'two-switch-forward', corner: 'max-input/10pct-load', isMixed: false },
  // Here no duty cycle holds 12 V (the 100 ns floor; the engine reports the output it reaches).
  { topology: 'forward-reset-winding', corner: 'max-input/2pct-load', isMixed: false },
  { topology: 'forward-reset-winding', corner: 'max-input/5pct-load', isMixed: false },
  { topology: 'forward-reset-winding', corner: 'max-input/10pct-load', isMixed: false },
  // The second output's inductor fixed at 2 mH: continuous beside the first's discontinuous one,
  // and its voltage well under 5 V (the duty cycle the discontinuous first output needs).
  { topology: 'two-switch-forward', corner: 'nominal-input/5pct-load', isMixed: true },
] as const;

/** The invented two-output scenario, or its variant with the second inductor fixed at 2 mH. */
function caseSpec(c: (typeof CASES)[number]): Spec {
  const spec = twoOutputHighInputSpec(c.topology, { loadFractions: [0.02, 0.05, 0.1, 1] });
  if (!c.isMixed) return spec;
  return SpecSchema.parse({
    ...spec,
    outputs: spec.outputs.map((o, k) => (k === 1 ? { ...o, inductanceH: 2e-3 } : o)),
  });
}

interface Case {
  design: ForwardDesign | ResetWindingForwardDesign;
  corner: ForwardCorner;
  runs: Promise<NgspiceRun>[];
}

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
    const key = `${c.topology}${c.isMixed ? ' mixed' : ''}`;
    let entry = designs.get(key);
    if (entry === undefined) {
      const spec = caseSpec(c);
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
    const runs = TRIALS.map((offsets) =>
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
            'delivered_1_a',
            'delivered_2_a',
            'switch_current_peak_a',
            'switch_voltage_peak_v',
            'magnetizing_current_end_a',
          ],
        },
      ),
    );
    cases.set(c, { design, corner, runs });
  }
  await Promise.allSettled([...cases.values()].flatMap((k) => k.runs));
}, 900_000);

describe('two-output forwards at 400 V and light load against ngspice with the outputs held', () => {
  for (const c of CASES) {
    it(`the ${c.topology}${c.isMixed ? ' (second inductor continuous)' : ''} at ${c.corner}: both settled outputs within 2 %, switch peaks within 5 %`, async () => {
      const { corner, runs } = cases.get(c) as Case;
      const engineV = corner.outputs.map((o) => o.voltageV);
      const loadsOhm = corner.outputs.map((o) => o.voltageV / o.currentA);
      const measures = (await Promise.all(runs)).map((r) => r.measures);
      // Each output's delivered current less the load its held voltage draws, per trial.
      const excess = measures.map((m, t) =>
        [0, 1].map(
          (k) =>
            (m[`delivered_${k + 1}_a`] ?? NaN) -
            ((engineV[k] ?? NaN) * (1 + (TRIALS[t]?.[k] ?? 0))) / (loadsOhm[k] ?? NaN),
        ),
      );
      const at = (t: number, k: number): number => excess[t]?.[k] ?? NaN;
      // Central differences: J[k][j] = ∂excess_k/∂V_j.
      const dv = [0, 1].map((j) => 2 * STEP * (engineV[j] ?? NaN));
      const j11 = (at(2, 0) - at(1, 0)) / (dv[0] ?? NaN);
      const j12 = (at(4, 0) - at(3, 0)) / (dv[1] ?? NaN);
      const j21 = (at(2, 1) - at(1, 1)) / (dv[0] ?? NaN);
      const j22 = (at(4, 1) - at(3, 1)) / (dv[1] ?? NaN);
      const det = j11 * j22 - j12 * j21;
      const settled = [
        (engineV[0] ?? NaN) - (at(0, 0) * j22 - j12 * at(0, 1)) / det,
        (engineV[1] ?? NaN) - (j11 * at(0, 1) - j21 * at(0, 0)) / det,
      ];
      // Each output delivers more than its load 1.5 % below the engine's voltage and less 1.5 %
      // above it (the other held at the engine's).
      expect(at(1, 0)).toBeGreaterThan(0);
      expect(at(2, 0)).toBeLessThan(0);
      expect(at(3, 1)).toBeGreaterThan(0);
      expect(at(4, 1)).toBeLessThan(0);
      settled.forEach((v, k) => {
        // ref: ngspice (Debian package), the same design simulated as a switched circuit with
        // both outputs held; the agreement target is 2 % on output voltage
        expectClose(v, engineV[k] ?? NaN, { rel: 0.02 });
      });
      const atEngine = measures[0] ?? {};
      // ref: ngspice (Debian package), at the engine's output voltages; the target is
      // 5 % on the switch current and voltage peaks
      expectClose(atEngine.switch_current_peak_a ?? NaN, corner.switches[0]?.currentPeakA ?? NaN, {
        rel: 0.05,
      });
      expectClose(atEngine.switch_voltage_peak_v ?? NaN, corner.switches[0]?.voltagePeakV ?? NaN, {
        rel: 0.05,
      });
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
