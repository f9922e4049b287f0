import { SpecSchema } from '../../solvers/spec/spec-schema.js';
import {
  doubleEndedCircuit,
  type DoubleEndedChoices,
  type DoubleEndedCircuit,
} from '../../solvers/topologies/double-ended/double-ended-state.js';
import { primaryBridge } from '../../solvers/topologies/double-ended/primary-bridge.js';

/** What {@link idealizedBridgeCircuit} takes; the rest is fixed (see there). */
export interface IdealizedBridge {
  kind: 'half-bridge' | 'full-bridge';
  /** The bridge's input, V (a half bridge drives half of it). */
  inputVoltageV: number;
  /** The one 12 V output's current, A. */
  currentA: number;
  switchingFrequencyHz: number;
  leakageInductanceH: number;
  /** One switch's output capacitance, F. */
  outputCapacitanceF: number;
  /** One switch's body-diode drop, V. */
  bodyDiodeForwardVoltageV: number;
}

/**
 * An invented, idealized bridge for the leakage's tests (not any product): one 12 V output at
 * `currentA` through drop-free rectifiers, turns ratio 1, no winding or loop resistance, and
 * magnetizing and output inductances so large (1 H) that the currents are flat: the primary
 * current at turn-off and at turn-on are both the output current.
 */
export function idealizedBridgeCircuit(bridge: IdealizedBridge): DoubleEndedCircuit {
  const spec = SpecSchema.parse({
    topology: bridge.kind,
    inputVoltageMinV: bridge.inputVoltageV,
    inputVoltageNominalV: bridge.inputVoltageV,
    inputVoltageMaxV: bridge.inputVoltageV,
    outputs: [
      {
        voltageV: 12,
        currentA: bridge.currentA,
        rectifier: { kind: 'diode', forwardVoltageV: 0, resistanceOhm: 0, voltageRatingV: 100 },
        windingResistanceOhm: 0,
      },
    ],
    switchingFrequencyHz: bridge.switchingFrequencyHz,
    primarySwitch: {
      onResistanceOhm: 1e-3,
      voltageRatingV: 200,
      outputCapacitanceF: bridge.outputCapacitanceF,
      bodyDiodeForwardVoltageV: bridge.bodyDiodeForwardVoltageV,
    },
  });
  const choices = {
    turnsRatio: 1,
    outputTurnsRatios: [1],
    magnetizingInductanceH: 1,
    leakageInductanceH: bridge.leakageInductanceH,
    outputInductancesH: [1],
    primaryResistanceOhm: 0,
    outputWindingResistancesOhm: [0],
    outputInductorResistancesOhm: [0],
    secondaryArrangements: ['center-tapped'],
  } as unknown as DoubleEndedChoices;
  const circuit = doubleEndedCircuit(spec, primaryBridge(bridge.kind), choices, {
    label: 'invented',
    inputVoltageV: bridge.inputVoltageV,
    loadFraction: 1,
  });
  // The spec asks for some on-resistance; the idealized circuit has none.
  return { ...circuit, primaryLoopResistanceOhm: 0 };
}
