import { describe, expect, it } from 'vitest';
import { designConverter, SpecSchema, type Spec } from '../../../solvers/index.js';
import { EVENT_FALLBACKS } from '../../../solvers/topologies/double-ended/double-ended-state.js';
import { LIGHT_LOAD_MIN_ON_TIME_S } from '../../../solvers/topologies/light-load-min-on-time.js';
import { average } from '../../../solvers/waveform/average.js';
import { FORWARD_EVENT_FALLBACK } from '../../../solvers/topologies/two-switch-forward/two-switch-forward-state.js';
import { forwardTelecomSpec } from '../../helpers/forward-specs.js';

const rectifier = { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01, voltageRatingV: 100 };
const rated200 = { ...rectifier, voltageRatingV: 200 };

/**
 * A two-switch forward from a 200–400 V bus, 12 V 6.42 A and 5 V 2.54 A, 296.1 kHz, 2 µH of
 * leakage, its transformer designed, loads 2.8, 50 and 100 % (invented scenario, drawn by the
 * lead's scan of random specs on 2026-12-04: one of some 1,000 light-load corners of both
 * forwards, with two or three outputs, whose event solve did not converge). At the highest input
 * and 2.8 % load the event period's Newton solve fails and the plain model stays. If a solver change
 * makes it converge, this case has served its purpose: find another or drop it. (Moved on
 * 2026-12-05: the scan's own spec, 296.7 kHz and 2.4 %, converges since the leakage's spike
 * drew its plateau's current in the primary winding, whose designed resistance moved by 5e-4;
 * this one is the same spec at 0.998 of the frequency and 2.6 % load, found by trying a few.
 * Moved again on 2026-12-05, helper fback: the magnetizing ring behind the leakage's spike made
 * the nominal-input 2.6 % corner converge; at 2.8 % load the highest input's does not.)
 */
function fallbackSpec(): Spec {
  return SpecSchema.parse({
    topology: 'two-switch-forward',
    inputVoltageMinV: 200,
    inputVoltageNominalV: 300,
    inputVoltageMaxV: 400,
    outputs: [
      { voltageV: 12, currentA: 6.421454109251499, capacitanceF: 100e-6, rectifier },
      { voltageV: 5, currentA: 2.5423197746276855, capacitanceF: 100e-6, rectifier },
    ],
    switchingFrequencyHz: 296069.33908462524,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 1200 },
    loadFractions: [0.028, 0.5, 1],
    magnetics: { mode: 'design' },
    transformer: { leakageInductanceH: 2e-6 },
  });
}

/**
 * A full bridge from a 200–400 V bus, 12 V 6.53 A and 5 V 1.22 A, 297.8 kHz, no leakage, its
 * transformer designed, loads 2 and 100 % (invented scenario, drawn by
 * `test/bench/model-fallback-scan.ts` on 2026-12-04, seed 7: 20 of its 171 light-load corners
 * fell back). At 2 % load and the nominal and highest inputs the event model finds no duty cycle
 * that delivers as little as the load (its half settled at the lowest stage duty delivers more;
 * ngspice at the highest input put the regulated output 21 % above the older model's, which
 * stays); at the lowest input its outputs stop apart, which
 * each output's own events confirm (`ownEventsCheck`, 2026-12-04, later), so the event model
 * takes it. If a solver change makes the event model take the other two, this case has served
 * its purpose: find another or drop it.
 */
function fullBridgeFallbackSpec(): Spec {
  return SpecSchema.parse({
    topology: 'full-bridge',
    inputVoltageMinV: 200,
    inputVoltageNominalV: 300,
    inputVoltageMaxV: 400,
    outputs: [
      { voltageV: 12, currentA: 6.526769082061946, capacitanceF: 100e-6, rectifier: rated200 },
      { voltageV: 5, currentA: 1.2166827917099, capacitanceF: 100e-6, rectifier: rated200 },
    ],
    switchingFrequencyHz: 297820.2512860298,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 1200 },
    loadFractions: [0.0204, 1],
    magnetics: { mode: 'design' },
    transformer: { leakageInductanceH: 0 },
  });
}

/**
 * A full bridge from a 200–400 V bus, one 12 V 5.15 A output, 133.5 kHz, the default leakage,
 * its transformer designed, loads 2.11 and 100 % (invented scenario, drawn by
 * `test/bench/model-fallback-scan.ts --seed 11 --count 150 --outputs 1` on 2026-12-04, spec 80).
 * At 400 V and 2.11 % load no duty cycle of the event model delivers as little as the load (the
 * drain capacitance's energy at each turn-on rings on into the output), so the corner is solved
 * at the shortest on-time with the output risen (`floorEventState`): 18.06 V for 12 V, where
 * ngspice (Debian) settles at 18.31 V (`double-ended-light-load-floor-netlist.test.ts`). Before,
 * the old light-load model claimed 12 V there, flagged `no-regulated-half`.
 */
function fullBridgeFloorSpec(): Spec {
  return SpecSchema.parse({
    topology: 'full-bridge',
    inputVoltageMinV: 200,
    inputVoltageNominalV: 300,
    inputVoltageMaxV: 400,
    outputs: [
      { voltageV: 12, currentA: 5.151157061569393, capacitanceF: 100e-6, rectifier: rated200 },
    ],
    switchingFrequencyHz: 133511.76917552948,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 1200 },
    loadFractions: [0.0211, 1],
    magnetics: { mode: 'design' },
  });
}

describe('summary.modelFallbacks', () => {
  it('lists the corner whose light-load event solve did not converge, and that corner says why', () => {
    const result = designConverter(fallbackSpec());
    if (!result.ok) throw new Error(JSON.stringify(result.issues));
    const { corners, summary } = result.value;
    expect(summary.modelFallbacks).toEqual([
      { corner: 'max-input/2.8pct-load', reason: FORWARD_EVENT_FALLBACK },
    ]);
    for (const corner of corners) {
      expect(corner.modelFallback).toBe(
        corner.label === 'max-input/2.8pct-load' ? FORWARD_EVENT_FALLBACK : undefined,
      );
    }
  });

  it('lists the double-ended corners the event model did not take, each with its reason', () => {
    const result = designConverter(fullBridgeFallbackSpec());
    if (!result.ok) throw new Error(JSON.stringify(result.issues));
    const { corners, summary } = result.value;
    const expected: Record<string, string> = {
      'nominal-input/2pct-load': EVENT_FALLBACKS['no-regulated-half'],
      'max-input/2pct-load': EVENT_FALLBACKS['no-regulated-half'],
    };
    expect(summary.modelFallbacks).toEqual(
      Object.entries(expected).map(([corner, reason]) => ({ corner, reason })),
    );
    for (const corner of corners) expect(corner.modelFallback).toBe(expected[corner.label]);
  });

  it('lists a double-ended corner solved at the shortest on-time as a regulation miss, not a fallback', () => {
    const spec = fullBridgeFloorSpec();
    const result = designConverter(spec);
    if (!result.ok) throw new Error(JSON.stringify(result.issues));
    const { corners, summary } = result.value;
    const label = 'max-input/2.1pct-load';
    const corner = corners.find((c) => c.label === label);
    if (corner === undefined || !('outputInductorModes' in corner)) throw new Error(label);
    const output = corner.outputs[0];
    if (output === undefined) throw new Error('no output');
    expect(summary.modelFallbacks).toEqual([]);
    expect(corner.modelFallback).toBeUndefined();
    // ref: a controller at its shortest on-time, some 100 ns of leading-edge blanking (common
    // practice, from memory): each switch's gate on for that time, D = t_on·fs.
    expect(corner.dutyCycle).toBeCloseTo(LIGHT_LOAD_MIN_ON_TIME_S * spec.switchingFrequencyHz, 12);
    // The output rises (ngspice (Debian) settles 18.31 V against the engine's 18.06 V: the
    // netlist test), and the summary lists the corner at the voltage reached.
    expect(output.voltageV).toBeGreaterThan(1.4 * 12);
    expect(summary.regulationMisses).toEqual([
      { corner: label, outputVoltageV: output.voltageV, targetVoltageV: 12 },
    ]);
    // ref: charge balance on the output capacitor (common practice): the inductor's mean
    // current over the period is the load's, held at its target current.
    const inductorA = corner.waveforms.outputInductorCurrentsA[0];
    if (inductorA === undefined) throw new Error('no inductor current');
    expect(average(inductorA)).toBeCloseTo(0.0211 * 5.151157061569393, 9);
  });

  it('is empty where every corner took its usual model (the telecom forward at 10 % load)', () => {
    const result = designConverter(forwardTelecomSpec({ loadFractions: [0.1, 1] }));
    if (!result.ok) throw new Error(JSON.stringify(result.issues));
    expect(
      result.value.corners.some(
        (c) => 'outputInductorModes' in c && c.outputInductorModes.includes('dcm'),
      ),
    ).toBe(true);
    expect(result.value.summary.modelFallbacks).toEqual([]);
  });
});
