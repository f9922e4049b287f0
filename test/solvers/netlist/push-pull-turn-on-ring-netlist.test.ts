import { beforeAll, describe, expect, it } from 'vitest';
import { designConverter, doubleEndedNetlist, SpecSchema } from '../../../solvers/index.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { settledOutputV } from '../../helpers/settled-average.js';

// The push-pull's off drain ringing as the other switch turns on (pushPullTurnOnRing): an
// invented 200–400 V push-pull (not any product) with 10 µH of leakage a half and 100 pF
// switches, 12 V at 4.3 A, 190 kHz, the default clamp (600 V above the rail), at 200 V and full
// load. Both leakages ring with the off drain from the rail towards Vin + Vp; below the clamp
// it peaks near 3·Vin, and the ring's current, some 0.45 A, is larger than the switch's own
// 0.33 A. ngspice against the engine: output +0.21 %, switch current 0.707 against 0.708 A
// (−0.1 %), voltage 582.6 against 588.2 V (−1.0 %). D = 0.45 leaves 263 ns of dead time, short
// of the off drain's ring's decay, so the engine steps that half (pushPullShortDeadTime) with
// the deck's damping (LEAKAGE_DAMPING_RATIO); with the ring from the rail, lossless to its crest,
// it read 599.4 V (−2.8 %). Before the ring was modelled the engine gave 0.330 A and
// 399.7 V (about 2·Vin), and ngspice, its deck with 3·Z across each leakage and the current
// measured from 5 % of the on-time, 0.445 A (+35 %) and 540.7 V (+35 %), the output +0.14 %.
const rectifier = { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01, voltageRatingV: 100 };
const SPEC = SpecSchema.parse({
  topology: 'push-pull',
  inputVoltageMinV: 200,
  inputVoltageNominalV: 300,
  inputVoltageMaxV: 400,
  outputs: [{ voltageV: 12, currentA: 4.3, capacitanceF: 100e-6, rectifier }],
  switchingFrequencyHz: 190e3,
  primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 1200 },
  loadFractions: [1],
  magnetics: { mode: 'assume' },
  transformer: { leakageInductanceH: 10e-6 },
});
const CORNER = 'min-input/100pct-load';

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

describe('the push-pull turn-on ring against ngspice', () => {
  it('200 V, 10 µH, full load: output, and the switch peaks with the ring', async () => {
    const corner = design.corners.find((k) => k.label === CORNER);
    if (corner === undefined) throw new Error(`no corner ${CORNER}`);
    // The engine's own claim: the off drain above 2·Vin (the ring), below Vin + Vc.
    const switchPeak = corner.switches[0];
    expect(switchPeak?.voltagePeakV ?? NaN).toBeGreaterThan(2.5 * 200);
    expect(switchPeak?.voltagePeakV ?? NaN).toBeLessThan(200 + 600);
    const m = (await run).measures;
    // ref: ngspice (Debian package), the design's own deck simulated as a switched circuit;
    // the targets: 2 % on the output, 5 % on switch peak current and voltage
    const outputV = settledOutputV(m, 1);
    expectClose(outputV, corner.outputs[0]?.voltageV ?? NaN, { rel: 0.02 });
    expectSwitchPeaksClose(m, switchPeak);
  }, 300_000);
});
