import type { Spec } from '../../spec/spec-schema.js';
import { ascendingSampler } from '../../waveform/value-at.js';
import type { DoubleEndedCircuit, DoubleEndedState } from './double-ended-state.js';
import { LEAKAGE_DAMPING_RATIO } from './leakage-damping.js';
import type { PushPullTurnOnRing } from './push-pull-clamp.js';
import { pushPullShortDeadTime, type PushPullShortDeadTime } from './push-pull-short-dead-time.js';
import type { SecondaryWaveforms } from './secondary-waveforms.js';

/**
 * The push-pull's half stepped through its short dead time (`pushPullShortDeadTime`), where the
 * corner has one: continuous conduction on every output (not the leaky light-load half) and a
 * dead time shorter than the decay time of the off drain's ring with its leakage, 2·Q/ω
 * (Q = `LEAKAGE_DAMPING_RATIO`, ω = 1/√(Llk·Coss)), over which its amplitude falls by 1/e;
 * undefined elsewhere (the ring then starts where the engine's drawn drain leaves it, as before).
 */
export function pushPullCarriedHalf(
  spec: Spec,
  circuit: DoubleEndedCircuit,
  state: DoubleEndedState,
  outputs: readonly SecondaryWaveforms[],
  releaseS: number,
): PushPullShortDeadTime | undefined {
  const llk = circuit.leakageInductanceH;
  const c = spec.primarySwitch.outputCapacitanceF;
  const clampV = circuit.clampVoltageV;
  if (state.leakyHalf !== undefined || clampV === undefined || !(llk > 0 && c > 0)) {
    return undefined;
  }
  for (const point of state.points) if (point.mode !== 'ccm') return undefined;
  const halfS = circuit.periodS / 2;
  const onS = state.dutyCycle * circuit.periodS;
  const decayS = 2 * LEAKAGE_DAMPING_RATIO * Math.sqrt(llk * c);
  if (!(halfS - onS < decayS)) return undefined;
  const ratios = circuit.turnsRatios;
  const samplers = outputs.map((w) => ascendingSampler(w.inductorA));
  return pushPullShortDeadTime({
    inputV: circuit.inputVoltageV,
    leakageH: llk,
    capacitanceF: c,
    loopOhm: circuit.primaryLoopResistanceOhm,
    dampingOhm: LEAKAGE_DAMPING_RATIO * Math.sqrt(llk / c),
    magnetizingH: circuit.magnetizingInductanceH,
    magnetizingStartA: state.magnetizingStartA,
    clampV,
    halfS,
    onS,
    releaseS,
    referredInductorA: (timeS) => {
      let sum = 0;
      for (let k = 0; k < samplers.length; k++) {
        sum += (samplers[k] as (t: number) => number)(timeS) / (ratios[k] ?? 1);
      }
      return sum;
    },
  });
}

/**
 * The turn-on ring with the stepped half's peaks (`pushPullCarriedHalf`): the off drain's crest as its
 * voltage (the clamp's share as the lumped ring from the stepped start has it), and what the
 * drain holds above the driven level at that crest rung away.
 */
export function carriedTurnOnRing(
  lumped: PushPullTurnOnRing | undefined,
  carried: PushPullShortDeadTime,
  circuit: DoubleEndedCircuit,
  spec: Spec,
  clampV: number,
  windingV: number,
): PushPullTurnOnRing {
  const c = spec.primarySwitch.outputCapacitanceF;
  const halfRingS = Math.PI * Math.sqrt(2 * circuit.leakageInductanceH * c);
  const aboveRailV = Math.min(clampV, Math.max(0, carried.drainPeakV - circuit.inputVoltageV));
  const over = Math.max(0, aboveRailV - windingV);
  return {
    aboveRailV,
    riseS: lumped?.riseS ?? halfRingS,
    holdS: lumped?.holdS ?? 0,
    fallS: halfRingS,
    currentA: lumped?.currentA ?? 0,
    quarterS: halfRingS / 2,
    clampW: lumped?.clampW ?? 0,
    ringW: c * over * over * spec.switchingFrequencyHz,
  };
}
