import type { Spec } from '../../spec/spec-schema.js';
import { ascendingSampler } from '../../waveform/value-at.js';
import type { DoubleEndedCircuit, DoubleEndedState } from './double-ended-state.js';
import { LEAKAGE_DAMPING_RATIO } from './leakage-damping.js';
import type { PushPullTurnOnRing } from './push-pull-clamp.js';
import { pushPullShortDeadTime, type PushPullShortDeadTime } from './push-pull-short-dead-time.js';
import type { SecondaryWaveforms } from './secondary-waveforms.js';

/**
 * What is left of the off drain's ring's amplitude at the other switch's turn-on, as a fraction,
 * above which the half is stepped: 5 %, a dead time of 2·Q·√(Llk·Coss)·ln 20, some three times
 * the ring's 1/e decay. Taken from ngspice (Debian) at 32 steps a ring (DEVELOPERS.md, "The
 * push-pull's short dead time", the threshold): of the scans' 12 push-pull corners whose dead
 * time lies between 1/e and 5 %, the ring from the rail read up to 13 % low on the switch current
 * and 7 % on the voltage (the stepped half: within 1.7 %, but for one 36 V corner whose voltage
 * went +2.1 → +5.8 %); at 1/e, where it stood first, a corner just past it was 12.8 % low.
 */
const CARRIED_RING_FRACTION_MIN = 0.05;

/**
 * The push-pull's half stepped through its short dead time (`pushPullShortDeadTime`), where the
 * corner has one: continuous conduction on every output (not the leaky light-load half) and a
 * dead time over which the off drain's ring with its leakage keeps more than
 * CARRIED_RING_FRACTION_MIN of its amplitude (the amplitude falls as e^(−t·ω/(2·Q)), Q =
 * `LEAKAGE_DAMPING_RATIO`, ω = 1/√(Llk·Coss)); undefined elsewhere (the ring then starts where
 * the engine's drawn drain leaves it, as before).
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
  // The ring's time constant 2·Q·√(Llk·C), times ln(1/fraction).
  const carriedS =
    2 * LEAKAGE_DAMPING_RATIO * Math.sqrt(llk * c) * Math.log(1 / CARRIED_RING_FRACTION_MIN);
  if (!(halfS - onS < carriedS)) return undefined;
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
