import { beforeAll, describe, expect, it } from 'vitest';
import { designConverter, doubleEndedNetlist, SpecSchema } from '../../../solvers/index.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { settledOutputV } from '../../helpers/settled-average.js';

// The push-pull's off-time at light load with its leakage in the event ring, the drains'
// differential mode (`pushPullRingLeakageH`: Llk/2 on the 2·C node): an invented 36–72 V
// push-pull (not any product), 12 V at 5.5 A, 220 kHz, 0.2 µH of leakage a half, the default
// 100 pF switches, at 36 V and 6.5 % load (the round-number twin of the seed-59 scan's push-pull
// 11). After the turn-off the leakages carry the current on through the rectifiers' hand-over,
// which lifts the drains' difference by some 9 V before the slow ring of the inductances with the
// drains; that ring reaches the far switch's body diode with less current and leaves it sooner,
// so the off drain stands higher as the other switch turns on and the turn-on ring steps less.
// Without the leakage in the ring the engine held the body diode 178 ns against ngspice's some
// 140 and read the drain's peak 88.65 V against ngspice's 80.98 V (−8.65 %, over the 5 %);
// with it 80.88 V.
const rectifier = { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01, voltageRatingV: 100 };
const SPEC = SpecSchema.parse({
  topology: 'push-pull',
  inputVoltageMinV: 36,
  inputVoltageNominalV: 48,
  inputVoltageMaxV: 72,
  outputs: [{ voltageV: 12, currentA: 5.5, capacitanceF: 100e-6, rectifier }],
  switchingFrequencyHz: 220e3,
  primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 216 },
  loadFractions: [0.065],
  magnetics: { mode: 'assume' },
  transformer: { leakageInductanceH: 0.2e-6 },
});
const CORNER = 'min-input/6.5pct-load';

const result = designConverter(SPEC);
if (!result.ok || result.value.topology !== 'push-pull') {
  throw new Error('invented scenario infeasible or not a push-pull');
}
const design = result.value;
let run: Promise<NgspiceRun>;

beforeAll(() => {
  run = runNgspice(doubleEndedNetlist(SPEC, design, { cornerLabel: CORNER }), {
    timeoutMs: 240_000,
  });
  run.catch(() => undefined);
});

describe('the push-pull off-time with its leakage against ngspice', () => {
  it('36 V, 0.2 µH, 6.5 % load: output, and the switch peaks after the off-time', async () => {
    const corner = design.corners.find((k) => k.label === CORNER);
    if (corner === undefined) throw new Error(`no corner ${CORNER}`);
    // The engine's own claim: an unflagged corner, the off drain's turn-on ring above 2·Vin.
    expect(corner.modelFallback).toBeUndefined();
    const switchPeak = corner.switches[0];
    expect(switchPeak?.voltagePeakV ?? NaN).toBeGreaterThan(2 * 36);
    const m = (await run).measures;
    // ref: ngspice (Debian package), the design's own deck simulated as a switched circuit;
    // the targets: 2 % on the output, 5 % on switch peak current and voltage
    expectClose(settledOutputV(m, 1), corner.outputs[0]?.voltageV ?? NaN, { rel: 0.02 });
    expectSwitchPeaksClose(m, switchPeak);
  }, 300_000);
});
