import { beforeAll, describe, expect, it } from 'vitest';
import {
  designConverter,
  doubleEndedNetlist,
  SpecSchema,
  type DoubleEndedDesign,
  type Spec,
  type SpecInput,
} from '../../../solvers/index.js';
import { expectClose } from '../../helpers/expect-close.js';
import { fullBridgeSpec, halfBridgeSpec, pushPullSpec } from '../../helpers/double-ended-specs.js';
import { holdOutputs, type HeldOutput } from '../../helpers/held-output-deck.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { quadraticRoot } from '../../helpers/quadratic-root.js';

/*
 * Two outputs at about 10 % load in the light-load event model, with the spec's default leakage
 * (0.01·Lm), against ngspice (issue 3; DEVELOPERS.md, "Light load with several outputs: the
 * event model"). Invented scenarios: the test helpers' half bridge (150 pF switches), full
 * bridge (bridge rectifiers, 100 pF) and push-pull (100 pF), each with a second output at the
 * first's voltage over 2.4 and a tenth of its current, the converter's own Lm (magnetics
 * assumed), nominal input. Both outputs are held (`holdOutputs`): each output's settled voltage
 * is the root of its delivered current less its load over three held voltages about the
 * engine's (a quadratic through the three), the other output held at the engine's voltage; the
 * switch peaks are read with both at the engine's. The decks' rectifier snubbers are 1 pF at
 * these corners (a shared fall), as `doubleEndedNetlist` chooses.
 * Before (main's engine of 2026-12-04 and its decks, 100 pF snubbers, outputs held as here):
 * half bridge −2.83 %, +0.09 % on the outputs and −8.1 % on the switch current; full bridge
 * −2.52 %, −0.06 % and −9.9 % (with the decks' windows instead of held outputs the lead found
 * −2.9 %/−4.2 % and −2.7 %/−7.1 %). After: +0.54 %, +0.24 %, +2.1 %; +1.17 %, +0.10 %, +8.4 %;
 * the push-pull +0.54 %, +0.14 %, +3.1 %; without leakage the full bridge −0.07 %, +0.02 %,
 * −0.4 %. With the leakage in the event ring of the bridges (2026-12-04, later; their decks'
 * leakage resistor 30·√(Llk/Coss) at these corners): half bridge −0.16 %, +0.19 %, −0.4 %;
 * full bridge −0.38 %, +0.00 %, −1.75 %.
 * And a scan's half bridge with three outputs at 4.6 % load that the event solve's third start
 * takes (`threeOutputScanCase`; each output held at three voltages as above, the others at the
 * engine's): −0.36 %, −0.00 %, +0.83 % on the outputs, +0.6 % and +2.3 % on the switch peaks
 * (2026-12-04).
 */

// 50 periods, the last 20 averaged (80 before 2026-12-05, as `double-ended-held-runs.ts`), but
// 80 for the three-output scan case (`Case.periods`). On solver 0.23.0's designs, 80 → 50: the
// two-output cases' settled outputs moved by at most 0.0118 V (the push-pull's 12 V with
// leakage, 12.0618 → 12.0736 V, 0.10 % of the 2 % checked; the others 0.0018 V or less), their
// switch peaks by at most 0.013 % (of 5 %); the three-output case's 24 V output (28.67 V at the
// engine) moved 0.051 V (28.9109 → 28.8598 V, 0.18 %), near a tenth of the 2 %, so it keeps 80.
const PERIODS = 50;
const AVERAGED_PERIODS = 20;
const TRIAL_RATIOS = [0.97, 1, 1.03] as const;
const ASSUMED = { mode: 'assume' } as const;

interface Case {
  name: string;
  spec: Spec;
  design: DoubleEndedDesign;
  label: string;
  /** The switch peaks compared (see the cases for why one is left out). */
  peaks: readonly ('current' | 'voltage')[];
  /** The switch voltage peak's tolerance where it is not 5 % (see the case). */
  voltageRel?: number;
  /** Periods its held decks run where not {@link PERIODS} (see there). */
  periods?: number;
}

function twoOutputCase(
  topology: 'full-bridge' | 'half-bridge' | 'push-pull',
  base: (overrides: Partial<Omit<SpecInput, 'topology'>>) => Spec,
  leakage: 'default' | 'none',
  peaks: Case['peaks'],
): Case {
  const plain = base({});
  const first = plain.outputs[0];
  if (first === undefined) throw new Error('no first output');
  const spec = base({
    magnetics: ASSUMED,
    loadFractions: [0.1, 1],
    outputs: [first, { ...first, voltageV: first.voltageV / 2.4, currentA: first.currentA / 10 }],
    ...(leakage === 'none'
      ? {
          transformer: {
            leakageInductanceH: 0,
            primaryResistanceOhm: plain.transformer.primaryResistanceOhm,
          },
        }
      : {}),
  });
  const result = designConverter(spec);
  if (!result.ok || result.value.topology !== topology) {
    throw new Error(`invented scenario infeasible: ${JSON.stringify(result)}`);
  }
  return {
    name:
      `${topology} with two outputs, ${spec.inputVoltageNominalV} V, 10 % load, ` +
      (leakage === 'none' ? 'no leakage' : 'default leakage'),
    spec,
    design: result.value,
    label: 'nominal-input/10pct-load',
    peaks,
  };
}

const CASES: Case[] = [
  twoOutputCase('half-bridge', halfBridgeSpec, 'default', ['current', 'voltage']),
  // With the default leakage (32 µH here) the leakage carries the primary current on into the
  // node after the switches open (its energy, ½·Llk·I², about the node capacitance's ½·C·Vd²):
  // before the event ring carried it, ngspice's switch current ran 8.4 % above the engine's
  // (DEVELOPERS.md, "Known gaps at light load", item (6)); now −1.8 %.
  twoOutputCase('full-bridge', fullBridgeSpec, 'default', ['current', 'voltage']),
  // The push-pull's leakage spike is held by its RCD clamp at Vin + Vc, in the engine and the
  // deck (before the clamp the deck's drains spiked to 151 V on this 24 V input). Within 8 %:
  // since the deck damps the push-pull's leakage at 10·Z (3·Z before; DEVELOPERS.md, "The
  // push-pull's turn-on ring") the circuit puts more into the clamp here than the engine books,
  // and the clamp, its resistor Vc²/P from the engine's P, settles above Vc: 83.1 V against the
  // engine's 78 V (+6.5 %; within 5 % at 3·Z). Outside issue 3's 5 % on the switch voltage: a
  // known gap (DEVELOPERS.md, push-pull known gaps), held here so that it cannot grow unseen.
  {
    ...twoOutputCase('push-pull', pushPullSpec, 'default', ['current', 'voltage']),
    voltageRel: 0.08,
  },
  twoOutputCase('full-bridge', fullBridgeSpec, 'none', ['current', 'voltage']),
  twoOutputCase('push-pull', pushPullSpec, 'none', ['current', 'voltage']),
  threeOutputScanCase(),
];

/**
 * The corner the event solve's third start takes (`solveEventHalfBracketed`: the duty bracketed
 * by the load with the half the circuit settles on at each trial, where Newton's steps from the
 * plain state's duty and from half of it swing without converging): spec 118 of
 * `model-fallback-scan.ts --seed 11 --count 150` (invented: an 18–36 V half bridge at 164 kHz,
 * outputs of 12, 5 and 24 V, no leakage, its transformer designed) at 18 V and 4.6 % load.
 * Before (engine of 2026-12-04, the old light-load model kept there, D = 0.4070) ngspice's
 * settled outputs were +18.6, +49.9 and +34.8 % from the engine's (one Newton step on held runs,
 * `several-outputs-probe.ts`); with the event half (D = 0.2846) +0.47, +0.08 and +1.97 % there.
 */
function threeOutputScanCase(): Case {
  const diode = {
    kind: 'diode',
    forwardVoltageV: 0.5,
    resistanceOhm: 0.01,
    voltageRatingV: 200,
    reverseRecoveryChargeC: 0,
  };
  const output = (voltageV: number, currentA: number) => ({
    voltageV,
    currentA,
    rectifier: diode,
    windingResistanceOhm: 0.005,
    capacitanceF: 1e-4,
    capacitorEsrOhm: 0.02,
  });
  const spec = SpecSchema.parse({
    topology: 'half-bridge',
    inputVoltageMinV: 18,
    inputVoltageNominalV: 24,
    inputVoltageMaxV: 36,
    outputs: [
      output(12, 7.343343675136566),
      output(5, 1.2625207901000977),
      output(24, 0.5036857575178146),
    ],
    loadFractions: [0.0459, 1],
    switchingFrequencyHz: 163577.86640059203,
    primarySwitch: {
      onResistanceOhm: 0.03,
      voltageRatingV: 108,
      outputCapacitanceF: 1e-10,
      riseTimeS: 2e-8,
      fallTimeS: 2e-8,
      gateChargeC: 2e-8,
      gateDriveVoltageV: 12,
    },
    transformer: { leakageInductanceH: 0, primaryResistanceOhm: 0.05 },
  });
  const result = designConverter(spec);
  if (!result.ok || result.value.topology !== 'half-bridge') {
    throw new Error(`invented scenario infeasible: ${JSON.stringify(result)}`);
  }
  return {
    name: 'half-bridge with three outputs, 18 V, 4.6 % load, designed transformer (scan spec 118)',
    spec,
    design: result.value,
    label: 'min-input/4.6pct-load',
    peaks: ['current', 'voltage'],
    periods: 80,
  };
}

/** The trials of one case: output k (0-based) at each ratio of its voltage, the other at its own. */
function trialHolds(engineV: readonly number[]): HeldOutput[][] {
  const holds: HeldOutput[][] = [];
  for (let k = 0; k < engineV.length; k++) {
    for (const r of TRIAL_RATIOS) {
      if (k > 0 && r === 1) continue; // the same run as output 0's middle trial
      holds.push(engineV.map((v, j) => ({ output: j + 1, heldV: j === k ? r * v : v })));
    }
  }
  return holds;
}

function heldDeck(c: Case, held: readonly HeldOutput[]): string {
  const periodS = 1 / c.spec.switchingFrequencyHz;
  const periods = c.periods ?? PERIODS;
  return holdOutputs(
    doubleEndedNetlist(c.spec, c.design, {
      cornerLabel: c.label,
      periodsToSimulate: periods,
      stepsPerPeriod: 2000,
    }),
    held,
    (periods - AVERAGED_PERIODS) * periodS,
    periods * periodS,
  );
}

const runs = new Map<Case, Promise<NgspiceRun[]>>();

function engineVoltages(c: Case): number[] {
  const corner = c.design.corners.find((k) => k.label === c.label);
  return corner?.outputs.map((o) => o.voltageV) ?? [];
}

beforeAll(async () => {
  for (const c of CASES) {
    runs.set(
      c,
      Promise.all(
        trialHolds(engineVoltages(c)).map((held) =>
          runNgspice(heldDeck(c, held), {
            timeoutMs: 300_000,
            expect: [
              ...engineVoltages(c).map((_v, k) => `delivered_${k + 1}_a`),
              'switch_current_peak_a',
              'switch_voltage_peak_v',
            ],
          }),
        ),
      ),
    );
  }
  await Promise.allSettled(runs.values());
}, 1_200_000);

describe('doubleEndedNetlist at light load with several outputs (event model)', () => {
  for (const c of CASES) {
    it(`ngspice agrees with the engine on the ${c.name}: every output and switch peaks`, async () => {
      const corner = c.design.corners.find((k) => k.label === c.label);
      if (corner === undefined) throw new Error(`no corner ${c.label}`);
      const engineV = engineVoltages(c);
      const trials = await (runs.get(c) as Promise<NgspiceRun[]>);
      // Runs by output: output 0's three, then each other output's two around the shared middle one.
      const middle = trials[1] as NgspiceRun;
      const byOutput = engineV.map((_v, k) =>
        k === 0 ? [trials[0], middle, trials[2]] : [trials[1 + 2 * k], middle, trials[2 + 2 * k]],
      ) as NgspiceRun[][];
      // Each case is a corner the event model takes (else it would check the older model).
      expect(corner.modelFallback).toBeUndefined();
      for (let k = 0; k < engineV.length; k++) {
        const output = corner.outputs[k];
        if (output === undefined) throw new Error(`no output ${k + 1}`);
        const heldV = TRIAL_RATIOS.map((r) => r * (engineV[k] as number));
        const loadOhm = output.voltageV / output.currentA;
        const excessA = (byOutput[k] as NgspiceRun[]).map(
          (run, i) =>
            (run.measures[`delivered_${k + 1}_a`] ?? NaN) - (heldV[i] as number) / loadOhm,
        );
        // ref: ngspice (Debian package), the same design simulated as a switched circuit with
        // its outputs held: each settled output lies within its trials and within 2 % of the
        // engine's (the target), the switch peaks at the engine's outputs within 5 %
        expect(excessA[0]).toBeGreaterThan(0);
        expect(excessA[2]).toBeLessThan(0);
        expectClose(quadraticRoot(heldV, excessA), output.voltageV, { rel: 0.02 });
      }
      const atTarget = middle.measures;
      if (c.peaks.includes('current')) {
        expectClose(
          atTarget.switch_current_peak_a ?? NaN,
          corner.switches[0]?.currentPeakA ?? NaN,
          { rel: 0.05 },
        );
      }
      if (c.peaks.includes('voltage')) {
        expectClose(
          atTarget.switch_voltage_peak_v ?? NaN,
          corner.switches[0]?.voltagePeakV ?? NaN,
          { rel: c.voltageRel ?? 0.05 },
        );
      }
    });
  }
});
