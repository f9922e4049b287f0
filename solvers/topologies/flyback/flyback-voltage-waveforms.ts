import {
  drawnWaveform,
  drawPoint,
  drawTrace,
  piecewiseLinear,
  reusableDrawing,
  startDrawing,
} from '../../waveform/piecewise-linear.js';
import type { Waveform } from '../../waveform/waveform.js';
import type { FlybackCircuit } from './flyback-circuit.js';
import type { FlybackRingTraces } from './flyback-ring-traces.js';
import type { FlybackSteadyState } from './flyback-steady-state.js';

/**
 * The drawings of the drain voltage and of one rectifier's (the outputs' are drawn one after
 * another), started again for every corner: each waveform then allocates its kept points once.
 */
const DRAIN = reusableDrawing();
const RECTIFIER = reusableDrawing();

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
  const { leakageRise, leakageReturn } = traces;
  const rdsOn = switchOnResistanceOhm;
  // DCM: the idle ring from the end of secondary conduction (flyback-idle-ring.ts).
  const ring = isContinuous ? undefined : traces.idle;
  // Drawn as columns of times and values, as the currents are (flyback-current-waveforms.ts).
  const drain = startDrawing(0, ring === undefined ? 0 : rdsOn * valley, DRAIN);
  if (ring === undefined) drawPoint(drain, t1, rdsOn * state.onsetCurrentA);
  drawPoint(drain, onS, rdsOn * state.peakCurrentA);
  drawTrace(drain, rise.timesS, rise.drainV);
  if (hasRing) {
    drawTrace(drain, leakageRise.timesS, leakageRise.drainV);
    drawPoint(drain, risenS + state.leakageRingS, clampedV);
    drawPoint(drain, commutatedS, clampedV);
    drawTrace(drain, leakageReturn.timesS, leakageReturn.drainV);
  } else {
    // A zero-length clamp plateau (no leakage) collapses into the jump.
    drawPoint(drain, risenS, clampedV);
    drawPoint(drain, commutatedS, clampedV);
    drawPoint(drain, commutatedS, afterV);
  }
  if (ring === undefined) {
    drawPoint(drain, periodS, vin + v0 + rs * valley);
  } else {
    drawPoint(drain, endS, vin + v0);
    drawTrace(drain, ring.timesS, ring.drainV);
  }
  const switchV = drawnWaveform(periodS, drain);
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
    if (isContinuous) {
      return piecewiseLinear(periodS, [
        [0, 0 - (vf + slope * valley)],
        [t1, 0 - vf],
        [t1, blockingStartV],
        [onS, blockingEndV],
        [risenS, 0 - vf],
        [commutatedS, conductingAfterV],
        [periodS, 0 - (vf + slope * valley)],
      ]);
    }
    const drawing = startDrawing(0, blockingStartV, RECTIFIER);
    drawPoint(drawing, onS, blockingEndV);
    // The winding voltage reverses as the drain rises; the rectifier conducts after it.
    drawPoint(drawing, risenS, 0 - vf);
    drawPoint(drawing, commutatedS, conductingAfterV);
    drawPoint(drawing, endS, 0 - vf);
    // Idle: the winding carries the ring's share of (vd − Vin) over nk.
    const idleTimesS = ring?.timesS ?? [];
    for (let j = 0; j < idleTimesS.length; j++) {
      const drainV = ring?.drainV[j] ?? vin;
      drawPoint(drawing, idleTimesS[j] as number, vo - (magnetizingShare * (drainV - vin)) / n);
    }
    return drawnWaveform(periodS, drawing);
  });
  return { switchV, rectifiersV };
}
