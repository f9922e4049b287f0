import type { DoubleEndedCircuit } from './double-ended-state.js';

/**
 * The current a bridge's leakage has built towards the next half by its turn-on, A (≥ 0), where
 * the leakage's decay after turn-off ends within the off-time (half and full bridge, the
 * continuous model). Once the decay through the opposite switches' body diodes has brought the
 * leakage's current to zero, those diodes stop, and the leakage rings with the node capacitance
 * C (`nodeCapacitanceF`) about the winding, which the freewheeling rectifiers hold at zero: the
 * voltage across the leakage starts at V = Vd + m·Vbd (the drive voltage plus the m body
 * diodes' drop that held the node at the far rail), so its current grows towards the next
 * half's direction as i = (V/Z)·sin(ω·t), Z = √(Llk/C), ω = 1/√(Llk·C), while the node swings
 * back through the idle level. The next switches turn on t_r after the decay's end and the
 * turn-on commutation starts from that current: it has the leakage's current already i on its
 * way to the reflected valley, and is shorter by Llk·i/Vd. Undamped over its first swing (half a
 * ring, where the current is back at zero and the node at the near rail); taken as settled at the
 * idle level after it, as the light-load node ring (`node-ring.ts`) takes its ring, so zero where
 * t_r is half a ring or more. Zero for the push-pull (its clamp takes each half's leakage),
 * without leakage, node capacitance or turn-off current, where the decay outlasts the off-time
 * (`leakageCarryA` then carries its rest), and where the leakage's charge does not take the node
 * to the rail (τ < t_s/2, as `bridgeDecayPlateau`).
 *
 * The timing is `leakageCarryA`'s: the off-time after the turn-off swing t_s holds the node's
 * second stretch (as long as t_s, counted as t_s/2 at full voltage) and the decay at full voltage
 * τ = Llk·Ip/(V + R·Ip/2); t_r is what the off-time has left after them.
 *
 * Just below the leakage's knee (`leakageKneeDuty`) this makes the output nearly flat in D: the
 * ring's current grows at V/Llk, as fast as the commutation's would at Vd/Llk, so a longer
 * on-time loses as much ring as it gains drive (d(drive)/dD = 1 − (V/Vd)·cos ω·t_r).
 * ref: Mohan, Undeland, Robbins, 3rd ed. (from memory), §9 (a series LC from rest under a step
 * of voltage: i = (V/Z)·sin ωt) and §5-3 (commutation through a series inductance); ngspice
 * (the 200–400 V half bridge of `ngspice-scan.ts --seed 53 --input high`, spec 22, at 200 V and
 * full load: the leakage at −0.27 A by the turn-on; test/solvers/netlist/bridge-turn-on-ring-netlist.test.ts).
 */
export function leakageRingA(
  circuit: DoubleEndedCircuit,
  dutyCycle: number,
  turnOffA: number,
  swingFraction: number,
): number {
  const llk = circuit.leakageInductanceH;
  const c = circuit.nodeCapacitanceF;
  const { bridge } = circuit;
  if (bridge.kind === 'push-pull' || !(llk > 0) || !(c > 0) || !(turnOffA > 0)) return 0;
  const { swingS, offS, fallV } = bridgeOffTiming(circuit, dutyCycle, turnOffA, swingFraction);
  const ringV = circuit.driveVoltageV + bridge.switchesInPath * circuit.bodyDiodeVoltageV;
  const decayS = (llk * turnOffA) / fallV;
  if (decayS < swingS / 2 || offS < swingS) return 0;
  const restS = offS - swingS / 2 - decayS;
  const angle = restS / Math.sqrt(llk * c);
  if (!(angle > 0) || angle >= Math.PI) return 0;
  return (ringV / Math.sqrt(llk / c)) * Math.sin(angle);
}

/** What {@link bridgeOffTiming} returns; one scratch object, read before the next call. */
export interface BridgeOffTiming {
  /** The turn-off swing t_s, s. */
  swingS: number;
  /** The off-time after the swing, (1/2 − D)·T − t_s (≥ 0), s. */
  offS: number;
  /** The voltage the leakage decays at, Vd + m·Vbd + R·Ip/2, V. */
  fallV: number;
}

const OFF_TIMING: BridgeOffTiming = { swingS: 0, offS: 0, fallV: 0 };

/**
 * The timing `leakageCarryA` and `leakageRingA` share: the turn-off swing t_s (`swingFraction`
 * of the period), the off-time after it, and the voltage the leakage's current falls at once the
 * opposite switches' body diodes carry it (the drive, the m body diodes' drop, and half the
 * primary loop's drop at the turn-off current `turnOffA`). Written into one scratch object (a
 * pass of the fixed point calls it; a fresh object a call was garbage).
 */
export function bridgeOffTiming(
  circuit: DoubleEndedCircuit,
  dutyCycle: number,
  turnOffA: number,
  swingFraction: number,
): BridgeOffTiming {
  const periodS = circuit.periodS;
  const swingS = Math.max(0, swingFraction) * periodS;
  OFF_TIMING.swingS = swingS;
  OFF_TIMING.offS = Math.max(0, (0.5 - dutyCycle) * periodS - swingS);
  OFF_TIMING.fallV =
    circuit.driveVoltageV +
    circuit.bridge.switchesInPath * circuit.bodyDiodeVoltageV +
    (circuit.primaryLoopResistanceOhm * turnOffA) / 2;
  return OFF_TIMING;
}
