import { beforeAll, describe, expect, it } from 'vitest';
import {
  designConverter,
  SpecSchema,
  type DoubleEndedDesign,
  type Spec,
} from '../../../solvers/index.js';
import { LIGHT_LOAD_MIN_ON_TIME_S } from '../../../solvers/topologies/light-load-min-on-time.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import { heldExcessCurrents, heldFirstOutputRuns } from '../../helpers/double-ended-held-runs.js';
import type { NgspiceRun } from '../../helpers/ngspice.js';
import { quadraticRoot } from '../../helpers/quadratic-root.js';

/*
 * The double-ended light-load corners where no duty cycle holds the output (DEVELOPERS.md,
 * "Light load with several outputs: the event model", the shortest on-time): the half settled
 * at the lowest stage duty already delivers more than the load, each turn-on's drain-capacitance
 * energy ringing on into the output, so the engine solves the corner at the shortest on-time
 * (100 ns, `LIGHT_LOAD_MIN_ON_TIME_S`) with the regulated output's voltage as the unknown
 * (`floorEventState`). The deck runs open loop at the engine's duty cycle, so ngspice's settled
 * output at that duty cycle must be the engine's risen one. Invented scenarios drawn by
 * `test/bench/model-fallback-scan.ts --seed 11 --count 150 --outputs 1` (2026-12-04): 200–400 V
 * full bridges with one 12 V output, the default leakage (0.01·Lm), transformer designed, at
 * 400 V. As in `double-ended-light-load-netlist.test.ts` the output is held at three trial
 * voltages about the engine's (it settles over thousands of periods otherwise) and the settled
 * output is the root of ngspice's mean inductor current less the load each voltage draws, the
 * load a resistor of the engine's output over its current. Before (main's engine of
 * 2026-12-04: the old light-load model kept, flagged `no-regulated-half`, 12 V claimed at D =
 * 0.0705 and 0.0802), ngspice at the old duty cycles delivered more than the load up to 16.3 V
 * on spec 80 (no settled output within the probe's steps, +36 % and more) and settled at 16.6 V
 * on spec 2 (+38 %, extrapolated) (`test/bench/light-load-probe.ts --spec-file`).
 */

const TRIAL_RATIOS = [0.96, 1, 1.04] as const;
const rectifier = { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01, voltageRatingV: 200 };

interface Case {
  name: string;
  spec: Spec;
  design: DoubleEndedDesign;
  label: string;
  /**
   * Whether the switch current turns positive in its on-time: where the 100 ns pulse leaves the
   * primary current negative throughout (the magnetizing current's), the engine's peak is 0 and
   * ngspice's the least negative value, so only the voltage peak is compared.
   */
  isForward: boolean;
}

/** A scan's one-output full bridge: its output current, frequency and light load. */
function floorCase(
  name: string,
  currentA: number,
  frequencyHz: number,
  load: number,
  label: string,
  leakage: 'default' | 'none' = 'default',
): Case {
  const spec = SpecSchema.parse({
    topology: 'full-bridge',
    inputVoltageMinV: 200,
    inputVoltageNominalV: 300,
    inputVoltageMaxV: 400,
    outputs: [{ voltageV: 12, currentA, capacitanceF: 100e-6, rectifier }],
    switchingFrequencyHz: frequencyHz,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 1200 },
    loadFractions: [load, 1],
    magnetics: { mode: 'design' },
    ...(leakage === 'none' ? { transformer: { leakageInductanceH: 0 } } : {}),
  });
  const result = designConverter(spec);
  if (!result.ok || result.value.topology !== 'full-bridge') {
    throw new Error(`invented scenario infeasible: ${JSON.stringify(result)}`);
  }
  return { name, spec, design: result.value, label, isForward: leakage === 'default' };
}

const CASES: Case[] = [
  floorCase(
    'full bridge, 400 V, 2.1 % load, 133.5 kHz (scan spec 80)',
    5.151157061569393,
    133511.76917552948,
    0.0211,
    'max-input/2.1pct-load',
  ),
  floorCase(
    'full bridge, 400 V, 2.6 % load, 250.3 kHz (scan spec 2)',
    9.690473951399326,
    250295.71652412415,
    0.0259,
    'max-input/2.6pct-load',
  ),
  // No leakage: the on-time ends with the primary current still negative, so the winding sits a
  // hair past the drive voltage as the switches open and the body diodes clamp it at once
  // (`simulateRing`'s clamp start). Before that start the ring swung 3.5 V past the clamp level:
  // the switch peak 423.3 V against ngspice's 400.3 V, the output 25.38 V where ngspice (its load
  // at 25.38 V) settled at 23.33 V (−8.1 %).
  floorCase(
    'full bridge, 400 V, 2 % load, 297.8 kHz, no leakage (scan seed 7, spec 14)',
    6.526769082061946,
    297820.2512860298,
    0.0204,
    'max-input/2pct-load',
    'none',
  ),
];

let runs = new Map<Case, Promise<NgspiceRun[]>>();

beforeAll(async () => {
  runs = await heldFirstOutputRuns(CASES, TRIAL_RATIOS);
}, 900_000);

describe('doubleEndedNetlist at the shortest on-time (no duty cycle holds the output)', () => {
  for (const c of CASES) {
    it(`ngspice settles where the engine's output rises on the ${c.name}`, async () => {
      const corner = c.design.corners.find((k) => k.label === c.label);
      if (corner === undefined) throw new Error(`no corner ${c.label}`);
      const output = corner.outputs[0];
      if (output === undefined) throw new Error('no output');
      const targetV = c.spec.outputs[0]?.voltageV ?? NaN;
      // The corner is solved at the floor, not on the old model (whose fallback it carried).
      expect(corner.modelFallback).toBeUndefined();
      expect(corner.dutyCycle).toBeCloseTo(
        LIGHT_LOAD_MIN_ON_TIME_S * c.spec.switchingFrequencyHz,
        12,
      );
      expect(output.voltageV).toBeGreaterThan(1.1 * targetV);
      const trials = await (runs.get(c) as Promise<NgspiceRun[]>);
      const { heldV, excessA } = heldExcessCurrents(trials, TRIAL_RATIOS, output);
      // ref: ngspice (Debian package), the same design simulated as a switched circuit at the
      // engine's duty cycle with its output held: the settled output lies within the trials
      // (the current it delivers falls through the load's as the held voltage rises) and within
      // 2 % of the engine's risen output (the target)
      expect(excessA[0]).toBeGreaterThan(0);
      expect(excessA[2]).toBeLessThan(0);
      expectClose(quadraticRoot(heldV, excessA), output.voltageV, { rel: 0.02 });
      // and the switch peaks at the engine's output within 5 % (the target; 2026-12-05:
      // −0.6 % and −0.3 % on the current, 0.0 % on the voltage)
      const atEngine = trials[1]?.measures ?? {};
      if (c.isForward) expectSwitchPeaksClose(atEngine, corner.switches[0]);
      else {
        expect(corner.switches[0]?.currentPeakA).toBe(0);
        expect(atEngine.switch_current_peak_a).toBeLessThan(0);
        expectClose(
          atEngine.switch_voltage_peak_v ?? NaN,
          corner.switches[0]?.voltagePeakV ?? NaN,
          {
            rel: 0.05,
          },
        );
      }
    });
  }
});
