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
 * the corner's temperature (a winding with no copper line in `corner`, such as a reset winding,
 * gets one, after the others), a core-loss line per core is added (in the order of `cores`), and
 * input power, input current and efficiency follow (the input supplies the extra loss; the duty
 * cycle is not re-solved for it). A winding named twice takes the later core's numbers. The
 * corner is copied once, whatever the number of cores.
 */
export function cornerWithWoundCores<Corner extends AnyCorner>(
  corner: Corner,
  cores: readonly WoundCoreAtCorner[],
): Corner {
  // The windings' names and numbers in plain arrays, searched from the end (the later core
  // wins, as a Map's last set would): a corner has a handful of windings, and the Map and the
  // callbacks over it were about a quarter of this function's own time in a profile.
  const names: string[] = [];
  const lossesW: number[] = [];
  const resistancesOhm: number[] = [];
  for (const { duty, losses } of cores) {
    for (let k = 0; k < duty.windings.length; k++) {
      const loss = losses.windings[k];
      if (loss === undefined) continue;
      names.push((duty.windings[k] as (typeof duty.windings)[number]).name);
      lossesW.push(loss.dcLossW + loss.acLossW);
      resistancesOhm.push(loss.resistanceOhm);
    }
  }
  const losses: AnyCorner['losses'] = [];
  const lined: boolean[] = names.map(() => false);
  for (const item of corner.losses) {
    const i = item.mechanism === 'copper' ? names.lastIndexOf(item.component) : -1;
    if (i >= 0) lined[i] = true;
    losses.push(i < 0 ? item : Object.assign({}, item, { powerW: lossesW[i] as number }));
  }
  // A winding the converter's solve gives no copper line of its own (the reset-winding
  // forward's reset winding: its resistance is not in the solve) still loses its evaluated
  // copper: a line of its own, else the total and the efficiency leave it out.
  for (let i = 0; i < names.length; i++) {
    if (lined[i] === true || names.lastIndexOf(names[i] as string) !== i) continue;
    losses.push({
      component: names[i] as string,
      mechanism: 'copper',
      powerW: lossesW[i] as number,
    });
  }
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
  // A spread over keys the corner has already (every corner carries these): one copy of its
  // shape. Object.assign({}, corner, {...}) added the corner's 25–30 keys one by one and left
  // the copy in dictionary mode (slow properties) past V8's limit for keys added so.
  return {
    ...corner,
    windings: corner.windings.map((entry) => {
      const i = names.lastIndexOf(entry.name);
      return i < 0
        ? entry
        : Object.assign({}, entry, {
            resistanceOhm: resistancesOhm[i] as number,
            copperLossW: lossesW[i] as number,
          });
    }),
    losses,
    lossTotalW,
    inputPowerW,
    inputCurrentAverageA: inputPowerW / corner.inputVoltageV,
    efficiency: corner.outputPowerW / inputPowerW,
  };
}
