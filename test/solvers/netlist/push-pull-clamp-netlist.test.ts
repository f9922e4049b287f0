import { beforeAll, describe, expect, it } from 'vitest';
import {
  designConverter,
  doubleEndedNetlist,
  type DoubleEndedDesign,
  type Spec,
} from '../../../solvers/index.js';
import { expectClose } from '../../helpers/expect-close.js';
import { pushPullSpec } from '../../helpers/double-ended-specs.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { settledOutputV } from '../../helpers/settled-average.js';

// The push-pull with leakage and its RCD clamp from each drain (push-pull-clamp.ts): the
// invented 18–36 V scenario (test/helpers/double-ended-specs.ts) with the converter's own Lm,
// the spec's default leakage (0.01·Lm, 0.45 µH) and 1 µH, the default clamp (1.5 × 36 V above
// the rail). Before the clamp the deck had none, and ngspice's drains spiked to some 150 V on a
// 24 V rail where the engine reported about 2·Vin.

function design(spec: Spec): DoubleEndedDesign {
  const result = designConverter(spec);
  if (!result.ok) throw new Error(`invented scenario infeasible: ${JSON.stringify(result.issues)}`);
  if (result.value.topology !== 'push-pull') throw new Error('not a push-pull');
  return result.value;
}

const ASSUMED = { mode: 'assume' } as const;
const DEFAULT_LEAKAGE = pushPullSpec({ magnetics: ASSUMED });
const MICROHENRY = pushPullSpec({
  magnetics: ASSUMED,
  transformer: { primaryResistanceOhm: 0.01, leakageInductanceH: 1e-6 },
});
const CASES = [
  {
    name: 'default leakage, 18 V full load',
    spec: DEFAULT_LEAKAGE,
    corner: 'min-input/100pct-load',
  },
  { name: '1 µH of leakage, 36 V full load', spec: MICROHENRY, corner: 'max-input/100pct-load' },
  {
    name: 'default leakage, 24 V 10 % load',
    spec: DEFAULT_LEAKAGE,
    corner: 'nominal-input/10pct-load',
  },
].map((c) => ({ ...c, design: design(c.spec) }));

const runs = new Map<(typeof CASES)[number], Promise<NgspiceRun>>();

/** The deck with the clamp resistor's mean power over the last period added. */
function deckWithClampPower(c: (typeof CASES)[number]): string {
  const netlist = doubleEndedNetlist(c.spec, c.design, { cornerLabel: c.corner });
  const window = /magnetizing_current_average_a AVG i\(vmag\) (.*)/.exec(netlist)?.[1];
  const ohm = /^Rclamp clamp rail (\S+)$/m.exec(netlist)?.[1];
  if (window === undefined || ohm === undefined) throw new Error('no clamp resistor in the deck');
  return netlist.replace(
    /\.end\n$/,
    `.meas tran clamp_resistor_w AVG par('(v(clamp)-v(rail))^2/${ohm}') ${window}\n.end\n`,
  );
}

beforeAll(async () => {
  for (const c of CASES) {
    runs.set(c, runNgspice(deckWithClampPower(c), { timeoutMs: 240_000 }));
  }
  await Promise.allSettled(runs.values());
}, 600_000);

describe('the push-pull clamp against ngspice', () => {
  it('puts the clamp in the deck: a diode from each drain, the capacitor started at Vc', () => {
    const c = CASES[0] as (typeof CASES)[number];
    const netlist = doubleEndedNetlist(c.spec, c.design, { cornerLabel: c.corner });
    for (const line of ['Dcla da clamp knee', 'Dclb db clamp knee', 'IC=54']) {
      expect(netlist).toContain(line);
    }
  });

  for (const c of CASES) {
    it(`ngspice agrees with the engine on ${c.name}: output, switch peaks, clamp power`, async () => {
      const corner = c.design.corners.find((k) => k.label === c.corner);
      if (corner === undefined) throw new Error(`no corner ${c.corner}`);
      const m = (await (runs.get(c) as Promise<NgspiceRun>)).measures;
      // ref: ngspice (Debian package), the design's own deck simulated as a switched circuit;
      // the targets: 2 % on the output, 5 % on switch peak current and voltage
      const outputV = settledOutputV(m, 1);
      expectClose(outputV, corner.outputs[0]?.voltageV ?? NaN, { rel: 0.02 });
      const switchPeak = corner.switches[0];
      expectClose(m.switch_current_peak_a ?? NaN, switchPeak?.currentPeakA ?? NaN, { rel: 0.05 });
      // The clamp holds the spike: Vin + Vc in the engine (the ring reaches it in all three).
      expectClose(switchPeak?.voltagePeakV ?? NaN, corner.inputVoltageV + 54, { rel: 1e-9 });
      expectClose(m.switch_voltage_peak_v ?? NaN, switchPeak?.voltagePeakV ?? NaN, { rel: 0.05 });
      // ref: ngspice (Debian package): the deck's resistor, R = Vc²/P from the engine, settles
      // at the power the circuit puts into the clamp, so the clamp's voltage, the switch's peak,
      // sits at Vc only where the engine's P is the circuit's. Within 5 % since the turn-off spike
      // is stepped with the other drain behind its leakage and the stated damping, and the deck
      // resolves the leakage's ring (its default; DEVELOPERS.md, "The push-pull's turn-off spike
      // against a ring-resolved deck"): −1.7, −1.5 and −2.4 %. With the other drain on the
      // winding, as before, the 24 V 10 % case read +8 % (15 % was the bound then: 3·Z across
      // each leakage took 4–7 % of the power, and at the default step the rings read low)
      const clampW = corner.losses.find((l) => l.component === 'leakage-clamp')?.powerW ?? NaN;
      expectClose(m.clamp_resistor_w ?? NaN, clampW, { rel: 0.05 });
    });
  }
});
