import { beforeAll, describe, it } from 'vitest';
import {
  designConverter,
  SpecSchema,
  twoSwitchForwardNetlist,
  type ResetWindingForwardDesign,
} from '../../../solvers/index.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { SCAN_DIODE_RECTIFIER } from '../../helpers/scan-specs.js';
import { settledOutputV } from '../../helpers/settled-average.js';

/*
 * The reset winding's deck must run in ngspice (issue 3's netlist export; DEVELOPERS.md, "The
 * ngspice check", the audit of seed 59). The reset winding is an ideal controlled-source pair;
 * with its diode alone in that loop, ngspice stopped with "timestep too small ... trouble with
 * knee-instance dreset" on this design at 36 V and full load (the scan's spec 9 of seed 59, here
 * in round numbers; three roundings tried, each stopped). The deck now has 10 mΩ in that path
 * (`RESET_PATH_RESISTANCE_OHM`, a short winding's copper).
 */

const LABEL = 'min-input/100pct-load';

// Invented scenario (not any product): an auxiliary two-output supply of a made-up test bench,
// 36–72 V in, 12 V 6.8 A and 5 V 1 A out, 120 kHz, no leakage, the transformer assumed.
const spec = SpecSchema.parse({
  topology: 'forward-reset-winding',
  inputVoltageMinV: 36,
  inputVoltageNominalV: 48,
  inputVoltageMaxV: 72,
  outputs: [
    { voltageV: 12, currentA: 6.8, capacitanceF: 100e-6, rectifier: SCAN_DIODE_RECTIFIER },
    { voltageV: 5, currentA: 1, capacitanceF: 100e-6, rectifier: SCAN_DIODE_RECTIFIER },
  ],
  switchingFrequencyHz: 120e3,
  primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 216 },
  loadFractions: [0.2, 1],
  magnetics: { mode: 'assume' },
  transformer: { leakageInductanceH: 0 },
});

let design: ResetWindingForwardDesign;
let run: Promise<NgspiceRun>;

beforeAll(() => {
  const result = designConverter(spec);
  if (!result.ok || result.value.topology !== 'forward-reset-winding') {
    throw new Error(`invented scenario infeasible: ${JSON.stringify(result)}`);
  }
  design = result.value;
  // Some 5–10 s of ngspice.
  run = runNgspice(twoSwitchForwardNetlist(spec, design, { cornerLabel: LABEL }), {
    timeoutMs: 240_000,
    expect: ['switch_voltage_peak_v', 'switch_current_peak_a'],
  });
});

describe('the reset winding’s deck in ngspice', () => {
  it('runs at 36 V and full load, two outputs, and agrees with the engine on both outputs and the switch peaks', async () => {
    const corner = design.corners.find((c) => c.label === LABEL);
    const m = (await run).measures;
    // ref: ngspice (Debian package), the same design simulated as a switched circuit: issue 3's
    // 2 % on the outputs and 5 % on the switch peaks (11.9996 and 5.0011 V here in the seed's
    // own numbers; 10 mΩ against the engine's lossless reset path moves the output by 0.003 %)
    expectClose(settledOutputV(m, 1), corner?.outputs[0]?.voltageV ?? NaN, { rel: 0.02 });
    expectClose(settledOutputV(m, 2), corner?.outputs[1]?.voltageV ?? NaN, { rel: 0.02 });
    expectSwitchPeaksClose(m, corner?.switches[0]);
  }, 300_000);
});
