import { describe, expect, it } from 'vitest';
import { copperResistance } from '../../../../solvers/materials/copper-resistance.js';
import { chooseFlyback } from '../../../../solvers/topologies/flyback/flyback-choices.js';
import { average } from '../../../../solvers/waveform/average.js';
import { peakToPeak } from '../../../../solvers/waveform/peak-to-peak.js';
import { cornerAt, solveFlyback } from '../../../helpers/flyback-corners.js';
import { expectClose } from '../../../helpers/expect-close.js';
import { losslessSpec, telecomSpec } from '../../../helpers/flyback-specs.js';

describe('chooseFlyback', () => {
  it('chooses n so that the lowest input at full load needs exactly the target duty cycle', () => {
    const { corners } = solveFlyback(telecomSpec());
    // ref: spec contract, targets.dutyCycleTarget "at the lowest input and full load"
    expectClose(cornerAt(corners, 'min-input/100pct-load').dutyCycle, 0.45, { rel: 1e-9 });
  });

  it('chooses the loss-inclusive n of the averaged equivalent circuit (no leakage)', () => {
    const spec = telecomSpec({
      transformer: { leakageInductanceH: 0, primaryResistanceOhm: 0.06 },
      // The averaged equivalent circuit's ideal switch: no drain capacitance to ring or rise.
      primarySwitch: { onResistanceOhm: 0.05, voltageRatingV: 200, outputCapacitanceF: 0 },
    });
    const chosen = chooseFlyback(spec);
    if (!chosen.ok) throw new Error('choose failed');
    // D·(Vin − Im·Rp) = (1 − D)·n·(V + n·Im·Rs), Im = Io/(n(1 − D)), as a quadratic in n:
    // [(1 − D)·V + Rs·Io]·n² − D·Vin·n + D·Io·Rp/(1 − D) = 0; the larger root is the design.
    const d = 0.45;
    const rp = 0.05 + copperResistance(0.06, 25);
    // The output capacitor's ESR (0.02 Ω by default) carries is − Io: it adds to Rs and takes
    // ESR·Io off V.
    const rs = 0.02 + copperResistance(0.006, 25) + 0.02;
    const a = (1 - d) * (12.45 - 0.02 * 2) + rs * 2;
    const b = -d * 36;
    const c = (d * 2 * rp) / (1 - d);
    // ref: Erickson & Maksimović, 2nd ed. (from memory), §3.3 and §6.3.4, loss-inclusive flyback
    // model
    expectClose(chosen.value.turnsRatio, (-b + Math.sqrt(b * b - 4 * a * c)) / (2 * a), {
      rel: 1e-9,
    });
  });

  it('chooses Lm so that the magnetizing ripple over its average at the lowest input is the target', () => {
    const { corners } = solveFlyback(telecomSpec());
    const im = cornerAt(corners, 'min-input/100pct-load').waveforms.magnetizingCurrentA;
    // ref: spec contract, targets.magnetizingRippleRatioTarget, ΔIm/Im at the lowest input
    expectClose(peakToPeak(im) / average(im), 0.6, { rel: 1e-8 });
  });

  it('chooses the lossless n and Lm of the textbook relations when there are no losses', () => {
    const chosen = chooseFlyback(losslessSpec());
    if (!chosen.ok) throw new Error('choose failed');
    const d = 0.45;
    const n = (d * 36) / ((1 - d) * 12);
    // ref: Erickson & Maksimović, 2nd ed. (from memory), §6.3.4, Vo/Vin = D/(n(1 − D))
    expectClose(chosen.value.turnsRatio, n, { rel: 1e-9 });
    // ref: Erickson & Maksimović, 2nd ed. (from memory), §2.2: ΔIm = Vin·D·T/Lm, and Im = Io/(n(1 −
    // D)) by charge balance, so ΔIm/Im = 0.6 gives Lm = Vin·D·T·n·(1 − D)/(0.6·Io)
    expectClose(chosen.value.magnetizingInductanceH, (36 * d * 1e-5 * n * (1 - d)) / (0.6 * 2), {
      rel: 1e-8,
    });
  });

  it('keeps what the spec fixes and records where each choice came from', () => {
    const spec = telecomSpec({
      transformer: {
        turnsRatio: 2.2,
        magnetizingInductanceH: 120e-6,
        leakageInductanceH: 1e-6,
        primaryResistanceOhm: 0.06,
      },
      clamp: { voltageV: 45 },
    });
    const chosen = chooseFlyback(spec);
    if (!chosen.ok) throw new Error('choose failed');
    const { value } = chosen;
    // ref: spec contract, fixed fields are kept as given
    expect([
      value.turnsRatio,
      value.magnetizingInductanceH,
      value.leakageInductanceH,
      value.clampVoltageV,
    ]).toEqual([2.2, 120e-6, 1e-6, 45]);
    // ref: spec contract, origins name the request as the source
    expect(value.origins).toEqual({
      turnsRatio: 'spec',
      magnetizingInductanceH: 'spec',
      leakageInductanceH: 'spec',
      clampVoltageV: 'spec',
    });
    const free = chooseFlyback(telecomSpec());
    if (!free.ok) throw new Error('choose failed');
    // ref: spec contract, leakage and clamp come from default rules, n and Lm from targets
    expect(free.value.origins).toEqual({
      turnsRatio: 'target',
      magnetizingInductanceH: 'target',
      leakageInductanceH: 'default',
      clampVoltageV: 'default',
    });
    // ref: spec contract, leakageInductanceFraction × Lm and voltageToReflectedRatio × Vr
    expectClose(free.value.leakageInductanceH, 0.01 * free.value.magnetizingInductanceH, {
      rel: 1e-12,
    });
    expectClose(free.value.clampVoltageV, 1.5 * free.value.reflectedVoltageV, { rel: 1e-9 });
  });

  it('scales the winding resistances from 20 °C to the ambient by IEC 60028', () => {
    const chosen = chooseFlyback(telecomSpec({ ambientTemperatureC: 85 }));
    if (!chosen.ok) throw new Error('choose failed');
    // ref: IEC 60028, R(T) = R20·(1 + 0.00393·(T − 20))
    expectClose(chosen.value.primaryResistanceOhm, 0.06 * (1 + 0.00393 * 65), { rel: 1e-12 });
    expectClose(chosen.value.outputWindingResistancesOhm[0] ?? NaN, 0.006 * (1 + 0.00393 * 65), {
      rel: 1e-12,
    });
  });

  it('refuses a duty-cycle target above the duty-cycle limit, with both numbers', () => {
    const chosen = chooseFlyback(telecomSpec({ targets: { dutyCycleTarget: 0.7 } }));
    // ref: spec contract, limits.dutyCycleMax is the largest duty cycle the controller commands
    expect(chosen).toEqual({
      ok: false,
      issues: [
        {
          code: 'duty_cycle_limit',
          path: ['targets', 'dutyCycleTarget'],
          constraint: 'dutyCycleTarget <= dutyCycleMax',
          quantity: 'dutyCycle',
          required: 0.7,
          limit: 0.65,
        },
      ],
    });
  });

  it('refuses a leakage inductance at or above the magnetizing inductance', () => {
    const chosen = chooseFlyback(
      telecomSpec({
        transformer: {
          magnetizingInductanceH: 100e-6,
          leakageInductanceH: 150e-6,
          primaryResistanceOhm: 0.06,
        },
      }),
    );
    // ref: common practice, leakage is the part of the primary inductance not coupled: Llk < Lp
    expect(chosen.ok ? [] : chosen.issues.map((issue) => issue.code)).toEqual([
      'non_physical_value',
    ]);
  });
});
