import type { OutputStagePoint } from '../buck-derived/output-stage.js';
import { LIGHT_LOAD_MIN_ON_TIME_S } from '../light-load-min-on-time.js';
import { forwardClampV } from './complete-forward-state.js';
import type { ForwardEventCircuit } from './light-load-period.js';
import { solveForwardEventPeriod } from './light-load-solve.js';
import { magnetizingRingFrom } from './magnetizing-ring.js';
import type { TwoSwitchForwardCircuit, TwoSwitchForwardState } from './two-switch-forward-state.js';

/** Largest duty cycle the event solve may take (the reset needs the rest). */
const EVENT_DUTY_MAX = 0.9;

/**
 * Whether the event period is the model of a corner whose plain state is `plain`: a capacitance on
 * the winding at turn-off, and an output inductor discontinuous or the inductors' referred valley
 * (Σ Iv/n) below the magnetizing current the ring's return leaves circulating (−I0). In the
 * latter the plain model's continuous conduction does not hold either: the freewheeling
 * rectifiers carry the inductor current less the forward rectifier's share of −I0, so before the
 * turn-on they stop, the winding leaves zero and the magnetizing current drains into the outputs
 * (ngspice, the audit's 200–400 V two-switch forward with two outputs at 400 V and 15 % load,
 * `ngspice-scan.ts --seed 53 --input high` spec 13: its inductor valley 0.12 A against the plain
 * model's 0.008 A, the outputs 7.9 % and 8.4 % above the engine; with the event period 0.0 % and
 * 0.1 %; DEVELOPERS.md, "The ngspice check", audit5).
 */
export function eventPeriodApplies(
  circuit: TwoSwitchForwardCircuit,
  plain: TwoSwitchForwardState,
): boolean {
  return (
    circuit.stages.length > 0 &&
    plain.points.length === circuit.stages.length &&
    (plain.points.some((p) => p.mode === 'dcm') ||
      referredValleyA(circuit, plain) < -plain.magnetizingStartA) &&
    circuit.turnOffCapacitanceF > 0
  );
}

/** The output inductors' valley currents referred to the primary, Σ Iv,k/n_k, A. */
function referredValleyA(circuit: TwoSwitchForwardCircuit, plain: TwoSwitchForwardState): number {
  let sumA = 0;
  for (let k = 0; k < plain.points.length; k++) {
    sumA += (plain.points[k]?.valleyA ?? 0) / (circuit.turnsRatios[k] ?? 1);
  }
  return sumA;
}

/**
 * Returns the light-load steady state of a forward from its event period
 * ({@link solveForwardEventPeriod}: the turn-off swing, the ring of Lm with the node, the
 * inductors' freewheel and the drain of Lm and the inductors in series after the ring's return),
 * with the first output held at `regulatedV` (V) and the others cross-regulating (their voltages
 * solved from their charge balance), where `plain` (the state at the plain model's duty cycle)
 * has an output inductor discontinuous and the winding sees a capacitance. Undefined where that
 * does not apply (continuous conduction, no capacitance) or the solve does not converge; the
 * model notes say so.
 */
export function lightLoadState(
  circuit: TwoSwitchForwardCircuit,
  regulatedV: number,
  plain: TwoSwitchForwardState,
): TwoSwitchForwardState | undefined {
  const { stages, turnsRatios } = circuit;
  const n = turnsRatios[0] ?? 1;
  if (!eventPeriodApplies(circuit, plain)) return undefined;
  // Output k's secondary sees q·v (q = n/nk): referred, Lk/q², its paths' voltages /q, q·ILk.
  const q = stages.map((_stage, k) => n / (turnsRatios[k] ?? 1));
  const loadsA = stages.map((stage, k) => (q[k] as number) * stage.loadA);
  const periodS = circuit.periodS;
  // The drops taken at the load current (linear, as the plain model's at light load).
  const circuitAt = (outputV: number, otherOutputsV: readonly number[]): ForwardEventCircuit => ({
    outputs: stages.map((stage, k) => {
      const qk = q[k] as number;
      const io = stage.loadA;
      const { forwardVoltageV: vf, resistanceOhm: rd } = stage.rectifier;
      const fw = stage.freewheel ?? stage.rectifier;
      const vo = k === 0 ? outputV : (otherOutputsV[k - 1] as number);
      const pathV = vo + vf + (rd + stage.windingResistanceOhm + stage.inductorResistanceOhm) * io;
      const freewheelV =
        vo + fw.forwardVoltageV + (fw.resistanceOhm + stage.inductorResistanceOhm) * io;
      return k === 0
        ? { inductanceH: stage.inductanceH, pathV, freewheelV }
        : {
            inductanceH: stage.inductanceH / (qk * qk),
            pathV: pathV / qk,
            freewheelV: freewheelV / qk,
          };
    }),
    referredMagnetizingH: circuit.magnetizingInductanceH / (n * n),
    capacitanceF: circuit.turnOffCapacitanceF * n * n,
    clampV: forwardClampV(circuit) / n,
    onV: plain.primaryVoltageV / n,
    periodS,
    leakageH: circuit.leakageInductanceH / (n * n),
  });
  const start = {
    inductorsA: stages.map(() => 0),
    magnetizingA: plain.magnetizingStartA * n,
  };
  const plainOthersV = plain.points.slice(1).map((p) => p.voltageV);
  let outputV = regulatedV;
  let d: number;
  // With the first output held the circuit changes only with the other outputs' voltages: one
  // output builds it once.
  const held = circuitAt(regulatedV, plainOthersV);
  let solution = solveForwardEventPeriod(
    (x, others) => ({
      circuit: others.length === 0 ? held : circuitAt(regulatedV, others),
      dutyCycle: x,
    }),
    loadsA,
    { unknown: plain.dutyCycle, otherOutputsV: plainOthersV, start },
    { lo: 1e-6, hi: EVENT_DUTY_MAX },
  );
  if (solution !== undefined) d = solution.unknown;
  else {
    // No duty cycle holds the output: where the energy the node capacitance gives up at each
    // turn-off already exceeds the load's, the output rises even at the shortest on-time. The
    // corner is solved at that on-time for the output it reaches (listed in
    // summary.regulationMisses).
    d = Math.min(LIGHT_LOAD_MIN_ON_TIME_S / periodS, plain.dutyCycle);
    const atFloor = d;
    solution = solveForwardEventPeriod(
      (x, others) => ({ circuit: circuitAt(x, others), dutyCycle: atFloor }),
      loadsA,
      { unknown: regulatedV * 1.1, otherOutputsV: plainOthersV.map((v) => v * 1.1), start },
      { lo: regulatedV, hi: plain.primaryVoltageV / n },
    );
    if (solution !== undefined) outputV = solution.unknown;
  }
  if (solution === undefined) return undefined;
  const { period } = solution;
  if (!Number.isFinite(period.swingEndS)) return undefined;
  const commutation = period.commutationS / periodS;
  const swing = period.swingEndS / periodS;
  const startA = solution.start.magnetizingA / n;
  const turnOffA = period.swingEndMagnetizingA / n;
  const ring = magnetizingRingFrom(
    turnOffA,
    startA,
    circuit.magnetizingInductanceH,
    circuit.turnOffCapacitanceF,
    forwardClampV(circuit),
    (1 - d - swing) * periodS,
  );
  // Each stage's waveforms draw the valley through the commutation, the on-ramp to halfway
  // through the swing, a freewheel down to the valley and the valley held to the period's end
  // (the drain's shape is not drawn); the freewheel's length makes the mean the load.
  const onEnd = d + swing / 2;
  const points = stages.map((stage, k): OutputStagePoint => {
    const qk = q[k] as number;
    const io = stage.loadA;
    const valleyA =
      k === 0
        ? (solution.start.inductorsA[0] as number)
        : (solution.start.inductorsA[k] as number) / qk;
    const gateOffA =
      k === 0 ? (period.inductorPeaksA[0] as number) : (period.inductorPeaksA[k] as number) / qk;
    // Where even a fall over the whole off-time leaves the mean under the load (the current
    // still rises through a long swing, as at the 100 ns floor), the drawn peak is what the
    // mean needs: valley + 2·(Io − valley)/(1 − commutation).
    const mode = plain.points[k]?.mode ?? 'dcm';
    // A continuous output (beside a discontinuous one) is drawn as a triangle from the valley
    // through the period, mean (valley + peak)/2: its drawn peak is what makes that the load.
    const peakA =
      mode === 'ccm' && valleyA < io
        ? 2 * io - valleyA
        : Math.max(gateOffA, valleyA + (2 * (io - valleyA)) / (1 - commutation));
    const heldA =
      valleyA * (commutation + 1 - onEnd) + ((valleyA + peakA) / 2) * (onEnd - commutation);
    const freewheel = Math.min(
      Math.max((2 * (io - heldA)) / Math.max(peakA - valleyA, 1e-12), 0),
      1 - onEnd,
    );
    return {
      // The plain model's label (the netlists' snubbers follow it): one output is 'dcm' here.
      mode,
      voltageV: k === 0 ? outputV : (solution.otherOutputsV[k - 1] as number),
      valleyA,
      peakA,
      freewheelDutyCycle: freewheel,
      onMeanA: (valleyA + peakA) / 2,
    };
  });
  return {
    dutyCycle: d,
    commutationFraction: commutation,
    turnOffSwingFraction: swing,
    stageDutyCycle: Math.max(d - commutation + swing / 2, 1e-9),
    primaryVoltageV: plain.primaryVoltageV,
    magnetizingPeakA: turnOffA,
    magnetizingStartA: startA,
    ring,
    resetVoltageV: Math.max(ring.peakWindingV, period.reversedPeakV * n),
    resetDutyCycle: swing + ring.zeroCurrentS / periodS,
    points,
    lightLoad: period,
  };
}
