import { describe, expect, it } from 'vitest';
import {
  designConverter,
  doubleEndedNetlist,
  SpecSchema,
  type DoubleEndedDesign,
} from '../../../solvers/index.js';
import { expectClose } from '../../helpers/expect-close.js';
import { holdOutputs } from '../../helpers/held-output-deck.js';
import { runNgspice } from '../../helpers/ngspice.js';
import { quadraticRoot } from '../../helpers/quadratic-root.js';

/*
 * Two outputs that stop apart at light load, against ngspice (issue 3; DEVELOPERS.md, "Light load
 * with several outputs: the event model", fallbacks flagged). Invented scenario, drawn by
 * `test/bench/model-fallback-scan.ts` (seed 7, spec 55): a half bridge from 36–72 V, 12 V 7.40 A
 * and 5 V 1.22 A, 174.9 kHz, no leakage, its transformer designed, 3.3 % load, nominal input. The
 * 12 V output's current reaches zero before the equivalent's, the 5 V one still carries some
 * 28 % of its peak there; each output's own events (`shootSeveralOutputs`) put the duty cycle
 * and the voltages within 1 % of the equivalent's, so the event model takes the corner. Before
 * (the older shared fall, flagged): ngspice 1.9 % below the engine on the 12 V output and 18.4 %
 * above it on the 5 V one (DEVELOPERS.md). Three ngspice runs: the 12 V output held at the
 * engine's voltage, the 5 V output at 0.97, 1 and 1.03 of the engine's; its settled voltage is
 * the root of its delivered current less its load (a quadratic through the three). With both
 * outputs found jointly (five runs, a scratch script) ngspice read +0.33 % and +0.81 %.
 *
 * The second case has the default leakage, which the bridges' ring carries (`simulateLeakyRing`),
 * and since 2026-12-04 the own-events check does too (`ShotCircuit.ringLeakageH`): invented,
 * drawn by the same script (seed 7, spec 28), a half bridge from 36–72 V, 12 V 4.72 A and 5 V
 * 1.99 A, 84.2 kHz, its transformer designed, 2.02 % load, nominal input. The check put the duty
 * cycle within 0.1 % and the 5 V output within 0.3 % of the equivalent's. Before (the older
 * model, flagged) its deck delivered more than the load at every trial voltage of both outputs
 * (ngspice above that model by more than 3 %, a linear extrapolation some +11 % on the 12 V
 * output and +18 % on the 5 V one); after, ngspice +0.40 % and +0.96 % (each output's root with
 * the other held at the engine's, a scratch script). Three runs, as the first case.
 */

// 50 periods, the last 20 averaged (80 before 2026-12-05, as `double-ended-held-runs.ts`): on
// solver 0.23.0's designs the settled 5 V outputs moved by at most 0.00004 V (3.47919 → 3.47915
// and 3.41962 V unchanged, of the 2 % checked).
const PERIODS = 50;
const AVERAGED_PERIODS = 20;
const TRIAL_RATIOS = [0.97, 1, 1.03] as const;
const LABEL = 'nominal-input/3.3pct-load';
const rectifier = { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01, voltageRatingV: 200 };

const spec = SpecSchema.parse({
  topology: 'half-bridge',
  inputVoltageMinV: 36,
  inputVoltageNominalV: 48,
  inputVoltageMaxV: 72,
  outputs: [
    { voltageV: 12, currentA: 7.399027228355408, capacitanceF: 100e-6, rectifier },
    { voltageV: 5, currentA: 1.2201075553894043, capacitanceF: 100e-6, rectifier },
  ],
  switchingFrequencyHz: 174868.62152814865,
  primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 216 },
  loadFractions: [0.033, 1],
  magnetics: { mode: 'design' },
  transformer: { leakageInductanceH: 0 },
});

const LEAKY_LABEL = 'nominal-input/2pct-load';
const leakySpec = SpecSchema.parse({
  topology: 'half-bridge',
  inputVoltageMinV: 36,
  inputVoltageNominalV: 48,
  inputVoltageMaxV: 72,
  outputs: [
    { voltageV: 12, currentA: 4.7216957015916705, capacitanceF: 100e-6, rectifier },
    { voltageV: 5, currentA: 1.985804557800293, capacitanceF: 100e-6, rectifier },
  ],
  switchingFrequencyHz: 84158.616065979,
  primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 216 },
  loadFractions: [0.0202, 1],
  magnetics: { mode: 'design' },
});

async function settledSecondOutput(
  spec: ReturnType<typeof SpecSchema.parse>,
  label: string,
): Promise<{ engineV: number; heldV: number[]; excessA: number[] }> {
  const result = designConverter(spec);
  if (!result.ok || result.value.topology !== 'half-bridge') {
    throw new Error(`invented scenario infeasible: ${JSON.stringify(result)}`);
  }
  const design = result.value as DoubleEndedDesign;
  const corner = design.corners.find((c) => c.label === label);
  if (corner === undefined) throw new Error(`no corner ${label}`);
  // The event model took the corner (before: the older model, flagged).
  expect(corner.modelFallback).toBeUndefined();
  const [first, second] = corner.outputs;
  if (first === undefined || second === undefined) throw new Error('two outputs expected');
  const periodS = 1 / spec.switchingFrequencyHz;
  const heldV = TRIAL_RATIOS.map((r) => r * second.voltageV);
  const runs = await Promise.all(
    heldV.map((v) =>
      runNgspice(
        holdOutputs(
          doubleEndedNetlist(spec, design, {
            cornerLabel: label,
            periodsToSimulate: PERIODS,
            stepsPerPeriod: 2000,
            // The bridges' light-load decks resolve the leakage's ring by default (32 steps a
            // ring, since audit5); with these designed transformers' tens of nanohenries that is
            // some ten times the steps, and these checks passed both ways (2026-12-05: the
            // own-stops file 173 s → 19 s, the stop-apart file 62 s → 14 s), so they keep the
            // 2000 steps a period alone.
            leakageRingStepsMin: 0,
          }),
          [
            { output: 1, heldV: first.voltageV },
            { output: 2, heldV: v },
          ],
          (PERIODS - AVERAGED_PERIODS) * periodS,
          PERIODS * periodS,
        ),
        { timeoutMs: 300_000, expect: ['delivered_2_a'] },
      ),
    ),
  );
  const loadOhm = second.voltageV / second.currentA;
  const excessA = runs.map(
    (run, i) => (run.measures.delivered_2_a ?? NaN) - (heldV[i] as number) / loadOhm,
  );
  return { engineV: second.voltageV, heldV, excessA };
}

describe('doubleEndedNetlist where two outputs stop apart at light load (event model)', () => {
  it('ngspice settles the cross-regulated output within 2 % of the engine', async () => {
    const { engineV, heldV, excessA } = await settledSecondOutput(spec, LABEL);
    // ref: ngspice (Debian package), the same design simulated as a switched circuit with its
    // outputs held: the settled 5 V output lies within its trials and within 2 % of the
    // engine's (issue 3's target)
    expect(excessA[0]).toBeGreaterThan(0);
    expect(excessA[2]).toBeLessThan(0);
    expectClose(quadraticRoot(heldV, excessA), engineV, { rel: 0.02 });
  }, 900_000);

  it('with the leakage in the ring: ngspice settles the cross-regulated output within 2 %', async () => {
    const { engineV, heldV, excessA } = await settledSecondOutput(leakySpec, LEAKY_LABEL);
    // ref: ngspice (Debian package), as above: the settled 5 V output lies within its trials
    // and within 2 % of the engine's (issue 3's target)
    expect(excessA[0]).toBeGreaterThan(0);
    expect(excessA[2]).toBeLessThan(0);
    expectClose(quadraticRoot(heldV, excessA), engineV, { rel: 0.02 });
  }, 900_000);
});
