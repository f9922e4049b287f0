import { describe, expect, it } from 'vitest';
import { designConverter, SpecSchema, type Spec } from '../../../solvers/index.js';
import { average } from '../../../solvers/waveform/average.js';
import { expectClose } from '../../helpers/expect-close.js';

// Specs a random scan of invented specs (lead's scratch script, 2026-12-04) found throwing from
// designConverter, which the API turns into a 500 instead of a design or a 422. Their numbers
// are kept as drawn: rounded, the solves take other paths and the faults hide.

const rectifier = { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01, voltageRatingV: 100 };

/** An invented two-output scenario of the scan, all at the 5 V level. */
function scanSpec(fields: Record<string, unknown>, currentsA: readonly [number, number]): Spec {
  return SpecSchema.parse({
    outputs: currentsA.map((currentA) => ({
      voltageV: 5,
      currentA,
      capacitanceF: 100e-6,
      rectifier,
    })),
    ...fields,
  });
}

describe('designs a random scan found throwing', () => {
  it('a 200-400 V two-output flyback at 2 % load: DCM on the ring start that delivers', () => {
    // The duty-cycle search carried a start current over from another branch of the idle ring,
    // one so low that the switch current never turned positive (I0 = −0.02 A, the delivering
    // branch +0.015 A); the second output's cross-regulation then divided by a zero mean
    // secondary current.
    const spec = scanSpec(
      {
        topology: 'flyback',
        inputVoltageMinV: 200,
        inputVoltageNominalV: 300,
        inputVoltageMaxV: 400,
        switchingFrequencyHz: 144423.52056503296,
        primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 1200 },
        loadFractions: [0.02, 0.1, 1],
        magnetics: { mode: 'assume' },
        transformer: { leakageInductanceH: 2e-6 },
      },
      [2.423579216003418, 0.07079892158508301],
    );
    const result = designConverter(spec);
    if (!result.ok) throw new Error(JSON.stringify(result.issues));
    const corner = result.value.corners.find((c) => c.label === 'min-input/2pct-load');
    if (corner === undefined || !('secondaryCurrentsA' in corner.waveforms)) {
      throw new Error('no flyback corner min-input/2pct-load');
    }
    const { secondaryCurrentsA } = corner.waveforms;
    corner.outputs.forEach((output, k) => {
      // ref: common practice (charge balance of the output capacitor): in steady state the
      // rectifier's mean current is the load's
      expectClose(average(secondaryCurrentsA[k] as never), output.currentA, { rel: 1e-6 });
    });
  });

  it('a 36-72 V two-output full bridge with its inductors designed: the flux returns to its start', () => {
    // An output inductor's current stepped 8 ns before the period's end; ramped as flux, the step
    // was cut at the end and the iGSE refused a flux that did not return to its start.
    const spec = scanSpec(
      {
        topology: 'full-bridge',
        inputVoltageMinV: 36,
        inputVoltageNominalV: 48,
        inputVoltageMaxV: 72,
        switchingFrequencyHz: 347956.4607143402,
        primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 216 },
        loadFractions: [0.02, 0.1, 1],
        magnetics: { mode: 'design' },
      },
      [3.5206594467163086, 1.5280126810073853],
    );
    const result = designConverter(spec);
    if (!result.ok) throw new Error(JSON.stringify(result.issues));
    const inductors = result.value.outputInductors ?? [];
    expect(inductors).toHaveLength(2);
    for (const inductor of inductors) {
      for (const corner of inductor.corners) {
        // ref: common practice, a core's loss is positive wherever its flux swings
        expect(corner.coreLossW).toBeGreaterThan(0);
      }
    }
  });
});
