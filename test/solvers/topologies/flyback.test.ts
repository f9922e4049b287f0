import { describe, expect, it } from 'vitest';
import type { Corner, FlybackDesign } from '../../../solvers/design/design-schema.js';
import { copperResistance } from '../../../solvers/materials/copper-resistance.js';
import type { Spec } from '../../../solvers/spec/spec-schema.js';
import { flyback } from '../../../solvers/topologies/flyback.js';
import { average } from '../../../solvers/waveform/average.js';
import { peak } from '../../../solvers/waveform/peak.js';
import { valueAt } from '../../../solvers/waveform/value-at.js';
import { cornerAt, solveFlyback } from '../../helpers/flyback-corners.js';
import { expectClose } from '../../helpers/expect-close.js';
import { losslessSpec, telecomSpec } from '../../helpers/flyback-specs.js';

/** Primary loop and secondary path resistances at the spec's ambient, Ω. */
function lossOf(corner: Corner, component: string, mechanism: string): number {
  const found = corner.losses.find(
    (loss) => loss.component === component && loss.mechanism === mechanism,
  );
  if (found === undefined) throw new Error(`no ${component} ${mechanism} loss`);
  return found.powerW;
}

/**
 * The current the drain's rise leaves in the leakage when the drain reaches Vin + V0 (the
 * secondary's reflected voltage with no drops), from the switch current at turn-off.
 * ref: common practice (lossless series LC about Vin: ½·L·i² + ½·C·(vd − Vin)² holds),
 * I1² = Ipk² + C·(Vin² − V0²)/(Lm + Llk)
 */
function riseEndCurrentA(corner: Corner, choices: FlybackDesign['choices'], cossF: number): number {
  const peakA = corner.switches[0]?.currentPeakA ?? NaN;
  const v0 = choices.turnsRatio * 12.45;
  const inductanceH = choices.magnetizingInductanceH + choices.leakageInductanceH;
  return Math.sqrt(peakA ** 2 + (cossF * (corner.inputVoltageV ** 2 - v0 ** 2)) / inductanceH);
}

function resistances(spec: Spec): { primaryOhm: number; secondaryOhm: number } {
  const output = spec.outputs[0];
  if (output === undefined || output.rectifier.kind !== 'diode') throw new Error('diode output');
  const ambientC = spec.ambientTemperatureC;
  return {
    primaryOhm:
      spec.primarySwitch.onResistanceOhm +
      copperResistance(spec.transformer.primaryResistanceOhm, ambientC),
    // The capacitor's ESR carries the AC part of the secondary current, is − Io, so it adds
    // ESR to the secondary path and takes ESR·Io off its offset (see secondaryOffsetV).
    secondaryOhm:
      output.rectifier.resistanceOhm +
      copperResistance(output.windingResistanceOhm, ambientC) +
      output.capacitorEsrOhm,
  };
}

/** Secondary voltage at zero current: Vo + Vf − ESR·Io, V (the ESR term of resistances()). */
function secondaryOffsetV(spec: Spec, loadA: number): number {
  const output = spec.outputs[0];
  if (output === undefined || output.rectifier.kind !== 'diode') throw new Error('diode output');
  return output.voltageV + output.rectifier.forwardVoltageV - output.capacitorEsrOhm * loadA;
}

/**
 * The loss-inclusive CCM duty cycle of the flyback's averaged equivalent circuit, in closed form:
 * D·(Vin − Im·Rp) = (1 − D)·n·(Vo + Vf + n·Im·Rs) with Im = Io/(n(1 − D)). With x = 1 − D,
 * (Vin + n·V)·x² − (Vin + Io·Rp/n − n·Rs·Io)·x + Io·Rp/n = 0; the larger x is the operating point.
 */
function lossyCcmDuty(spec: Spec, n: number, inputV: number, loadA: number): number {
  const output = spec.outputs[0];
  if (output === undefined || output.rectifier.kind !== 'diode') throw new Error('diode output');
  const { primaryOhm, secondaryOhm } = resistances(spec);
  const v = secondaryOffsetV(spec, loadA);
  const a = inputV + n * v;
  const b = inputV + (loadA * primaryOhm) / n - n * secondaryOhm * loadA;
  const c = (loadA * primaryOhm) / n;
  const x = (b + Math.sqrt(b * b - 4 * a * c)) / (2 * a);
  return 1 - x;
}

/**
 * The magnetizing-inductance voltage of each linear piece of the corner, from the interval
 * relations of the flyback: secondary conducting, −n·(Vo + Vf + Rs·is); switch on alone,
 * Lm/(Lm + Llk)·(Vin − Rp·ip); idle, 0. Currents are the pieces' means (exact for ramps).
 */
function magnetizingPieces(spec: Spec, choices: FlybackDesign['choices'], corner: Corner) {
  const output = spec.outputs[0];
  if (output === undefined || output.rectifier.kind !== 'diode') throw new Error('diode output');
  const { primaryOhm, secondaryOhm } = resistances(spec);
  const lm = choices.magnetizingInductanceH;
  const llk = choices.leakageInductanceH;
  const n = choices.turnsRatio;
  const im = corner.waveforms.magnetizingCurrentA;
  const ip = corner.waveforms.primaryCurrentA;
  const iw = corner.waveforms.primaryWindingCurrentA;
  const is = corner.waveforms.secondaryCurrentsA[0];
  if (is === undefined) throw new Error('no secondary current');
  const vd = corner.waveforms.switchVoltageV;
  const onS = corner.dutyCycle / spec.switchingFrequencyHz;
  const pieces: {
    durationS: number;
    voltageV: number;
    slopeVoltageV: number;
    isIdle: boolean;
    isLeakageRing: boolean;
  }[] = [];
  for (let k = 1; k < im.timesS.length; k++) {
    const t0 = im.timesS[k - 1] as number;
    const t1 = im.timesS[k] as number;
    const durationS = t1 - t0;
    if (durationS <= 0) continue;
    const mean = (w: typeof im) =>
      (valueAt(w, t0 + 0.25 * durationS) + valueAt(w, t0 + 0.75 * durationS)) / 2;
    const middle = t0 + 0.5 * durationS;
    let voltageV = 0;
    // Drain-driven pieces (its rise at turn-off, the DCM idle ring), where neither the switch nor
    // a rectifier conducts: v_Lm = Lm/(Lm + Llk)·(Vin − vd).
    const isIdle = t0 >= onS && !(valueAt(is, middle) > 0);
    // After turn-off, while the secondary conducts and the leakage still carries current (the
    // leakage ring with the drain capacitance, the clamp's commutation, the ring's return).
    const isLeakageRing = t0 >= onS && valueAt(is, middle) > 0 && valueAt(iw, middle) !== 0;
    if (isIdle) {
      voltageV = (lm / (lm + llk)) * (corner.inputVoltageV - mean(vd));
    } else if (valueAt(is, middle) > 0) {
      voltageV =
        -n * (secondaryOffsetV(spec, corner.outputs[0]?.currentA ?? NaN) + secondaryOhm * mean(is));
    } else if (valueAt(ip, middle) > 0) {
      voltageV = (lm / (lm + llk)) * (corner.inputVoltageV - primaryOhm * mean(ip));
    }
    const slopeVoltageV =
      (lm * ((im.values[k] as number) - (im.values[k - 1] as number))) / durationS;
    pieces.push({ durationS, voltageV, slopeVoltageV, isIdle, isLeakageRing });
  }
  return pieces;
}

describe('flyback.solveCorner: balances', () => {
  const spec = telecomSpec();
  const { choices, corners } = solveFlyback(spec);

  it('holds volt-second balance on Lm at every corner, with the interval voltages of the flyback', () => {
    for (const corner of corners) {
      const pieces = magnetizingPieces(spec, choices, corner);
      // Over the leakage ring and the clamp's commutation the engine takes the secondary drop at
      // the mean of a ramp from 0 to Ib; each piece's own drop n·R·is lies within n·R·max(is).
      const { secondaryOhm } = resistances(spec);
      const secondaryA = corner.waveforms.secondaryCurrentsA[0];
      if (secondaryA === undefined) throw new Error('no secondary current');
      const ringDropV = choices.turnsRatio * secondaryOhm * peak(secondaryA);
      let sumVs = 0;
      let scaleVs = 0;
      for (const piece of pieces) {
        // ref: Mohan, Undeland, Robbins, 3rd ed., §10-4-2 flyback (from memory): v_Lm = Vin on,
        // −n(Vo + Vf) off; slopes of i_m are v_Lm/Lm
        // The idle ring is drawn as chords at most π/12 of its phase apart: within 2 % of Vin.
        expectClose(piece.slopeVoltageV, piece.voltageV, {
          rel: piece.isIdle || piece.isLeakageRing ? 0 : 1e-9,
          abs: piece.isIdle
            ? 0.02 * corner.inputVoltageV
            : piece.isLeakageRing
              ? ringDropV
              : 1e-9 * corner.inputVoltageV,
        });
        // The chords' own volt-seconds over the idle and the leakage ring: the rest must balance
        // them exactly.
        const isOwn = piece.isIdle || piece.isLeakageRing;
        sumVs += (isOwn ? piece.slopeVoltageV : piece.voltageV) * piece.durationS;
        scaleVs += Math.abs(piece.voltageV) * piece.durationS;
      }
      // ref: Erickson & Maksimović, 2nd ed. (from memory), §2.2, inductor volt-second balance
      expectClose(sumVs, 0, { abs: 1e-9 * scaleVs });
    }
  });

  it('holds charge balance: the mean rectifier current equals the load current at every corner', () => {
    for (const corner of corners) {
      const secondaryA = corner.waveforms.secondaryCurrentsA[0];
      if (secondaryA === undefined) throw new Error('no secondary');
      // ref: Erickson & Maksimović, 2nd ed. (from memory), §2.3, capacitor charge balance
      expectClose(average(secondaryA), 2 * corner.loadFraction, { rel: 1e-9 });
    }
  });

  it('balances energy: Pin = Pout + Σ losses, Iin = Pin/Vin, 0 < η < 1', () => {
    for (const corner of corners) {
      const sum = corner.losses.reduce((total, loss) => total + loss.powerW, 0);
      // ref: common practice, conservation of energy
      expectClose(corner.inputPowerW, corner.outputPowerW + sum, { rel: 1e-12 });
      expectClose(corner.lossTotalW, sum, { rel: 1e-12 });
      expectClose(corner.inputCurrentAverageA * corner.inputVoltageV, corner.inputPowerW, {
        rel: 1e-12,
      });
      expect(corner.efficiency).toBeGreaterThan(0);
      expect(corner.efficiency).toBeLessThan(1);
    }
  });

  it('draws through the switch the power of the steady-state loads, to the linear-ramp accuracy', () => {
    const steadyState = new Set(['conduction', 'copper', 'clamp', 'output-capacitance']);
    const capacitanceF = spec.primarySwitch.outputCapacitanceF;
    const fs = spec.switchingFrequencyHz;
    for (const corner of corners) {
      // The input also charges the drain capacitance (its rise at turn-off, the idle ring) to the
      // voltage the switch then discharges at turn-on: C·von per period besides the switch current.
      const switchV = corner.waveforms.switchVoltageV;
      const turnOnV = switchV.values[switchV.values.length - 1] ?? NaN;
      const drawnW =
        corner.inputVoltageV *
        (average(corner.waveforms.primaryCurrentA) + capacitanceF * turnOnV * fs);
      const suppliedW =
        corner.outputPowerW +
        corner.losses
          .filter((loss) => steadyState.has(loss.mechanism))
          .reduce((s, l) => s + l.powerW, 0);
      // ref: common practice, conservation of energy. The drops are taken at interval-average
      // currents, so the ripple part of each I²R loss (R·ΔI²/12) is outside the volt-second
      // equations; here it is a few tenths of a percent of the input power at most.
      expectClose(drawnW, suppliedW, { rel: 5e-3 });
    }
  });
});

describe('flyback.solveCorner: textbook relations', () => {
  it('gives the lossless CCM ratio Vo/Vin = D/(n(1 − D)) at every continuous corner', () => {
    const spec = losslessSpec({
      transformer: {
        turnsRatio: 2,
        magnetizingInductanceH: 400e-6,
        leakageInductanceH: 0,
        primaryResistanceOhm: 0,
      },
    });
    const { corners } = solveFlyback(spec);
    const continuous = corners.filter((corner) => corner.conductionMode === 'ccm');
    expect(continuous.length).toBeGreaterThanOrEqual(6);
    for (const corner of continuous) {
      const d = corner.dutyCycle;
      // ref: Erickson & Maksimović, 2nd ed. (from memory), §6.3.4, flyback M(D) = D/(n(1 − D)) with
      // n = Np/Ns (Erickson writes 1:n, so M = nD/(1 − D) there); Mohan, Undeland, Robbins, 3rd ed.
      // (from memory), §10-4-2
      expectClose(12 / corner.inputVoltageV, d / (2 * (1 - d)), { rel: 1e-8 });
    }
  });

  it('gives the lossless DCM relation Vo = Vin·D·√(R·T/(2Lm)) at every discontinuous corner', () => {
    const lm = 20e-6;
    const spec = losslessSpec({
      transformer: {
        turnsRatio: 2,
        magnetizingInductanceH: lm,
        leakageInductanceH: 0,
        primaryResistanceOhm: 0,
      },
    });
    const { corners } = solveFlyback(spec);
    expect(corners.every((corner) => corner.conductionMode === 'dcm')).toBe(true);
    for (const corner of corners) {
      const loadOhm = 12 / (2 * corner.loadFraction);
      // ref: Erickson & Maksimović, 2nd ed. (from memory), Table 5.2, buck-boost DCM M = D/√K, K =
      // 2L/(R·T); referred through n (ch. 6) the flyback gives Vo = Vin·D·√(R·T/(2Lm)), independent
      // of n
      expectClose(
        12,
        corner.inputVoltageV * corner.dutyCycle * Math.sqrt((loadOhm * 1e-5) / (2 * lm)),
        {
          rel: 1e-8,
        },
      );
    }
  });

  it('gives the loss-inclusive CCM duty cycle of the averaged equivalent circuit', () => {
    const spec = telecomSpec({
      ambientTemperatureC: 60,
      // The averaged equivalent circuit's ideal switch: no drain capacitance to ring or rise.
      primarySwitch: { onResistanceOhm: 0.05, voltageRatingV: 200, outputCapacitanceF: 0 },
      transformer: {
        turnsRatio: 2.4,
        magnetizingInductanceH: 150e-6,
        leakageInductanceH: 0,
        primaryResistanceOhm: 0.06,
      },
    });
    const { corners } = solveFlyback(spec);
    const continuous = corners.filter((corner) => corner.conductionMode === 'ccm');
    expect(continuous.map((corner) => corner.label)).toContain('min-input/100pct-load');
    for (const corner of continuous) {
      // ref: Erickson & Maksimović, 2nd ed. (from memory), §3.3 (equivalent circuit with conduction
      // losses) applied to the flyback of §6.3.4; solved here as a quadratic in closed form
      expectClose(
        corner.dutyCycle,
        lossyCcmDuty(spec, 2.4, corner.inputVoltageV, 2 * corner.loadFraction),
        {
          rel: 1e-9,
        },
      );
    }
  });

  it('flips from DCM to CCM where K = 2Lm/(n²·R·T) crosses Kcrit = (1 − D)²', () => {
    const n = 2;
    const loadOhm = 6;
    const duty = (n * 12) / (36 + n * 12);
    const criticalH = ((1 - duty) ** 2 * n * n * loadOhm * 1e-5) / 2;
    const corner = { label: 'min-input/100pct-load', inputVoltageV: 36, loadFraction: 1 };
    const modeAt = (lm: number) => {
      const spec = losslessSpec({
        transformer: {
          turnsRatio: n,
          magnetizingInductanceH: lm,
          leakageInductanceH: 0,
          primaryResistanceOhm: 0,
        },
      });
      const chosen = flyback.choose(spec);
      if (!chosen.ok) throw new Error('choose failed');
      const solved = flyback.solveCorner(spec, chosen.value, corner);
      if (!solved.ok) throw new Error('solve failed');
      return solved.value.conductionMode;
    };
    // ref: Erickson & Maksimović, 2nd ed. (from memory), §5.1 and Table 5.1, buck-boost Kcrit(D) =
    // (1 − D)², with L and R referred through n (ch. 6)
    expect(modeAt(1.01 * criticalH)).toBe('ccm');
    // ref: Erickson & Maksimović, 2nd ed. (from memory), §5.1, K < Kcrit is discontinuous
    expect(modeAt(0.99 * criticalH)).toBe('dcm');
  });

  it('labels the corner bcm when the ripple target is 2, the boundary of continuous conduction', () => {
    const { corners } = solveFlyback(
      telecomSpec({
        targets: { magnetizingRippleRatioTarget: 2 },
        // The boundary of the averaged circuit: an ideal switch, no drain capacitance.
        primarySwitch: { onResistanceOhm: 0.05, voltageRatingV: 200, outputCapacitanceF: 0 },
      }),
    );
    // ref: Erickson & Maksimović, 2nd ed. (from memory), §5.1: ΔI = 2·I (valley at zero) is the
    // mode boundary
    expect(cornerAt(corners, 'min-input/100pct-load').conductionMode).toBe('bcm');
  });
});

describe('flyback.solveCorner: clamp and blocking voltages', () => {
  // Secondary drops (and the capacitor ESR) set to zero so that the reflected voltage is
  // exactly n·(Vo + Vf).
  const spec = telecomSpec({
    outputs: [
      {
        voltageV: 12,
        currentA: 2,
        rectifier: { kind: 'diode', forwardVoltageV: 0.45, resistanceOhm: 0 },
        windingResistanceOhm: 0,
        capacitorEsrOhm: 0,
      },
    ],
  });
  const { choices, corners } = solveFlyback(spec);
  const reflectedV = choices.turnsRatio * 12.45;

  it('dissipates ½·Llk·Ipk²·fs·Vc/(Vc − Vr) in the RCD clamp, after ts = Llk·Ipk/(Vc − Vr)', () => {
    // Without drain capacitance the clamp takes the whole leakage current at once.
    const ideal = solveFlyback({
      ...spec,
      primarySwitch: { ...spec.primarySwitch, outputCapacitanceF: 0 },
    });
    const llk = ideal.choices.leakageInductanceH;
    const vc = ideal.choices.clampVoltageV;
    const vr = ideal.choices.turnsRatio * 12.45;
    for (const corner of ideal.corners) {
      const ipk = corner.magnetizingCurrentPeakA;
      // ref: Pressman, Billings, Morey, 3rd ed., flyback leakage clamp (from memory); common
      // practice
      expectClose(corner.clamp.powerW, (0.5 * llk * ipk ** 2 * 100e3 * vc) / (vc - vr), {
        rel: 1e-9,
      });
      // ref: common practice, the leakage current falls at (Vc − Vr)/Llk
      expectClose(corner.clamp.commutationTimeS, (llk * ipk) / (vc - vr), { rel: 1e-9 });
      // ref: common practice, energy in an inductor ½·L·I²
      expectClose(corner.clamp.leakageEnergyJ, 0.5 * llk * ipk ** 2, { rel: 1e-12 });
      expect(lossOf(corner, 'leakage-ring', 'output-capacitance')).toBe(0);
    }
  });

  it('leaves ½·Coss·(Vc − Vr)² of the leakage energy in the drain capacitance, the rest to the clamp', () => {
    const llk = choices.leakageInductanceH;
    const vc = choices.clampVoltageV;
    const cossF = spec.primarySwitch.outputCapacitanceF;
    expect(cossF).toBeGreaterThan(0);
    const impedanceOhm = Math.sqrt(llk / cossF);
    for (const corner of corners) {
      const i1 = riseEndCurrentA(corner, choices, cossF);
      // ref: common practice (lossless series LC from u = 0 with i = I1: ½·Llk·I1² = ½·Llk·ic² +
      // ½·C·u²), Mohan, Undeland, Robbins, 3rd ed., ch. 9 resonant circuits (from memory)
      const clampA = Math.sqrt(i1 ** 2 - (cossF * (vc - reflectedV) ** 2) / llk);
      // ref: Pressman, Billings, Morey, 3rd ed., flyback leakage clamp (from memory), with ic
      expectClose(corner.clamp.powerW, (0.5 * llk * clampA ** 2 * 100e3 * vc) / (vc - reflectedV), {
        rel: 1e-9,
      });
      // ref: common practice, u = Z·I1·sin ωt reaches Vc − Vr after asin((Vc − Vr)/(Z·I1))/ω,
      // then the leakage current falls from ic at (Vc − Vr)/Llk
      const ringS = Math.asin((vc - reflectedV) / (impedanceOhm * i1)) * Math.sqrt(llk * cossF);
      expectClose(corner.clamp.commutationTimeS, ringS + (llk * clampA) / (vc - reflectedV), {
        rel: 1e-9,
      });
      // ref: common practice, energy in a capacitor ½·C·V², dissipated once a period
      expectClose(
        lossOf(corner, 'leakage-ring', 'output-capacitance'),
        0.5 * cossF * (vc - reflectedV) ** 2 * 100e3,
        { rel: 1e-9 },
      );
      expectClose(corner.clamp.leakageEnergyJ, 0.5 * llk * i1 ** 2, { rel: 1e-12 });
    }
  });

  it('peaks at Vin + Vr + Z·I1 below a clamp the leakage ring cannot reach, and the clamp takes nothing', () => {
    // A 10 nF drain against the leakage: Z·I1 falls short of Vc − Vr at the lighter loads.
    const cossF = 10e-9;
    const large = solveFlyback({
      ...spec,
      primarySwitch: { ...spec.primarySwitch, outputCapacitanceF: cossF },
    });
    const llk = large.choices.leakageInductanceH;
    const vr = large.choices.turnsRatio * 12.45;
    const impedanceOhm = Math.sqrt(llk / cossF);
    const below = large.corners.filter(
      (corner) =>
        impedanceOhm * riseEndCurrentA(corner, large.choices, cossF) <
        large.choices.clampVoltageV - vr,
    );
    expect(below.length).toBeGreaterThan(0);
    for (const corner of below) {
      const i1 = riseEndCurrentA(corner, large.choices, cossF);
      // ref: common practice (lossless series LC about Vin + Vr from u = 0 with i = I1)
      expectClose(
        peak(corner.waveforms.switchVoltageV),
        corner.inputVoltageV + vr + impedanceOhm * i1,
        {
          rel: 1e-9,
        },
      );
      expect(corner.clamp.powerW).toBe(0);
      // ref: common practice, the whole leakage energy ½·Llk·I1² rings out once a period
      expectClose(
        lossOf(corner, 'leakage-ring', 'output-capacitance'),
        0.5 * llk * i1 ** 2 * 100e3,
        { rel: 1e-9 },
      );
    }
  });

  it('blocks Vin + Vc at the switch while the clamp conducts, then Vin + n·(Vo + Vf)', () => {
    for (const corner of corners) {
      const switchV = corner.waveforms.switchVoltageV;
      // ref: common practice, an RCD clamp holds the drain at the input plus the clamp voltage
      expectClose(peak(switchV), corner.inputVoltageV + choices.clampVoltageV, { rel: 1e-12 });
      const offMiddleS = (corner.dutyCycle + 0.5 * corner.demagnetizingDutyCycle) * 1e-5;
      // ref: Mohan, Undeland, Robbins, 3rd ed., §10-4-2 (from memory), switch blocks Vin + n·Vo'
      expectClose(valueAt(switchV, offMiddleS), corner.inputVoltageV + reflectedV, { rel: 1e-12 });
    }
  });

  it('blocks Vo + Vin/n at the rectifier while the switch is on (lossless, no leakage)', () => {
    const lossless = losslessSpec({
      transformer: {
        turnsRatio: 2.5,
        magnetizingInductanceH: 200e-6,
        leakageInductanceH: 0,
        primaryResistanceOhm: 0,
      },
    });
    for (const corner of solveFlyback(lossless).corners) {
      // ref: Mohan, Undeland, Robbins, 3rd ed., §10-4-2 (from memory); common practice Vo + Vin/n
      expectClose(corner.rectifiers[0]?.voltagePeakV ?? NaN, 12 + corner.inputVoltageV / 2.5, {
        rel: 1e-8,
      });
    }
  });

  it('blocks about Vo + Vin/n at the rectifier with drops and leakage', () => {
    for (const corner of corners) {
      // ref: common practice Vo + Vin/n; the leakage takes Llk/(Lm + Llk) = 1 % of the on-state
      // voltage and the switch drop a little more, hence 2 %
      expectClose(
        corner.rectifiers[0]?.voltagePeakV ?? NaN,
        12 + corner.inputVoltageV / choices.turnsRatio,
        {
          rel: 2e-2,
        },
      );
    }
  });
});
