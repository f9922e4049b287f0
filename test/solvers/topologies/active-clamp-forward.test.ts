import { describe, expect, it } from 'vitest';
import { designConverter } from '../../../solvers/design/design-converter.js';
import type { ActiveClampForwardDesign } from '../../../solvers/design/design-schema.js';
import type { Issue } from '../../../solvers/result.js';
import type { Spec } from '../../../solvers/spec/spec-schema.js';
import { average } from '../../../solvers/waveform/average.js';
import { minimum } from '../../../solvers/waveform/minimum.js';
import { peak } from '../../../solvers/waveform/peak.js';
import { expectClose } from '../../helpers/expect-close.js';
import {
  activeClampLosslessSpec,
  activeClampTelecomSpec,
} from '../../helpers/active-clamp-specs.js';

function designed(spec: Spec): ActiveClampForwardDesign {
  const result = designConverter(spec);
  if (!result.ok) throw new Error(JSON.stringify(result.issues));
  if (result.value.topology !== 'active-clamp-forward') throw new Error('not an active clamp');
  return result.value;
}

function issuesOf(spec: Spec): Issue[] {
  const result = designConverter(spec);
  if (result.ok) throw new Error('expected the spec to be infeasible');
  return result.issues;
}

const PERIOD_S = 5e-6;

describe('activeClampForward (lossless)', () => {
  const design = designed(activeClampLosslessSpec());
  const { choices } = design;

  it('designConverter(lossless) gives Vo = D·Vin/n at every continuous-conduction corner', () => {
    for (const corner of design.corners) {
      if (corner.outputInductorModes[0] !== 'ccm') continue;
      // ref: Mohan, Undeland, Robbins, 3rd ed., §10-4-1 (from memory): Vo/Vin = D·Ns/Np
      expectClose(12, (corner.dutyCycle * corner.inputVoltageV) / choices.turnsRatio, {
        rel: 1e-9,
      });
    }
  });

  it('chooses the turns ratio for the target duty cycle 0.6, above the 0.5 of a diode reset', () => {
    // ref: Mohan, Undeland, Robbins, 3rd ed., §10-4-1 (from memory): n = D·Vin/Vo, lossless
    expectClose(choices.turnsRatio, (0.6 * 36) / 12, { rel: 1e-9 });
    const lowest = design.corners.find((c) => c.label === 'min-input/100pct-load');
    // ref: common practice, an active clamp resets the core at Vin·D/(1 − D), which grows with
    // D, so the duty cycle may exceed 0.5 (a clamp-diode forward's limit)
    expect(lowest?.dutyCycle ?? NaN).toBeGreaterThan(0.5);
    expectClose(lowest?.dutyCycle ?? NaN, 0.6, { rel: 1e-9 });
  });

  it('holds the clamp capacitor at Vc = Vin·D/(1 − D) and resets over the whole off-time', () => {
    for (const corner of design.corners) {
      const d = corner.dutyCycle;
      // ref: Erickson & Maksimović, 2nd ed., §2.2 (from memory): volt-second balance on Lm with
      // the high-side clamp across the winding, Vin·D·T = Vc·(1 − D)·T
      expectClose(corner.activeClamp.capacitorVoltageV, (corner.inputVoltageV * d) / (1 - d), {
        rel: 1e-9,
      });
      expectClose(corner.resetDutyCycle, 1 - d, { rel: 1e-9 });
    }
  });

  it('swings the magnetizing current symmetrically about zero by Vin·D·T/Lm', () => {
    for (const corner of design.corners) {
      const swingA =
        (corner.inputVoltageV * corner.dutyCycle * PERIOD_S) / choices.magnetizingInductanceH;
      // ref: Erickson & Maksimović, 2nd ed., §2.2 and §2.3 (from memory): ΔIm = Vin·D·T/Lm, and
      // charge balance on the clamp capacitor (it carries Im through the whole reset) centres it
      expectClose(corner.magnetizingCurrentPeakA, swingA / 2, { rel: 1e-9 });
      expectClose(corner.activeClamp.magnetizingCurrentValleyA, -swingA / 2, { rel: 1e-9 });
      expectClose(average(corner.waveforms.magnetizingCurrentA), 0, { abs: 1e-9 * swingA });
    }
  });

  it('gives the clamp capacitor a ripple of ΔIm·(1 − D)·T/(8·Cc), 0.05 of Vc at the highest input', () => {
    for (const corner of design.corners) {
      const swingA = 2 * corner.magnetizingCurrentPeakA;
      const expectedV =
        (swingA * (1 - corner.dutyCycle) * PERIOD_S) / (8 * choices.clampCapacitanceF);
      // ref: Erickson & Maksimović, 2nd ed., §2.5 (from memory): the charge of the positive half
      // of a symmetric triangular current, (ΔI/2)·(t/2)/2, over the capacitance
      expectClose(corner.activeClamp.capacitorRippleVoltagePeakToPeakV, expectedV, { rel: 1e-9 });
    }
    const highest = design.corners.find((c) => c.label === 'max-input/100pct-load');
    // ref: common practice (from memory), a clamp ripple of a few percent of Vc
    expectClose(
      (highest?.activeClamp.capacitorRippleVoltagePeakToPeakV ?? NaN) /
        (highest?.activeClamp.capacitorVoltageV ?? NaN),
      0.05,
      { rel: 1e-9 },
    );
  });

  it('chooses Lm for a magnetizing swing of 0.1 of the reflected load and L for 0.3·Io ripple', () => {
    const lowest = design.corners.find((c) => c.label === 'min-input/100pct-load');
    // ref: common practice, a forward's magnetizing current is a small fraction of the load
    expectClose(2 * (lowest?.magnetizingCurrentPeakA ?? NaN), (0.1 * 8) / choices.turnsRatio, {
      rel: 1e-9,
    });
    const highest = design.corners.find((c) => c.label === 'max-input/100pct-load');
    // ref: common practice, output inductor ripple of about 30 % of the full-load current
    expectClose(highest?.outputInductorCurrentRipplesA[0] ?? NaN, 0.3 * 8, { rel: 1e-9 });
  });

  it('gives an output ripple of ΔIL·T/(8·C) in continuous conduction with no ESR', () => {
    for (const corner of design.corners) {
      if (corner.outputInductorModes[0] !== 'ccm') continue;
      const rippleA = corner.outputInductorCurrentRipplesA[0] ?? NaN;
      // ref: Erickson & Maksimović, 2nd ed., §2.5 (from memory): buck output ripple ΔI·T/(8C)
      expectClose(
        corner.outputs[0]?.rippleVoltagePeakToPeakV ?? NaN,
        (rippleA * PERIOD_S) / (8 * 470e-6),
        {
          rel: 1e-6,
        },
      );
    }
  });

  it('draws no input current during the off-time: the clamp loop closes at the input rail', () => {
    for (const corner of design.corners) {
      const switchA = corner.waveforms.primaryCurrentA;
      // ref: common practice, energy balance of the lossless converter: Vin·mean(i_in) = Po
      expectClose(
        corner.inputVoltageV * average(switchA),
        12 * (corner.outputs[0]?.currentA ?? NaN),
        {
          rel: 1e-6,
        },
      );
    }
  });
});

describe('activeClampForward (switch stress)', () => {
  // A clamp capacitance so large that its ripple vanishes: the stresses are the textbook ones.
  const design = designed(
    activeClampLosslessSpec({ activeClamp: { capacitanceF: 1, capacitorEsrOhm: 0, deadTimeS: 0 } }),
  );

  it('puts Vin/(1 − D) on the main and the auxiliary switch', () => {
    for (const corner of design.corners) {
      const stressV = corner.inputVoltageV / (1 - corner.dutyCycle);
      // ref: common practice (from memory): an active-clamp forward's switches block
      // Vin + Vc = Vin/(1 − D), lowest at D = 0.5 for a given Vin
      expectClose(corner.switches[0]?.voltagePeakV ?? NaN, stressV, { rel: 1e-6 });
      expectClose(corner.activeClamp.auxiliarySwitch.voltagePeakV, stressV, { rel: 1e-6 });
      expectClose(
        minimum(corner.waveforms.clampCapacitorVoltageV),
        stressV - corner.inputVoltageV,
        {
          rel: 1e-6,
        },
      );
    }
  });

  it('reads the main switch peak current as Im,pk plus the reflected inductor peak', () => {
    for (const corner of design.corners) {
      // ref: Mohan, Undeland, Robbins, 3rd ed., §10-4 (from memory): the forward's switch
      // carries the reflected output inductor current plus the magnetizing current
      expectClose(
        corner.switches[0]?.currentPeakA ?? NaN,
        corner.magnetizingCurrentPeakA +
          peak(corner.waveforms.outputInductorCurrentsA[0] ?? corner.waveforms.primaryCurrentA) /
            design.choices.turnsRatio,
        { rel: 1e-9 },
      );
    }
  });
});

describe('activeClampForward (limits)', () => {
  it('refuses a duty cycle target above limits.dutyCycleMax with both numbers', () => {
    const issues = issuesOf(activeClampTelecomSpec({ targets: { dutyCycleTarget: 0.7 } }));
    // ref: common practice, the controller's maximum duty cycle bounds the target
    expect(issues[0]?.code).toBe('duty_cycle_limit');
    expectClose(issues[0]?.required ?? NaN, 0.7, { rel: 0 });
    expectClose(issues[0]?.limit ?? NaN, 0.65, { rel: 0 });
  });

  it('refuses a fixed turns ratio that needs more than limits.dutyCycleMax at the lowest input', () => {
    const issues = issuesOf(activeClampTelecomSpec({ transformer: { turnsRatio: 2.2 } }));
    const duty = issues.find(
      (i) => i.code === 'duty_cycle_limit' && i.corner === 'min-input/100pct-load',
    );
    expect(duty?.path).toEqual(['transformer', 'turnsRatio']);
    expectClose(duty?.limit ?? NaN, 0.65, { rel: 0 });
    // ref: Mohan, Undeland, Robbins, 3rd ed., §10-4-1 (from memory): D ≈ n·(Vo + Vf)/Vin, and
    // the drops only raise it
    expect(duty?.required ?? NaN).toBeGreaterThan((2.2 * 12.5) / 36);
  });

  it('refuses a 100 V switch at 72 V in, naming the peak about Vin/(1 − D) against 0.9 of the rating', () => {
    const issues = issuesOf(
      activeClampTelecomSpec({ primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 100 } }),
    );
    const rating = issues.find(
      (i) => i.code === 'switch_voltage_rating' && i.corner === 'max-input/100pct-load',
    );
    expect(rating?.path).toEqual(['primarySwitch', 'voltageRatingV']);
    expectClose(rating?.limit ?? NaN, 90, { rel: 1e-12 });
    // ref: common practice (from memory): switch stress Vin/(1 − D), D ≈ n·(Vo + Vf)/Vin at the
    // highest input, plus the clamp ripple and drops; bounded loosely from both sides
    const design = designed(activeClampTelecomSpec());
    const n = design.choices.turnsRatio;
    const losslessV = 72 / (1 - (n * 12.5) / 72);
    expect(rating?.required ?? NaN).toBeGreaterThan(losslessV);
    expect(rating?.required ?? NaN).toBeLessThan(1.15 * losslessV);
  });

  it('refuses its own auxiliary switch when its rating is too low, on its own path', () => {
    const issues = issuesOf(
      activeClampTelecomSpec({
        activeClamp: { auxiliarySwitch: { onResistanceOhm: 0.1, voltageRatingV: 80 } },
      }),
    );
    const rating = issues.find(
      (i) => i.path.join('.') === 'activeClamp.auxiliarySwitch.voltageRatingV',
    );
    // ref: common practice: the auxiliary switch blocks Vin + Vc = Vin/(1 − D) while the main is on
    expect(rating?.code).toBe('switch_voltage_rating');
    expectClose(rating?.limit ?? NaN, 72, { rel: 1e-12 });
    expect(rating?.required ?? NaN).toBeGreaterThan(72);
  });

  it('refuses a 30 V rectifier that must block Vc/n + Vo at the highest input', () => {
    const base = activeClampTelecomSpec();
    const issues = issuesOf(
      activeClampTelecomSpec({
        outputs: [
          {
            ...base.outputs[0],
            voltageV: 12,
            currentA: 8,
            rectifier: {
              kind: 'diode',
              forwardVoltageV: 0.5,
              resistanceOhm: 0.01,
              voltageRatingV: 30,
            },
          },
        ],
      }),
    );
    const rating = issues.find(
      (i) => i.code === 'rectifier_voltage_rating' && i.corner === 'max-input/100pct-load',
    );
    expect(rating?.path).toEqual(['outputs', 0, 'rectifier', 'voltageRatingV']);
    expectClose(rating?.limit ?? NaN, 27, { rel: 1e-12 });
    // ref: common practice (from memory): the forward rectifier blocks the reset voltage
    // Vin·D/(1 − D) over n plus the output voltage, so more than Vo
    expect(rating?.required ?? NaN).toBeGreaterThan(27);
  });
});
