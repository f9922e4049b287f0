import { describe, expect, it } from 'vitest';
import { designConverter } from '../../../solvers/design/design-converter.js';
import type { ForwardDesign } from '../../../solvers/design/design-schema.js';
import type { Issue } from '../../../solvers/result.js';
import type { Spec } from '../../../solvers/spec/spec-schema.js';
import { peak } from '../../../solvers/waveform/peak.js';
import { expectClose } from '../../helpers/expect-close.js';
import {
  forwardBusSpec,
  forwardLosslessSpec,
  forwardTelecomSpec,
} from '../../helpers/forward-specs.js';

function designed(spec: Spec): ForwardDesign {
  const result = designConverter(spec);
  if (!result.ok) throw new Error(JSON.stringify(result.issues));
  if (result.value.topology !== 'two-switch-forward') throw new Error('not a forward design');
  return result.value;
}

function issuesOf(spec: Spec): Issue[] {
  const result = designConverter(spec);
  if (result.ok) throw new Error('expected the spec to be infeasible');
  return result.issues;
}

const PERIOD_S = 1e-5;

describe('twoSwitchForward (lossless)', () => {
  const design = designed(forwardLosslessSpec());
  const { choices } = design;

  it('designConverter(lossless) gives Vo = D·Vin/n at every continuous-conduction corner', () => {
    for (const corner of design.corners) {
      if (corner.outputInductorModes[0] !== 'ccm') continue;
      // ref: Mohan, Undeland, Robbins, 3rd ed., §10-4-1 (from memory): Vo/Vin = D·Ns/Np
      expectClose(12, (corner.dutyCycle * corner.inputVoltageV) / choices.turnsRatio, {
        rel: 1e-6,
      });
    }
  });

  it('chooses the turns ratio so that the lowest input at full load needs the target duty cycle', () => {
    // ref: Mohan, Undeland, Robbins, 3rd ed., §10-4-1 (from memory): n = D·Vin/Vo, lossless
    expectClose(choices.turnsRatio, (0.45 * 36) / 12, { rel: 1e-6 });
  });

  it('resets the core in a time equal to the on-time when the reset voltage is Vin', () => {
    for (const corner of design.corners) {
      // ref: Erickson & Maksimović, 2nd ed., §6.3.2 (from memory): volt-second balance on Lm,
      // Vin·D·T = Vin·Dr·T when the clamp diodes apply −Vin
      expectClose(corner.resetDutyCycle, corner.dutyCycle, { rel: 1e-6 });
      // ref: Erickson & Maksimović, 2nd ed., §6.3.2 (from memory): Im,pk = Vin·D·T/Lm
      expectClose(
        corner.magnetizingCurrentPeakA,
        (corner.inputVoltageV * corner.dutyCycle * PERIOD_S) / choices.magnetizingInductanceH,
        { rel: 1e-6 },
      );
    }
  });

  it('runs the output inductor discontinuous below ΔIL = 2·Io and follows the buck DCM relation', () => {
    const inductanceH = choices.outputInductancesH[0] ?? NaN;
    for (const corner of design.corners) {
      const loadA = corner.outputs[0]?.currentA ?? NaN;
      const secondaryV = corner.inputVoltageV / choices.turnsRatio;
      // CCM ripple at this corner's duty cycle: ΔIL = Vo·(1 − D)·T/L.
      const ccmD = 12 / secondaryV;
      const ccmRippleA = (12 * (1 - ccmD) * PERIOD_S) / inductanceH;
      // ref: Erickson & Maksimović, 2nd ed., §5.1 (from memory): CCM while Io > ΔIL/2
      expect(corner.outputInductorModes[0]).toBe(loadA > ccmRippleA / 2 ? 'ccm' : 'dcm');
      if (corner.outputInductorModes[0] !== 'dcm') continue;
      // ref: Erickson & Maksimović, 2nd ed., eq. 5.26 (from memory): M = 2/(1 + √(1 + 4K/D²)),
      // K = 2L/(R·T), for the buck in DCM
      const k = (2 * inductanceH) / ((12 / loadA) * PERIOD_S);
      const m = 2 / (1 + Math.sqrt(1 + (4 * k) / corner.dutyCycle ** 2));
      expectClose(12 / secondaryV, m, { rel: 1e-6 });
    }
  });

  it('chooses the output inductance for 0.3·Io ripple at the highest input and full load', () => {
    const corner = design.corners.find((c) => c.label === 'max-input/100pct-load');
    // ref: common practice, output inductor ripple of about 30 % of the full-load current
    expectClose(corner?.outputInductorCurrentRipplesA[0] ?? NaN, 0.3 * 8, { rel: 1e-6 });
  });

  it('chooses Lm so that the magnetizing peak is 0.1 of the reflected load at the lowest input', () => {
    const corner = design.corners.find((c) => c.label === 'min-input/100pct-load');
    // ref: common practice, a forward's magnetizing current is a small fraction of the load
    expectClose(corner?.magnetizingCurrentPeakA ?? NaN, (0.1 * 8) / choices.turnsRatio, {
      rel: 1e-6,
    });
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
});

describe('twoSwitchForward (limits)', () => {
  it('holds the duty cycle to 0.5 even when limits.dutyCycleMax allows more', () => {
    // Turns ratio 1.8 needs D ≈ 1.8·12.5/36 ≈ 0.63 at the lowest input.
    const issues = issuesOf(forwardTelecomSpec({ transformer: { turnsRatio: 1.8 } }));
    const duty = issues.find(
      (i) => i.code === 'duty_cycle_limit' && i.corner === 'min-input/100pct-load',
    );
    // ref: common practice, a two-switch forward resets at −Vin, so D cannot exceed 0.5
    expectClose(duty?.limit ?? NaN, 0.5, { rel: 0 });
    expect(duty?.path).toEqual(['transformer', 'turnsRatio']);
    // ref: Mohan, Undeland, Robbins, 3rd ed., §10-4-1 (from memory): D ≈ n·(Vo + Vf)/Vin, and
    // drops and the leakage commutation only raise it
    expect(duty?.required ?? NaN).toBeGreaterThan((1.8 * 12.5) / 36);
    expect(duty?.required ?? NaN).toBeLessThan(0.8);
  });

  it('reports the lower limits.dutyCycleMax as the limit when it is below 0.5', () => {
    const issues = issuesOf(
      forwardTelecomSpec({ transformer: { turnsRatio: 1.8 }, limits: { dutyCycleMax: 0.4 } }),
    );
    const duty = issues.find((i) => i.code === 'duty_cycle_limit');
    // ref: common practice, the lower of the controller's and the topology's limit applies
    expectClose(duty?.limit ?? NaN, 0.4, { rel: 0 });
  });

  it('refuses a duty cycle target above 0.5 when the turns ratio is free', () => {
    const issues = issuesOf(forwardTelecomSpec({ targets: { dutyCycleTarget: 0.55 } }));
    // ref: common practice, a two-switch forward's duty cycle cannot exceed 0.5
    expect(issues[0]?.code).toBe('duty_cycle_limit');
    expectClose(issues[0]?.limit ?? NaN, 0.5, { rel: 0 });
  });

  it('lets each switch block only the input voltage: a 400 V bus fits a 500 V switch', () => {
    const design = designed(forwardBusSpec());
    for (const corner of design.corners) {
      for (const [index, device] of corner.switches.entries()) {
        // ref: common practice, each two-switch forward switch is clamped to Vin (plus one
        // clamp diode drop), so a 400 V bus takes switches rated about 500 V
        expectClose(device.voltagePeakV, corner.inputVoltageV + 0.8, { rel: 1e-12 });
        expectClose(
          peak(corner.waveforms.switchVoltagesV[index] ?? corner.waveforms.primaryCurrentA),
          device.voltagePeakV,
          { rel: 1e-12 },
        );
      }
    }
    expect(design.corners.every((c) => c.switches.length === 2)).toBe(true);
  });

  it('refuses a 400 V switch on a 420 V bus, naming the switch rating with numbers', () => {
    const issues = issuesOf(
      forwardBusSpec({ primarySwitch: { onResistanceOhm: 0.4, voltageRatingV: 400 } }),
    );
    const rating = issues.find(
      (i) => i.code === 'switch_voltage_rating' && i.corner === 'max-input/100pct-load',
    );
    // ref: common practice, switch peak Vin + Vf against 0.9 of the rating
    expectClose(rating?.required ?? NaN, 420.8, { rel: 1e-12 });
    expectClose(rating?.limit ?? NaN, 360, { rel: 1e-12 });
    expect(rating?.path).toEqual(['primarySwitch', 'voltageRatingV']);
  });
});
