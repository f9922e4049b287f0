import { describe, expect, it } from 'vitest';
import { designConverter, SpecSchema, type Issue, type Spec } from '../../../solvers/index.js';
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
  it('a 200-400 V two-output flyback at 2 % load: a 422 where a pulse delivers more than the load up to the clamp', () => {
    // The duty-cycle search carried a start current over from another branch of the idle ring,
    // one so low that the switch current never turned positive (I0 = −0.02 A, the delivering
    // branch +0.015 A), took the jump between the branches for a root, and the second output's
    // cross-regulation divided by a zero mean secondary current. At 300 and 400 V the load draws
    // less than the least a pulse delivers there; at 200 V a duty cycle holds it. Solved at the
    // shortest pulse (flyback-floor-state.ts), the 5 V output would rise to some 8 V at 300 V and
    // 12 V at 400 V, its reflected voltage past the 258 V clamp, which would then take the surplus
    // (not modelled): the 422 stays.
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
    if (result.ok) throw new Error('expected a 422: the load is below the least a pulse delivers');
    expect(result.issues.map((issue) => [issue.code, issue.corner])).toEqual([
      ['load_below_minimum_power', 'nominal-input/2pct-load'],
      ['load_below_minimum_power', 'max-input/2pct-load'],
    ]);
    const [nominal, highest] = result.issues as [Issue, Issue];
    // ref: common practice (conservation of energy): the load draws Σ Vo·Io at 2 %
    expectClose(nominal.required, 0.02 * 5 * (2.423579216003418 + 0.07079892158508301), {
      rel: 1e-9,
    });
    // ref: common practice, the drain capacitance's energy a pulse, ½·C·(Vin² − V0²), grows
    // with the input voltage
    expect(nominal.limit).toBeGreaterThan(nominal.required);
    expect(highest.limit).toBeGreaterThan(nominal.limit);
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

  it('200-400 V two-output forwards at 1 % load with the transformer designed: the magnetizing current closes', () => {
    // The light-load event period's ring, cut by the next turn-on, was drawn as the lossless ring
    // and ended up to 40 % of the start current away from it, so the transformer's flux did not
    // return to its start and the iGSE refused it.
    const base = {
      inputVoltageMinV: 200,
      inputVoltageNominalV: 300,
      inputVoltageMaxV: 400,
      primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 1200 },
      loadFractions: [0.01, 0.5, 1],
      magnetics: { mode: 'design' },
    };
    const specs = [
      SpecSchema.parse({
        ...base,
        topology: 'two-switch-forward',
        switchingFrequencyHz: 440751.451253891,
        outputs: [
          {
            voltageV: 3.3,
            currentA: 3.4953787326812744,
            capacitanceF: 100e-6,
            rectifier: {
              kind: 'synchronous',
              onResistanceOhm: 0.01606933891773224,
              voltageRatingV: 100,
            },
          },
          {
            voltageV: 5,
            currentA: 1.2184160232543946,
            capacitanceF: 100e-6,
            rectifier: {
              kind: 'synchronous',
              onResistanceOhm: 0.018577633500099184,
              voltageRatingV: 100,
            },
          },
        ],
      }),
      scanSpec(
        {
          ...base,
          topology: 'forward-reset-winding',
          switchingFrequencyHz: 320004.4631958008,
          transformer: { leakageInductanceH: 9.999999999999999e-6 },
        },
        [3.9600067138671875, 2.684183883666992],
      ),
    ];
    for (const spec of specs) {
      const result = designConverter(spec);
      if (!result.ok) throw new Error(JSON.stringify(result.issues));
      for (const corner of result.value.corners) {
        const { values } = corner.waveforms.magnetizingCurrentA;
        const swingA = Math.max(...values) - Math.min(...values);
        // ref: common practice (volt-second balance): in steady state the magnetizing current
        // ends each period where it started
        expect(Math.abs((values.at(-1) as number) - (values[0] as number))).toBeLessThanOrEqual(
          1e-9 * swingA,
        );
      }
    }
  });
});
