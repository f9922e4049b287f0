import { beforeAll, describe, expect, it } from 'vitest';
import { designConverter, doubleEndedNetlist } from '../../../solvers/index.js';
import { expectClose } from '../../helpers/expect-close.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { scanDrawnSpec } from '../../helpers/scan-specs.js';
import { settledOutputV } from '../../helpers/settled-average.js';

// The push-pull's own turn-off crest where its dead time is short: `ngspice-scan.ts --topologies
// push-pull --seed 1`, spec 9, in round numbers (invented by the scan, not any product): 36–72 V,
// 1 µH of leakage a half, 100 pF switches, 12 V at 6.28 A and 5 V at 1.33 A, 178 kHz, 20.4 %
// load at 36 V (D = 0.432: 381 ns of dead time, 1.9 times the ring's 2·Q·√(Llk·C) = 200 ns, so
// the engine steps the half for its turn-on ring). The switch's highest voltage is the drain
// that opens, ringing on with its leakage's current as the winding collapses (some 19 ns after
// the gate's turn-off), not the turn-on ring: the turn-off spike stepped with the other drain
// behind its own leakage (`pushPullTurnOffSpike`) gives it, 117.5 V (the stepped half's own
// dead-time crest agrees within 0.01 V). The deck (ring resolved, 1 pF rectifier snubbers where
// the push-pull has its clamp, as the engine takes no rectifier capacitance): ngspice 116.4 V on
// the scan's spec, −0.9 %. Before the stepped spike the engine read 103.6 V there (the turn-on
// ring's crest; +5.75 % against the 30 pF deck of then, which slowed the winding's collapse to a
// 109.5 V crest), so with the old spike this test fails.
const spec = scanDrawnSpec(
  'push-pull',
  [36, 48, 72],
  [
    [12, 6.28],
    [5, 1.33],
  ],
  178e3,
  0.204,
  1e-6,
);
const result = designConverter(spec);
if (!result.ok || result.value.topology !== 'push-pull') {
  throw new Error('invented scenario infeasible or not a push-pull');
}
const design = result.value;
const LABEL = 'min-input/20.4pct-load';
let run: Promise<NgspiceRun> | undefined;

beforeAll(() => {
  const netlist = doubleEndedNetlist(spec, design, { cornerLabel: LABEL, leakageRingStepsMin: 32 });
  run = runNgspice(netlist, { timeoutMs: 280_000 });
  run.catch(() => undefined);
});

describe('the push-pull turn-off crest with a short dead time against ngspice', () => {
  it(`36 V, 1 µH, ${LABEL}: the outputs and the switch peaks at 32 steps a ring`, async () => {
    const corner = design.corners.find((c) => c.label === LABEL);
    if (corner === undefined) throw new Error(`no corner ${LABEL}`);
    // The dead time between 1/e and 5 % of the ring's decay (Q = 10): the stepped half runs.
    const deadS = (0.5 - corner.dutyCycle) / spec.switchingFrequencyHz;
    const tauS = 2 * 10 * Math.sqrt(1e-6 * spec.primarySwitch.outputCapacitanceF);
    expect(deadS).toBeGreaterThan(tauS);
    expect(deadS).toBeLessThan(tauS * Math.log(20));
    const m = (await run)?.measures ?? {};
    // ref: ngspice (Debian package), the design's own deck simulated as a switched circuit;
    // the 2 % on each output
    corner.outputs.forEach((output, k) => {
      expectClose(settledOutputV(m, k + 1), output.voltageV, { rel: 0.02 });
    });
    const switchPeak = corner.switches[0];
    // Within 2 % each (the scan's spec: −0.13 % and −0.88 %).
    expectClose(m.switch_current_peak_a ?? NaN, switchPeak?.currentPeakA ?? NaN, { rel: 0.02 });
    expectClose(m.switch_voltage_peak_v ?? NaN, switchPeak?.voltagePeakV ?? NaN, { rel: 0.02 });
  }, 300_000);
});
