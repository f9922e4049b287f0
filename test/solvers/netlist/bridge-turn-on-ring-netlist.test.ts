import { beforeAll, describe, it } from 'vitest';
import {
  designConverter,
  doubleEndedNetlist,
  SpecSchema,
  type DoubleEndedDesign,
  type Spec,
} from '../../../solvers/index.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { settledOutputV } from '../../helpers/settled-average.js';

/*
 * The bridges' leakage ringing with the node between the end of its turn-off decay and the next
 * turn-on (issue 3; DEVELOPERS.md, the audit of 2026-12-05, second round, the half bridge 22, and
 * `bridge-turn-on-ring.ts`): once the decay through the opposite switch's body diode has ended,
 * the leakage rings with the switches' capacitance about the freewheeling winding and its current
 * has grown towards the next half by the turn-on, so that half's commutation is shorter and its
 * drive longer. The engine took the leakage at rest there: ngspice read the audit's half bridge
 * (seed 53 spec 22) 2.03 % above it at 200 V and full load, and the case below 2.71 % above.
 */

const LABEL = 'min-input/100pct-load';

// Invented, after the audit's half bridge (`ngspice-scan.ts --topologies forward-reset-winding,
// two-switch-forward,active-clamp-forward,flyback,half-bridge,full-bridge --count 24 --seed 53
// --input high`, spec 22) in round numbers with one output: 200–400 V, 12 V 10 A, 290 kHz,
// 10 µH of leakage, the default 100 pF switches of 30 mΩ, the transformer assumed with its turns
// ratio fixed at 5.5, which puts the 200 V corner at D ≈ 0.40: the decay (some 0.21 µs) ends
// some 0.11 µs before the turn-on, between a quarter and a half of the leakage's ring with the
// node's 200 pF (a quarter is 70 ns), where the ring's current is some 0.26 A.
const SPEC: Spec = SpecSchema.parse({
  topology: 'half-bridge',
  inputVoltageMinV: 200,
  inputVoltageNominalV: 300,
  inputVoltageMaxV: 400,
  outputs: [
    {
      voltageV: 12,
      currentA: 10,
      capacitanceF: 100e-6,
      rectifier: { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01, voltageRatingV: 100 },
    },
  ],
  switchingFrequencyHz: 290e3,
  primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 1200 },
  loadFractions: [0.1, 1],
  transformer: { leakageInductanceH: 10e-6, turnsRatio: 5.5 },
  magnetics: { mode: 'assume' },
});

function design(spec: Spec): DoubleEndedDesign {
  const result = designConverter(spec);
  if (!result.ok || result.value.topology !== spec.topology) {
    throw new Error(`invented scenario infeasible: ${JSON.stringify(result)}`);
  }
  return result.value as DoubleEndedDesign;
}

const DESIGN = design(SPEC);
let run: Promise<NgspiceRun>;

beforeAll(async () => {
  // Some 5–15 s of ngspice.
  run = runNgspice(doubleEndedNetlist(SPEC, DESIGN, { cornerLabel: LABEL }), {
    timeoutMs: 240_000,
    expect: ['switch_voltage_peak_v', 'switch_current_peak_a'],
  });
  await Promise.allSettled([run]);
}, 300_000);

describe('the bridges’ leakage ring before the turn-on', () => {
  it('ngspice agrees with the engine on the half bridge at 200 V and full load: output within 1 %, switch peaks', async () => {
    const corner = DESIGN.corners.find((k) => k.label === LABEL);
    if (corner === undefined) throw new Error(`no corner ${LABEL}`);
    const m = (await run).measures;
    // ref: ngspice (Debian package), the same design simulated as a switched circuit; the
    // issue's targets are 2 % on the output and 5 % on the switch peaks. The output is held to
    // 1 % here to see the ring: without it the engine read +2.71 % (D 0.4107), with it −0.31 %
    // (D 0.4028); the switch current peak +2.26 % against −0.33 %.
    expectClose(settledOutputV(m, 1), corner.outputs[0]?.voltageV ?? NaN, { rel: 0.01 });
    expectSwitchPeaksClose(m, corner.switches[0]);
  });
});
