import { describe, expect, it } from 'vitest';
import {
  doubleEndedStateAt,
  leakageCarryA,
  leakageKneeDuty,
} from '../../../../solvers/topologies/double-ended/double-ended-state.js';
import { primaryBridge } from '../../../../solvers/topologies/double-ended/primary-bridge.js';
import { expectClose } from '../../../helpers/expect-close.js';
import { idealizedBridgeCircuit } from '../../../helpers/idealized-bridge.js';

/*
 * The leakage's turn-off decay in the bridges (DEVELOPERS.md, "The leakage's turn-off decay").
 * An invented, idealized half bridge: 36 V (18 V of drive), 200 kHz, 12 V 5 A, turns ratio 1, no
 * drops, no drain capacitance, and magnetizing and output inductances so large (1 H) that the
 * currents are flat: the primary current at turn-off and at turn-on are both Io/n.
 */
const FS = 200e3;
const IO = 5;
const N = 1;
const VIN = 36;

function circuitWith(
  leakageH: number,
  kind: 'half-bridge' | 'full-bridge' = 'half-bridge',
  bodyDiodeV = 0.8,
) {
  return idealizedBridgeCircuit({
    kind,
    inputVoltageV: VIN,
    currentA: IO,
    switchingFrequencyHz: FS,
    leakageInductanceH: leakageH,
    outputCapacitanceF: 0,
    bodyDiodeForwardVoltageV: bodyDiodeV,
  });
}

describe('leakage decay of the bridges', () => {
  it('at D = 0.5 the commutation sweeps the whole current from +Io/n to −Io/n: ΔVo = 4·f·Llk·Io/n²', () => {
    const llk = 2e-6;
    const ideal = doubleEndedStateAt(circuitWith(0), 0.5);
    const leaky = doubleEndedStateAt(circuitWith(llk), 0.5);
    // ref: Mohan, Undeland, Robbins, 3rd ed., §5-3 (from memory): a single-phase bridge whose
    // current Id commutates from +Id to −Id through Ls loses Au = 2·ω·Ls·Id of volt-radians
    // twice a cycle, ΔVd = (2/π)·ω·Ls·Id = 4·f·Ls·Id. Here the primary current commutates
    // from +Io/n to −Io/n through Llk at the drive voltage twice a period (no off-time to decay
    // in), referred to the secondary: ΔVo = 4·fs·Llk·Io/n².
    const expectedDropV = (4 * FS * llk * IO) / (N * N);
    expectClose(
      (ideal.points[0]?.voltageV ?? NaN) - (leaky.points[0]?.voltageV ?? NaN),
      expectedDropV,
      { rel: 1e-3 },
    );
    expectClose(leaky.leakageCarryA ?? NaN, IO / N, { rel: 1e-3 });
  });

  // The body diode's drop: the default, a silicon body diode (0.8 V, common practice), and a
  // switch conducting in reverse at 2.5 V (a wide-bandgap class; the figure from memory).
  it.each([0.8, 2.5])(
    'below the knee the decay ends within the off-time and the commutation is the plain Llk·Io/(n·Vd): body diode %s V',
    (vbd) => {
      const llk = 1e-6;
      const circuit = circuitWith(llk, 'half-bridge', vbd);
      // ref: Mohan, Undeland, Robbins, 3rd ed., §5-3 (from memory): a current falls through a
      // series inductance at V/L; here at the drive plus one body diode's drop Vbd, so the decay
      // lasts Llk·Io/(n·(Vd + Vbd)) and the knee sits that far before the half's end.
      const decayS = (llk * IO) / N / (VIN / 2 + vbd);
      const kneeDuty = 0.5 - decayS * FS;
      expectClose(leakageKneeDuty(circuit, IO / N), kneeDuty, { rel: 1e-9 });
      const below = doubleEndedStateAt(circuit, kneeDuty - 0.02);
      expect(below.leakageCarryA).toBe(0);
      // ref: Mohan, Undeland, Robbins, 3rd ed., §5-3 (from memory): the turn-on commutation from
      // zero, tc = Llk·I/Vd.
      expectClose(below.commutationFraction, ((llk * IO) / N / (VIN / 2)) * FS, { rel: 1e-3 });
      // Above it the rest is what the decay left: Io/n − (Vd + Vbd)·t_off/Llk.
      const above = doubleEndedStateAt(circuit, kneeDuty + 0.02);
      const offS = (0.5 - (kneeDuty + 0.02)) / FS;
      expectClose(above.leakageCarryA ?? NaN, IO / N - ((VIN / 2 + vbd) * offS) / llk, {
        rel: 1e-3,
      });
      // Past the knee the drive after the commutation no longer rises with D: a longer on-time
      // shortens the decay's time as much as it lengthens the commutation, which sweeps at Vd
      // where the decay fell at Vd + Vbd; so D − tc/T falls by Vbd/Vd per unit of D, and the
      // output (2·(D − tc/T)·Vd/n, no drops) by 2·Vbd/n.
      const further = doubleEndedStateAt(circuit, kneeDuty + 0.04);
      expectClose(
        (further.points[0]?.voltageV ?? NaN) - (above.points[0]?.voltageV ?? NaN),
        (-2 * vbd * 0.02) / N,
        { rel: 1e-3 },
      );
    },
  );

  it('leaves the push-pull without a carried current (its leakage goes to its clamp)', () => {
    const circuit = { ...circuitWith(1e-6), bridge: primaryBridge('push-pull') };
    expect(leakageCarryA(circuit, 0.5, IO, 0)).toBe(0);
    expect(leakageKneeDuty(circuit, IO)).toBe(Infinity);
  });

  it.each([0.8, 2.5])(
    'the full bridge decays through two body diodes at the whole input: body diode %s V',
    (vbd) => {
      const llk = 1e-6;
      const circuit = circuitWith(llk, 'full-bridge', vbd);
      // ref: Mohan, Undeland, Robbins, 3rd ed., §5-3 (from memory), as above: Vd = Vin and two
      // body diodes (Vbd each) in the decay's path.
      expectClose(leakageKneeDuty(circuit, IO), 0.5 - ((llk * IO) / (VIN + 2 * vbd)) * FS, {
        rel: 1e-9,
      });
    },
  );
});
