import type { TransformerCorner } from '../transformer/evaluate-transformer.js';
import type { TransformerDuty } from '../transformer/transformer-duty.js';
import type { AnyCorner } from './design-schema.js';

/** One wound core (the transformer, or an output inductor) evaluated at one corner. */
export interface WoundCoreAtCorner {
  /** The duty it was evaluated on: its windings' names are the corner's copper lines. */
  duty: TransformerDuty;
  /** Its losses and resistances at the corner. */
  losses: TransformerCorner;
  /** Name of the core-loss line it adds to the corner's budget. */
  coreComponent: string;
}

/**
 * Returns `corner` with the losses of every wound core in `cores` in its budget: each winding's
 * copper line (and stress entry) takes the evaluated DC-plus-AC loss and its DC resistance at
 * the corner's temperature, a core-loss line per core is added (in the order of `cores`), and
 * input power, input current and efficiency follow (the input supplies the extra loss; the duty
 * cycle is not re-solved for it). A winding named twice takes the later core's numbers. The
 * corner is copied once, whatever the number of cores.
 */
export function cornerWithWoundCores<Corner extends AnyCorner>(
  corner: Corner,
  cores: readonly WoundCoreAtCorner[],
): Corner {
  const byName = new Map<string, { lossW: number; resistanceOhm: number }>();
  for (const { duty, losses } of cores) {
    duty.windings.forEach((winding, k) => {
      const loss = losses.windings[k];
      if (loss === undefined) return;
      byName.set(winding.name, {
        lossW: loss.dcLossW + loss.acLossW,
        resistanceOhm: loss.resistanceOhm,
      });
    });
  }
  const losses = corner.losses.map((item) => {
    const winding = item.mechanism === 'copper' ? byName.get(item.component) : undefined;
    return winding === undefined ? item : Object.assign({}, item, { powerW: winding.lossW });
  });
  for (const core of cores) {
    losses.push({
      component: core.coreComponent,
      mechanism: 'core',
      powerW: core.losses.coreLossW,
    });
  }
  let lossTotalW = 0;
  for (const item of losses) lossTotalW += item.powerW;
  const inputPowerW = corner.outputPowerW + lossTotalW;
  // Object.assign, not a spread followed by keys: this V8 (Node 20) copies a corner about twice
  // as fast so (the same keys in the same order, the same values).
  return Object.assign({}, corner, {
    windings: corner.windings.map((entry) => {
      const winding = byName.get(entry.name);
      return winding === undefined
        ? entry
        : Object.assign({}, entry, {
            resistanceOhm: winding.resistanceOhm,
            copperLossW: winding.lossW,
          });
    }),
    losses,
    lossTotalW,
    inputPowerW,
    inputCurrentAverageA: inputPowerW / corner.inputVoltageV,
    efficiency: corner.outputPowerW / inputPowerW,
  });
}
