import type { Spec } from '../spec/spec-schema.js';
import type { TransformerChoice } from '../transformer/design-transformer.js';
import type { TransformerDuty } from '../transformer/transformer-duty.js';

/**
 * Returns `spec` with the designed transformer fixed in it, so that the topology solves the
 * operating point with what will be wound: the whole-turns ratio of every output, the winding
 * resistances at 20 °C taken at the hottest corner's temperature, the leakage from the winding
 * geometry, (for an ungapped core) the magnetizing inductance the core gives, and a reset
 * winding's whole-turns ratio.
 */
export function specWithTransformer(
  spec: Spec,
  duty: TransformerDuty,
  chosen: TransformerChoice,
): Spec {
  const { build, evaluation } = chosen;
  const primaryTurns = build.turns[0] as number;
  const outputTurns: number[] = spec.outputs.map(() => NaN);
  const outputResistances: number[] = spec.outputs.map((output) => output.windingResistanceOhm);
  let primaryResistanceOhm = spec.transformer.primaryResistanceOhm;
  let resetTurnsRatio: number | undefined;
  duty.windings.forEach((winding, k) => {
    const resistanceOhm = evaluation.resistancesAt20COhm[k] ?? 0;
    if (winding.role.kind === 'primary') primaryResistanceOhm = resistanceOhm;
    if (winding.role.kind === 'reset') resetTurnsRatio = (build.turns[k] as number) / primaryTurns;
    if (winding.role.kind !== 'output') return;
    const index = winding.role.outputIndex;
    // The first winding of an output (one half of a center tap) names its turns and resistance.
    if (Number.isNaN(outputTurns[index])) {
      outputTurns[index] = build.turns[k] as number;
      outputResistances[index] = resistanceOhm;
    }
  });
  const outputTurnsRatios = outputTurns.map((turns) => primaryTurns / turns);
  if (outputTurnsRatios.some((ratio) => !Number.isFinite(ratio))) {
    throw new Error('specWithTransformer: an output has no winding in the duty');
  }
  const hottestC = Math.max(...evaluation.corners.map((corner) => corner.temperatureC));
  // Object.assign, not spreads followed by new keys: this V8 (Node 20) takes a slow path of
  // several microseconds for the latter (same keys, same order, same values).
  return Object.assign(
    {},
    spec,
    resetTurnsRatio === undefined
      ? {}
      : { forward: Object.assign({}, spec.forward, { resetTurnsRatio }) },
    {
      outputs: spec.outputs.map((output, k) =>
        Object.assign({}, output, {
          windingResistanceOhm: outputResistances[k] ?? output.windingResistanceOhm,
        }),
      ),
      transformer: Object.assign({}, spec.transformer, {
        turnsRatio: outputTurnsRatios[0] as number,
        outputTurnsRatios,
        magnetizingInductanceH:
          duty.gapRole === 'set-inductance'
            ? duty.magnetizingInductanceH
            : evaluation.magnetizingInductanceH,
        // A leakage the request fixes (a measured one, say) outranks the geometric estimate.
        leakageInductanceH:
          spec.transformer.leakageInductanceH ?? evaluation.stack.leakageInductanceH,
        primaryResistanceOhm,
        copperTemperatureC: hottestC,
      }),
    },
  );
}
