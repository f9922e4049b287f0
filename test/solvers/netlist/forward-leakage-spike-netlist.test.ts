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
import { forwardHighInputSpec, leakyHighInputSpec } from '../../helpers/forward-specs.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { settledOutputV } from '../../helpers/settled-average.js';
import { valueAt } from '../../../solvers/waveform/value-at.js';

/*
 * The leakage's spike after the hard-reset forwards' turn-off swing (issue 3; DEVELOPERS.md, the
 * audit of 2026-12-05, second round, item (5)): at 400 V and full load with 10 µH of leakage the
 * leakage's current at turn-off carries the drain on past the swing to the clamp, the reset
 * winding's Vin + (Vin + Vf)·Np/Nr or the clamp diodes' Vin + Vf on each switch, where the
 * engine's peak was the magnetizing ring's, short of it: 747.3 V and 381.6 V here before.
 * And the spike feeds back into the steady state (the ring behind it): where the spike carries
 * the node to the clamp, Lm resets there (I0 = −Vr/Z) even where the ring alone stops short;
 * short of the clamp the ring returns with −√(I1² + (v1/Z)²).
 */

const LABEL = 'max-input/100pct-load';

function design(spec: Spec): ForwardDesign | ResetWindingForwardDesign {
  const result = designConverter(spec);
  if (
    !result.ok ||
    (result.value.topology !== 'two-switch-forward' &&
      result.value.topology !== 'forward-reset-winding')
  ) {
    throw new Error(`invented scenario infeasible: ${JSON.stringify(result)}`);
  }
  return result.value;
}

// The audit's reset winding (seed 53 spec 0: 12 V 7.95 A and 5 V 1.59 A, 208 kHz) and
// two-switch forward (spec 19: 12 V 4.36 A, 211.4 kHz) in round numbers, one output each.
const CASES = [
  { name: 'reset winding, 12 V 8 A', spec: leakyHighInputSpec('forward-reset-winding', 8) },
  { name: 'two-switch, 12 V 4.4 A', spec: leakyHighInputSpec('two-switch-forward', 4.4) },
].map((c) => ({ ...c, design: design(c.spec) }));

// Short of the clamp: the reset winding of forwardHighInputSpec (12 V 5 A, 200 kHz) with 10 µH.
const SHORT = {
  name: 'reset winding short of the clamp, 12 V 5 A, 10 µH',
  spec: forwardHighInputSpec('forward-reset-winding', {
    transformer: { leakageInductanceH: 10e-6 },
  }),
};
const SHORT_DESIGN = design(SHORT.spec);

const runs = new Map<string, Promise<NgspiceRun>>();

beforeAll(async () => {
  // Some 10–20 s of ngspice each.
  for (const c of CASES) {
    runs.set(
      c.name,
      runNgspice(twoSwitchForwardNetlist(c.spec, c.design, { cornerLabel: LABEL }), {
        timeoutMs: 240_000,
        expect: ['switch_voltage_peak_v', 'switch_current_peak_a'],
      }),
    );
  }
  runs.set(
    SHORT.name,
    runNgspice(twoSwitchForwardNetlist(SHORT.spec, SHORT_DESIGN, { cornerLabel: LABEL }), {
      timeoutMs: 240_000,
      expect: ['switch_voltage_peak_v', 'magnetizing_current_peak_a', 'magnetizing_current_end_a'],
    }),
  );
  await Promise.allSettled(runs.values());
}, 300_000);

function cornerOf(d: ForwardDesign | ResetWindingForwardDesign): ForwardCorner {
  const corner = d.corners.find((c) => c.label === LABEL);
  if (corner === undefined) throw new Error(`no corner ${LABEL}`);
  return corner;
}

describe('the forwards’ leakage spike at turn-off against ngspice', () => {
  for (const c of CASES) {
    it(`ngspice agrees with the engine on the ${c.name} from 400 V with 10 µH of leakage: the switch voltage at the clamp, output, switch current`, async () => {
      const corner = cornerOf(c.design);
      const m = (await (runs.get(c.name) as Promise<NgspiceRun>)).measures;
      // ref: ngspice (Debian package), the same design simulated as a switched circuit: issue
      // 3's 5 % on the switch peaks and 2 % on the output; the switch voltage within 1 %, where
      // the clamp holds the drain in both (ngspice 800.8 V and 400.2 V here; before, the engine
      // 747.3 V, −6.7 %, and 381.6 V, −4.7 %)
      expectClose(corner.switches[0]?.voltagePeakV ?? NaN, m.switch_voltage_peak_v ?? NaN, {
        rel: 0.01,
      });
      expectSwitchPeaksClose(m, corner.switches[0]);
      expectClose(settledOutputV(m, 1), corner.outputs[0]?.voltageV ?? NaN, { rel: 0.02 });
      // The engine's peak is the clamp's: Vin + (Vin + Vf)·Np/Nr, or Vin + Vf on each switch.
      const clampV =
        'resetTurnsRatio' in c.design.choices
          ? 400 + (400 + 0.8) / c.design.choices.resetTurnsRatio
          : 400 + 0.8;
      expectClose(corner.switches[0]?.voltagePeakV ?? NaN, clampV, { rel: 1e-9 });
      expect(corner.outputInductorModes[0]).toBe('ccm');
    });
  }

  it('ngspice agrees with the engine on the reset winding’s magnetizing peak and start, 12 V 8 A from 400 V: the spike carries the node to the clamp, so Lm resets there', async () => {
    const c = CASES[0] as (typeof CASES)[number];
    const corner = cornerOf(c.design);
    const m = (await (runs.get(c.name) as Promise<NgspiceRun>)).measures;
    // ref: ngspice (Debian package), the same design as a switched circuit: peak 0.0486 A and
    // start (the end of the last period) −0.0675 A. The ring alone stops short of the clamp and
    // swung symmetrically, ±0.0580 A (+19 % and −14 %) before the spike fed back; behind the
    // spike I1 = ΔI − Vr/Z and I0 = −Vr/Z (0.0490 and −0.0669 here).
    expectClose(corner.magnetizingCurrentPeakA, m.magnetizing_current_peak_a ?? NaN, {
      rel: 0.03,
    });
    expectClose(
      valueAt(corner.waveforms.magnetizingCurrentA, 0),
      m.magnetizing_current_end_a ?? NaN,
      { rel: 0.03 },
    );
  });

  it(`ngspice agrees with the engine on the ${SHORT.name}: the switch voltage and the magnetizing peak behind the spike`, async () => {
    const corner = cornerOf(SHORT_DESIGN);
    const m = (await (runs.get(SHORT.name) as Promise<NgspiceRun>)).measures;
    // ref: ngspice (Debian package): 718.8 V on the switch; the engine read 752.1 V (+4.6 %)
    // with the ring started from the magnetizing peak the spike left out (0.0355 A against
    // ngspice's 0.0306 A). Within 1 % now (720.6 V and 0.0305 A).
    expectClose(corner.switches[0]?.voltagePeakV ?? NaN, m.switch_voltage_peak_v ?? NaN, {
      rel: 0.01,
    });
    expectClose(corner.magnetizingCurrentPeakA, m.magnetizing_current_peak_a ?? NaN, {
      rel: 0.03,
    });
    expectClose(
      valueAt(corner.waveforms.magnetizingCurrentA, 0),
      m.magnetizing_current_end_a ?? NaN,
      { rel: 0.03 },
    );
  });
});
