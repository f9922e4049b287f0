import { beforeAll, describe, expect, it } from 'vitest';
import { designConverter, doubleEndedNetlist } from '../../../solvers/index.js';
import { expectClose } from '../../helpers/expect-close.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { scanDrawnSpec } from '../../helpers/scan-specs.js';
import { settledOutputV } from '../../helpers/settled-average.js';

// The push-pull's turn-off spike below its clamp: `ngspice-scan.ts --topologies
// push-pull,half-bridge,full-bridge --seed 37`, spec 0, in round numbers (invented by the scan,
// not any product): 36–72 V, 0.2 µH of leakage a half, 100 pF switches, 12 V at 5.75 A,
// 242.8 kHz, at 36 V and full load, where the drain's peak is the turn-off spike's own (below
// the clamp, 90 V above the rail). The engine steps the turn-off with the other drain behind its
// own leakage (push-pull-clamp.ts); until 2026-12-05 it had that drain's capacitance straight on
// the winding, whose slow fall held the spike low: ngspice read +8.4 % on it with 1 pF rectifier
// snubbers (+3.5 % with 30 pF, which slowed the winding's fall as that model did). With the
// stepped spike: −1.6 % at 1 pF (the push-pull deck's snubbers with its clamp now), −5.9 % at
// 30 pF (DEVELOPERS.md, "The push-pull's turn-off spike against a ring-resolved deck").
const spec = scanDrawnSpec('push-pull', [36, 48, 72], [[12, 5.75]], 242.8e3, 0.211, 0.2e-6);
const result = designConverter(spec);
if (!result.ok || result.value.topology !== 'push-pull') {
  throw new Error('invented scenario infeasible or not a push-pull');
}
const design = result.value;
const LABEL = 'min-input/100pct-load';
let run: Promise<NgspiceRun>;

beforeAll(() => {
  // The deck as exported: the leakage's ring resolved (32 steps a ring) and 1 pF snubbers.
  run = runNgspice(doubleEndedNetlist(spec, design, { cornerLabel: LABEL }), {
    timeoutMs: 280_000,
  });
  run.catch(() => undefined);
});

describe('the push-pull turn-off spike below the clamp against ngspice', () => {
  it('36 V, 0.2 µH, full load: the switch voltage, the spike, within 5 %', async () => {
    const corner = design.corners.find((c) => c.label === LABEL);
    if (corner === undefined) throw new Error(`no corner ${LABEL}`);
    const switchPeak = corner.switches[0];
    // The spike stays below the clamp: Vin + Vc = 36 + 1.5·72 V.
    expect(switchPeak?.voltagePeakV ?? NaN).toBeLessThan(36 + 108);
    const m = (await run).measures;
    // ref: ngspice (Debian package), the design's own deck simulated as a switched circuit; the
    // issue's targets: 2 % on the output, 5 % on the switch peaks
    expectClose(settledOutputV(m, 1), corner.outputs[0]?.voltageV ?? NaN, { rel: 0.02 });
    expectClose(m.switch_current_peak_a ?? NaN, switchPeak?.currentPeakA ?? NaN, { rel: 0.05 });
    expectClose(m.switch_voltage_peak_v ?? NaN, switchPeak?.voltagePeakV ?? NaN, { rel: 0.05 });
  }, 300_000);
});
