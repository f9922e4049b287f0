import type { DoubleEndedCircuit } from './double-ended-state.js';
import type { PushPullTurnOffSpike } from './push-pull-clamp.js';

/**
 * The off switch's voltage over a bridge's leakage decay (half and full bridge, the continuous
 * model: no shared fall, no node ring), as a bump over the idle level Vin/2 for
 * `withTurnOffSpike`: once the turn-off swing has brought the winding to zero, the leakage's
 * current (the turn-off current Ip) drives the node on to the far rail, where the opposite
 * switch's body diode takes it back to the input, so the switch just turned off blocks the
 * input plus that diode's drop, Vin + Vbd (the spec's `bodyDiodeForwardVoltageV`; the engine
 * carries no body-diode resistance, so no I·R: the loop's resistance, which sets the decay's
 * pace, lies between the two nodes, not across the switch). Rise: the node's second stretch, taken
 * as long as the turn-off swing t_s (`swingS`, as `leakageCarryA` takes it). Hold: the decay at
 * full voltage, τ = Llk·Ip/(Vd + m·Vbd + R·Ip/2), less the half of t_s the rise stands for; where
 * the decay outlasts the off-time (`carryA` > 0) it lasts to the half's end (`holdS` is then the
 * half-period, for the caller to cut). Fall: the node's return to the idle level once the diode
 * stops, a quarter of the ring of Llk with the node capacitance (that ring's further swings are
 * not drawn; the idle level stands for them, as before). Undefined for the push-pull (its clamp
 * holds its spike), without leakage or turn-off current, and where τ < t_s/2 (the leakage's
 * charge does not take the node to the rail in this first-order picture).
 * ref: Mohan, Undeland, Robbins, 3rd ed. (from memory), §5-3 (a current commutated through a
 * series inductance at a fixed voltage falls linearly, at V/L) and §10 (bridge legs: a switch
 * whose partner's antiparallel diode conducts blocks the rail plus that diode's drop); ngspice
 * (test/solvers/netlist/bridge-decay-drop-netlist.test.ts, the audit's seed 43 spec 11).
 */
export function bridgeDecayPlateau(
  circuit: DoubleEndedCircuit,
  turnOffA: number,
  carryA: number,
  swingS: number,
): PushPullTurnOffSpike | undefined {
  const llk = circuit.leakageInductanceH;
  const { bridge } = circuit;
  if (bridge.kind === 'push-pull' || !(llk > 0) || !(turnOffA > 0)) return undefined;
  const halfS = circuit.periodS / 2;
  const vin = circuit.inputVoltageV;
  const vbd = circuit.bodyDiodeVoltageV;
  const fallV =
    circuit.driveVoltageV +
    bridge.switchesInPath * vbd +
    (circuit.primaryLoopResistanceOhm * turnOffA) / 2;
  const decayS = (llk * turnOffA) / fallV;
  if (carryA <= 0 && decayS < swingS / 2) return undefined;
  return {
    aboveRailV: vin / 2 + vbd,
    riseS: swingS,
    holdS: carryA > 0 ? halfS : decayS - swingS / 2,
    fallS: (Math.PI / 2) * Math.sqrt(llk * circuit.nodeCapacitanceF),
    clampW: 0,
    ringW: 0,
  };
}
