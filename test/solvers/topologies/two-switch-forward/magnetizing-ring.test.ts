import { describe, expect, it } from 'vitest';
import { designConverter } from '../../../../solvers/design/design-converter.js';
import {
  magnetizingRing,
  pathAt,
  ringEnds,
} from '../../../../solvers/topologies/two-switch-forward/magnetizing-ring.js';
import {
  twoSwitchForwardCircuit,
  twoSwitchForwardStateAt,
} from '../../../../solvers/topologies/two-switch-forward/two-switch-forward-state.js';
import { valueAt } from '../../../../solvers/waveform/value-at.js';
import { forwardLeakageSpike } from '../../../../solvers/topologies/two-switch-forward/leakage-spike.js';
import { expectClose } from '../../../helpers/expect-close.js';
import { forwardHighInputSpec } from '../../../helpers/forward-specs.js';

// Invented values: 8 mH against 50 pF (two 100 pF switches in series), a 400 V clamp.
const LM = 8e-3;
const C = 50e-12;
const CLAMP_V = 401.6;
const Z = Math.sqrt(LM / C);
const W = 1 / Math.sqrt(LM * C);

describe('magnetizingRing', () => {
  it('magnetizingRing(ramp below 2·Vr/Z) rings short of the clamp: peak I1·Z, start −I1', () => {
    const rampA = 0.04;
    const ring = magnetizingRing(rampA, LM, C, CLAMP_V, 10e-6);
    // ref: lossless LC (a textbook fact, common practice): i = I1·cos ωt, v = I1·Z·sin ωt, so
    // the winding peaks at I1·Z a quarter period on and is back at zero, with −I1, after π/ω;
    // periodic, I1 − (−I1) = ramp
    expect(ring.reachesClamp).toBe(false);
    expectClose(ring.turnOffA, rampA / 2, { rel: 1e-12 });
    expectClose(ring.startA, -rampA / 2, { rel: 1e-12 });
    expectClose(ring.peakWindingV, (rampA / 2) * Z, { rel: 1e-12 });
    expectClose(ring.ringEndS, Math.PI / W, { rel: 1e-12 });
    expectClose(ring.zeroCurrentS, Math.PI / (2 * W), { rel: 1e-12 });
    // ref: energy conservation in a lossless LC: ½·Lm·I1² = ½·C·Vpk²
    expectClose(0.5 * LM * ring.turnOffA ** 2, 0.5 * C * ring.peakWindingV ** 2, { rel: 1e-12 });
  });

  it('magnetizingRing(ramp above 2·Vr/Z) reaches the clamp with √(I1² − (Vr/Z)²) and starts at −Vr/Z', () => {
    const rampA = 0.08;
    const ring = magnetizingRing(rampA, LM, C, CLAMP_V, 10e-6);
    // ref: lossless LC bounded by the clamp (common practice): the energy at the clamp's start
    // is ½·C·Vr² + ½·Lm·i1²; after the clamp the ring from Vr at zero current returns the
    // winding to zero a quarter period later with −Vr/Z
    expect(ring.reachesClamp).toBe(true);
    expectClose(ring.startA, -CLAMP_V / Z, { rel: 1e-12 });
    expectClose(ring.turnOffA, rampA - CLAMP_V / Z, { rel: 1e-12 });
    expectClose(
      0.5 * LM * ring.turnOffA ** 2,
      0.5 * C * CLAMP_V ** 2 + 0.5 * LM * ring.clampStartA ** 2,
      { rel: 1e-12 },
    );
    expectClose(ring.clampStartS, Math.asin(CLAMP_V / (ring.turnOffA * Z)) / W, { rel: 1e-12 });
    // ref: an inductor across a constant voltage: di/dt = Vr/Lm
    expectClose(ring.clampEndS - ring.clampStartS, (LM * ring.clampStartA) / CLAMP_V, {
      rel: 1e-12,
    });
    expectClose(ring.ringEndS - ring.clampEndS, Math.PI / (2 * W), { rel: 1e-12 });
    expect(ring.peakWindingV).toBe(CLAMP_V);
  });

  it('ringEnds gives the ring start, peak and end to the bit, without the ring', () => {
    // Two code paths that must agree exactly (the forward's CCM steady state takes one or the
    // other); the physics of both is the lossless LC checked above.
    const out = { startA: NaN, turnOffA: NaN, ringEndS: NaN, reachesClamp: false, isCut: false };
    const limitA = CLAMP_V / Z;
    const cases: [number, number, number][] = [
      [0.04, C, CLAMP_V],
      [2 * limitA, C, CLAMP_V],
      [2 * limitA * (1 + 1e-15), C, CLAMP_V],
      [0.3, C, CLAMP_V],
      [3, C, CLAMP_V],
      [0.2, 0, CLAMP_V],
      [0, C, CLAMP_V],
      [-0.1, C, CLAMP_V],
      [0.2, C, 0],
    ];
    // Uncut, and cut by a turn-on before, at and after the ring's end (the cut path).
    for (const [rampA, capacitanceF, clampV] of cases) {
      const uncut = magnetizingRing(rampA, LM, capacitanceF, clampV, Infinity);
      for (const availableS of [Infinity, uncut.ringEndS, 0.5 * uncut.ringEndS, 1e-9]) {
        const ring = magnetizingRing(rampA, LM, capacitanceF, clampV, availableS);
        ringEnds(rampA, LM, capacitanceF, clampV, availableS, out);
        expect(out.startA).toBe(ring.startA);
        expect(out.turnOffA).toBe(ring.turnOffA);
        expect(out.ringEndS).toBe(ring.ringEndS);
      }
    }
  });

  it('magnetizingRing(ramp) is continuous where the ring first touches the clamp (ramp = 2·Vr/Z)', () => {
    const edge = (2 * CLAMP_V) / Z;
    const below = magnetizingRing(edge * (1 - 1e-9), LM, C, CLAMP_V, 10e-6);
    const above = magnetizingRing(edge * (1 + 1e-9), LM, C, CLAMP_V, 10e-6);
    // Consistency check (no outside reference): both sides meet at the boundary.
    expect(below.reachesClamp).toBe(false);
    expect(above.reachesClamp).toBe(true);
    expectClose(above.startA, below.startA, { rel: 1e-6 });
    expectClose(above.peakWindingV, below.peakWindingV, { rel: 1e-6 });
    expectClose(above.ringEndS, below.ringEndS, { rel: 1e-4 });
    expectClose(above.zeroCurrentS, below.zeroCurrentS, { rel: 1e-4 });
  });

  it('magnetizingRing(ramp, available time shorter than the ring) is periodic where the turn-on cuts it', () => {
    const rampA = 0.08;
    const full = magnetizingRing(rampA, LM, C, CLAMP_V, 10e-6);
    const availableS = full.ringEndS - 0.2 * (full.ringEndS - full.clampEndS);
    const ring = magnetizingRing(rampA, LM, C, CLAMP_V, availableS);
    // ref: lossless LC (common practice): the start is the path's current at the turn-on, and
    // I1 − start = ramp (periodic)
    expectClose(ring.startA, pathAt(ring, availableS).currentA, { abs: 1e-12 * rampA });
    expectClose(ring.turnOffA - ring.startA, rampA, { rel: 1e-12 });
    expect(ring.startA).toBeGreaterThan(-CLAMP_V / Z);
    expect(ring.startA).toBeLessThan(0);
    expect(ring.turnOnWindingV).toBeGreaterThan(0);
    // Cut much earlier, the periodic path would need a positive start: the reset does not
    // complete, and the ring keeps a zero start with the current still positive at the turn-on.
    const early = magnetizingRing(rampA, LM, C, CLAMP_V, full.clampEndS);
    expect(early.startA).toBe(0);
    expect(early.zeroCurrentS).toBeGreaterThan(full.clampEndS);
  });
});

describe('the forward with a reset winding at 400 V, ringing short of the clamp', () => {
  // Invented scenario (the helper's), the converter's own Lm.
  const spec = forwardHighInputSpec('forward-reset-winding', {
    outputs: [
      {
        voltageV: 12,
        currentA: 4,
        capacitanceF: 100e-6,
        rectifier: { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01 },
      },
    ],
    switchingFrequencyHz: 250e3,
  });
  const designed = designConverter(spec);
  if (!designed.ok || designed.value.topology !== 'forward-reset-winding') {
    throw new Error('the invented scenario should be feasible');
  }
  const design = designed.value;

  it('designConverter(reset winding, 400 V) puts the switch peak at Vin + Im·Z and starts at −Im', () => {
    const corner = design.corners.find((c) => c.label === 'max-input/100pct-load');
    if (corner === undefined) throw new Error('no corner');
    const z = Math.sqrt(
      design.choices.magnetizingInductanceH / spec.primarySwitch.outputCapacitanceF,
    );
    const imA = corner.magnetizingCurrentPeakA;
    // ref: lossless LC (a textbook fact, common practice): the drain peaks at Vin + Im·Z when
    // Im·Z is below the clamp's (Vin + Vf)·Np/Nr, and the current comes back as −Im
    expect(imA * z).toBeLessThan((400 + 0.8) / design.choices.resetTurnsRatio);
    expectClose(corner.switches[0]?.voltagePeakV ?? NaN, 400 + imA * z, { rel: 1e-9 });
    expectClose(valueAt(corner.waveforms.magnetizingCurrentA, 0), -imA, { rel: 1e-9 });
  });

  it('twoSwitchForwardStateAt(reset winding, 200–400 V) keeps Vo(D) continuous and rising across the clamp boundary', () => {
    // Consistency check (no outside reference): the first output rises with D, with no step
    // where the ring first reaches the clamp.
    const circuit = twoSwitchForwardCircuit(spec, design.choices, {
      label: 'scan',
      inputVoltageV: 300,
      loadFraction: 1,
    });
    let previousV = -Infinity;
    let previousClamp: boolean | undefined;
    let crossings = 0;
    for (let d = 0.1; d <= 0.45; d += 0.0005) {
      const state = twoSwitchForwardStateAt(circuit, d);
      const v = state.points[0]?.voltageV ?? NaN;
      expect(v).toBeGreaterThan(previousV);
      // Between neighbours 0.0005 apart the output moves about 0.0005·Vin/n; a step would show.
      if (Number.isFinite(previousV)) expect(v - previousV).toBeLessThan(0.05);
      if (previousClamp !== undefined && previousClamp !== state.ring.reachesClamp) crossings++;
      previousClamp = state.ring.reachesClamp;
      previousV = v;
    }
    expect(crossings).toBe(1);
  });
});

describe('behind the leakage’s spike', () => {
  // Invented: 10 µH of leakage, damped by 3·√(Llk/Coss) on one 100 pF switch, reflected
  // inductor peaks of 1.5 A at turn-off.
  const LEAKAGE = {
    leakageH: 10e-6,
    dampingOhm: 3 * Math.sqrt(10e-6 / 100e-12),
    reflectedPeakA: 1.5,
  };
  const spikeOf = (i1: number) =>
    forwardLeakageSpike(10e-6, LM, C, LEAKAGE.dampingOhm, CLAMP_V, i1 + LEAKAGE.reflectedPeakA, i1);

  it('magnetizingRing(…, leakage) where the spike reaches the clamp resets Lm at the clamp even below ramp = 2·Vr/Z, after the plateau', () => {
    const rampA = 0.04;
    const ring = magnetizingRing(rampA, LM, C, CLAMP_V, Infinity, LEAKAGE);
    // ref: lossless LC (common practice) from the clamp at Vr with Lm at I1: the clamp takes I1
    // to zero at Vr/Lm (Mohan, Undeland, Robbins, 3rd ed. (from memory), §5-3: a current at a
    // fixed voltage through an inductance falls at V/L) and the node rings back with −Vr/Z;
    // periodic, I1 = ramp − Vr/Z. Without the spike this ramp stops short (±ramp/2). ngspice
    // shows the same on a designed reset winding (forward-leakage-spike-netlist.test.ts).
    const i1 = rampA - CLAMP_V / Z;
    const spike = spikeOf(i1);
    expect(spike?.holdS ?? 0).toBeGreaterThan(0);
    expect(ring.reachesClamp).toBe(true);
    expectClose(ring.turnOffA, i1, { rel: 1e-12 });
    expectClose(ring.startA, -CLAMP_V / Z, { rel: 1e-12 });
    // The reset starts after stage A and the plateau, Llk·(I − I1)/Vr: Lm holds I1 through it.
    const plateauEndS = (spike?.riseS ?? NaN) + (spike?.holdS ?? NaN);
    expectClose(ring.zeroCurrentS, plateauEndS + (LM * i1) / CLAMP_V, { rel: 1e-12 });
    expect(pathAt(ring, 0.5 * plateauEndS).currentA).toBe(i1);
  });

  it('magnetizingRing(…, leakage) short of the clamp returns with −√(I1² + (v1/Z)²): the leakage’s energy above Im added to Lm’s', () => {
    const small = { ...LEAKAGE, leakageH: 0.2e-6, dampingOhm: 3 * Math.sqrt(0.2e-6 / 100e-12) };
    const rampA = 0.02;
    const ring = magnetizingRing(rampA, LM, C, CLAMP_V, Infinity, small);
    const spike = forwardLeakageSpike(
      0.2e-6,
      LM,
      C,
      small.dampingOhm,
      CLAMP_V,
      ring.turnOffA + small.reflectedPeakA,
      ring.turnOffA,
    );
    const v1 = spike?.releaseV ?? NaN;
    // ref: lossless LC (common practice): from (v1, I1) the amplitude is √(I1² + (v1/Z)²)
    // (½·Lm·i² + ½·C·v² constant) and the winding is back at zero with its negative;
    // periodic, I1 + √(I1² + (v1/Z)²) = ramp, so I1 = (ramp² − (v1/Z)²)/(2·ramp).
    expect(ring.reachesClamp).toBe(false);
    expect(v1).toBeGreaterThan(0);
    expectClose(ring.turnOffA, (rampA ** 2 - (v1 / Z) ** 2) / (2 * rampA), { rel: 1e-9 });
    expectClose(ring.startA, -Math.hypot(ring.turnOffA, v1 / Z), { rel: 1e-9 });
    expectClose(ring.peakWindingV, Math.hypot(ring.turnOffA * Z, v1), { rel: 1e-9 });
    expect(ring.turnOffA).toBeLessThan(rampA / 2);
  });
});
