import { beforeAll, describe, expect, it } from 'vitest';
import {
  designConverter,
  designNetlist,
  twoSwitchForwardNetlist,
  type ForwardCorner,
  type ForwardDesign,
  type ResetWindingForwardDesign,
  type Spec,
} from '../../../solvers/index.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import {
  forwardBusSpec,
  forward400VComparisonSpec,
  forwardTelecomSpec,
  resetWindingSpec,
  threeOutputHighInputSpec,
} from '../../helpers/forward-specs.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { valueAt } from '../../../solvers/waveform/value-at.js';
import { settledOutputV } from '../../helpers/settled-average.js';

interface Scenario {
  spec: Spec;
  design: ForwardDesign | ResetWindingForwardDesign;
}

function scenario(spec: Spec): Scenario {
  const result = designConverter(spec);
  if (!result.ok) throw new Error(`invented scenario infeasible: ${JSON.stringify(result.issues)}`);
  if (
    result.value.topology !== 'two-switch-forward' &&
    result.value.topology !== 'forward-reset-winding'
  ) {
    throw new Error('not a forward design');
  }
  return { spec, design: result.value };
}

// Invented scenarios: ideally coupled, and one with 1 µH of leakage (its turn-on commutation and
// its share of the on-voltage are in the engine's steady state).
const TELECOM = scenario(forwardTelecomSpec({ transformer: { leakageInductanceH: 0 } }));
const LEAKY = scenario(forwardTelecomSpec({ transformer: { leakageInductanceH: 1e-6 } }));
// The bus case keeps the spec's transformer (magnetics 'assume') like the telecom ones: with the
// wound core's Lm (several mH) the ring after reset outgrows the residue bound used below.
const BUS = scenario(
  forwardBusSpec({
    transformer: { primaryResistanceOhm: 0.3, leakageInductanceH: 0 },
    magnetics: { mode: 'assume' },
  }),
);

const RESET_WINDING = scenario(
  resetWindingSpec(0.8, {
    transformer: { leakageInductanceH: 0 },
    targets: { dutyCycleTarget: 0.5 },
  }),
);

// The reset winding with 1 µH of leakage: the deck winds the reset winding with the primary
// (ideally coupled to it, as the engine takes it). Before 2026-12-04 the deck coupled it to the
// magnetizing branch, behind the leakage: the leakage current at turn-off then had no path but
// the drain capacitance, and the drain rose to 4–9 times the engine's peak (random scan seed 21,
// specs 4 and 10: +434 % and +862 % at full load; DEVELOPERS.md).
const RESET_WINDING_LEAKY = scenario(
  resetWindingSpec(0.8, {
    transformer: { leakageInductanceH: 1e-6 },
    targets: { dutyCycleTarget: 0.5 },
  }),
);

const COMPARISONS = [
  {
    name: '12 V 8 A from 36 V, full load',
    s: TELECOM,
    corner: 'min-input/100pct-load',
    mode: 'ccm',
  },
  {
    name: '12 V 0.8 A from 72 V, light load',
    s: TELECOM,
    corner: 'max-input/10pct-load',
    mode: 'dcm',
  },
  { name: '24 V 10 A from a 400 V bus', s: BUS, corner: 'nominal-input/100pct-load', mode: 'ccm' },
  {
    name: '12 V 8 A from 36 V, 1 µH leakage',
    s: LEAKY,
    corner: 'min-input/100pct-load',
    mode: 'ccm',
  },
  {
    name: '12 V 0.8 A from 72 V, 1 µH leakage',
    s: LEAKY,
    corner: 'max-input/10pct-load',
    mode: 'dcm',
  },
  {
    name: 'reset winding Nr/Np 0.8, 12 V 8 A from 36 V',
    s: RESET_WINDING,
    corner: 'min-input/100pct-load',
    mode: 'ccm',
  },
  {
    name: 'reset winding Nr/Np 0.8, 12 V 0.8 A from 72 V',
    s: RESET_WINDING,
    corner: 'max-input/10pct-load',
    mode: 'dcm',
  },
  {
    name: 'reset winding Nr/Np 0.8, 12 V 8 A from 36 V, 1 µH leakage',
    s: RESET_WINDING_LEAKY,
    corner: 'min-input/100pct-load',
    mode: 'ccm',
  },
] as const;

// At 400 V, 12 V 3–4 A and 250 kHz the drain's swing at turn-off (100 pF each switch, in series)
// adds about 2 % (full load) and 3 % (half load) to the output when left out. The converter's own
// Lm (a magnetizing peak of 0.1 of the reflected current at the lowest input) leaves the node
// ringing short of the clamp at 400 V: the engine's ring of Lm with the drain capacitance
// (magnetizing-ring.ts) gives the peak and the negative magnetizing current at turn-on.
const highInputSpec = (
  topology: 'two-switch-forward' | 'forward-reset-winding',
  currentA: number,
): Spec => forward400VComparisonSpec(topology, currentA);
const HIGH_INPUT = scenario(highInputSpec('two-switch-forward', 3));
const HIGH_INPUT_RESET = scenario(highInputSpec('forward-reset-winding', 4));

const HIGH_INPUT_COMPARISONS = [
  { name: '12 V 3 A from 400 V', s: HIGH_INPUT, corner: 'max-input/100pct-load' },
  { name: '12 V 1.5 A from 400 V', s: HIGH_INPUT, corner: 'max-input/50pct-load' },
  {
    name: 'reset winding, 12 V 4 A from 400 V',
    s: HIGH_INPUT_RESET,
    corner: 'max-input/100pct-load',
  },
  {
    name: 'reset winding, 12 V 4 A from 200 V',
    s: HIGH_INPUT_RESET,
    corner: 'min-input/100pct-load',
  },
] as const;

// Three outputs at 400 V and full load (12 V 5 A, 5 V 2 A, 24 V 0.5 A): the reset winding's deck
// stopped here with "timestep too small" at the reset node before the deck's abstol of 1 nA.
const THREE_OUTPUTS = scenario(threeOutputHighInputSpec('forward-reset-winding'));
const THREE_OUTPUT_CORNER = 'max-input/100pct-load';

const runs = new Map<(typeof COMPARISONS)[number], Promise<NgspiceRun>>();
const highInputRuns = new Map<(typeof HIGH_INPUT_COMPARISONS)[number], Promise<NgspiceRun>>();
let threeOutputRun: Promise<NgspiceRun> | undefined;

beforeAll(async () => {
  for (const c of COMPARISONS) {
    const netlist = twoSwitchForwardNetlist(c.s.spec, c.s.design, { cornerLabel: c.corner });
    // The leaky full-load case takes about 40 s alone (the leakage ring at every edge); others ~6 s.
    runs.set(c, runNgspice(netlist, { timeoutMs: 240_000, expect: ['magnetizing_current_end_a'] }));
  }
  for (const c of HIGH_INPUT_COMPARISONS) {
    const netlist = twoSwitchForwardNetlist(c.s.spec, c.s.design, { cornerLabel: c.corner });
    highInputRuns.set(
      c,
      runNgspice(netlist, { timeoutMs: 240_000, expect: ['magnetizing_current_end_a'] }),
    );
  }
  threeOutputRun = runNgspice(
    twoSwitchForwardNetlist(THREE_OUTPUTS.spec, THREE_OUTPUTS.design, {
      cornerLabel: THREE_OUTPUT_CORNER,
    }),
    { timeoutMs: 240_000 },
  );
  await Promise.allSettled([...runs.values(), ...highInputRuns.values(), threeOutputRun]);
}, 300_000);

function cornerOf(s: Scenario, label: string): ForwardCorner {
  const corner = s.design.corners.find((c) => c.label === label);
  if (corner === undefined) throw new Error(`no corner ${label}`);
  return corner;
}

/**
 * The agreement targets against ngspice (Debian package), the same design simulated as
 * a switched circuit: 2 % on the settled output voltage, 5 % on the switch current and voltage
 * peaks.
 */
function expectAgreesOnOutputAndSwitchPeaks(
  m: NgspiceRun['measures'],
  corner: ForwardCorner,
): void {
  const outputV = settledOutputV(
    m,
    1,
    // The deck starts Lm at the engine's turn-on current; where the node rings short of the
    // clamp a mismatch alternates period by period, damped only by the resistances, and the
    // windows wobble by up to 3e-4 of the output (far inside the 2 % compared).
    { settledRel: 5e-4 },
  );
  // ref: ngspice (Debian package), the same design simulated as a switched circuit
  expectClose(outputV, corner.outputs[0]?.voltageV ?? NaN, { rel: 0.02 });
  expectSwitchPeaksClose(m, corner.switches[0]);
}

describe('twoSwitchForwardNetlist', () => {
  it('designNetlist(spec, design) gives the two-switch forward netlist for a forward design', () => {
    const options = { cornerLabel: 'nominal-input/50pct-load' };
    expect(designNetlist(TELECOM.spec, TELECOM.design, options)).toBe(
      twoSwitchForwardNetlist(TELECOM.spec, TELECOM.design, options),
    );
  });

  it('twoSwitchForwardNetlist(spec, design) holds both switches, both clamp diodes and no NaN', () => {
    const text = twoSwitchForwardNetlist(TELECOM.spec, TELECOM.design);
    for (const element of [
      'Shigh d1 a gate 0',
      'Slow b s2 gate 0',
      'Dclamp1 0 k1',
      'Dclamp2 b k2',
    ]) {
      expect(text).toContain(element);
    }
    expect(text).toMatch(/^Lm pm b \S+ IC=\S+$/m);
    expect(text).not.toMatch(/NaN|Infinity|undefined/);
  });

  it('twoSwitchForwardNetlist(spec, design, { cornerLabel }) throws RangeError for an unknown corner', () => {
    expect(() =>
      twoSwitchForwardNetlist(TELECOM.spec, TELECOM.design, { cornerLabel: 'none' }),
    ).toThrow(RangeError);
  });

  for (const c of COMPARISONS) {
    it(`ngspice agrees with the engine on ${c.name} (${c.mode}): output voltage, switch peaks, reset`, async () => {
      const corner = cornerOf(c.s, c.corner);
      expect(corner.outputInductorModes[0]).toBe(c.mode);
      const run = await (runs.get(c) as Promise<NgspiceRun>);
      const m = run.measures;
      expectAgreesOnOutputAndSwitchPeaks(m, corner);
      // ref: ngspice (Debian package): the magnetizing current returns to zero before the next
      // turn-on, up to the ring of Lm with the capacitances the engine leaves out once the reset
      // diodes stop: its residue is at most Vr·√(C/Lm) (common practice, LC ring amplitude), with
      // the reset voltage Vr (Vin + 2·0.8 V, or (Vin + 0.8 V)·Np/Nr) and C bounded by one switch
      // capacitance plus both rectifier snubbers (100 pF at most) referred to the primary
      const { choices } = c.s.design;
      const resetV =
        'resetTurnsRatio' in choices
          ? (corner.inputVoltageV + 0.8) / choices.resetTurnsRatio
          : corner.inputVoltageV + 1.6;
      const ringC =
        c.s.spec.primarySwitch.outputCapacitanceF + (2 * 100e-12) / choices.turnsRatio ** 2;
      const residueA = resetV * Math.sqrt(ringC / choices.magnetizingInductanceH);
      expect(Math.abs(m.magnetizing_current_end_a ?? NaN)).toBeLessThan(residueA);
      expect(residueA).toBeLessThan(0.25 * corner.magnetizingCurrentPeakA);
    });
  }

  for (const c of HIGH_INPUT_COMPARISONS) {
    it(`ngspice agrees with the engine on ${c.name}, the turn-off swing and the magnetizing ring: output voltage, switch peaks, magnetizing start`, async () => {
      const corner = cornerOf(c.s, c.corner);
      expect(corner.outputInductorModes[0]).toBe('ccm');
      const m = (await (highInputRuns.get(c) as Promise<NgspiceRun>)).measures;
      expectAgreesOnOutputAndSwitchPeaks(m, corner);
      // ref: ngspice (Debian package): the magnetizing current just before the next turn-on, the
      // start the ring leaves (negative), within 10 % of the magnetizing peak-to-peak ramp.
      const startA = valueAt(corner.waveforms.magnetizingCurrentA, 0);
      expect(startA).toBeLessThan(0);
      expect(Math.abs((m.magnetizing_current_end_a ?? NaN) - startA)).toBeLessThan(
        0.1 * (corner.magnetizingCurrentPeakA - startA),
      );
    });
  }

  it('ngspice agrees with the engine on a reset winding with three outputs from 400 V at full load: every output, switch peaks', async () => {
    const corner = cornerOf(THREE_OUTPUTS, THREE_OUTPUT_CORNER);
    const m = (await (threeOutputRun as Promise<NgspiceRun>)).measures;
    expectAgreesOnOutputAndSwitchPeaks(m, corner);
    corner.outputs.forEach((output, k) => {
      const outputV = settledOutputV(m, k + 1);
      // ref: ngspice (Debian package), the same design simulated as a switched circuit; the
      // issue's agreement target is 2 % on every output voltage
      expectClose(outputV, output.voltageV, { rel: 0.02 });
    });
  });
});
