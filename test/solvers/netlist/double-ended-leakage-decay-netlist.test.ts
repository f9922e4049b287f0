import { beforeAll, describe, expect, it } from 'vitest';
import {
  designConverter,
  doubleEndedNetlist,
  type DoubleEndedDesign,
  type Spec,
} from '../../../solvers/index.js';
import { leakyLowInputBridgeSpec } from '../../helpers/double-ended-specs.js';
import { expectClose } from '../../helpers/expect-close.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { settledAverage } from '../../helpers/settled-average.js';

/*
 * The bridges' leakage decay outlasting the off-time (issue 3; DEVELOPERS.md, "The leakage's
 * turn-off decay"). At turn-off the leakage carries the primary current on through the opposite
 * switches' body diodes at about Vd/Llk; at the lowest input, with 1 µH of leakage at 227 kHz and
 * D = 0.45, that takes some 0.45 µs against an off-time of 0.22 µs, and the next switches turn
 * on into the rest of it: the turn-on commutation starts from that rest. Invented scenarios
 * (`leakyLowInputBridgeSpec`): a half bridge on 36–72 V and a full bridge on 18–36 V (the same
 * 18 V of drive), 12 V 5.7 A, the converter's own Lm, full load at the lowest input. Their decay is so
 * long that no turns ratio reaches 12 V with the lowest input's duty cycle held below the
 * decay's knee, so the target 0.45 is kept (on the knee's flat side, `chooseDoubleEnded`).
 * Before (engine of 2026-12-04, its own designs and decks): ngspice −5.01 % (half bridge) and
 * −4.93 % (full bridge) on the output, −4.41 % and −4.36 % on the switch peak current.
 */

interface Case {
  name: string;
  spec: Spec;
  design: DoubleEndedDesign;
}

function leakyCase(topology: 'half-bridge' | 'full-bridge'): Case {
  const spec = leakyLowInputBridgeSpec(topology);
  const result = designConverter(spec);
  if (!result.ok || result.value.topology !== topology) {
    throw new Error(`invented scenario infeasible: ${JSON.stringify(result)}`);
  }
  return { name: `${topology}, ${spec.inputVoltageMinV} V, 1 µH`, spec, design: result.value };
}

const LABEL = 'min-input/100pct-load';
const CASES = [leakyCase('half-bridge'), leakyCase('full-bridge')];
const runs = new Map<Case, Promise<NgspiceRun>>();

beforeAll(async () => {
  // Some 3 s of ngspice each.
  for (const c of CASES) {
    const netlist = doubleEndedNetlist(c.spec, c.design, { cornerLabel: LABEL });
    runs.set(c, runNgspice(netlist, { timeoutMs: 240_000 }));
  }
  await Promise.allSettled(runs.values());
}, 600_000);

describe('the bridges with a leakage decay that outlasts the off-time', () => {
  for (const c of CASES) {
    it(`ngspice agrees with the engine on the ${c.name} at full load, lowest input: output voltage and switch peak current`, async () => {
      const corner = c.design.corners.find((k) => k.label === LABEL);
      if (corner === undefined) throw new Error(`no corner ${LABEL}`);
      // The engine's own account of the decay: the switch turns on into the last half's rest
      // (its current starts below zero) and the leakage swings the node, so no turn-on loss.
      const switchA = corner.waveforms.switchCurrentsA[0]?.values ?? [];
      expect(Math.min(...switchA)).toBeLessThan(-0.5);
      const turnOn = corner.losses.filter((l) => l.mechanism === 'turn-on');
      expect(turnOn.length).toBeGreaterThan(0);
      for (const l of turnOn) expect(l.powerW).toBe(0);
      const m = (await (runs.get(c) as Promise<NgspiceRun>)).measures;
      // ref: ngspice (Debian package), the same design simulated as a switched circuit; the
      // issue's agreement targets are 2 % on output voltage and 5 % on switch peaks.
      const outputV = settledAverage(
        m.output_1_voltage_earlier_v ?? NaN,
        m.output_1_voltage_previous_v ?? NaN,
        m.output_1_voltage_v ?? NaN,
      );
      expectClose(outputV, corner.outputs[0]?.voltageV ?? NaN, { rel: 0.02 });
      expectClose(m.switch_current_peak_a ?? NaN, corner.switches[0]?.currentPeakA ?? NaN, {
        rel: 0.05,
      });
    });
  }
});
