import type { TransformerCorner } from '../transformer/evaluate-transformer.js';
import type { TransformerDuty } from '../transformer/transformer-duty.js';
import type { AnyCorner } from './design-schema.js';

/** Name of the core-loss line a designed transformer adds to each corner's budget. */
export const TRANSFORMER_CORE_COMPONENT = 'transformer-core';

/**
 * Returns `corner` with a designed wound core's losses in its budget: each winding's copper
 * line (and stress entry) takes the evaluated DC-plus-AC loss and its DC resistance at the
 * corner's temperature, a core-loss line named `coreComponent` is added, and input power, input
 * current and efficiency follow (the input supplies the extra loss; the duty cycle is not
 * re-solved for it). The transformer uses it, and each output inductor (its one winding named as
 * the corner's inductor copper line, its core line under the same name).
 */
export function cornerWithTransformer<Corner extends AnyCorner>(
  corner: Corner,
  duty: TransformerDuty,
  transformer: TransformerCorner,
  coreComponent: string = TRANSFORMER_CORE_COMPONENT,
): Corner {
  const byName = new Map<string, { lossW: number; resistanceOhm: number }>();
  duty.windings.forEach((winding, k) => {
    const loss = transformer.windings[k];
    if (loss === undefined) return;
    byName.set(winding.name, {
      lossW: loss.dcLossW + loss.acLossW,
      resistanceOhm: loss.resistanceOhm,
    });
  });
  const losses = corner.losses.map((item) => {
    const winding = item.mechanism === 'copper' ? byName.get(item.component) : undefined;
    return winding === undefined ? item : { ...item, powerW: winding.lossW };
  });
  losses.push({
    component: coreComponent,
    mechanism: 'core',
    powerW: transformer.coreLossW,
  });
  let lossTotalW = 0;
  for (const item of losses) lossTotalW += item.powerW;
  const inputPowerW = corner.outputPowerW + lossTotalW;
  return {
    ...corner,
    windings: corner.windings.map((entry) => {
      const winding = byName.get(entry.name);
      return winding === undefined
        ? entry
        : { ...entry, resistanceOhm: winding.resistanceOhm, copperLossW: winding.lossW };
    }),
    losses,
    lossTotalW,
    inputPowerW,
    inputCurrentAverageA: inputPowerW / corner.inputVoltageV,
    efficiency: corner.outputPowerW / inputPowerW,
  };
}
