import { beforeAll, describe, expect, it } from 'vitest';
import {
  activeClampForwardNetlist,
  designConverter,
  designNetlist,
  SpecSchema,
  type ActiveClampForwardCorner,
  type ActiveClampForwardDesign,
  type Spec,
} from '../../../solvers/index.js';
import { average } from '../../../solvers/waveform/average.js';
import { activeClampSimulationSpec } from '../../helpers/active-clamp-specs.js';
import { forwardHighInputSpec } from '../../helpers/forward-specs.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { scanDrawnSpec } from '../../helpers/scan-specs.js';
import { settledOutputV } from '../../helpers/settled-average.js';

interface Scenario {
  spec: Spec;
  design: ActiveClampForwardDesign;
}

function scenario(spec: Spec): Scenario {
  const result = designConverter(spec);
  if (!result.ok) throw new Error(`invented scenario infeasible: ${JSON.stringify(result.issues)}`);
  if (result.value.topology !== 'active-clamp-forward') throw new Error('not an active clamp');
  return { spec, design: result.value };
}

// Invented scenarios: ideally coupled, and one with 0.5 µH of leakage (its commutations at turn-on
// and into the clamp at turn-off are in the engine's steady state).
const IDEAL = scenario(activeClampSimulationSpec(0));
const LEAKY = scenario(activeClampSimulationSpec(0.5e-6));
// At 400 V the drain's swing at turn-off (100 pF each switch) adds about 4 % (full load) and
// 6 % (half load) to the output when left out.
const HIGH_INPUT = scenario(forwardHighInputSpec('active-clamp-forward'));
// The same at 10 % load: the turn-off swing (about 0.4 µs) runs well past the 100 ns dead time,
// and the switch's channel carries at most its current as the gate turns off (the engine had
// held the winding's current at the swing's end there, 11 % above ngspice's peak).
const HIGH_INPUT_LIGHT = scenario(
  forwardHighInputSpec('active-clamp-forward', { loadFractions: [0.1, 1] }),
);
/** A 36–72 V, single 12 V output, no-leakage spec as `test/bench/ngspice-scan.ts` draws it. */
function scanSpec(loadA: number, switchingFrequencyHz: number, lightLoad: number): Spec {
  return scanDrawnSpec(
    'active-clamp-forward',
    [36, 48, 72],
    [[12, loadA]],
    switchingFrequencyHz,
    lightLoad,
    0,
  );
}
// Invented by the scan (seed 7, spec 3 of the five topologies; seed 11, spec 5 of the active clamp
// alone): with a 1 Ω resistor in series with the drain capacitance ngspice stalled on both at the
// lowest input ("timestep too small" at a switching edge).
const SCAN_SEED_7 = scenario(scanSpec(5.223392009735107, 278463.7987613678, 0.129));
const SCAN_SEED_11 = scenario(scanSpec(5.570995569229126, 115727.5915145874, 0.2));

/**
 * Invented by the scan (seed 2, spec 6 of the active clamp alone): 18–36 V, a 12 V output of
 * 7.7 A at 164 kHz, 1 µH of leakage, with the duty cycle target raised to 0.5 (at the default
 * 0.45 the leakage's turn-on commutation leaves the output short of 12 V at any turns ratio).
 * With 1 µH the leakage still carries most of the negative magnetizing current as the gate
 * turns on (ngspice: about −3.6 A of Im,v −5.8 A); the engine had taken the commutation from zero
 * and ngspice put its design's output 3.4 % low (6.7 % for its design at the 0.45 target).
 */
const LOW_INPUT_LEAKY = scenario(
  SpecSchema.parse({
    topology: 'active-clamp-forward',
    inputVoltageMinV: 18,
    inputVoltageNominalV: 24,
    inputVoltageMaxV: 36,
    outputs: [
      {
        voltageV: 12,
        currentA: 7.710413455963135,
        capacitanceF: 100e-6,
        rectifier: {
          kind: 'diode',
          forwardVoltageV: 0.5,
          resistanceOhm: 0.01,
          voltageRatingV: 100,
        },
      },
    ],
    switchingFrequencyHz: 163616.32347106934,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 108 },
    loadFractions: [0.14, 1],
    targets: { dutyCycleTarget: 0.5 },
    magnetics: { mode: 'assume' },
    transformer: { leakageInductanceH: 1e-6 },
  }),
);
const LOW_INPUT_LEAKY_CORNER = 'min-input/100pct-load';

const COMPARISONS = [
  { name: '12 V 8 A from 36 V at D = 0.6', s: IDEAL, corner: 'min-input/100pct-load', mode: 'ccm' },
  {
    name: '12 V 0.8 A from 36 V, the dead-time swing past Vin',
    s: IDEAL,
    corner: 'min-input/10pct-load',
    mode: 'ccm',
  },
  {
    name: '12 V 0.8 A from 72 V, light load',
    s: IDEAL,
    corner: 'max-input/10pct-load',
    mode: 'dcm',
  },
  {
    name: '12 V 8 A from 36 V, 0.5 µH leakage',
    s: LEAKY,
    corner: 'min-input/100pct-load',
    mode: 'ccm',
  },
  {
    name: '12 V 5 A from 400 V, the turn-off swing',
    s: HIGH_INPUT,
    corner: 'max-input/100pct-load',
    mode: 'ccm',
    isHardTurnOn: true,
  },
  {
    name: '12 V 2.5 A from 400 V, the turn-off swing',
    s: HIGH_INPUT,
    corner: 'max-input/50pct-load',
    mode: 'ccm',
    isHardTurnOn: true,
  },
  {
    name: '12 V 0.5 A from 400 V, light load',
    s: HIGH_INPUT_LIGHT,
    corner: 'max-input/10pct-load',
    mode: 'dcm',
    isHardTurnOn: true,
  },
  {
    name: '12 V 5.2 A from 36 V at 278 kHz (scan, seed 7)',
    s: SCAN_SEED_7,
    corner: 'min-input/100pct-load',
    mode: 'ccm',
  },
  {
    name: '12 V 5.6 A from 36 V at 116 kHz (scan, seed 11)',
    s: SCAN_SEED_11,
    corner: 'min-input/100pct-load',
    mode: 'ccm',
  },
] as const;

const runs = new Map<(typeof COMPARISONS)[number], Promise<NgspiceRun>>();
let lowInputLeakyRun: Promise<NgspiceRun> | undefined;

beforeAll(async () => {
  for (const c of COMPARISONS) {
    // Each run takes about 15 s alone here.
    runs.set(c, simulate(c.s, c.corner));
  }
  lowInputLeakyRun = simulate(LOW_INPUT_LEAKY, LOW_INPUT_LEAKY_CORNER);
  await Promise.allSettled([...runs.values(), lowInputLeakyRun]);
}, 300_000);

/**
 * Runs the corner's deck as exported (the deck's own largest time step), with no retry: a stall
 * ("timestep too small") fails the case, as it would stop a user running the deck.
 */
function simulate(s: Scenario, cornerLabel: string): Promise<NgspiceRun> {
  return runNgspice(activeClampForwardNetlist(s.spec, s.design, { cornerLabel }), {
    timeoutMs: 240_000,
    expect: ['clamp_voltage_average_v'],
  });
}

function cornerOf(s: Scenario, label: string): ActiveClampForwardCorner {
  const corner = s.design.corners.find((c) => c.label === label);
  if (corner === undefined) throw new Error(`no corner ${label}`);
  return corner;
}

/**
 * ngspice's settled output, switch peaks and clamp voltage against the engine's corner.
 * ref: ngspice (Debian package), the same design simulated as a switched circuit; the issue's
 * agreement targets are 2 % on output voltage and 5 % on switch peaks; the clamp voltage follows
 * volt-second balance on Lm, so it is held to the output's 2 %.
 */
function expectOutputPeaksClampClose(
  m: NgspiceRun['measures'],
  corner: ActiveClampForwardCorner,
): void {
  const outputV = settledOutputV(m, 1);
  expectClose(outputV, corner.outputs[0]?.voltageV ?? NaN, { rel: 0.02 });
  expectSwitchPeaksClose(m, corner.switches[0]);
  expectClose(m.clamp_voltage_average_v ?? NaN, average(corner.waveforms.clampCapacitorVoltageV), {
    rel: 0.02,
  });
}

describe('activeClampForwardNetlist', () => {
  it('designNetlist(spec, design) gives the active-clamp netlist for an active-clamp design', () => {
    const options = { cornerLabel: 'nominal-input/50pct-load' };
    expect(designNetlist(IDEAL.spec, IDEAL.design, options)).toBe(
      activeClampForwardNetlist(IDEAL.spec, IDEAL.design, options),
    );
  });

  it('activeClampForwardNetlist(spec, design) holds both switches, the clamp and no NaN', () => {
    const text = activeClampForwardNetlist(IDEAL.spec, IDEAL.design);
    for (const element of ['Smain b s1 gate 0', 'Saux x1 x gateaux 0', 'Daux x1 x body']) {
      expect(text).toContain(element);
    }
    expect(text).toMatch(/^Cclamp xc in \S+ IC=\S+$/m);
    expect(text).not.toMatch(/NaN|Infinity|undefined/);
  });

  it('activeClampForwardNetlist(spec, design, { cornerLabel }) throws RangeError for an unknown corner', () => {
    expect(() =>
      activeClampForwardNetlist(IDEAL.spec, IDEAL.design, { cornerLabel: 'none' }),
    ).toThrow(RangeError);
  });

  it('ngspice agrees with the engine on 12 V 7.7 A from 18 V with 1 µH leakage: output, switch peaks, clamp', async () => {
    const corner = cornerOf(LOW_INPUT_LEAKY, LOW_INPUT_LEAKY_CORNER);
    expect(corner.outputInductorModes[0]).toBe('ccm');
    const m = (await (lowInputLeakyRun as Promise<NgspiceRun>)).measures;
    // ref: ngspice (Debian package): output 2 %, switch peaks 5 %, clamp 2 % (with the
    // commutation taken from zero the engine's design here had the output 3.4 % off).
    expectOutputPeaksClampClose(m, corner);
    // ref: ngspice (Debian package): the magnetizing valley within 5 % as in the other cases
    // (2.4 % now; 7 % deeper in the engine while the turn-off commutation left out the clamp
    // loop's resistive drop).
    expectClose(
      m.magnetizing_current_valley_a ?? NaN,
      corner.activeClamp.magnetizingCurrentValleyA,
      { rel: 0.05 },
    );
  });

  for (const c of COMPARISONS) {
    it(`ngspice agrees with the engine on ${c.name} (${c.mode}): output, switch peaks, clamp`, async () => {
      const corner = cornerOf(c.s, c.corner);
      expect(corner.outputInductorModes[0]).toBe(c.mode);
      const run = await (runs.get(c) as Promise<NgspiceRun>);
      const m = run.measures;
      // ref: ngspice (Debian package): output 2 %, switch peaks 5 %, clamp 2 %
      expectOutputPeaksClampClose(m, corner);
      // ref: ngspice (Debian package): the magnetizing current swings negative by about the
      // engine's valley (charge balance on the clamp capacitor); 5 % as for the switch current.
      // At 400 V the auxiliary switch turns on hard (the dead time ends before the drain reaches
      // the clamp) and the charge it gives the switch node lifts the valley: without that the
      // deck's valley was 15 % (full load) and 39 % (half load) shallower than the engine's.
      expectClose(
        m.magnetizing_current_valley_a ?? NaN,
        corner.activeClamp.magnetizingCurrentValleyA,
        { rel: 0.05 },
      );
      // ref: ngspice (Debian package) for the drain voltage as the auxiliary gate turns on, and
      // common practice for the loss: a capacitance charged from a stiff source through a switch
      // loses half the energy it takes, ½·C·ΔV² a period with ΔV = Vin + Vc − v(drain) (the
      // switch node's C = Coss,main + Coss,aux); 10 % on the loss is 5 % on ΔV, as for the peaks
      const auxiliaryLoss = corner.losses.find(
        (l) => l.component === 'auxiliary-switch' && l.mechanism === 'output-capacitance',
      );
      const deckStepV = Math.max(
        0,
        corner.inputVoltageV +
          (m.clamp_voltage_average_v ?? NaN) -
          (m.drain_voltage_at_auxiliary_gate_v ?? NaN),
      );
      const nodeF =
        c.s.spec.primarySwitch.outputCapacitanceF +
        (c.s.spec.activeClamp?.auxiliarySwitch ?? c.s.spec.primarySwitch).outputCapacitanceF;
      const deckLossW = 0.5 * nodeF * deckStepV ** 2 * c.s.spec.switchingFrequencyHz;
      if ('isHardTurnOn' in c) {
        expect(deckStepV).toBeGreaterThan(0.1 * corner.inputVoltageV);
        expectClose(auxiliaryLoss?.powerW ?? NaN, deckLossW, { rel: 0.1 });
      } else {
        // The drain reaches the clamp within the dead time: a zero-voltage turn-on in both.
        expect(deckStepV).toBeLessThan(0.02 * corner.inputVoltageV);
        expect(auxiliaryLoss?.powerW).toBe(0);
      }
    });
  }
});
