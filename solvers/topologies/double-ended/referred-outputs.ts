import type { OutputStage } from '../buck-derived/output-stage.js';

/** The equivalent output referred to output 0's secondary, and each output's weight in it. */
export interface ReferredOutputs {
  stage: OutputStage;
  /** Per output: Leq/L'_k, the share of a change of the equivalent's voltage it sees. */
  weights: number[];
  /** Per output: n0/n_k, its current's factor referred to output 0's secondary. */
  factors: number[];
}

/** The drops of one output at its load current: the driven path's and the freewheeling one's, V. */
export interface StageDrops {
  onV: number;
  offV: number;
}

/** The drops of `lightLoadPoint` at the load current: they keep the equivalent's sums exact. */
export function stageDrops(stage: OutputStage): StageDrops {
  const io = stage.loadA;
  const rl = stage.inductorResistanceOhm;
  const { forwardVoltageV: vf, resistanceOhm: rd } = stage.rectifier;
  const { forwardVoltageV: offVf, resistanceOhm: offRd } = stage.freewheel ?? stage.rectifier;
  return {
    onV: vf + (stage.windingResistanceOhm + rd + rl) * io,
    offV: offVf + (offRd + rl) * io,
  };
}

/**
 * The equivalent output: the referred inductances L'_k = L_k·(n_k/n0)² in parallel, each
 * output's referred drops weighted by Leq/L'_k, the referred loads summed; the drops as fixed
 * voltages (their resistances already taken at the load current).
 */
export function referredOutputs(
  stages: readonly OutputStage[],
  turnsRatios: readonly number[],
  n0: number,
): ReferredOutputs | undefined {
  let inverseH = 0;
  for (let k = 0; k < stages.length; k++) {
    const c = n0 / (turnsRatios[k] ?? 1);
    const l = (stages[k] as OutputStage).inductanceH;
    if (!(l > 0) || !(c > 0)) return undefined;
    inverseH += (c * c) / l;
  }
  const leq = 1 / inverseH;
  const weights: number[] = [];
  const factors: number[] = [];
  let loadA = 0;
  let onV = 0;
  let offV = 0;
  for (let k = 0; k < stages.length; k++) {
    const stage = stages[k] as OutputStage;
    const c = n0 / (turnsRatios[k] ?? 1);
    const weight = (leq * c * c) / stage.inductanceH;
    const drops = stageDrops(stage);
    weights.push(weight);
    factors.push(c);
    loadA += c * stage.loadA;
    onV += (weight * drops.onV) / c;
    offV += (weight * drops.offV) / c;
  }
  return {
    stage: {
      loadA,
      inductanceH: leq,
      inductorResistanceOhm: 0,
      windingResistanceOhm: 0,
      rectifier: { forwardVoltageV: onV, resistanceOhm: 0 },
      freewheel: { forwardVoltageV: offV, resistanceOhm: 0 },
    },
    weights,
    factors,
  };
}
