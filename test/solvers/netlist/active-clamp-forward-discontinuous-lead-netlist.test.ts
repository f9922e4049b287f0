import { beforeAll, describe, expect, it } from 'vitest';
import {
  activeClampForwardNetlist,
  designConverter,
  type ActiveClampForwardCorner,
  type ActiveClampForwardDesign,
} from '../../../solvers/index.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { scanDrawnSpec } from '../../helpers/scan-specs.js';
import { settledOutputV } from '../../helpers/settled-average.js';

// The scan's seed 47 spec 14 (`ngspice-scan.ts --seed 47 --input telecom`, the audit of
// 2026-12-05, second round; invented by the scan): 36–72 V, 12 V 6.0 A and 5 V 1.5 A, no
// leakage, 267.9 kHz. At 72 V and 3.3 % load both output inductors are discontinuous and the
// negative magnetizing current carries the drain well below Vin in the dead time before turn-on;
// their rectifiers conduct only once the ramping winding passes n·(Vo + Vf). The engine had given
// them the whole ramp's area over Vin as a lead, some 0.03 A too much current at the gate, and
// ngspice read the outputs 3.04 % and 2.95 % below the engine's (the switch current 2.68 %); now
// each takes its current at the gate from the swing loaded by the conducting stages.
const SPEC = scanDrawnSpec(
  'active-clamp-forward',
  [36, 48, 72],
  [
    [12, 5.967051066458225],
    [5, 1.510064721107483],
  ],
  267879.2119026184,
  0.033,
  0,
);
const CORNER = 'max-input/3.3pct-load';

function designOf(): ActiveClampForwardDesign {
  const result = designConverter(SPEC);
  if (!result.ok) throw new Error(`invented scenario infeasible: ${JSON.stringify(result.issues)}`);
  if (result.value.topology !== 'active-clamp-forward') throw new Error('not an active clamp');
  return result.value;
}

const DESIGN = designOf();
let run: Promise<NgspiceRun> | undefined;

beforeAll(async () => {
  // Some 15–30 s here; the deck as exported, with no retry.
  run = runNgspice(activeClampForwardNetlist(SPEC, DESIGN, { cornerLabel: CORNER }), {
    timeoutMs: 240_000,
    expect: ['output_2_voltage_v'],
  });
  await Promise.allSettled([run]);
}, 300_000);

describe('activeClampForwardNetlist against the engine, both stages discontinuous in the dead time', () => {
  it('ngspice agrees on 12 V and 5 V at 3.3 % load from 72 V: outputs, switch peaks', async () => {
    const corner = DESIGN.corners.find((c) => c.label === CORNER) as ActiveClampForwardCorner;
    expect(corner.outputInductorModes).toEqual(['dcm', 'dcm']);
    const m = (await (run as Promise<NgspiceRun>)).measures;
    // ref: ngspice (Debian package), issue 3's limits: outputs 2 % (−0.16 and −0.02 % now;
    // −3.04 and −2.95 % with the whole ramp over Vin as every stage's lead), switch peaks 5 %
    // (−0.21 and +0.14 %)
    expectClose(settledOutputV(m, 1), corner.outputs[0]?.voltageV ?? NaN, { rel: 0.02 });
    expectClose(settledOutputV(m, 2), corner.outputs[1]?.voltageV ?? NaN, { rel: 0.02 });
    expectSwitchPeaksClose(m, corner.switches[0]);
  });
});
