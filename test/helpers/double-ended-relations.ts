import { describe, expect, it } from 'vitest';
import { designConverter } from '../../solvers/design/design-converter.js';
import type { DoubleEndedDesign } from '../../solvers/design/design-schema.js';
import type { Issue } from '../../solvers/result.js';
import type { Spec, SpecInput } from '../../solvers/spec/spec-schema.js';
import { average } from '../../solvers/waveform/average.js';
import { peak } from '../../solvers/waveform/peak.js';
import { expectClose } from './expect-close.js';
import { losslessDoubleEnded } from './double-ended-specs.js';

type Overrides = Partial<Omit<SpecInput, 'topology'>>;

/** Designs `spec`, which must be feasible and double-ended. */
export function designedDoubleEnded(spec: Spec): DoubleEndedDesign {
  const result = designConverter(spec);
  if (!result.ok) throw new Error(JSON.stringify(result.issues));
  const design = result.value;
  if (
    design.topology !== 'push-pull' &&
    design.topology !== 'half-bridge' &&
    design.topology !== 'full-bridge'
  ) {
    throw new Error('not a double-ended design');
  }
  return design;
}

/** The issues of an infeasible `spec`. */
export function issuesOfSpec(spec: Spec): Issue[] {
  const result = designConverter(spec);
  if (result.ok) throw new Error('expected the spec to be infeasible');
  return result.issues;
}

/**
 * The textbook relations every double-ended topology keeps, checked on the lossless version of
 * an invented scenario with each secondary arrangement. `driveFraction` is the winding voltage
 * over the input (1, or ½ for the half bridge).
 */
export function describeDoubleEndedRelations(
  name: string,
  base: (overrides: Overrides) => Spec,
  driveFraction: number,
): void {
  for (const arrangement of ['center-tapped', 'full-bridge'] as const) {
    describe(`${name} (lossless, ${arrangement} secondary)`, () => {
      const spec = losslessDoubleEnded(base, arrangement);
      const design = designedDoubleEnded(spec);
      const { choices } = design;
      const output = spec.outputs[0];
      const vo = output?.voltageV ?? NaN;
      const io = output?.currentA ?? NaN;
      const periodS = 1 / spec.switchingFrequencyHz;
      const drive = (corner: { inputVoltageV: number }) => driveFraction * corner.inputVoltageV;
      const inductanceH = choices.outputInductancesH[0] ?? NaN;
      const n = choices.turnsRatio;
      const lm = choices.magnetizingInductanceH;
      // ref: Mohan, Undeland, Robbins, 3rd ed., §10-5 (from memory): while the secondary
      // freewheels, its rectifiers carry the inductor current plus and minus the magnetizing
      // current referred to the secondary, which they can only while the valley Io − ΔIL/2
      // stays above n·Im,pk; below it one rectifier stops (DEVELOPERS.md, light load)
      const hasSharedFall = (corner: { inputVoltageV: number; loadFraction: number }) => {
        const ccmD = vo / (drive(corner) / n);
        const rippleA = (vo * (1 - ccmD) * periodS) / 2 / inductanceH;
        const magnetizingPeakA = (drive(corner) * (ccmD / 2) * periodS) / (2 * lm);
        return io * corner.loadFraction - rippleA / 2 < n * magnetizingPeakA;
      };

      it('gives Vo = 2·D·Vd/n at every continuous-conduction corner', () => {
        for (const corner of design.corners) {
          if (corner.outputInductorModes[0] !== 'ccm' || hasSharedFall(corner)) continue;
          // ref: Mohan, Undeland, Robbins, 3rd ed., §10-5 (from memory): Vo = 2·(Ns/Np)·D·Vd,
          // D each switch's on-time over the period; Vd = Vin (push-pull, full bridge), Vin/2
          // (half bridge)
          expectClose(vo, (2 * corner.dutyCycle * drive(corner)) / choices.turnsRatio, {
            rel: 1e-6,
          });
        }
      });

      it('chooses the turns ratio for targets.dutyCycleTarget at the lowest input', () => {
        // ref: Mohan, Undeland, Robbins, 3rd ed., §10-5 (from memory): n = 2·D·Vd/Vo, lossless
        expectClose(choices.turnsRatio, (2 * 0.45 * driveFraction * spec.inputVoltageMinV) / vo, {
          rel: 1e-6,
        });
      });

      it('keeps the magnetizing current symmetric: no DC, peak Vd·D·T/(2·Lm)', () => {
        for (const corner of design.corners) {
          const im = corner.waveforms.magnetizingCurrentA;
          // ref: Mohan, Undeland, Robbins, 3rd ed., §10-5 (from memory): the core is driven
          // by ±Vd for equal times, so the flux swings symmetrically and carries no DC
          expectClose(average(im), 0, { abs: 1e-9 * corner.magnetizingCurrentPeakA });
          expectClose(peak(im), corner.magnetizingCurrentPeakA, { rel: 1e-9 });
          if (hasSharedFall(corner)) continue;
          // ref: Mohan, Undeland, Robbins, 3rd ed., §10-5 (from memory): ΔIm = Vd·D·T/Lm, so
          // Im,pk = Vd·D·T/(2·Lm)
          expectClose(
            corner.magnetizingCurrentPeakA,
            (drive(corner) * corner.dutyCycle * periodS) / (2 * choices.magnetizingInductanceH),
            { rel: 1e-6 },
          );
        }
      });

      it('lets the magnetizing current hold the inductor current up at light load', () => {
        const light = design.corners.filter(hasSharedFall);
        expect(light.length).toBeGreaterThan(0);
        for (const corner of light) {
          const il = corner.waveforms.outputInductorCurrentsA[0];
          const im = corner.waveforms.magnetizingCurrentA;
          if (il === undefined) throw new Error('no inductor current');
          const valleyA = il.values[0] ?? NaN;
          // ref: common practice (Kirchhoff's voltage law): with one rectifier stopped, the
          // output inductor and the magnetizing inductance referred to the secondary, Lm/n², are
          // in series across Vo + Vf (Vf = 0 here), so the current falls at Vo/(L + Lm/n²)
          const slopes = sharedFallSlopes(il.timesS, il.values, periodS / 2);
          expect(slopes.length).toBeGreaterThan(0);
          for (const slope of slopes) {
            expectClose(slope, -vo / (inductanceH + lm / n ** 2), { rel: 1e-6 });
          }
          // ref: common practice (ampere-turn balance with the primary open): the half ends with
          // the magnetizing current equal to the inductor current over n, so the next half's
          // magnetizing current starts at −valley/n; ref: Mohan, Undeland, Robbins, 3rd ed.,
          // §10-5 (from memory): it then rises by Vd·D·T/Lm over the on-time
          expectClose(im.values[0] ?? NaN, -valleyA / n, { rel: 1e-6, abs: 1e-12 });
          expectClose(
            corner.magnetizingCurrentPeakA,
            (drive(corner) * corner.dutyCycle * periodS) / lm - valleyA / n,
            { rel: 1e-6 },
          );
          // ref: Erickson & Maksimović, 2nd ed., §2.3 (from memory): the output no longer
          // follows volt-second balance alone; it sits above 2·D·Vd/n
          expect(vo).toBeGreaterThan((2 * corner.dutyCycle * drive(corner)) / n);
        }
      });

      it('chooses Lm for a magnetizing peak of 0.1 of the reflected load at the lowest input', () => {
        const corner = design.corners.find((c) => c.label === 'min-input/100pct-load');
        // ref: common practice, the magnetizing current is a small fraction of the load current
        expectClose(corner?.magnetizingCurrentPeakA ?? NaN, (0.1 * io) / choices.turnsRatio, {
          rel: 1e-6,
        });
      });

      it('chooses the output inductance for 0.3·Io ripple at the highest input and full load', () => {
        const corner = design.corners.find((c) => c.label === 'max-input/100pct-load');
        // ref: common practice, output inductor ripple of about 30 % of the full-load current
        expectClose(corner?.outputInductorCurrentRipplesA[0] ?? NaN, 0.3 * io, { rel: 1e-6 });
      });

      it('runs the output inductor at 2·fs, discontinuous below ΔIL = 2·Io, by the buck relations', () => {
        const halfS = periodS / 2;
        for (const corner of design.corners) {
          const loadA = corner.outputs[0]?.currentA ?? NaN;
          const secondaryV = drive(corner) / choices.turnsRatio;
          const ccmD = vo / secondaryV;
          // ref: Mohan, Undeland, Robbins, 3rd ed., §10-5 (from memory): the output filter
          // sees a buck at twice the switching frequency with duty 2·D; ΔIL = Vo·(1 − 2D)·(T/2)/L
          const ccmRippleA = (vo * (1 - ccmD) * halfS) / inductanceH;
          // The textbook buck applies where the rectifiers carry the magnetizing current.
          if (hasSharedFall(corner)) continue;
          // ref: Erickson & Maksimović, 2nd ed., §5.1 (from memory): CCM while Io > ΔIL/2
          expect(corner.outputInductorModes[0]).toBe(loadA > ccmRippleA / 2 ? 'ccm' : 'dcm');
          if (corner.outputInductorModes[0] !== 'dcm') continue;
          // ref: Erickson & Maksimović, 2nd ed., eq. 5.26 (from memory): M = 2/(1 + √(1 + 4K/D²)),
          // K = 2L/(R·Ts), for the buck in DCM, here with Ts = T/2 and duty 2·D
          const k = (2 * inductanceH) / ((vo / loadA) * halfS);
          const m = 2 / (1 + Math.sqrt(1 + (4 * k) / (2 * corner.dutyCycle) ** 2));
          expectClose(vo / secondaryV, m, { rel: 1e-6 });
        }
      });

      it(`lets each rectifier block ${arrangement === 'center-tapped' ? '2·Vs' : 'Vs'}`, () => {
        for (const corner of design.corners) {
          const secondaryV = drive(corner) / choices.turnsRatio;
          const count = arrangement === 'center-tapped' ? 2 : 4;
          expect(corner.rectifiers).toHaveLength(count);
          for (const rectifier of corner.rectifiers) {
            // ref: Mohan, Undeland, Robbins, 3rd ed., §10-5 (from memory); common practice: a
            // center-tapped rectifier blocks the whole secondary, twice the half's voltage; each
            // diode of a bridge blocks the secondary voltage once
            expectClose(
              rectifier.voltagePeakV,
              (arrangement === 'center-tapped' ? 2 : 1) * secondaryV,
              { rel: 1e-9 },
            );
          }
        }
      });

      it('gives an output ripple of ΔIL·(T/2)/(8·C) in continuous conduction with no ESR', () => {
        for (const corner of design.corners) {
          if (corner.outputInductorModes[0] !== 'ccm' || hasSharedFall(corner)) continue;
          const rippleA = corner.outputInductorCurrentRipplesA[0] ?? NaN;
          // ref: Erickson & Maksimović, 2nd ed., §2.5 (from memory): buck output ripple
          // ΔI·Ts/(8C), with Ts = T/2
          expectClose(
            corner.outputs[0]?.rippleVoltagePeakToPeakV ?? NaN,
            (rippleA * periodS) / 2 / (8 * (output?.capacitanceF ?? NaN)),
            { rel: 1e-6 },
          );
        }
      });
    });
  }

  describe(`${name} (duty-cycle limits)`, () => {
    it('refuses a duty cycle target above 0.5 when the turns ratio is free', () => {
      const issues = issuesOfSpec(base({ targets: { dutyCycleTarget: 0.55 } }));
      // ref: Mohan, Undeland, Robbins, 3rd ed., §10-5 (from memory): each switch conducts at
      // most half the period, D ≤ 0.5
      expect(issues[0]?.code).toBe('duty_cycle_limit');
      expect(issues[0]?.path).toEqual(['targets', 'dutyCycleTarget']);
      expectClose(issues[0]?.required ?? NaN, 0.55, { rel: 0 });
      expectClose(issues[0]?.limit ?? NaN, 0.5, { rel: 0 });
    });

    it('names the duty cycle a too-high fixed turns ratio would need, against 0.5', () => {
      const chosen = designedDoubleEnded(base({}));
      const turnsRatio = chosen.choices.turnsRatio * 1.3;
      const issues = issuesOfSpec(base({ transformer: { turnsRatio } }));
      const duty = issues.find(
        (i) => i.code === 'duty_cycle_limit' && i.corner === 'min-input/100pct-load',
      );
      expect(duty?.path).toEqual(['transformer', 'turnsRatio']);
      // ref: common practice, the lower of the controller's and the topology's limit applies,
      // here the topology's 0.5 below the default dutyCycleMax 0.65
      expectClose(duty?.limit ?? NaN, 0.5, { rel: 0 });
      // ref: Mohan, Undeland, Robbins, 3rd ed., §10-5 (from memory): 1.3 times the turns ratio
      // chosen for D = 0.45 needs about 1.3·0.45 ≈ 0.59 > 0.5
      expect(duty?.required ?? NaN).toBeGreaterThan(0.5);
    });

    it('reports the lower limits.dutyCycleMax as the limit when it is below 0.5', () => {
      const issues = issuesOfSpec(
        base({ targets: { dutyCycleTarget: 0.45 }, limits: { dutyCycleMax: 0.4 } }),
      );
      // ref: common practice, the lower of the controller's and the topology's limit applies
      expect(issues[0]?.code).toBe('duty_cycle_limit');
      expectClose(issues[0]?.limit ?? NaN, 0.4, { rel: 0 });
    });
  });
}

/**
 * The slopes of the falling segments of the first half-period that end at the half (or at zero
 * just before it): the shared fall, A/s. Only the last falling segment before the half's end or
 * the inductor current's zero is taken.
 */
function sharedFallSlopes(timesS: number[], values: number[], halfS: number): number[] {
  let last: number | undefined;
  for (let i = 1; i < timesS.length; i++) {
    const t0 = timesS[i - 1] as number;
    const t1 = timesS[i] as number;
    if (t1 > halfS * (1 + 1e-12) || t1 - t0 <= 1e-15) continue;
    const slope = ((values[i] as number) - (values[i - 1] as number)) / (t1 - t0);
    if (slope < 0) last = slope;
  }
  return last === undefined ? [] : [last];
}
