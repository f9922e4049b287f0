import { beforeAll, describe, expect, it } from 'vitest';
import {
  activeClampForwardNetlist,
  designConverter,
  type ActiveClampForwardCorner,
  type ActiveClampForwardDesign,
  type Spec,
} from '../../../solvers/index.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { scanDrawnSpec } from '../../helpers/scan-specs.js';
import { settledOutputV } from '../../helpers/settled-average.js';

/** Two specs the scan drew, from the audit of 2026-12-05 (`--seed 31`, specs 14 and 23). */
const scanSpec = (
  input: [number, number, number],
  outputs: Array<[number, number]>,
  switchingFrequencyHz: number,
  lightLoad: number,
  leakageInductanceH: number,
): Spec =>
  scanDrawnSpec(
    'active-clamp-forward',
    input,
    outputs,
    switchingFrequencyHz,
    lightLoad,
    leakageInductanceH,
  );

function designOf(spec: Spec): ActiveClampForwardDesign {
  const result = designConverter(spec);
  if (!result.ok) throw new Error(`invented scenario infeasible: ${JSON.stringify(result.issues)}`);
  if (result.value.topology !== 'active-clamp-forward') throw new Error('not an active clamp');
  return result.value;
}

function cornerOf(design: ActiveClampForwardDesign, label: string): ActiveClampForwardCorner {
  const corner = design.corners.find((c) => c.label === label);
  if (corner === undefined) throw new Error(`no corner ${label}`);
  return corner;
}

// Seed 31 spec 14: 18–36 V, 12 V 6.6 A, 1 µH of leakage on an 18 A primary. At 36 V and full load
// the turn-off commutation into the clamp takes a third of the period, and the loop's resistance
// (primary winding, auxiliary switch, clamp ESR: 91 mΩ) drops some 1.6 V of the 10 V clamp at its
// start: the engine had left that out of the commutation and counted the reset's drop with the
// wrong sign in the clamp voltage, and its magnetizing current ran 0.7 A below ngspice's (switch
// current +5.0 %, magnetizing valley 13 % deeper; with the deck's snubbers at 30 pF +4.2 % and
// 10.6 %).
const LEAKY = scanSpec([18, 24, 36], [[12, 6.568542718887329]], 157531.7144393921, 0.147, 1e-6);
const LEAKY_CORNER = 'max-input/100pct-load';
// Seed 31 spec 23: 36–72 V, 12 V 9.6 A and 5 V 1.5 A, no leakage. At 72 V and 18 % load the
// magnetizing current in the dead time before turn-on is larger than the output inductors' current
// and carries the drain below Vin; the engine had taken their current at the valley, where
// conduction starts, not where the drain passes Vin, and so too large a current on the swing: the
// outputs 2.3 % below the engine's in ngspice (2.9 % with the deck's snubbers at 100 pF).
const TWO_OUTPUTS = scanSpec(
  [36, 48, 72],
  [
    [12, 9.556572198867798],
    [5, 1.4646070003509521],
  ],
  282100.7549762726,
  0.18,
  0,
);
const TWO_OUTPUTS_CORNER = 'max-input/18pct-load';

const LEAKY_DESIGN = designOf(LEAKY);
const TWO_OUTPUTS_DESIGN = designOf(TWO_OUTPUTS);
let leakyRun: Promise<NgspiceRun> | undefined;
let twoOutputsRun: Promise<NgspiceRun> | undefined;

beforeAll(async () => {
  // Each run takes some 5–15 s alone here; the deck as exported, with no retry.
  leakyRun = runNgspice(
    activeClampForwardNetlist(LEAKY, LEAKY_DESIGN, { cornerLabel: LEAKY_CORNER }),
    { timeoutMs: 240_000, expect: ['magnetizing_current_valley_a'] },
  );
  twoOutputsRun = runNgspice(
    activeClampForwardNetlist(TWO_OUTPUTS, TWO_OUTPUTS_DESIGN, { cornerLabel: TWO_OUTPUTS_CORNER }),
    { timeoutMs: 240_000, expect: ['output_2_voltage_v'] },
  );
  await Promise.allSettled([leakyRun, twoOutputsRun]);
}, 300_000);

function settledOutput(m: NgspiceRun['measures'], k: number): number {
  return settledOutputV(m, k);
}

describe('activeClampForwardNetlist against the engine (the audit of 2026-12-05)', () => {
  it('ngspice agrees on 12 V 6.6 A from 36 V with 1 µH leakage: output, switch peaks, magnetizing valley', async () => {
    const corner = cornerOf(LEAKY_DESIGN, LEAKY_CORNER);
    expect(corner.outputInductorModes[0]).toBe('ccm');
    const m = (await (leakyRun as Promise<NgspiceRun>)).measures;
    // ref: ngspice (Debian package), issue 3's limits: output 2 %, switch peaks 5 %
    expectClose(settledOutput(m, 1), corner.outputs[0]?.voltageV ?? NaN, { rel: 0.02 });
    expectSwitchPeaksClose(m, corner.switches[0]);
    // ref: ngspice (Debian package): the clamp's charge balance sets where the magnetizing
    // current swings; 6 % here (4.0 % now; 10.6 % with the commutation at the clamp voltage alone)
    expectClose(
      m.magnetizing_current_valley_a ?? NaN,
      corner.activeClamp.magnetizingCurrentValleyA,
      { rel: 0.06 },
    );
  });

  it('ngspice agrees on 12 V and 5 V at 18 % load from 72 V, the drain below Vin in the dead time: outputs, switch peaks', async () => {
    const corner = cornerOf(TWO_OUTPUTS_DESIGN, TWO_OUTPUTS_CORNER);
    expect(corner.outputInductorModes).toEqual(['ccm', 'ccm']);
    const m = (await (twoOutputsRun as Promise<NgspiceRun>)).measures;
    // ref: ngspice (Debian package), issue 3's limits: outputs 2 %, switch peaks 5 %
    expectClose(settledOutput(m, 1), corner.outputs[0]?.voltageV ?? NaN, { rel: 0.02 });
    expectClose(settledOutput(m, 2), corner.outputs[1]?.voltageV ?? NaN, { rel: 0.02 });
    expectSwitchPeaksClose(m, corner.switches[0]);
  });
});
