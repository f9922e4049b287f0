import { beforeAll, describe, expect, it } from 'vitest';
import { designConverter, doubleEndedNetlist } from '../../../solvers/index.js';
import { LEAKY_RING_SLOW_FALLBACK } from '../../../solvers/topologies/double-ended/double-ended-state.js';
import { leakyHighInputPushPullSpec } from '../../helpers/double-ended-specs.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import { holdFirstOutput, holdPushPullClamp } from '../../helpers/held-output-deck.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';

/*
 * The push-pull's light-load half with each drain behind its leakage (`push-pull-leaky-half.ts`;
 * DEVELOPERS.md, "The push-pull's leaky light-load half") against ngspice. An invented 200–400 V
 * push-pull (not any product; `leakyHighInputPushPullSpec`, the lead's scan seed 23, spec 0,
 * the probe's `scan-push-pull-400`): 10 µH of leakage a half, 100 pF switches, 12 V at
 * 4.28 A, 188.6 kHz, at 400 V and 6.1 % load. Before, the lumped event solve did not converge
 * there and the older model answered (D = 0.145, flagged), where ngspice's held output settled
 * at 16.22 V (+35 %).
 *
 * The deck as the lead set it for this check: the clamp held by a source at the engine's clamp
 * level (600 V above the rail; the deck's RC clamp would float to where its resistor takes what
 * the circuit puts in, a second unknown), no resistor across the leakages (a real leakage has
 * none; the undamped deck converges, and 1000·√(Llk/C) across each moved the delivered current
 * by 0.2 % and the clamp's power by 0.7 %), 8000 steps a period (at 2000 the clamp's power read
 * 12 % low, at 16 000 within 0.2 % of 8000's), the output held by a source (three runs: 400 V at
 * the engine's 12 V; on the branch also 300 V at 12 V and 2 % above it), the mean inductor
 * current and clamp current over periods 40–60 (at 400 V the same to
 * 3e-6 over periods 80–120 and 200–240; at 300 V 0.5 % between periods 0–40 and 40–60).
 * Found at 400 V (2026-12-04): delivered 0.26504 A against the load's 0.26085 (+1.6 %; a run
 * at 12.24 V, not kept, 0.25810 against 0.26607: settled output 12.083 V, +0.69 %); clamp
 * 3.523 W against the engine's 3.604 W (engine +2.3 %); switch current peak
 * (the deck's window from three gate edges into the on-time) 0.7092 against 0.7125 A (−0.5 %;
 * 0.850 A, +20 %, while the engine drew the turn-on ring's current from its lumped ring), switch
 * voltage 1000.35 against 1000 V (the clamp), magnetizing peak 0.02427 against 0.02421 A. At
 * 300 V and 6.1 % load the lumped event model converged (D = 0.1213) and ngspice delivered
 * 0.1888 A there against the load's 0.2608 (−28 %; the leaky half at that duty cycle 0.1880 A):
 * the leaky half took that corner too on its branch (its leakage ring, 281 ns, a tenth of the
 * half-period), D = 0.1810: delivered 0.27149 A (+4.1 %), at 12.24 V 0.26008 against 0.26607,
 * settled 12.154 V (+1.28 %); switch peaks 0.5270 A and 818.4 V against 0.5531 A (+5.0 %) and
 * 826.3 V. But there it cost some 0.3 s a design against 7.5 ms, so the lead kept the lumped
 * state at such converged corners, flagged (`LEAKY_RING_SLOW_FALLBACK`), and dropped that case's
 * two ngspice runs; its numbers above are what the flag's text quotes.
 */

const SPEC = leakyHighInputPushPullSpec(0.061);
const CORNER = 'max-input/6.1pct-load';
const NOMINAL = 'nominal-input/6.1pct-load';
const PERIODS = 60;
const AVERAGED_PERIODS = 20;

const result = designConverter(SPEC);
if (!result.ok || result.value.topology !== 'push-pull') {
  throw new Error('invented scenario infeasible or not a push-pull');
}
const design = result.value;
const corner = design.corners.find((k) => k.label === CORNER);
const nominal = design.corners.find((k) => k.label === NOMINAL);
if (corner === undefined || nominal === undefined) throw new Error('no such corner');
const clampV = design.choices.clampVoltageV ?? NaN;

/** A corner's deck, output held at `heldV`, clamp held at the engine's level, undamped. */
function deck(label: string, heldV: number): string {
  const periodS = 1 / SPEC.switchingFrequencyHz;
  const fromS = (PERIODS - AVERAGED_PERIODS) * periodS;
  const toS = PERIODS * periodS;
  return holdPushPullClamp(
    holdFirstOutput(
      doubleEndedNetlist(SPEC, design, {
        cornerLabel: label,
        periodsToSimulate: PERIODS,
        stepsPerPeriod: 8000,
      }),
      heldV,
      fromS,
      toS,
    ),
    clampV,
    { clampMeanS: { fromS, toS } },
  );
}

let runs: Promise<NgspiceRun[]>;

beforeAll(() => {
  const engineV = corner.outputs[0]?.voltageV ?? NaN;
  const options = { timeoutMs: 240_000, expect: ['delivered_a', 'clamp_a'] };
  runs = Promise.all([runNgspice(deck(CORNER, engineV), options)]);
  runs.catch(() => undefined);
});

describe('the push-pull with leakage at light load against ngspice', () => {
  it('400 V, 10 µH, 6.1 % load: delivered current, clamp power and switch peaks', async () => {
    // The engine's own claims: the leaky half took the corner (no fallback), at a duty cycle
    // well below the older model's 0.145.
    expect(corner.modelFallback).toBeUndefined();
    expect(corner.dutyCycle).toBeLessThan(0.1);
    const output = corner.outputs[0];
    if (output === undefined) throw new Error('no output');
    const [atEngine] = await runs;
    // ref: ngspice (Debian package), the design's deck simulated as a switched circuit with its
    // output and its clamp held: the current delivered at the engine's output within 2 % of the
    // load (the target on the output; found +1.6 %, the settled output +0.69 %)
    expectClose(atEngine?.measures.delivered_a ?? NaN, output.currentA, { rel: 0.02 });
    // ref: ngspice (Debian package), the power the held clamp takes at the engine's output
    // against the engine's clamp loss, within 5 % (found 2.3 %)
    const clampW = (atEngine?.measures.clamp_a ?? NaN) * clampV;
    const engineClampW = corner.losses.find((l) => l.component === 'leakage-clamp')?.powerW;
    expectClose(clampW, engineClampW ?? NaN, { rel: 0.05 });
    // ref: ngspice (Debian package), the same run: the switch peaks within 5 % (the issue's
    // target)
    expectSwitchPeaksClose(atEngine?.measures ?? {}, corner.switches[0]);
  }, 300_000);

  it('300 V, 10 µH, 6.1 % load: the lumped state kept there is flagged', () => {
    // The engine's own claim (no simulation): the corner whose ring is slow against the half,
    // where ngspice delivered 28 % under the lumped model (above), carries the flag that says so.
    expect(nominal.modelFallback).toBe(LEAKY_RING_SLOW_FALLBACK);
    expect(design.summary.modelFallbacks.map((f) => f.corner)).toContain(NOMINAL);
  });
});
