import { beforeAll, describe, expect, it } from 'vitest';
import {
  designConverter,
  doubleEndedNetlist,
  SpecSchema,
  type DoubleEndedDesign,
  type Spec,
} from '../../../solvers/index.js';
import { leakyLowInputBridgeSpec } from '../../helpers/double-ended-specs.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { settledOutputV } from '../../helpers/settled-average.js';

/*
 * The bridges' off switch over the leakage's turn-off decay (issue 3; DEVELOPERS.md, the audit of
 * 2026-12-05, second round, item (4)): the leakage carries the turn-off current on through the
 * opposite switches' body diodes, so the switch just turned off blocks the input plus a body
 * diode's drop. The engine drew that stretch at the idle level and took Vin as the peak: 18.0 V
 * against ngspice's 18.92 V (+5.11 %) on the audit's full bridge at 18 V and full load. Now
 * Vin + the spec's `bodyDiodeForwardVoltageV` (0.8 V by default; the deck's diode drops some
 * 0.92 V at 10 A).
 */

const LABEL = 'min-input/100pct-load';

// The audit's full bridge (`ngspice-scan.ts --topologies forward-reset-winding,two-switch-forward,
// active-clamp-forward,flyback,half-bridge,full-bridge --count 24 --seed 43 --input low`, spec
// 11, in round numbers; invented): 18–36 V, 12 V 6.5 A, 199.3 kHz, 1 µH of leakage, the default
// 100 pF switches of 30 mΩ, the transformer assumed. At 18 V and full load D is about 0.39, where
// the decay (some 0.5 µs) just fills the off-time. (At 200 kHz the engine finds 6.5 A past what
// the 18 V corner can deliver: the frequency is kept as drawn.)
const SPEC: Spec = SpecSchema.parse({
  topology: 'full-bridge',
  inputVoltageMinV: 18,
  inputVoltageNominalV: 24,
  inputVoltageMaxV: 36,
  outputs: [
    {
      voltageV: 12,
      currentA: 6.5,
      capacitanceF: 100e-6,
      rectifier: { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01, voltageRatingV: 100 },
    },
  ],
  switchingFrequencyHz: 199.3e3,
  primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 108 },
  loadFractions: [0.11, 1],
  transformer: { leakageInductanceH: 1e-6 },
  magnetics: { mode: 'assume' },
});

// The half bridge (its off switch sees the rail plus the other switch's body diode in the same
// way): `leakyLowInputBridgeSpec` (36–72 V, 12 V 5.7 A, 227 kHz, 1 µH; invented) at 36 V and
// full load, where the decay just fills the off-time too.
const HALF_SPEC = leakyLowInputBridgeSpec('half-bridge');

function design(spec: Spec): DoubleEndedDesign {
  const result = designConverter(spec);
  if (!result.ok || result.value.topology !== spec.topology) {
    throw new Error(`invented scenario infeasible: ${JSON.stringify(result)}`);
  }
  return result.value as DoubleEndedDesign;
}

const DESIGN = design(SPEC);
const HALF_DESIGN = design(HALF_SPEC);
let run: Promise<NgspiceRun>;
let halfRun: Promise<NgspiceRun>;

beforeAll(async () => {
  // Some 3–30 s of ngspice each.
  const options = {
    timeoutMs: 240_000,
    expect: ['switch_voltage_peak_v', 'switch_current_peak_a'],
  };
  run = runNgspice(doubleEndedNetlist(SPEC, DESIGN, { cornerLabel: LABEL }), options);
  halfRun = runNgspice(doubleEndedNetlist(HALF_SPEC, HALF_DESIGN, { cornerLabel: LABEL }), options);
  await Promise.allSettled([run, halfRun]);
}, 300_000);

describe('the full bridge’s off switch over the leakage decay', () => {
  it('ngspice agrees with the engine on the audit’s full bridge at 18 V and full load: switch voltage peak (Vin + a body diode’s drop), switch current peak, output voltage', async () => {
    const corner = DESIGN.corners.find((k) => k.label === LABEL);
    if (corner === undefined) throw new Error(`no corner ${LABEL}`);
    const m = (await run).measures;
    // ref: ngspice (Debian package), the same design simulated as a switched circuit; the
    // issue's agreement targets are 2 % on output voltage and 5 % on switch peaks. Before the
    // change the voltage peak was +5.17 % (18.0 V against 18.93 V); now +0.70 % (18.8 V).
    expectSwitchPeaksClose(m, corner.switches[0]);
    expectClose(settledOutputV(m, 1), corner.outputs[0]?.voltageV ?? NaN, { rel: 0.02 });
    // A bridge switch whose partner's body diode conducts blocks the rail plus that diode's
    // drop (common practice); the engine takes the spec's 0.8 V.
    expect(corner.switches[0]?.voltagePeakV).toBeCloseTo(
      corner.inputVoltageV + SPEC.primarySwitch.bodyDiodeForwardVoltageV,
      6,
    );
  });

  it('ngspice agrees with the engine on the half bridge at 36 V and full load: switch voltage peak within 1 % (Vin + a body diode’s drop)', async () => {
    const corner = HALF_DESIGN.corners.find((k) => k.label === LABEL);
    if (corner === undefined) throw new Error(`no corner ${LABEL}`);
    const m = (await halfRun).measures;
    // ref: ngspice (Debian package), as above. The target is 5 %; the drop is 2.2 % of
    // 36 V, so this holds the peak to 1 % to see it: before the change +2.28 % (36.0 V against
    // 36.82 V), now +0.06 % (36.8 V).
    expectSwitchPeaksClose(m, corner.switches[0]);
    expectClose(m.switch_voltage_peak_v ?? NaN, corner.switches[0]?.voltagePeakV ?? NaN, {
      rel: 0.01,
    });
  });
});
