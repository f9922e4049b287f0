import { piecewiseLinear } from '../../waveform/piecewise-linear.js';
import type { Waveform } from '../../waveform/waveform.js';
import type { FlybackCircuit } from './flyback-circuit.js';
import type { FlybackRingTraces } from './flyback-ring-traces.js';
import type { FlybackSteadyState } from './flyback-steady-state.js';

/** The switch and rectifier voltages of one corner. */
export interface FlybackVoltageWaveforms {
  /** Drain-source voltage of the primary switch, V. */
  switchV: Waveform;
  /** Blocking voltage of each rectifier (cathode to anode; negative while it conducts), V. */
  rectifiersV: Waveform[];
}

/**
 * Returns the switch and rectifier voltages. Off-state switch voltage: Vin + Vc while the clamp
 * conducts, then Vin + n0·(Vo0 + Vf0 + R0·is0); with drain capacitance the leakage ring's arcs
 * (flyback-turn-off.ts) up to the clamp (or the ring's lower peak) and back; in DCM's idle interval the ring of Lm + Llk with
 * the drain capacitance (flyback-idle-ring.ts), from Vin + V0 down to the drain voltage at the
 * next turn-on (Vin when the spec gives no capacitance). Rectifier k blocks Vo_k + vm/nk while the
 * switch is on, vm = Lm/(Lm + Llk)·(Vin − Rp·ip) (Mohan, Undeland, Robbins, 3rd ed., §10-4-2
 * flyback converters, Vo + Vin/n, from memory), and Vo_k − vm/nk in the idle interval with
 * vm = Lm/(Lm + Llk)·(vd − Vin). `traces` are the corner's arcs (flyback-ring-traces.ts), shared
 * with the current waveforms.
 */
export function flybackVoltageWaveforms(
  circuit: FlybackCircuit,
  state: FlybackSteadyState,
  switchOnResistanceOhm: number,
  outputVoltagesV: readonly number[],
  traces: FlybackRingTraces,
): FlybackVoltageWaveforms {
  const periodS = circuit.periodS;
  const vin = circuit.inputVoltageV;
  const onS = state.dutyCycle * periodS;
  const t1 = state.turnOnCommutationS;
  // The drain's rise to Vin + V0 at turn-off (drawn along its arc), then the clamp plateau.
  const risenS = onS + state.turnOffTransitionS;
  const commutatedS = risenS + state.leakageRingS + state.turnOffCommutationS;
  const rise = traces.rise;
  const risePoints = rise.timesS.map((timeS, k): [number, number] => [
    timeS,
    rise.drainV[k] ?? vin + circuit.reflectedOffsetV,
  ]);
  const endS = state.conductionEndS;
  const valley = state.valleyCurrentA;
  const isContinuous = state.mode !== 'dcm' && valley > 0;
  const v0 = circuit.reflectedOffsetV;
  const rs = circuit.reflectedResistanceOhm;
  const afterV = vin + v0 + rs * state.afterCommutationCurrentA;
  // With drain capacitance the leakage ring lifts the drain to Vin + Vc, or peaks below it, and
  // swings back towards Vin + Vr (flyback-turn-off.ts); the engine takes it as damped there.
  const hasRing = state.leakageRingS > 0;
  const clampedV = hasRing
    ? Math.min(vin + circuit.clampVoltageV, vin + state.turnOffReflectedV + state.leakageRingPeakV)
    : vin + circuit.clampVoltageV;
  const clampPlateau: Array<[number, number]> = [
    [risenS, clampedV],
    [commutatedS, clampedV],
    [commutatedS, afterV],
  ];
  const { leakageRise, leakageReturn } = traces;
  const offPoints: Array<[number, number]> = [];
  for (let k = 0; k < leakageRise.timesS.length; k++) {
    offPoints.push([leakageRise.timesS[k] as number, leakageRise.drainV[k] as number]);
  }
  offPoints.push([risenS + state.leakageRingS, clampedV], [commutatedS, clampedV]);
  for (let k = 0; k < leakageReturn.timesS.length; k++) {
    offPoints.push([leakageReturn.timesS[k] as number, leakageReturn.drainV[k] as number]);
  }
  const rdsOn = switchOnResistanceOhm;
  // DCM: the idle ring from the end of secondary conduction (flyback-idle-ring.ts).
  const ring = isContinuous ? undefined : traces.idle;
  const switchV =
    ring === undefined
      ? piecewiseLinear(periodS, [
          [0, 0],
          [t1, rdsOn * state.onsetCurrentA],
          [onS, rdsOn * state.peakCurrentA],
          ...risePoints,
          // A zero-length clamp plateau (no leakage) collapses into the jump.
          ...(hasRing ? offPoints : clampPlateau),
          [periodS, vin + v0 + rs * valley],
        ])
      : piecewiseLinear(periodS, [
          [0, rdsOn * valley],
          [onS, rdsOn * state.peakCurrentA],
          ...risePoints,
          ...(hasRing ? offPoints : clampPlateau),
          [endS, vin + v0],
          ...ring.timesS.map((timeS, k): [number, number] => [timeS, ring.drainV[k] ?? vin]),
        ]);
  const magnetizingShare =
    circuit.magnetizingInductanceH / (circuit.magnetizingInductanceH + circuit.leakageInductanceH);
  const rp = circuit.primaryLoopResistanceOhm;
  const rectifiersV = circuit.outputs.map((path, k) => {
    const vo = outputVoltagesV[k] ?? 0;
    const n = path.turnsRatio;
    const vf = path.forwardVoltageV;
    const slope = path.rectifierResistanceOhm * path.currentShare;
    const blockingStartV = vo + (magnetizingShare * (vin - rp * state.onsetCurrentA)) / n;
    const blockingEndV = vo + (magnetizingShare * (vin - rp * state.peakCurrentA)) / n;
    const conductingAfterV = 0 - (vf + slope * state.afterCommutationCurrentA);
    return isContinuous
      ? piecewiseLinear(periodS, [
          [0, 0 - (vf + slope * valley)],
          [t1, 0 - vf],
          [t1, blockingStartV],
          [onS, blockingEndV],
          [risenS, 0 - vf],
          [commutatedS, conductingAfterV],
          [periodS, 0 - (vf + slope * valley)],
        ])
      : piecewiseLinear(periodS, [
          [0, blockingStartV],
          [onS, blockingEndV],
          // The winding voltage reverses as the drain rises; the rectifier conducts after it.
          [risenS, 0 - vf],
          [commutatedS, conductingAfterV],
          [endS, 0 - vf],
          // Idle: the winding carries the ring's share of (vd − Vin) over nk.
          ...(ring?.timesS ?? []).map((timeS, k): [number, number] => [
            timeS,
            vo - (magnetizingShare * ((ring?.drainV[k] ?? vin) - vin)) / n,
          ]),
        ]);
  });
  return { switchV, rectifiersV };
}
