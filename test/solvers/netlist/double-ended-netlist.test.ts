import { beforeAll, describe, expect, it } from 'vitest';
import {
  designConverter,
  designNetlist,
  doubleEndedNetlist,
  SpecSchema,
  type DoubleEndedDesign,
  type Spec,
} from '../../../solvers/index.js';
import type { SpecInput } from '../../../solvers/spec/spec-schema.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import { fullBridgeSpec, halfBridgeSpec, pushPullSpec } from '../../helpers/double-ended-specs.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { settledOutputV } from '../../helpers/settled-average.js';

interface Scenario {
  spec: Spec;
  design: DoubleEndedDesign;
}

function scenario(spec: Spec): Scenario {
  const result = designConverter(spec);
  if (!result.ok) throw new Error(`invented scenario infeasible: ${JSON.stringify(result.issues)}`);
  const design = result.value;
  if (
    design.topology !== 'push-pull' &&
    design.topology !== 'half-bridge' &&
    design.topology !== 'full-bridge'
  ) {
    throw new Error('not a double-ended design');
  }
  return { spec, design };
}

const NO_LEAKAGE = { leakageInductanceH: 0, primaryResistanceOhm: 0.1 };

// Invented scenarios (test/helpers/double-ended-specs.ts): ideally coupled, and one full bridge
// with 2 µH of leakage (its turn-on commutation and its share of the on-voltage are in the
// engine's steady state).
const FULL_BRIDGE = scenario(fullBridgeSpec({ transformer: NO_LEAKAGE }));
const FULL_BRIDGE_LEAKY = scenario(fullBridgeSpec({ transformer: { leakageInductanceH: 2e-6 } }));
const FULL_BRIDGE_CENTER_TAPPED = scenario(
  fullBridgeSpec({
    transformer: NO_LEAKAGE,
    outputs: [
      {
        voltageV: 48,
        currentA: 10,
        secondaryArrangement: 'center-tapped',
        rectifier: { kind: 'diode', forwardVoltageV: 0.8, resistanceOhm: 0.01 },
      },
    ],
  }),
);
const HALF_BRIDGE = scenario(halfBridgeSpec({ transformer: { leakageInductanceH: 0 } }));
const HALF_BRIDGE_SYNCHRONOUS = scenario(
  halfBridgeSpec({
    transformer: { leakageInductanceH: 0 },
    outputs: [
      { voltageV: 24, currentA: 20, rectifier: { kind: 'synchronous', onResistanceOhm: 0.008 } },
    ],
  }),
);
const PUSH_PULL = scenario(pushPullSpec({ transformer: { leakageInductanceH: 0 } }));
const PUSH_PULL_BRIDGE_SYNCHRONOUS = scenario(
  pushPullSpec({
    transformer: { leakageInductanceH: 0 },
    outputs: [
      {
        voltageV: 12,
        currentA: 10,
        secondaryArrangement: 'full-bridge',
        rectifier: { kind: 'synchronous', onResistanceOhm: 0.005 },
      },
    ],
  }),
);

// Two outputs (invented: a 5 V 1 A auxiliary beside the main one). Every output's average is
// compared. The push-pull deck with two ideally coupled secondaries stopped in ngspice at its
// first dead time ("timestep too small") until the deck got its 1 GΩ node shunts.
const AUXILIARY_OUTPUT = {
  voltageV: 5,
  currentA: 1,
  rectifier: { kind: 'diode', forwardVoltageV: 0.4, resistanceOhm: 0.01, voltageRatingV: 100 },
} as const;
const PUSH_PULL_TWO_OUTPUTS = scenario(
  pushPullSpec({
    transformer: { leakageInductanceH: 0 },
    outputs: [
      {
        voltageV: 12,
        currentA: 10,
        rectifier: {
          kind: 'diode',
          forwardVoltageV: 0.45,
          resistanceOhm: 0.01,
          voltageRatingV: 100,
        },
      },
      AUXILIARY_OUTPUT,
    ],
  }),
);

// Light load with the default magnetizing inductance: the rectifiers cannot carry the
// magnetizing current through the whole freewheeling interval, so the inductor and magnetizing
// currents share a fall, and the switches' drain capacitance (the scenarios' own: 150 pF half
// bridge, 100 pF full bridge) rings with L‖Lm/n² as it starts (DEVELOPERS.md, light load).
// The "default Lm" light-load cases keep the converter's own Lm choice (magnetics 'assume'), which
// makes the ring relatively larger; one push-pull case takes the wound core's much larger Lm
// (DEVELOPERS.md, the double-ended family).
const SMALL_DRAIN_CAPACITANCE_F = 10e-12;
const ASSUMED = { mode: 'assume' } as const;
const PUSH_PULL_DEFAULT_LM = scenario(
  pushPullSpec({ transformer: { leakageInductanceH: 0 }, magnetics: ASSUMED }),
);
const HALF_BRIDGE_DEFAULT_LM = scenario(
  halfBridgeSpec({ magnetics: ASSUMED, transformer: { leakageInductanceH: 0 } }),
);
const FULL_BRIDGE_DEFAULT_LM = scenario(
  fullBridgeSpec({ magnetics: ASSUMED, transformer: NO_LEAKAGE }),
);
const FULL_BRIDGE_CENTER_TAPPED_DEFAULT_LM = scenario(
  fullBridgeSpec({
    magnetics: ASSUMED,
    transformer: NO_LEAKAGE,
    outputs: [
      {
        voltageV: 48,
        currentA: 10,
        secondaryArrangement: 'center-tapped',
        rectifier: { kind: 'diode', forwardVoltageV: 0.8, resistanceOhm: 0.01 },
      },
    ],
  }),
);

// Light load with ten times the default magnetizing inductance fixed in the spec: a long shared
// fall, the inductor current close to zero at the half's end.
const HALF_BRIDGE_LARGE_LM = scenario(
  halfBridgeSpec({
    transformer: { leakageInductanceH: 0, magnetizingInductanceH: 15e-3 },
    primarySwitch: {
      onResistanceOhm: 0.2,
      voltageRatingV: 500,
      outputCapacitanceF: SMALL_DRAIN_CAPACITANCE_F,
    },
  }),
);

// Two outputs at light load, the second at the first's voltage over 2.4 and a tenth of its
// current (invented, as the benchmark scenarios were checked with a second output): every
// output's rectifiers carry the magnetizing current while the windings sit at zero, and the
// outputs share its fall, and the node ring, once their referred currents no longer can
// (DEVELOPERS.md, light load; since 2026-12-04 their light-load corners take the event model,
// "Light load with several outputs: the event model", and their decks 1 pF snubbers). Loads of
// 10 and 20 % of full, the converter's own Lm.
function withSecondOutput(
  base: (overrides: Partial<Omit<SpecInput, 'topology'>>) => Spec,
  overrides: Partial<Omit<SpecInput, 'topology'>>,
): Spec {
  const first = base(overrides).outputs[0];
  if (first === undefined) throw new Error('no first output');
  return base({
    magnetics: ASSUMED,
    loadFractions: [0.1, 0.2, 0.5, 1],
    ...overrides,
    outputs: [first, { ...first, voltageV: first.voltageV / 2.4, currentA: first.currentA / 10 }],
  });
}
const HALF_BRIDGE_TWO_OUTPUTS_LIGHT = scenario(
  withSecondOutput(halfBridgeSpec, { transformer: { leakageInductanceH: 0 } }),
);
const HALF_BRIDGE_TWO_OUTPUTS_SMALL_DRAIN = scenario(
  withSecondOutput(halfBridgeSpec, {
    primarySwitch: {
      onResistanceOhm: 0.2,
      voltageRatingV: 500,
      outputCapacitanceF: SMALL_DRAIN_CAPACITANCE_F,
    },
  }),
);
const FULL_BRIDGE_TWO_OUTPUTS_LIGHT = scenario(
  withSecondOutput(fullBridgeSpec, { transformer: NO_LEAKAGE }),
);
const FULL_BRIDGE_TWO_CENTER_TAPPED_LIGHT = scenario(
  withSecondOutput(fullBridgeSpec, {
    transformer: NO_LEAKAGE,
    outputs: [
      {
        voltageV: 48,
        currentA: 10,
        secondaryArrangement: 'center-tapped',
        rectifier: { kind: 'diode', forwardVoltageV: 0.8, resistanceOhm: 0.01 },
      },
    ],
  }),
);
// The half bridge with its transformer designed at 17 and 20 % load: at the highest input and 17 %
// load the duty-cycle solve, its trials started from each other, ended on a state of the ring at
// 25.1 V for 24 V (ngspice: 24.3 V at that duty cycle); the corner is now solved again with every
// trial started afresh where it misses (double-ended-corner.ts).
const HALF_BRIDGE_DESIGNED_LIGHT = scenario(
  halfBridgeSpec({ loadFractions: [0.17, 0.2], magnetics: { mode: 'design' } }),
);
// The half bridge with its transformer designed at 15.5 and 14.8 % load and 118.2 kHz, no leakage
// (found by a scan of random loads and frequencies): at nominal input and 14.8 % load the node
// ring, started with the winding at zero, made the charge balance jump at the
// continuous-conduction voltage, and the engine ended on 24.21 V at D = 0.39106 where ngspice gave
// 23.28 V (−3.8 %); started at the drops' difference it is smooth there (DEVELOPERS.md, "Stray
// states and regulation misses").
const HALF_BRIDGE_DESIGNED_FLOOR = scenario(
  halfBridgeSpec({
    loadFractions: [0.155, 0.148],
    switchingFrequencyHz: 118.2e3,
    transformer: { leakageInductanceH: 0 },
    magnetics: { mode: 'design' },
  }),
);
const PUSH_PULL_TWO_OUTPUTS_LIGHT = scenario(
  withSecondOutput(pushPullSpec, { transformer: { leakageInductanceH: 0 } }),
);

// A push-pull on a 200–400 V bus (invented; unusual for a push-pull, but the engine takes it):
// at the highest input the turn-off swing (the drain capacitance charged by the primary current
// as the switches open) adds some 6 % to the output at the engine's duty cycle, which the
// engine left out before; default 100 pF switches, no leakage.
const PUSH_PULL_HIGH_VOLTAGE = scenario(
  pushPullSpec({
    inputVoltageMinV: 200,
    inputVoltageNominalV: 300,
    inputVoltageMaxV: 400,
    switchingFrequencyHz: 250e3,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 1200 },
    transformer: { leakageInductanceH: 0 },
    magnetics: ASSUMED,
  }),
);

// A full bridge on the same bus with 10 µH of leakage (invented): 5.8 % above the engine at the
// highest input and 30 % load before the turn-off swing was modelled.
const FULL_BRIDGE_HIGH_VOLTAGE = scenario(
  fullBridgeSpec({
    inputVoltageMinV: 200,
    inputVoltageNominalV: 300,
    inputVoltageMaxV: 400,
    switchingFrequencyHz: 190e3,
    outputs: [
      {
        voltageV: 12,
        currentA: 8,
        rectifier: {
          kind: 'diode',
          forwardVoltageV: 0.5,
          resistanceOhm: 0.01,
          voltageRatingV: 100,
        },
      },
    ],
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 1200 },
    loadFractions: [0.3, 1],
    transformer: { leakageInductanceH: 10e-6 },
    magnetics: ASSUMED,
  }),
);

// The audit's full bridge (`ngspice-scan.ts --seed 47 --input telecom`, spec 5, in round numbers;
// invented): 36–72 V, 12 V 8.8 A, 190 kHz, 1 µH of leakage with 100 pF switches (a ring of 63 ns),
// 7.4 % load. With the bridges' old default step (T/200, 26 ns: some 2.4 steps a ring, whose
// Gear integration damps the light-load ring the engine carries undamped) ngspice settled 3.97 %
// below the engine at 72 V and 2.18 % above at 36 V; the deck now resolves the ring at such
// corners (32 steps a ring): −0.07 % and +0.11 %.
const FULL_BRIDGE_TELECOM_LEAKY_LIGHT = scenario(
  SpecSchema.parse({
    topology: 'full-bridge',
    inputVoltageMinV: 36,
    inputVoltageNominalV: 48,
    inputVoltageMaxV: 72,
    outputs: [
      {
        voltageV: 12,
        currentA: 8.8,
        capacitanceF: 100e-6,
        rectifier: {
          kind: 'diode',
          forwardVoltageV: 0.5,
          resistanceOhm: 0.01,
          voltageRatingV: 100,
        },
      },
    ],
    switchingFrequencyHz: 190e3,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 216 },
    loadFractions: [0.074, 1],
    transformer: { leakageInductanceH: 1e-6 },
    magnetics: ASSUMED,
  }),
);

const COMPARISONS = [
  {
    name: 'full bridge, bridge rectifier, 300 V full load',
    s: FULL_BRIDGE,
    corner: 'min-input/100pct-load',
    mode: 'ccm',
  },
  {
    name: 'full bridge, 2 µH leakage, 300 V full load',
    s: FULL_BRIDGE_LEAKY,
    corner: 'min-input/100pct-load',
    mode: 'ccm',
  },
  {
    name: 'full bridge, center-tapped, 360 V half load',
    s: FULL_BRIDGE_CENTER_TAPPED,
    corner: 'nominal-input/50pct-load',
    mode: 'ccm',
  },
  {
    name: 'half bridge, center-tapped, 360 V full load',
    s: HALF_BRIDGE,
    corner: 'min-input/100pct-load',
    mode: 'ccm',
  },
  {
    name: 'half bridge, synchronous, 390 V full load',
    s: HALF_BRIDGE_SYNCHRONOUS,
    corner: 'nominal-input/100pct-load',
    mode: 'ccm',
  },
  {
    name: 'push-pull, 400 V full load, 250 kHz (the turn-off swing)',
    s: PUSH_PULL_HIGH_VOLTAGE,
    corner: 'max-input/100pct-load',
    mode: 'ccm',
  },
  {
    name: 'full bridge, 400 V 30 % load, 190 kHz, 10 µH leakage (the turn-off swing)',
    s: FULL_BRIDGE_HIGH_VOLTAGE,
    corner: 'max-input/30pct-load',
    mode: 'ccm',
  },
  {
    name: 'push-pull, center-tapped, 18 V full load',
    s: PUSH_PULL,
    corner: 'min-input/100pct-load',
    mode: 'ccm',
  },
  {
    name: 'push-pull, synchronous bridge, 24 V half load',
    s: PUSH_PULL_BRIDGE_SYNCHRONOUS,
    corner: 'nominal-input/50pct-load',
    mode: 'ccm',
  },
  {
    name: 'push-pull, two outputs, 18 V full load',
    s: PUSH_PULL_TWO_OUTPUTS,
    corner: 'min-input/100pct-load',
    mode: 'ccm',
  },
  {
    name: 'push-pull, two outputs, 24 V half load',
    s: PUSH_PULL_TWO_OUTPUTS,
    corner: 'nominal-input/50pct-load',
    mode: 'ccm',
  },
  {
    // The wound core's Lm, several times the converter's own choice: the deepest light load
    // the engine's shared fall meets here (it ran 4.5 % high before the node ring).
    name: 'push-pull, wound core, 24 V 10 % load',
    s: PUSH_PULL,
    corner: 'nominal-input/10pct-load',
    mode: 'ccm',
  },
  {
    name: 'push-pull, default Lm, 18 V 10 % load',
    s: PUSH_PULL_DEFAULT_LM,
    corner: 'min-input/10pct-load',
    mode: 'ccm',
  },
  {
    name: 'push-pull, default Lm, 36 V 10 % load',
    s: PUSH_PULL_DEFAULT_LM,
    corner: 'max-input/10pct-load',
    mode: 'ccm',
  },
  {
    name: 'half bridge, default Lm, 150 pF switches, 390 V 10 % load',
    s: HALF_BRIDGE_DEFAULT_LM,
    corner: 'nominal-input/10pct-load',
    mode: 'ccm',
  },
  {
    name: 'full bridge, default Lm, 100 pF switches, 360 V 10 % load',
    s: FULL_BRIDGE_DEFAULT_LM,
    corner: 'nominal-input/10pct-load',
    mode: 'ccm',
  },
  {
    name: 'full bridge, center-tapped, default Lm, 100 pF switches, 360 V 10 % load',
    s: FULL_BRIDGE_CENTER_TAPPED_DEFAULT_LM,
    corner: 'nominal-input/10pct-load',
    mode: 'ccm',
  },
  {
    // The event model's ring takes the inductor current to zero within the half (an idle
    // stretch) though the half ends above zero: discontinuous.
    name: 'half bridge, 10 Lm, 10 pF switches, 390 V 10 % load',
    s: HALF_BRIDGE_LARGE_LM,
    corner: 'nominal-input/10pct-load',
    mode: 'dcm',
  },
  {
    name: 'half bridge, two center-tapped outputs, default Lm, 150 pF switches, 390 V 20 % load',
    s: HALF_BRIDGE_TWO_OUTPUTS_LIGHT,
    corner: 'nominal-input/20pct-load',
    mode: 'ccm',
  },
  {
    name: 'half bridge, two outputs, default Lm and leakage, 10 pF switches, 390 V 10 % load',
    s: HALF_BRIDGE_TWO_OUTPUTS_SMALL_DRAIN,
    corner: 'nominal-input/10pct-load',
    mode: 'ccm',
  },
  {
    name: 'full bridge, two bridge-rectified outputs, default Lm, 100 pF switches, 360 V 10 % load',
    s: FULL_BRIDGE_TWO_OUTPUTS_LIGHT,
    corner: 'nominal-input/10pct-load',
    mode: 'ccm',
  },
  {
    name: 'full bridge, two bridge-rectified outputs, default Lm, 100 pF switches, 300 V 20 % load',
    s: FULL_BRIDGE_TWO_OUTPUTS_LIGHT,
    corner: 'min-input/20pct-load',
    mode: 'ccm',
  },
  {
    name: 'full bridge, two center-tapped outputs, default Lm, 100 pF switches, 360 V 10 % load',
    s: FULL_BRIDGE_TWO_CENTER_TAPPED_LIGHT,
    corner: 'nominal-input/10pct-load',
    mode: 'ccm',
  },
  {
    name: 'half bridge, transformer designed, 410 V 17 % load (once a stray state of the ring)',
    s: HALF_BRIDGE_DESIGNED_LIGHT,
    corner: 'max-input/17pct-load',
    // At the boundary: with the leakage in the event ring (2026-12-04, later) the inductor
    // current's lowest is 0.031 A of its 3.4 A mean (`dcm` before, where it touched zero);
    // ngspice's lowest over the last two periods 0.002 A.
    mode: 'ccm',
  },
  {
    name: 'half bridge, transformer designed, 390 V 14.8 % load at 118.2 kHz',
    s: HALF_BRIDGE_DESIGNED_FLOOR,
    corner: 'nominal-input/14.8pct-load',
    mode: 'ccm',
  },
  {
    name: 'push-pull, two center-tapped outputs, default Lm, 18 V 10 % load',
    s: PUSH_PULL_TWO_OUTPUTS_LIGHT,
    corner: 'min-input/10pct-load',
    mode: 'ccm',
  },
  {
    name: 'push-pull, two center-tapped outputs, default Lm, 24 V 20 % load',
    s: PUSH_PULL_TWO_OUTPUTS_LIGHT,
    corner: 'nominal-input/20pct-load',
    mode: 'ccm',
  },
  {
    name: 'full bridge, 1 µH leakage, 190 kHz, 72 V 7.4 % load (the audit’s seed 47, spec 5)',
    s: FULL_BRIDGE_TELECOM_LEAKY_LIGHT,
    corner: 'max-input/7.4pct-load',
    mode: 'ccm',
  },
  {
    name: 'full bridge, 1 µH leakage, 190 kHz, 36 V 7.4 % load (the audit’s seed 47, spec 5)',
    s: FULL_BRIDGE_TELECOM_LEAKY_LIGHT,
    corner: 'min-input/7.4pct-load',
    mode: 'ccm',
  },
] as const;

const runs = new Map<(typeof COMPARISONS)[number], Promise<NgspiceRun>>();

beforeAll(async () => {
  for (const c of COMPARISONS) {
    const netlist = doubleEndedNetlist(c.s.spec, c.s.design, { cornerLabel: c.corner });
    // The leaky and the synchronous cases take about 25 s each here; the others 3 to 16 s (the
    // light-load ones up to a minute on a shared machine).
    runs.set(
      c,
      runNgspice(netlist, {
        timeoutMs: 240_000,
        expect: ['magnetizing_current_peak_a', 'magnetizing_current_average_a'],
      }),
    );
  }
  await Promise.allSettled(runs.values());
}, 900_000);

describe('doubleEndedNetlist', () => {
  it('designNetlist(spec, design) gives the double-ended netlist for each of the three', () => {
    for (const s of [FULL_BRIDGE, HALF_BRIDGE, PUSH_PULL]) {
      const options = { cornerLabel: 'nominal-input/50pct-load' };
      expect(designNetlist(s.spec, s.design, options)).toBe(
        doubleEndedNetlist(s.spec, s.design, options),
      );
    }
  });

  it('doubleEndedNetlist(spec, design) holds every switch and rectifier and no NaN', () => {
    const full = doubleEndedNetlist(FULL_BRIDGE.spec, FULL_BRIDGE.design);
    for (const element of [
      'Sqah ',
      'Sqbl ',
      'Sqbh ',
      'Sqal ',
      'Drau1 ',
      'Dral1 ',
      'Drbu1 ',
      'Drbl1 ',
    ]) {
      expect(full).toContain(element);
    }
    const half = doubleEndedNetlist(HALF_BRIDGE.spec, HALF_BRIDGE.design);
    for (const element of ['Sqh ', 'Sql ', 'Cdiv1 ', 'Cdiv2 ', 'Dra1 ', 'Drb1 ']) {
      expect(half).toContain(element);
    }
    const push = doubleEndedNetlist(PUSH_PULL.spec, PUSH_PULL.design);
    for (const element of ['Sqa ', 'Sqb ', 'Eb tb eb ta da -1', 'Fb ta da Vbw 1']) {
      expect(push).toContain(element);
    }
    for (const text of [full, half, push]) expect(text).not.toMatch(/NaN|Infinity|undefined/);
  });

  it('doubleEndedNetlist(spec, design, { cornerLabel }) throws RangeError for an unknown corner', () => {
    expect(() =>
      doubleEndedNetlist(FULL_BRIDGE.spec, FULL_BRIDGE.design, { cornerLabel: 'none' }),
    ).toThrow(RangeError);
  });

  for (const c of COMPARISONS) {
    it(`ngspice agrees with the engine on ${c.name}: output voltage, switch peaks, flux balance`, async () => {
      const corner = c.s.design.corners.find((k) => k.label === c.corner);
      if (corner === undefined) throw new Error(`no corner ${c.corner}`);
      expect(corner.outputInductorModes[0]).toBe(c.mode);
      const run = await (runs.get(c) as Promise<NgspiceRun>);
      const m = run.measures;
      // ref: ngspice (Debian package), the same design simulated as a switched circuit; the
      // issue's agreement targets are 2 % on output voltage (every output) and 5 % on switch peaks
      corner.outputs.forEach((output, index) => {
        const k = index + 1;
        const outputV = settledOutputV(m, k);
        expectClose(outputV, output.voltageV, { rel: 0.02 });
      });
      expectSwitchPeaksClose(m, corner.switches[0]);
      // ref: ngspice (Debian package): started where the engine starts it (−Im,pk, or −valley/n
      // at light load), the magnetizing current swings to the engine's peak within 5 % above
      // its average over the period (zero in the engine: the swing is symmetric over a period),
      // and that average stays within a tenth of the peak: it does not walk. A half bridge's
      // divider capacitors ring slowly with Lm (about 400 Hz for 1.8 mH and 2 × 44 µF), so a
      // start state a little off the steady state leaves an offset that swings but never grows.
      const peakA = m.magnetizing_current_peak_a ?? NaN;
      const averageA = m.magnetizing_current_average_a ?? NaN;
      expectClose(peakA - averageA, corner.magnetizingCurrentPeakA, { rel: 0.05 });
      expect(Math.abs(averageA)).toBeLessThanOrEqual(0.1 * corner.magnetizingCurrentPeakA);
    });
  }
});
