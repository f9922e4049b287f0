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
 * Several outputs whose rectifier currents end at their own times at light load, against ngspice
 * (issue 3; DEVELOPERS.md, "Light load with several outputs: the event model", each output's own
 * stop). Where the outputs stop apart and their own events (`shootSeveralOutputs`) do not confirm
 * the equivalent output's half, the own-events half is now the state (before: the older light-load
 * model, flagged `outputs-stop-apart`).
 *
 * The first case, invented, drawn by `test/bench/model-fallback-scan.ts --seed 11 --count 150`
 * (spec 16): a half bridge from 36–72 V, 12 V 6.89 A and 5 V 1.49 A, 101.1 kHz, the default
 * leakage (in the ring), its transformer designed, 7.82 % load, highest input. The 12 V output
 * stops first; the equivalent set the 5 V output to zero some way before its own stop. Before,
 * the older model put the 5 V output at 2.16 V (D 0.1391); the own events at 3.463 V (D 0.1079),
 * and ngspice with both outputs held and one Newton step on them (`several-outputs-probe.ts`)
 * −0.05 % and −0.01 % from the engine's.
 *
 * The second case (spec 116): a full bridge from 18–36 V, 12 V 5.32 A, 5 V 1.42 A and 24 V
 * 1.19 A, 147.5 kHz, the default leakage, its transformer designed, 4.67 % load, highest input.
 * The equivalent's passes on the cross-regulated voltages alternated between two sets (its ring
 * ending just before or just after its last join), so it kept the older model (flagged
 * `not-converged`); now the own events take it: D 0.0722, ngspice (all held, one Newton step)
 * +0.10/+0.10/+1.31 % from the engine's.
 *
 * Each checked output's settled voltage: three ngspice runs with that output held at 0.97, 1 and
 * 1.03 of the engine's voltage, every other output at the engine's; the root of its delivered
 * current less its load (a quadratic through the three).
 */

// 50 periods, the last 20 averaged (80 before 2026-12-05, as `double-ended-held-runs.ts`): on
// solver 0.23.0's designs the three settled outputs moved by at most 0.00035 V (0.002 %, of the
// 2 % checked): 11.99267 → 11.99242, 3.46335 → 3.46327 and 19.70181 → 19.70216 V.
const PERIODS = 50;
const AVERAGED_PERIODS = 20;
const TRIAL_RATIOS = [0.97, 1.03] as const;
const rectifier = { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01, voltageRatingV: 200 };

const halfBridgeSpec = SpecSchema.parse({
  topology: 'half-bridge',
  inputVoltageMinV: 36,
  inputVoltageNominalV: 48,
  inputVoltageMaxV: 72,
  outputs: [
    { voltageV: 12, currentA: 6.893482863903046, capacitanceF: 100e-6, rectifier },
    { voltageV: 5, currentA: 1.4877684116363525, capacitanceF: 100e-6, rectifier },
  ],
  switchingFrequencyHz: 101068.61472129822,
  primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 216 },
  loadFractions: [0.0782, 1],
  magnetics: { mode: 'design' },
});

const fullBridgeSpec = SpecSchema.parse({
  topology: 'full-bridge',
  inputVoltageMinV: 18,
  inputVoltageNominalV: 24,
  inputVoltageMaxV: 36,
  outputs: [
    { voltageV: 12, currentA: 5.3194610476493835, capacitanceF: 100e-6, rectifier },
    { voltageV: 5, currentA: 1.4216002225875854, capacitanceF: 100e-6, rectifier },
    { voltageV: 24, currentA: 1.1906040459871292, capacitanceF: 100e-6, rectifier },
  ],
  switchingFrequencyHz: 147507.97390937805,
  primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 108 },
  loadFractions: [0.0467, 1],
  magnetics: { mode: 'design' },
});

/**
 * ngspice's settled voltage of each output in `checked` (indices), each from three held runs (the
 * run with every output at the engine's shared), with the engine's voltages and the excess
 * currents at the trials (for the bracket).
 */
async function settledOutputs(
  spec: ReturnType<typeof SpecSchema.parse>,
  label: string,
  checked: readonly number[],
): Promise<{ engineV: number; settledV: number; excessA: number[] }[]> {
  const result = designConverter(spec);
  if (!result.ok) throw new Error(`invented scenario infeasible: ${JSON.stringify(result)}`);
  const design = result.value as DoubleEndedDesign;
  const corner = design.corners.find((c) => c.label === label);
  if (corner === undefined) throw new Error(`no corner ${label}`);
  // The event model took the corner (before: the older model, flagged).
  expect(corner.modelFallback).toBeUndefined();
  const engineV = corner.outputs.map((o) => o.voltageV);
  const periodS = 1 / spec.switchingFrequencyHz;
  const trials: { output: number; ratio: number }[] = [{ output: -1, ratio: 1 }];
  for (const k of checked) for (const ratio of TRIAL_RATIOS) trials.push({ output: k, ratio });
  const runs = await Promise.all(
    trials.map((t) =>
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
          engineV.map((v, k) => ({ output: k + 1, heldV: k === t.output ? v * t.ratio : v })),
          (PERIODS - AVERAGED_PERIODS) * periodS,
          PERIODS * periodS,
        ),
        { timeoutMs: 600_000, expect: engineV.map((_v, k) => `delivered_${k + 1}_a`) },
      ),
    ),
  );
  return checked.map((k) => {
    const v = engineV[k] as number;
    const loadOhm = v / (corner.outputs[k]?.currentA ?? NaN);
    const at = (i: number, heldV: number): number =>
      (runs[i]?.measures[`delivered_${k + 1}_a`] ?? NaN) - heldV / loadOhm;
    const first = trials.findIndex((t) => t.output === k);
    const heldV = [TRIAL_RATIOS[0] * v, v, TRIAL_RATIOS[1] * v];
    const excessA = [at(first, heldV[0] as number), at(0, v), at(first + 1, heldV[2] as number)];
    return { engineV: v, settledV: quadraticRoot(heldV, excessA), excessA };
  });
}

describe('doubleEndedNetlist where several outputs stop at their own times (own events)', () => {
  it('half bridge, two outputs: ngspice settles each output within 2 % of the engine', async () => {
    const outputs = await settledOutputs(halfBridgeSpec, 'max-input/7.8pct-load', [0, 1]);
    for (const { engineV, settledV, excessA } of outputs) {
      // ref: ngspice (Debian package), the same design simulated as a switched circuit with its
      // outputs held: each output's settled voltage lies within its trials and within 2 % of
      // the engine's (issue 3's target)
      expect(excessA[0]).toBeGreaterThan(0);
      expect(excessA[2]).toBeLessThan(0);
      expectClose(settledV, engineV, { rel: 0.02 });
    }
  }, 900_000);

  it('full bridge, three outputs, the passes that alternated: ngspice within 2 % on 24 V', async () => {
    const [output] = await settledOutputs(fullBridgeSpec, 'max-input/4.7pct-load', [2]);
    if (output === undefined) throw new Error('no output');
    // ref: ngspice (Debian package), as above: the 24 V output (the farthest of the three in the
    // probe) settles within its trials and within 2 % of the engine's
    expect(output.excessA[0]).toBeGreaterThan(0);
    expect(output.excessA[2]).toBeLessThan(0);
    expectClose(output.settledV, output.engineV, { rel: 0.02 });
  }, 900_000);
});
