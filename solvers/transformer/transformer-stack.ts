import { ObjectMemo } from '../object-memo.js';
import { rms } from '../waveform/rms.js';
import type { TransformerDuty } from './transformer-duty.js';
import type { TransformerBuild } from './transformer-build.js';
import { windingLayout, type WindingLayout } from './winding-layout.js';
import { stackField, type StackField, type StackSection } from './winding-stack.js';

/**
 * Returns each winding's signed share of the ampere-turns in the window: the primary-role
 * windings share +1 and the output windings −1, each in proportion to Nk·Ik,rms at the corner of
 * largest primary RMS current (a push-pull's two primary halves, a center tap's two halves). A
 * reset winding conducts alone, while the primary and outputs are idle, so it takes no part in
 * their balance: its share is its own Nk·Ik,rms over the primaries' (positive; its field is
 * that of its own interval, see transformerStack).
 */
export function ampereTurnShares(duty: TransformerDuty, turns: readonly number[]): number[] {
  const currentsRms = worstCornerRms(duty);
  const weights = currentsRms.map((rmsA, k) => (rmsA === undefined ? 0 : (turns[k] ?? 0) * rmsA));
  const isPrimary = duty.windings.map((winding) => winding.role.kind === 'primary');
  const isReset = duty.windings.map((winding) => winding.role.kind === 'reset');
  // One loop, no named closure (under tsx a defineProperty per call; a search asks per turn set).
  let primarySum = 0;
  let otherSum = 0;
  for (let k = 0; k < weights.length; k++) {
    if (isPrimary[k] === true) primarySum += weights[k] as number;
    else if (isReset[k] !== true) otherSum += weights[k] as number;
  }
  primarySum = primarySum || 1;
  otherSum = otherSum || 1;
  return weights.map((weight, k) =>
    isPrimary[k] || isReset[k] ? weight / primarySum : -weight / otherSum,
  );
}

/**
 * Each winding's RMS current at the corner of largest primary RMS current (undefined for a
 * winding without currents), by the duty's windings: a search asks for the shares of every turn
 * set it tries against the same currents (waveforms are plain data nothing mutates).
 */
const WORST_CORNER_RMS = new ObjectMemo<TransformerDuty['windings'], Array<number | undefined>>();

function worstCornerRms(duty: TransformerDuty): Array<number | undefined> {
  const known = WORST_CORNER_RMS.get(duty.windings);
  if (known !== undefined) return known;
  const primary = duty.windings[0];
  if (primary === undefined) throw new RangeError('ampereTurnShares: no primary winding');
  const primaryRms = primary.currentsA.map((current) => rms(current));
  let worst = 0;
  for (let index = 1; index < primaryRms.length; index++) {
    if ((primaryRms[index] as number) > (primaryRms[worst] as number)) worst = index;
  }
  const currentsRms = duty.windings.map((winding) => {
    const current = winding.currentsA[worst] ?? winding.currentsA[0];
    return current === undefined ? undefined : rms(current);
  });
  WORST_CORNER_RMS.set(duty.windings, currentsRms);
  return currentsRms;
}

/** The windings of a build laid into its window. */
export interface TransformerStack extends StackField {
  /** Each winding's layout (for a split primary, the layout of the whole winding). */
  layouts: WindingLayout[];
  /** Height of all sections and the insulation between them, m. */
  stackHeightM: number;
  /** Outside cross-section of every turn, m². */
  outsideAreaM2: number;
}

/**
 * Lays the build's windings into a window of breadth `breadthM` (m) and returns the layouts,
 * the stack height, the leakage inductance (referred to winding 0) and Dowell's layer counts;
 * undefined when a winding does not fit the breadth. 'stacked' puts the primary-role windings
 * next to the centre leg and the others outside; 'interleaved' puts the others between two
 * primary halves (one primary split in two, or the first half of several primaries inside).
 * A reset winding goes next to the centre leg, inside everything else, in either arrangement:
 * it conducts only while the primary and secondaries are idle, so there the power transfer's
 * field is zero (no eddy loss while it is idle), and in its own interval the field rises from
 * zero across its own layers alone (Dowell's portion from a null; Dowell, Proc. IEE, 1966;
 * common practice: a winding next to the core with nothing inside it sees only its own MMF).
 * Ampere-turns follow the build's shares, or {@link ampereTurnShares} of the duty.
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
    if (wire === undefined || turns === undefined) {
      throw new RangeError('transformerStack: a winding lacks turns or wire');
    }
    const layout = windingLayout(turns, wire, breadthM);
    if (layout === undefined) return undefined;
    layouts.push(layout);
  }
  const referenceTurns = build.turns[0] as number;
  const shares = build.ampereTurnShares ?? ampereTurnShares(duty, build.turns);
  const primaries: number[] = [];
  const others: number[] = [];
  let resets: number[] | undefined;
  duty.windings.forEach((winding, k) => {
    const kind = winding.role.kind;
    if (kind === 'reset') (resets ??= []).push(k);
    else (kind === 'primary' ? primaries : others).push(k);
  });
  // Module functions, not named closures: under tsx each closure costs a defineProperty a call,
  // and a search lays a stack for every candidate it checks.
  const middle: StackSection[] = [];
  for (const k of others) {
    middle.push(
      stackSection(layouts, k, build.turns[k] as number, shares[k] ?? 0, referenceTurns, breadthM),
    );
  }
  let sections: StackSection[];
  const only = primaries[0] as number;
  if (build.arrangement === 'interleaved' && primaries.length === 1 && build.turns[only]! >= 2) {
    const turns = build.turns[only] as number;
    const inner = Math.ceil(turns / 2);
    const share = shares[only] ?? 0;
    sections = [
      stackSection(layouts, only, inner, (share * inner) / turns, referenceTurns, breadthM),
      ...middle,
      stackSection(
        layouts,
        only,
        turns - inner,
        (share * (turns - inner)) / turns,
        referenceTurns,
        breadthM,
      ),
    ];
  } else if (build.arrangement === 'interleaved' && primaries.length >= 2) {
    const split = Math.ceil(primaries.length / 2);
    sections = [];
    for (let i = 0; i < split; i++) {
      sections.push(
        wholeSection(layouts, primaries[i] as number, build, shares, referenceTurns, breadthM),
      );
    }
    sections.push(...middle);
    for (let i = split; i < primaries.length; i++) {
      sections.push(
        wholeSection(layouts, primaries[i] as number, build, shares, referenceTurns, breadthM),
      );
    }
  } else {
    sections = [];
    for (const k of primaries) {
      sections.push(wholeSection(layouts, k, build, shares, referenceTurns, breadthM));
    }
    sections.push(...middle);
  }
  // A reset winding goes inside everything, next to the centre leg, in its own interval.
  if (resets !== undefined) {
    const inside: StackSection[] = [];
    for (const k of resets) {
      const { winding, layerCount, heightM, ampereTurnsPerPrimaryA } = wholeSection(
        layouts,
        k,
        build,
        shares,
        referenceTurns,
        breadthM,
      );
      inside.push({
        winding,
        layerCount,
        heightM,
        ampereTurnsPerPrimaryA,
        conductionInterval: RESET_INTERVAL,
      });
    }
    sections = [...inside, ...sections];
  }
  const field = stackField(sections, windingCount, sectionInsulationM, breadthM, meanTurnLengthM);
  let stackHeightM = (sections.length - 1) * sectionInsulationM;
  for (const s of sections) stackHeightM += s.heightM;
  const outsideAreaM2 = layouts.reduce((sum, layout) => sum + layout.outsideAreaM2, 0);
  // Object.assign, not a spread followed by new keys: this V8 (Node 20) takes a slow path of
  // several microseconds for the latter (same keys, same order).
  return Object.assign({}, field, { layouts, stackHeightM, outsideAreaM2 });
}

/** The conduction interval of a forward's reset winding (stackField's interval 1). */
const RESET_INTERVAL = 1;

/** Section of `turns` turns of winding k carrying `share` of the ampere-turns. */
function stackSection(
  layouts: readonly WindingLayout[],
  k: number,
  turns: number,
  share: number,
  referenceTurns: number,
  breadthM: number,
): StackSection {
  const layout =
    turns === layouts[k]?.turns
      ? (layouts[k] as WindingLayout)
      : (windingLayout(turns, (layouts[k] as WindingLayout).wire, breadthM) as WindingLayout);
  return {
    winding: k,
    layerCount: layout.layerCount,
    heightM: layout.heightM,
    ampereTurnsPerPrimaryA: referenceTurns * share,
  };
}

/** The whole of winding k as one section. */
function wholeSection(
  layouts: readonly WindingLayout[],
  k: number,
  build: TransformerBuild,
  shares: readonly number[],
  referenceTurns: number,
  breadthM: number,
): StackSection {
  return stackSection(
    layouts,
    k,
    build.turns[k] as number,
    shares[k] ?? 0,
    referenceTurns,
    breadthM,
  );
}
