import { rms } from '../waveform/rms.js';
import type { TransformerDuty } from './transformer-duty.js';
import type { TransformerBuild } from './transformer-build.js';
import { windingLayout, type WindingLayout } from './winding-layout.js';
import { stackField, type StackField, type StackSection } from './winding-stack.js';

/**
 * Returns each winding's share of the ampere-turns that balance the primary's (0 for the
 * primary): Nk·Ik,rms at the corner of largest primary RMS current.
 */
export function ampereTurnShares(duty: TransformerDuty, turns: readonly number[]): number[] {
  const primary = duty.windings[0];
  if (primary === undefined) throw new RangeError('ampereTurnShares: no primary winding');
  let worst = 0;
  primary.currentsA.forEach((current, index) => {
    if (rms(current) > rms(primary.currentsA[worst] ?? current)) worst = index;
  });
  const shares = duty.windings.map((winding, k) => {
    const current = winding.currentsA[worst] ?? winding.currentsA[0];
    return k === 0 || current === undefined ? 0 : (turns[k] ?? 0) * rms(current);
  });
  const sum = shares.reduce((total, share) => total + share, 0) || 1;
  return shares.map((share) => share / sum);
}

/** The windings of a build laid into its window. */
export interface TransformerStack extends StackField {
  /** Each winding's layout (for an interleaved primary, the layout of the whole primary). */
  layouts: WindingLayout[];
  /** Height of all sections and the insulation between them, m. */
  stackHeightM: number;
  /** Outside cross-section of every turn, m². */
  outsideAreaM2: number;
}

/**
 * Lays the build's windings into a window of breadth `breadthM` (m) and returns the layouts,
 * the stack height, the leakage inductance and Dowell's layer counts; undefined when a winding
 * does not fit the breadth. The secondaries' ampere-turns balance the primary's in the build's
 * shares, or by {@link ampereTurnShares} of the duty when the build has none.
 */
export function transformerStack(
  duty: TransformerDuty,
  build: TransformerBuild,
  breadthM: number,
  sectionInsulationM: number,
  meanTurnLengthM: number,
): TransformerStack | undefined {
  const windingCount = duty.windings.length;
  const layouts: WindingLayout[] = [];
  for (let k = 0; k < windingCount; k++) {
    const wire = build.wires[k];
    const turns = build.turns[k];
    if (wire === undefined || turns === undefined)
      throw new RangeError('transformerStack: a winding lacks turns or wire');
    const layout = windingLayout(turns, wire, breadthM);
    if (layout === undefined) return undefined;
    layouts.push(layout);
  }
  const primaryTurns = build.turns[0] as number;
  const primary = duty.windings[0];
  if (primary === undefined) throw new RangeError('transformerStack: no primary winding');
  const weights = build.ampereTurnShares ?? ampereTurnShares(duty, build.turns);
  const weightSum = weights.reduce((sum, w) => sum + w, 0) || 1;
  const secondarySections: StackSection[] = layouts.slice(1).map((layout, i) => ({
    winding: i + 1,
    layerCount: layout.layerCount,
    heightM: layout.heightM,
    ampereTurnsPerPrimaryA: (-primaryTurns * (weights[i + 1] ?? 0)) / weightSum,
  }));
  const primaryLayout = layouts[0] as WindingLayout;
  const primarySection = (turns: number): StackSection => {
    const layout = windingLayout(turns, primaryLayout.wire, breadthM) as WindingLayout;
    return {
      winding: 0,
      layerCount: layout.layerCount,
      heightM: layout.heightM,
      ampereTurnsPerPrimaryA: turns,
    };
  };
  const inner = Math.ceil(primaryTurns / 2);
  const sections =
    build.arrangement === 'interleaved' && primaryTurns >= 2
      ? [primarySection(inner), ...secondarySections, primarySection(primaryTurns - inner)]
      : [primarySection(primaryTurns), ...secondarySections];
  const field = stackField(sections, windingCount, sectionInsulationM, breadthM, meanTurnLengthM);
  let stackHeightM = (sections.length - 1) * sectionInsulationM;
  for (const section of sections) stackHeightM += section.heightM;
  const outsideAreaM2 = layouts.reduce((sum, layout) => sum + layout.outsideAreaM2, 0);
  return { ...field, layouts, stackHeightM, outsideAreaM2 };
}
