import { describe, expect, it } from 'vitest';
import { leakageRingA } from '../../../../solvers/topologies/double-ended/bridge-turn-on-ring.js';
import {
  doubleEndedStateAt,
  leakageKneeDuty,
} from '../../../../solvers/topologies/double-ended/double-ended-state.js';
import { primaryBridge } from '../../../../solvers/topologies/double-ended/primary-bridge.js';
import { expectClose } from '../../../helpers/expect-close.js';
import { idealizedBridgeCircuit } from '../../../helpers/idealized-bridge.js';

/*
 * The bridges' leakage ring between the end of the turn-off decay and the next turn-on
 * (`bridge-turn-on-ring.ts`). An invented, idealized half bridge: 36 V (18 V of drive), 200 kHz,
 * 12 V 5 A, turns ratio 1, no drops or resistance, 1 nF switches (2 nF at the node), 1 µH of
 * leakage, and magnetizing and output inductances so large (1 H) that the currents are flat: the
 * primary current at turn-off and at turn-on are both Io/n.
 */
const FS = 200e3;
const T = 1 / FS;
const IO = 5;
const VD = 18;
const VBD = 0.8;
const LLK = 1e-6;
const COSS = 1e-9;

function circuitWith(kind: 'half-bridge' | 'full-bridge' = 'half-bridge', coss = COSS) {
  return idealizedBridgeCircuit({
    kind,
    inputVoltageV: 2 * VD,
    currentA: IO,
    switchingFrequencyHz: FS,
    leakageInductanceH: LLK,
    outputCapacitanceF: coss,
    bodyDiodeForwardVoltageV: VBD,
  });
}

// The node capacitance of the half bridge: both switches' (common practice: the switch node of
// a half bridge sees both devices' output capacitance to the rails, which are AC ground).
const C = 2 * COSS;
const Z = Math.sqrt(LLK / C);
const OMEGA = 1 / Math.sqrt(LLK * C);
// The turn-off swing, t_s = C·Vd/I (Mohan, Undeland, Robbins, 3rd ed., §9-2, from memory: a
// capacitor charged at a constant current), and the decay at Vd + Vbd, τ = Llk·I/(Vd + Vbd)
// (§5-3, from memory: a current falls through an inductance at V/L).
const SWING_S = (C * VD) / IO;
const DECAY_S = (LLK * IO) / (VD + VBD);

/** The duty cycle whose off-time leaves `restS` after the swing, the node's second stretch and the decay. */
function dutyWithRest(restS: number): number {
  return 0.5 - (restS + 1.5 * SWING_S + DECAY_S) / T;
}

describe('the bridges’ leakage ring before the turn-on', () => {
  it.each([0.25, 0.5, 0.75])(
    'a series LC from rest under a step: i = (V/Z)·sin(ω·t_r), and the commutation is shorter by Llk·i/Vd (t_r = %s of half a ring)',
    (share) => {
      const restS = (share * Math.PI) / OMEGA;
      const state = doubleEndedStateAt(circuitWith(), dutyWithRest(restS));
      // ref: Mohan, Undeland, Robbins, 3rd ed. (from memory), §9 (a series LC from rest under a
      // step of voltage V: i = (V/Z)·sin ωt), with V = Vd + Vbd across the leakage as the body
      // diode releases the node at the far rail.
      const ringA = ((VD + VBD) / Z) * Math.sin(OMEGA * restS);
      expect(state.leakageCarryA).toBe(0);
      expectClose(state.leakageRingA ?? NaN, ringA, { rel: 1e-3 });
      // ref: §5-3 (from memory), the commutation through a series inductance from i to Io/n at
      // the drive voltage: tc = Llk·(Io/n − i)/Vd.
      expectClose(state.commutationFraction, (LLK * (IO - ringA)) / VD / T, { rel: 1e-3 });
    },
  );

  it('takes the ring as settled after its first swing: no current at turn-on from half a ring on', () => {
    const state = doubleEndedStateAt(circuitWith(), dutyWithRest((1.2 * Math.PI) / OMEGA));
    expect(state.leakageRingA).toBe(0);
    expectClose(state.commutationFraction, (LLK * IO) / VD / T, { rel: 1e-3 });
  });

  it('vanishes towards the knee, where the decay fills the off-time, so the state is continuous there', () => {
    const circuit = circuitWith();
    const knee = leakageKneeDuty(circuit, IO);
    // The knee's own timing: where the rest after the decay is zero.
    expectClose(knee, dutyWithRest(0), { rel: 1e-6 });
    const near = doubleEndedStateAt(circuit, knee - 1e-5);
    expect(near.leakageRingA ?? NaN).toBeGreaterThan(0);
    expect(near.leakageRingA ?? NaN).toBeLessThan(1e-3 * IO);
    expect(doubleEndedStateAt(circuit, knee + 1e-3).leakageRingA).toBe(0);
  });

  it('is zero for the push-pull (its clamp takes each half’s leakage) and without node capacitance', () => {
    const restS = (0.5 * Math.PI) / OMEGA;
    const swing = SWING_S / T;
    const pushPull = { ...circuitWith(), bridge: primaryBridge('push-pull') };
    expect(leakageRingA(pushPull, dutyWithRest(restS), IO, swing)).toBe(0);
    expect(leakageRingA(circuitWith('half-bridge', 0), dutyWithRest(restS), IO, 0)).toBe(0);
    expect(leakageRingA(circuitWith(), dutyWithRest(restS), IO, swing)).toBeGreaterThan(0);
  });
});
