import { beforeAll, describe, expect, it } from 'vitest';
import {
  designConverter,
  SpecSchema,
  type DoubleEndedDesign,
  type Spec,
} from '../../../solvers/index.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import { fullBridgeSpec, halfBridgeSpec, pushPullSpec } from '../../helpers/double-ended-specs.js';
import { telecomSpec } from '../../helpers/flyback-specs.js';
import { heldExcessCurrents, heldFirstOutputRuns } from '../../helpers/double-ended-held-runs.js';
import type { NgspiceRun } from '../../helpers/ngspice.js';
import { quadraticRoot } from '../../helpers/quadratic-root.js';

/*
 * The bridges at their highest input and 3–10 % load against ngspice, the light-load event
 * model's cases (issue 3; DEVELOPERS.md, "Light load: the event model"). Invented scenarios: the
 * test helpers' full bridge (400 V), half bridge (410 V) and push-pull (36 V) with loads x/100 %, the converter's
 * own Lm (magnetics assumed), no leakage; and the bridges with the spec's default leakage at
 * 5–10 % load (nominal or lowest input), whose leakage rings with the node after turn-off. Below some 5 % load the deck's output settles over
 * thousands of periods, so the output is held instead (as `test/bench/light-load-probe.ts`
 * does): a source at three trial voltages about the engine's, ngspice's mean inductor current
 * over the last 20 of 50 periods against the load each draws, and the settled output is the root
 * of the difference (a quadratic through the three). The decks' rectifier snubbers are 1 pF at
 * these corners (a shared fall), as `doubleEndedNetlist` chooses.
 * Before the event model (engine of 2026-12-03, the same decks): full bridge +12.0, +5.8, +9.6,
 * −5.6 % at 3, 5, 7, 10 % load; half bridge +7.9, +3.4, +5.4, −2.8 % (ngspice against the
 * engine's output voltage at the engine's duty cycle).
 */

const TRIAL_RATIOS = [0.97, 1, 1.03] as const;
const NO_LEAKAGE = { leakageInductanceH: 0, primaryResistanceOhm: 0.1 };
const ASSUMED = { mode: 'assume' } as const;

interface Case {
  name: string;
  spec: Spec;
  design: DoubleEndedDesign;
  label: string;
}

function lightCase(
  topology: 'full-bridge' | 'half-bridge' | 'push-pull',
  load: number,
  leakage: 'none' | 'default' = 'none',
  input: 'min' | 'nominal' | 'max' = 'max',
): Case {
  // The spec's default leakage is 0.01·Lm (32 µH on the full bridge here).
  const transformer =
    leakage === 'default'
      ? {}
      : {
          transformer: topology === 'full-bridge' ? NO_LEAKAGE : { leakageInductanceH: 0 },
        };
  const spec = (
    topology === 'full-bridge'
      ? fullBridgeSpec
      : topology === 'half-bridge'
        ? halfBridgeSpec
        : pushPullSpec
  )({ loadFractions: [load, 1], magnetics: ASSUMED, ...transformer });
  const result = designConverter(spec);
  if (!result.ok || result.value.topology !== topology) {
    throw new Error(`invented scenario infeasible: ${JSON.stringify(result)}`);
  }
  const percent = Math.round(load * 100);
  const inputV =
    input === 'min'
      ? spec.inputVoltageMinV
      : input === 'nominal'
        ? spec.inputVoltageNominalV
        : spec.inputVoltageMaxV;
  return {
    name:
      `${topology}, ${inputV} V, ${percent} % load` +
      (leakage === 'default' ? ', default leakage' : ''),
    spec,
    design: result.value,
    label: `${input}-input/${percent}pct-load`,
  };
}

const CASES: Case[] = [
  ...[0.03, 0.05, 0.07, 0.1].map((load) => lightCase('full-bridge', load)),
  ...[0.03, 0.05, 0.07, 0.1].map((load) => lightCase('half-bridge', load)),
  // The push-pull at 36 V, whose ring turns many times a half: within 2 % before too (+1.3 % and
  // −0.7 %), kept as a check of the continued ring's many turns.
  ...[0.03, 0.05].map((load) => lightCase('push-pull', load)),
  // With the spec's default leakage (0.01·Lm) the leakage rings with the node after turn-off
  // (DEVELOPERS.md, "Known gaps at light load", item (6)). Before the leakage was in the event
  // ring (main's engine and decks, the leakage's resistor at 3·√(Llk/Coss)), ngspice against the
  // engine, output, then switch peak current: full bridge 360 V, 10 % +2.43 %, +9.36 %; 300 V,
  // 10 % +0.24 %, +0.33 %; half bridge 390 V, 10 % +2.27 %, +2.66 %; 5 % +1.75 %, +0.16 %.
  lightCase('full-bridge', 0.1, 'default', 'nominal'),
  lightCase('full-bridge', 0.1, 'default', 'min'),
  lightCase('half-bridge', 0.1, 'default', 'nominal'),
  lightCase('half-bridge', 0.05, 'default', 'nominal'),
  comparisonHalfBridgeCase(),
  longLeakageRingCase(),
];

/**
 * The corner the event solve's second start takes (`solveEventHalfFrom`: from half the plain
 * state's stage duty and currents): the design dump's comparison half bridge (the helpers'
 * invented 36–72 V telecom-style spec, its transformer designed, the default leakage) at 36 V and
 * 10 % load. Before (engine of 2026-12-04, the old light-load model kept there) ngspice's settled
 * output was 26.0 % above the engine's, at D = 0.3559 against 0.2360 now.
 */
function comparisonHalfBridgeCase(): Case {
  const spec = SpecSchema.parse({ ...telecomSpec(), topology: 'half-bridge' });
  const result = designConverter(spec);
  if (!result.ok || result.value.topology !== 'half-bridge') {
    throw new Error(`invented scenario infeasible: ${JSON.stringify(result)}`);
  }
  return {
    name: 'half-bridge, 36 V, 10 % load, designed transformer (the comparison spec)',
    spec,
    design: result.value,
    label: 'min-input/10pct-load',
  };
}

/**
 * The corner a longer allowance of ring stretches takes (`simulateLeakyRing`: four a turn of the
 * leakage's own ring over the off-time): spec 68 of `model-fallback-scan.ts --seed 11 --count 150
 * --outputs 1` (invented: an 18–36 V full bridge at 99.4 kHz, one 12 V output, the default
 * leakage, its transformer designed) at 36 V and 18.1 % load, where the leakage rings with the
 * node some 300 turns through the off-time and the fixed 400 stretches ran out, so the event solve
 * was taken as not converging. Before (engine of 2026-12-04, the old light-load model kept there,
 * D = 0.2009) ngspice's settled output was 1.0 % below the engine's; with the event half (D =
 * 0.2025) 0.14 % below.
 */
function longLeakageRingCase(): Case {
  const diode = {
    kind: 'diode',
    forwardVoltageV: 0.5,
    resistanceOhm: 0.01,
    voltageRatingV: 200,
    reverseRecoveryChargeC: 0,
  };
  const spec = SpecSchema.parse({
    topology: 'full-bridge',
    inputVoltageMinV: 18,
    inputVoltageNominalV: 24,
    inputVoltageMaxV: 36,
    outputs: [
      {
        voltageV: 12,
        currentA: 6.908972263336182,
        rectifier: diode,
        windingResistanceOhm: 0.005,
        capacitanceF: 1e-4,
        capacitorEsrOhm: 0.02,
      },
    ],
    loadFractions: [0.181, 1],
    switchingFrequencyHz: 99379.46557998657,
    primarySwitch: {
      onResistanceOhm: 0.03,
      voltageRatingV: 108,
      outputCapacitanceF: 1e-10,
      riseTimeS: 2e-8,
      fallTimeS: 2e-8,
      gateChargeC: 2e-8,
      gateDriveVoltageV: 12,
    },
    transformer: { leakageInductanceFraction: 0.01, primaryResistanceOhm: 0.05 },
  });
  const result = designConverter(spec);
  if (!result.ok || result.value.topology !== 'full-bridge') {
    throw new Error(`invented scenario infeasible: ${JSON.stringify(result)}`);
  }
  return {
    name: 'full-bridge, 36 V, 18 % load, designed transformer (scan spec 68)',
    spec,
    design: result.value,
    label: 'max-input/18.1pct-load',
  };
}

let runs = new Map<Case, Promise<NgspiceRun[]>>();

beforeAll(async () => {
  runs = await heldFirstOutputRuns(CASES, TRIAL_RATIOS);
}, 900_000);

describe('doubleEndedNetlist at light load (event model)', () => {
  for (const c of CASES) {
    it(`ngspice agrees with the engine on the ${c.name}: settled output and switch peaks`, async () => {
      const corner = c.design.corners.find((k) => k.label === c.label);
      if (corner === undefined) throw new Error(`no corner ${c.label}`);
      const output = corner.outputs[0];
      if (output === undefined) throw new Error('no output');
      // Each case is a corner the event model takes (else it would check the older model).
      expect(corner.modelFallback).toBeUndefined();
      const trials = await (runs.get(c) as Promise<NgspiceRun[]>);
      const { heldV, excessA } = heldExcessCurrents(trials, TRIAL_RATIOS, output);
      // ref: ngspice (Debian package), the same design simulated as a switched circuit with its
      // output held: the settled output lies within the trials (the current it delivers falls
      // through the load's as the held voltage rises) and within 2 % of the engine's (the issue's
      // target), and the switch peaks at the engine's output within 5 %
      expect(excessA[0]).toBeGreaterThan(0);
      expect(excessA[2]).toBeLessThan(0);
      expectClose(quadraticRoot(heldV, excessA), output.voltageV, { rel: 0.02 });
      const atTarget = trials[1]?.measures ?? {};
      expectSwitchPeaksClose(atTarget, corner.switches[0]);
    });
  }
});
