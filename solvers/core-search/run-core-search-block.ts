import { coreGeometry } from '../magnetics/core-geometry.js';
import type { MaterialClass } from '../magnetics/material-class.js';
import { ampereTurnShares } from '../transformer/transformer-stack.js';
import { turnsFromPrimary } from '../transformer/transformer-turns.js';
import { windingLayout } from '../transformer/winding-layout.js';
import { saturationLimitT } from './candidate-bounds.js';
import type { CoreSearchCandidate, CoreSearchCounts } from './core-search-candidate.js';
import type { CoreSearchRequest } from './core-search-request-schema.js';
import {
  completeSecond,
  designOnFirstPass,
  finishEvaluation,
  solveSecond,
  mergePartials,
  secondSolveFailure,
  solveMoreAt,
  solveSecondAt,
  type CandidateBuild,
  type CandidateVerdict,
  type FirstPassDesign,
  type PartialSecondSolve,
} from './evaluate-candidate.js';
import { completeDesign, designAtHottestCorner, type KnownCorners } from './first-pass-hottest.js';
import {
  boundPassFor,
  candidatePasses,
  boundPassStages,
  isInductanceReachable,
} from './first-pass-cache.js';
import type { FirstPass, SolvedPass } from './first-pass.js';
import {
  ROUND_OFF,
  boundPassBuildBounds,
  boundPassBuildOf,
  evaluateOnBoundPass,
  leafBounds,
  type BoundPassBuild,
  boundsOnSecondSolve,
  type LeafBounds,
  type PartialLeafBound,
  windowFits,
  type FactorCache,
  type WindowVerdict,
} from './leaf-bounds.js';
import { byLoss, dominates, topByLoss } from './pareto-front.js';
import type { CoreSearchSpace, FrequencySpace } from './search-space.js';

/** What the second solve's probe gave a candidate (see `probeSecond` in {@link runBlock}). */
interface ProbeOutcome {
  probe: PartialSecondSolve | undefined;
  isProbed: boolean;
  isProbedOut: boolean;
  /** The whole second solve's failure, where the probe's choices or corner failed. */
  failed: { verdict?: Extract<CandidateVerdict, { ok: false }> };
}

/** A candidate that passed the cheap checks, with its bounds, waiting for full evaluation. */
interface Survivor {
  kind: 'leaf';
  index: number;
  pass: SolvedPass;
  /** The pass its bounds are taken on (`boundPassFor`; the pass itself for a gapped core). */
  boundPass: SolvedPass | undefined;
  /** Its node's build on the bound pass (undefined without a bound pass). */
  onBoundPass: BoundPassBuild | undefined;
  material: MaterialClass;
  primaryTurns: number;
  wireDigits: number[];
  arrangement: number;
  /** Lower estimate of the worst-corner converter loss, W (margin applied). */
  lossBoundW: number;
  /** Lower estimate of the worst-corner temperature rise, K (margin applied). */
  riseBoundK: number;
  /** What the window check gave its build (Dowell's factors for {@link boundsOnSecondSolve}). */
  window: WindowVerdict;
  /** The corners (one or two) where its loss and rise bounds are largest: solved first. */
  probeCorners: number[];
}

/** A leaf past the window checks, its bounds not taken yet. */
interface Leaf {
  index: number;
  wireDigits: number[];
  arrangement: number;
  window: WindowVerdict;
}

/**
 * One (material, turns, gap) node's leaves past the window checks, or a group of them (the
 * leaves that share every wire but the last winding's), with bounds under all of theirs.
 */
interface LeafNode {
  kind: 'node';
  isGroup: boolean;
  /** The first leaf's number: the order among equal bounds. */
  index: number;
  pass: SolvedPass;
  boundPass: SolvedPass | undefined;
  onBoundPass: BoundPassBuild | undefined;
  material: MaterialClass;
  primaryTurns: number;
  bounds: LeafBounds;
  leaves: Leaf[];
  /** Under the loss bound of every leaf's build (margin applied), W. */
  lossBoundW: number;
  /** Under the rise bound of every leaf's build (margin applied), K. */
  riseBoundK: number;
  /** The corners where its loss and rise bounds are largest: its leaves' bounds start there. */
  corners: number[];
  /**
   * A node bounded on its bound pass at some corners only (see the queue in {@link runBlock}):
   * what its whole bound pass needs. Its bounds are under the whole node's.
   */
  pending?: {
    ideal: SolvedPass;
    turns: number[];
    onFirstPass: LeafBounds;
    /** The corners of each stage (`boundPassStages`), and the stage its bounds are taken at. */
    stages: number[][];
    stage: number;
  };
}

/**
 * A leaf of a group whose bounds are taken at the group's loss and rise corners only, waiting
 * in the queue by those: its own bounds are at least these, so a test that puts it out here,
 * its own bounds put out too; else its other corners are taken and it waits as a survivor.
 */
interface PartialLeaf {
  kind: 'partial';
  index: number;
  group: LeafNode;
  leaf: Leaf;
  bound: PartialLeafBound;
  lossBoundW: number;
  riseBoundK: number;
}

function nodeOf(
  leaves: Leaf[],
  pass: SolvedPass,
  boundPass: SolvedPass | undefined,
  onBoundPass: BoundPassBuild | undefined,
  material: MaterialClass,
  primaryTurns: number,
  bounds: LeafBounds,
  isGroup: boolean,
): LeafNode {
  const bound = bounds.node(leaves);
  return {
    kind: 'node',
    isGroup,
    index: leaves[0]!.index,
    pass,
    boundPass,
    onBoundPass,
    material,
    primaryTurns,
    bounds,
    leaves,
    lossBoundW: bound.lossW,
    riseBoundK: bound.riseK,
    corners:
      bound.lossCorner === bound.riseCorner
        ? [bound.lossCorner]
        : [bound.lossCorner, bound.riseCorner],
  };
}

/** A node's leaves in groups that share every wire but the last winding's, in leaf order. */
function groupsOf(node: LeafNode): LeafNode[] {
  const byPrefix = new Map<string, Leaf[]>();
  for (const leaf of node.leaves) {
    const key = leaf.wireDigits.slice(0, -1).join(',');
    let group = byPrefix.get(key);
    if (group === undefined) {
      group = [];
      byPrefix.set(key, group);
    }
    group.push(leaf);
  }
  return [...byPrefix.values()].map((leaves) =>
    nodeOf(
      leaves,
      node.pass,
      node.boundPass,
      node.onBoundPass,
      node.material,
      node.primaryTurns,
      node.bounds,
      true,
    ),
  );
}

/**
 * The group's leaves bounded at the group's loss and rise corners: those too hot there (so too
 * hot at their worst corner) counted, the rest queued.
 */
function expandNode(
  node: LeafNode,
  queue: WaitingQueue,
  counts: CoreSearchCounts,
  temperatureRiseMaxK: number,
): void {
  for (const leaf of node.leaves) {
    const bound = node.bounds.partial(leaf.wireDigits, leaf.window, node.corners);
    if (bound.riseK > temperatureRiseMaxK * (1 + ROUND_OFF)) {
      counts.temperatureRise += 1;
      continue;
    }
    queue.push({
      kind: 'partial',
      index: leaf.index,
      group: node,
      leaf,
      bound,
      lossBoundW: bound.lossW,
      riseBoundK: bound.riseK,
    });
  }
}

/** A partial leaf's other corners taken: too hot counted, else queued with its own bounds. */
function completeLeaf(
  waiting: PartialLeaf,
  queue: WaitingQueue,
  counts: CoreSearchCounts,
  temperatureRiseMaxK: number,
): void {
  const { group: node, leaf } = waiting;
  const bound = node.bounds.complete(leaf.wireDigits, leaf.window, waiting.bound);
  if (bound.riseK > temperatureRiseMaxK * (1 + ROUND_OFF)) {
    counts.temperatureRise += 1;
    return;
  }
  queue.push({
    kind: 'leaf',
    index: leaf.index,
    pass: node.pass,
    boundPass: node.boundPass,
    onBoundPass: node.onBoundPass,
    material: node.material,
    primaryTurns: node.primaryTurns,
    wireDigits: leaf.wireDigits,
    arrangement: leaf.arrangement,
    lossBoundW: bound.lossW,
    riseBoundK: bound.riseK,
    window: leaf.window,
    probeCorners:
      bound.lossCorner === bound.riseCorner
        ? [bound.lossCorner]
        : [bound.lossCorner, bound.riseCorner],
  });
}

type Waiting = LeafNode | PartialLeaf | Survivor;

/** Order among equal bounds: nodes and groups, then partial leaves, then survivors. */
const KIND_ORDER = { node: 0, partial: 1, leaf: 2 } as const;

/**
 * Nodes, groups, partial leaves and survivors by increasing loss bound, a node before a partial
 * leaf before a survivor of the same bound, then by number (a binary heap).
 */
class WaitingQueue {
  private readonly heap: Waiting[] = [];

  private static before(x: Waiting, y: Waiting): boolean {
    if (x.lossBoundW !== y.lossBoundW) return x.lossBoundW < y.lossBoundW;
    if (x.kind !== y.kind) return KIND_ORDER[x.kind] < KIND_ORDER[y.kind];
    if (x.kind === 'node' && y.kind === 'node' && x.isGroup !== y.isGroup) return !x.isGroup;
    return x.index < y.index;
  }

  push(item: Waiting): void {
    const heap = this.heap;
    let i = heap.length;
    heap.push(item);
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (!WaitingQueue.before(item, heap[parent]!)) break;
      heap[i] = heap[parent]!;
      i = parent;
    }
    heap[i] = item;
  }

  pop(): Waiting | undefined {
    const heap = this.heap;
    const first = heap[0];
    const last = heap.pop();
    if (heap.length === 0 || last === undefined) return first;
    let i = 0;
    for (;;) {
      const left = 2 * i + 1;
      if (left >= heap.length) break;
      const right = left + 1;
      const child =
        right < heap.length && WaitingQueue.before(heap[right]!, heap[left]!) ? right : left;
      if (!WaitingQueue.before(heap[child]!, last)) break;
      heap[i] = heap[child]!;
      i = child;
    }
    heap[i] = last;
    return first;
  }
}

/** What one block's run gives: its top N and Pareto front (its own candidates only). */
export interface BlockOutput {
  top: CoreSearchCandidate[];
  front: CoreSearchCandidate[];
}

/**
 * Real, accepted candidates from outside the block that a block's bound may compare against:
 * the scouts' top N (by loss) and the scouts' Pareto members no larger than the block's core.
 */
export interface Incumbents {
  top: readonly CoreSearchCandidate[];
  front: readonly CoreSearchCandidate[];
}

/** No incumbents: the block's bound compares against its own candidates only. */
export const NO_INCUMBENTS: Incumbents = { top: [], front: [] };

/** The candidates the counts account for (every count but `enumerated` and `fullyEvaluated`). */
export function accounted(counts: CoreSearchCounts): number {
  return (
    counts.saturation +
    counts.inductanceUnreachable +
    counts.windowFill +
    counts.temperatureRise +
    counts.saturationEvaluated +
    counts.converterInfeasible +
    counts.boundedOut +
    counts.accepted
  );
}

/**
 * Runs the candidates [lo, hi) of block `s` (a shape) of `f`: the hierarchical cheap checks (a
 * pruned node counted whole), then full evaluation in order of increasing loss bound, skipping a
 * candidate that can enter neither the search's top N nor its Pareto front given the block's
 * accepted candidates and `incumbents` (real candidates of the same search, fixed by the
 * request). Adds to `counts`; yields the candidates `counts` accounts for; returns the block's
 * own top N and Pareto front.
 */
export function* runBlock(
  request: CoreSearchRequest,
  space: CoreSearchSpace,
  f: FrequencySpace,
  s: number,
  lo: number,
  hi: number,
  passes: Map<string, FirstPass>,
  counts: CoreSearchCounts,
  incumbents: Incumbents,
): Generator<number, BlockOutput, void> {
  const { settings } = space;
  const shape = f.shapes[s]!;
  const geometry = coreGeometry(shape);
  const breadthM = geometry.windowBreadthM - 2 * settings.endMarginM;
  const windingCount = f.wireOptions.length;
  // Candidates below each digit: sizes[d] = product of the radices after digit d.
  const sizes = f.radices.map((_, d) => f.radices.slice(d + 1).reduce((p, r) => p * r, 1));
  const blockStart = f.offset + s * f.blockSize;
  const overlap = (a: number, b: number) => Math.max(0, Math.min(b, hi) - Math.max(a, lo));
  const queue = new WaitingQueue();
  // The window verdicts by turns, then by the leaf's place in its node (its wires' digits and
  // arrangement, the same in every node): no key string made per leaf.
  const windowVerdicts = new Map<string, Map<number, WindowVerdict | undefined>>();
  // Dowell's factors by winding foil, shared by the block's window verdicts.
  const factorCache: FactorCache = new Map();
  const areas = new Map<string, number>();
  const margin = 1 - request.lossBoundMargin;
  const isTooHot = (riseK: number) => riseK > settings.temperatureRiseMaxK * (1 + ROUND_OFF);
  // A node on its whole bound pass, queued, or counted in `temperatureRise` whole when its rise
  // bound is over the limit (under every leaf's, as each leaf's own is under its build's rise).
  // `isKnownFailing`: its bound pass at some corners failed, so the whole pass fails too.
  const wholeNode = (
    pass: SolvedPass,
    ideal: SolvedPass,
    material: MaterialClass,
    primaryTurns: number,
    turns: number[],
    leaves: Leaf[],
    onFirstPass: LeafBounds,
    isKnownFailing: boolean,
  ): void => {
    const isUngapped = pass.duty.gapRole !== 'set-inductance';
    const boundPass = isKnownFailing
      ? undefined
      : boundPassFor(f, passes, pass, ideal, geometry, material, primaryTurns);
    const bounds = isUngapped
      ? leafBounds(pass, boundPass, material, geometry, turns, f, settings, margin)
      : onFirstPass;
    const onBoundPass =
      boundPass === undefined ? undefined : boundPassBuildOf(pass, boundPass, turns);
    const node = nodeOf(
      leaves,
      pass,
      boundPass,
      onBoundPass,
      material,
      primaryTurns,
      bounds,
      false,
    );
    if (isTooHot(node.riseBoundK)) {
      counts.temperatureRise += leaves.length;
      return;
    }
    queue.push(node);
  };
  // An ungapped core's node bounded on its bound pass at the corners of `stages[stage]` only
  // (each that corner of the whole pass to the bit, `boundPassFor`): the largest of its
  // per-corner terms there is at most the largest over every corner, so its loss and rise
  // bounds are under the whole node's. 'rise': over the rise limit there (so over it on the
  // whole pass: out whole, as the whole node would be); undefined: that pass failed (the whole
  // one fails too). Else it waits in the queue by those bounds; taken, it is out whole when the
  // test puts those out (the whole node's, higher, taken later against a bar that only falls,
  // would be put out too), else it is bounded at the next stage's corners (a superset: bounds
  // no lower) and waits again, and after the last its whole bound pass is solved and it waits
  // as before. It is taken no later than the whole node would be, so every other node, group
  // and leaf is taken in the same order. Except where the whole pass fails at a corner no stage
  // solved: the whole node had no bounds (zero), so the node is now bounded at the corners that
  // solved (each corner is solved on its own, so those bounds claim what they claim of any
  // node, margin in) and put out on them, or, not put out, queued with no bounds later than
  // before, its leaves meeting a lower bar; counts move, as the half bridge's do.
  const pendingNode = (
    pass: SolvedPass,
    ideal: SolvedPass,
    material: MaterialClass,
    primaryTurns: number,
    turns: number[],
    leaves: Leaf[],
    onFirstPass: LeafBounds,
    stages: number[][],
    stage: number,
  ): LeafNode | 'rise' | undefined => {
    const only = stages[stage]!;
    const atSome = boundPassFor(f, passes, pass, ideal, geometry, material, primaryTurns, only);
    if (atSome === undefined) return undefined;
    const bounds = leafBounds(pass, atSome, material, geometry, turns, f, settings, margin);
    const node = nodeOf(leaves, pass, undefined, undefined, material, primaryTurns, bounds, false);
    if (isTooHot(node.riseBoundK)) return 'rise';
    return { ...node, pending: { ideal, turns, onFirstPass, stages, stage } };
  };
  // A node bounded at the corners of `stages[stage]` (`pendingNode`): out whole over the rise
  // limit, else queued, or, where that pass failed, bounded on its whole bound pass.
  const stageNode = (
    pass: SolvedPass,
    ideal: SolvedPass,
    material: MaterialClass,
    primaryTurns: number,
    turns: number[],
    leaves: Leaf[],
    onFirstPass: LeafBounds,
    stages: number[][],
    stage: number,
  ): void => {
    const node = pendingNode(
      pass,
      ideal,
      material,
      primaryTurns,
      turns,
      leaves,
      onFirstPass,
      stages,
      stage,
    );
    if (node === 'rise') counts.temperatureRise += leaves.length;
    else if (node !== undefined) queue.push(node);
    else wholeNode(pass, ideal, material, primaryTurns, turns, leaves, onFirstPass, true);
  };
  // A pending node's next step: the next stage's bounds, else its whole bound pass.
  const nextOf = (waiting: LeafNode): void => {
    const { ideal, turns, onFirstPass, stages, stage } = waiting.pending!;
    const { pass, material, primaryTurns, leaves } = waiting;
    if (stage + 1 < stages.length) {
      stageNode(pass, ideal, material, primaryTurns, turns, leaves, onFirstPass, stages, stage + 1);
    } else {
      wholeNode(pass, ideal, material, primaryTurns, turns, leaves, onFirstPass, false);
    }
  };
  for (let m = 0; m < f.materials.length; m++) {
    const material = f.materials[m]!;
    for (let t = 0; t < f.turnsCount; t++) {
      const primaryTurns = f.turnsStart[s]! + t;
      for (let g = 0; g < f.gaps.length; g++) {
        const a = blockStart + ((m * f.turnsCount + t) * f.gaps.length + g) * sizes[2]!;
        const n = overlap(a, a + sizes[2]!);
        if (n === 0) continue;
        const passesHere = candidatePasses(f, passes, g, geometry, material, primaryTurns);
        if (passesHere === undefined) {
          counts.converterInfeasible += n;
          continue;
        }
        const { ideal, pass } = passesHere;
        const ambientC = pass.duty.ambientTemperatureC;
        // Saturation: B = Lm·im/(Np·Amin) against the largest limit the core may meet.
        const peakT = pass.fluxLinkageWb / (primaryTurns * geometry.minimumAreaM2);
        if (peakT > saturationLimitT(material, ambientC, settings) * (1 + ROUND_OFF)) {
          counts.saturation += n;
          continue;
        }
        if (
          pass.duty.gapRole === 'set-inductance' &&
          !isInductanceReachable(geometry, material, primaryTurns, pass.duty.magnetizingInductanceH)
        ) {
          counts.inductanceUnreachable += n;
          continue;
        }
        const turns = turnsFromPrimary(pass.idealRatios, primaryTurns);
        const turnsKey = turns.join(',');
        let verdictsHere = windowVerdicts.get(turnsKey);
        if (verdictsHere === undefined) {
          verdictsHere = new Map();
          windowVerdicts.set(turnsKey, verdictsHere);
        }
        // The design's ampere-turn shares on this pass, taken once per node where a window is
        // checked.
        let shares: number[] | undefined;
        // The checks on the first pass (saturation, the first-pass design's rise) need no bound
        // pass: it is solved only for a node with a leaf past them.
        const isUngapped = pass.duty.gapRole !== 'set-inductance';
        // A gapped core's bound pass is its first pass (`boundPassFor`): its bounds at once.
        const onFirstPass = leafBounds(
          pass,
          isUngapped ? undefined : pass,
          material,
          geometry,
          turns,
          f,
          settings,
          margin,
        );
        // Window fill: each winding's area is fixed by its turns and wire, so a prefix of wires
        // whose area plus the smallest the rest can take is over the limit prunes its subtree.
        const optionAreas = f.wireOptions.map((options, k) =>
          options.map((wire, w) => {
            const key = `${k}:${turns[k]}:${w}`;
            let area = areas.get(key);
            if (area === undefined) {
              area = windingLayout(turns[k]!, wire, breadthM)?.outsideAreaM2 ?? Infinity;
              areas.set(key, area);
            }
            return area;
          }),
        );
        const restMin: number[] = new Array<number>(windingCount + 1).fill(0);
        for (let k = windingCount - 1; k >= 0; k--) {
          restMin[k] = restMin[k + 1]! + Math.min(...optionAreas[k]!);
        }
        const fillLimitM2 = settings.windowFillMax * geometry.windowAreaM2 * (1 + ROUND_OFF);
        const digits: number[] = [];
        const leaves: Leaf[] = [];
        const visit = (k: number, areaM2: number, start: number) => {
          if (k === windingCount) {
            for (let r = 0; r < f.arrangements.length; r++) {
              const index = start + r;
              if (index < lo || index >= hi) continue;
              const key = index - a;
              let verdict = verdictsHere.get(key);
              if (!verdictsHere.has(key)) {
                shares ??= ampereTurnShares(pass.duty, turns);
                verdict = windowFits(
                  shape,
                  pass,
                  geometry,
                  breadthM,
                  turns,
                  digits,
                  f,
                  r,
                  settings,
                  factorCache,
                  shares,
                );
                verdictsHere.set(key, verdict);
              }
              if (verdict === undefined) {
                counts.windowFill += 1;
                continue;
              }
              if (onFirstPass.saturated(digits, verdict)) {
                counts.saturation += 1;
                continue;
              }
              // Its first-pass design's rise from below: over the limit there, the design fails
              // (proven, no margin). Ungapped cores only: a gapped core's bound pass is its first
              // pass (no solve to spare), where the node, group and leaf rise bounds take it
              // lazily (the whole-catalog flyback: none over the limit, at nine corners a leaf).
              if (
                isUngapped &&
                onFirstPass.isFirstPassOver(
                  digits,
                  verdict,
                  settings.temperatureRiseMaxK * (1 + ROUND_OFF),
                )
              ) {
                counts.temperatureRise += 1;
                continue;
              }
              leaves.push({ index, wireDigits: [...digits], arrangement: r, window: verdict });
            }
            return;
          }
          const size = sizes[3 + k]!;
          for (let w = 0; w < optionAreas[k]!.length; w++) {
            const begin = start + w * size;
            const total = areaM2 + optionAreas[k]![w]!;
            if (!(total + restMin[k + 1]! <= fillLimitM2)) {
              counts.windowFill += overlap(begin, begin + size);
              continue;
            }
            if (overlap(begin, begin + size) === 0) continue;
            digits.push(w);
            visit(k + 1, total, begin);
            digits.pop();
          }
        };
        visit(0, 0, a);
        if (leaves.length > 0) {
          // An ungapped core's node is bounded first on its bound pass at full load only (see
          // `pendingNode`): the light-load corners are where a converter solve can cost most.
          const stages = isUngapped ? boundPassStages(f) : undefined;
          if (stages !== undefined) {
            stageNode(pass, ideal, material, primaryTurns, turns, leaves, onFirstPass, stages, 0);
          } else {
            wholeNode(pass, ideal, material, primaryTurns, turns, leaves, onFirstPass, false);
          }
        }
      }
      yield accounted(counts);
    }
  }
  // Best first: the candidates in order of their loss bound, each evaluated in full unless it
  // can enter neither the search's top N nor its Pareto front: its bound is over the N-th best
  // loss among the block's accepted candidates and the scouts' top N, and a Pareto member of
  // the block or of the scouts (no larger core) beats its loss bound and its rise bound. The
  // leaves' own bounds are taken lazily: a node (material, turns, gap) waits in order of its
  // bound (a lower bound of every one of its leaves' builds, as each leaf's own bound is of its
  // build) and is bounded out whole when that test puts it out, which no leaf of it can then
  // pass; else its leaves are bounded and queued, each taken when its bound is the least
  // waiting.
  let top: CoreSearchCandidate[] = [];
  let front: CoreSearchCandidate[] = [];
  let bar: CoreSearchCandidate[] = topByLoss(incumbents.top, request.topN);
  const beats = (member: CoreSearchCandidate, lossBoundW: number, riseBoundK: number) =>
    member.lossWorstCornerW < lossBoundW && member.temperatureRiseK <= riseBoundK;
  // Neither in the top N (over the N-th best loss so far) nor on the front (a member beats it).
  const isBoundedOut = (
    nth: CoreSearchCandidate | undefined,
    lossBoundW: number,
    riseBoundK: number,
  ) =>
    nth !== undefined &&
    lossBoundW > nth.lossWorstCornerW &&
    (front.some((member) => beats(member, lossBoundW, riseBoundK)) ||
      incumbents.front.some((member) => beats(member, lossBoundW, riseBoundK)));
  const surfaceAreaM2 = geometry.surfaceAreaM2;
  const fixedLeakageH = f.spec.transformer.leakageInductanceH;
  // The second solve, then a proven bound on it (no margin: nothing moves after it) before
  // the magnetics are evaluated there, which is most of what is left of the evaluation.
  // First at the corners where the leaf's bounds are largest only: the worst-corner loss
  // and rise are at least those at any corner, and each corner of the second solve is
  // solved on its own, so the bound there is proven as at every corner, for a fraction of
  // the solve; most candidates end here.
  // The loss corner first, then (when it differs and the candidate is still in) the rise
  // corner: the bound over both is the larger of the two corners' own (each corner's terms
  // are its own), so a candidate put out at its loss corner pays one corner solve.
  const probeSecond = (
    survivor: Survivor,
    build: CandidateBuild,
    designed: FirstPassDesign,
  ): ProbeOutcome => {
    const nth = bar.length >= request.topN ? bar[request.topN - 1] : undefined;
    const [lossCorner, riseCorner] = survivor.probeCorners as [number, number | undefined];
    const failed: ProbeOutcome['failed'] = {};
    let probe = solveSecondAt(f, survivor.pass, designed, [lossCorner], failed);
    let isProbedOut = false;
    const isProbed = probe !== undefined && probe.cornerCount > 1;
    if (probe !== undefined && isProbed) {
      const atLoss = boundsOnSecondSolve(
        f,
        probe,
        survivor.material,
        geometry,
        build.wires,
        survivor.window,
        settings,
      );
      const lossW = Math.max(atLoss.lossW, survivor.lossBoundW);
      const riseK = Math.max(atLoss.riseK, survivor.riseBoundK);
      isProbedOut = isBoundedOut(nth, lossW, riseK);
      if (!isProbedOut && riseCorner !== undefined) {
        const more = solveMoreAt(f, probe, [riseCorner]);
        if (more === undefined) {
          // A corner that does not solve: the whole solve decides, with every corner's issues.
          probe = undefined;
        } else {
          const atRise = boundsOnSecondSolve(
            f,
            more,
            survivor.material,
            geometry,
            build.wires,
            survivor.window,
            settings,
          );
          isProbedOut = isBoundedOut(
            nth,
            Math.max(lossW, atRise.lossW),
            Math.max(riseK, atRise.riseK),
          );
          probe = mergePartials(probe, more);
        }
      }
    }
    return { probe, isProbed, isProbedOut, failed };
  };
  for (;;) {
    const nth = bar.length >= request.topN ? bar[request.topN - 1] : undefined;
    const waiting = queue.pop();
    if (waiting === undefined) break;
    if (waiting.kind === 'node' && waiting.pending !== undefined) {
      // Bounded at some corners of its bound pass (`pendingNode`): out on those bounds, or on
      // its whole bound pass, as it would have been queued.
      if (isBoundedOut(nth, waiting.lossBoundW, waiting.riseBoundK)) {
        counts.boundedOut += waiting.leaves.length;
      } else {
        nextOf(waiting);
      }
      yield accounted(counts);
      continue;
    }
    if (waiting.kind === 'node') {
      // A node's bound is under every one of its leaves' loss and rise as each leaf's own is:
      // out, it puts every leaf out unbounded; else its groups (or, for a group, its leaves) are
      // bounded and queued.
      if (isBoundedOut(nth, waiting.lossBoundW, waiting.riseBoundK)) {
        counts.boundedOut += waiting.leaves.length;
      } else if (!waiting.isGroup) {
        for (const group of groupsOf(waiting)) {
          if (group.riseBoundK > settings.temperatureRiseMaxK * (1 + ROUND_OFF)) {
            counts.temperatureRise += group.leaves.length;
          } else {
            queue.push(group);
          }
        }
      } else {
        expandNode(waiting, queue, counts, settings.temperatureRiseMaxK);
      }
      yield accounted(counts);
      continue;
    }
    if (waiting.kind === 'partial') {
      // Its bounds at its group's corners are under its own: out here, it is out on its own.
      if (isBoundedOut(nth, waiting.lossBoundW, waiting.riseBoundK)) {
        counts.boundedOut += 1;
      } else {
        completeLeaf(waiting, queue, counts, settings.temperatureRiseMaxK);
      }
      yield accounted(counts);
      continue;
    }
    const survivor = waiting;
    if (isBoundedOut(nth, survivor.lossBoundW, survivor.riseBoundK)) {
      counts.boundedOut += 1;
      continue;
    }
    const build = {
      index: survivor.index,
      shape,
      material: survivor.material,
      primaryTurns: survivor.primaryTurns,
      wires: survivor.wireDigits.map((w, k) => f.wireOptions[k]![w]!),
      arrangement: f.arrangements[survivor.arrangement]!,
    };
    // Bounds before design: the build's own transformer evaluated on its bound pass at the one
    // or two corners where its leaf bounds are largest, before its first-pass design (which
    // evaluates it at every corner of the first pass and checks it there). The test is the
    // one `boundPassBuildBounds` makes after the design of a gapped core, at those corners
    // only: each corner is evaluated on its own (`evaluateTransformer` with corner indices
    // gives the very numbers of the whole evaluation at them, `node-bound.test.ts`), and the
    // largest over some corners is at most the largest over all, so this bound is never above
    // that one, and it carries the same margin, as every test before the second solve does.
    // The loss corner first, the rise corner only while the candidate is still in (the
    // largest over both is the larger of the two corners' own). A candidate it puts out counts
    // under `boundedOut` even where its design would have failed (each candidate counts under
    // the first test that rejects it, bounds before design).
    // The corners evaluated there: for a gapped core (its bound pass is its first pass) the very
    // corners the first-pass design evaluates (`designAtHottestCorner` checks the settings).
    const known: KnownCorners | undefined =
      survivor.boundPass === survivor.pass
        ? { cornerIndices: [], corners: [], settings }
        : undefined;
    if (survivor.onBoundPass !== undefined && survivor.boundPass !== undefined) {
      let lossW = survivor.lossBoundW;
      let riseK = survivor.riseBoundK;
      let isOut = false;
      for (const corner of survivor.probeCorners) {
        const corners = [corner];
        const evaluated = evaluateOnBoundPass(
          survivor.onBoundPass,
          shape,
          survivor.material,
          build.wires,
          build.arrangement,
          settings,
          corners,
        );
        const atCorner =
          evaluated === undefined
            ? undefined
            : boundPassBuildBounds(
                survivor.boundPass,
                evaluated,
                fixedLeakageH,
                surfaceAreaM2,
                settings,
                margin,
                corners,
              );
        if (atCorner === undefined) break;
        known?.cornerIndices.push(corner);
        known?.corners.push(evaluated!.corners[0]!);
        lossW = Math.max(lossW, atCorner.lossW);
        riseK = Math.max(riseK, atCorner.riseK);
        isOut = isBoundedOut(nth, lossW, riseK);
        if (isOut) break;
      }
      if (isOut) {
        counts.boundedOut += 1;
        yield accounted(counts);
        continue;
      }
    }
    // The second solve's probe (below) before the first-pass design, where the design's hottest
    // corner is found without evaluating every corner (`designAtHottestCorner`: the others proven
    // no hotter by a bound from above). The spec it fixes is then the design's to the bit, so
    // the probe gives the very bound the probe after the design would; a candidate it puts out
    // is counted in `boundedOut` without its design (every corner the design would check but
    // this did not evaluate is proven inside the flux density, rise and hot-spot limits, for a
    // corner that settles), and a candidate still in is designed and takes the tests after the
    // design as before, the probe's result reused (the same numbers).
    let early: ProbeOutcome | undefined;
    const atHottest = designAtHottestCorner(
      survivor.pass,
      build,
      survivor.window,
      geometry,
      known,
      survivor.onBoundPass,
    );
    if (atHottest !== undefined && !atHottest.isRejected) {
      early = probeSecond(survivor, build, atHottest);
      if (early.isProbedOut) {
        counts.boundedOut += 1;
        yield accounted(counts);
        continue;
      }
    }
    // Still in: its design (or its failure), from the corners evaluated above where it holds
    // (the same numbers).
    const designed =
      (atHottest === undefined ? undefined : completeDesign(survivor.pass, atHottest)) ??
      designOnFirstPass(survivor.pass, build);
    let verdict: CandidateVerdict;
    if (!designed.ok) {
      verdict = designed;
    } else {
      // A gapped core's first pass is its bound pass, so the first-pass design has evaluated the
      // build's own transformer there: a tighter bound before the second solve, for nothing. An
      // ungapped core's first pass is not its bound pass; evaluating its build again there (as
      // before) cost about what the second solve does, and the proven bound taken on the second
      // solve below prunes nearly all it did (two-switch forward, whole catalog: 1,671 full
      // evaluations without it against 1,651 with it, for a fifth less CPU).
      const { boundPass } = survivor;
      const onBoundPass =
        boundPass === survivor.pass ? designed.value.chosen.evaluation : undefined;
      const refined =
        boundPass === undefined || onBoundPass === undefined
          ? undefined
          : boundPassBuildBounds(
              boundPass,
              onBoundPass,
              fixedLeakageH,
              surfaceAreaM2,
              settings,
              margin,
            );
      if (
        refined !== undefined &&
        isBoundedOut(
          nth,
          Math.max(refined.lossW, survivor.lossBoundW),
          Math.max(refined.riseK, survivor.riseBoundK),
        )
      ) {
        counts.boundedOut += 1;
        yield accounted(counts);
        continue;
      }
      const { probe, isProbed, isProbedOut, failed } =
        early ?? probeSecond(survivor, build, designed.value);
      if (isProbedOut) {
        counts.boundedOut += 1;
        yield accounted(counts);
        continue;
      }
      // A probe that could not be taken (its corner did not solve, or the choices): the whole
      // solve fails with the same count, without solving every corner (the half bridge's
      // whole-catalog search: all of its 3,472 second solves that failed). The probe's own
      // failure where it had one (on the spec the design fixes, to the bit, as its result is
      // reused above), else that corner solved alone again.
      const second =
        probe === undefined
          ? (failed.verdict ??
            secondSolveFailure(f, survivor.pass, designed.value, survivor.probeCorners) ??
            solveSecond(f, survivor.pass, designed.value))
          : completeSecond(f, probe);
      if (!second.ok) {
        verdict = second;
      } else if (isProbed) {
        // Past the probe, the same bound over every corner put out about one candidate in 14
        // (forward) and one in 230 (flyback) and cost more than the evaluations it saved (about
        // a ninth of the flyback's search: the 32-order spectra of its ringing currents at every
        // corner), so a probed candidate is evaluated.
        verdict = finishEvaluation(f, survivor.pass, build, designed.value, settings, second.value);
      } else {
        const proven = boundsOnSecondSolve(
          f,
          second.value,
          survivor.material,
          geometry,
          build.wires,
          survivor.window,
          settings,
        );
        if (
          isBoundedOut(
            nth,
            Math.max(proven.lossW, survivor.lossBoundW),
            Math.max(proven.riseK, survivor.riseBoundK),
          )
        ) {
          counts.boundedOut += 1;
          yield accounted(counts);
          continue;
        }
        verdict = finishEvaluation(f, survivor.pass, build, designed.value, settings, second.value);
      }
    }
    counts.fullyEvaluated += 1;
    if (verdict.ok) {
      counts.accepted += 1;
      const candidate = verdict.candidate;
      if (nth === undefined || byLoss(candidate, nth) < 0) {
        bar = [...bar, candidate].sort(byLoss).slice(0, request.topN);
      }
      if (top.length < request.topN || byLoss(candidate, top[top.length - 1]!) < 0) {
        top = [...top, candidate].sort(byLoss).slice(0, request.topN);
      }
      if (!front.some((member) => dominates(member, candidate))) {
        front = [...front.filter((member) => !dominates(candidate, member)), candidate];
      }
    } else {
      counts[verdict.reason] += 1;
    }
    yield accounted(counts);
  }
  return { top, front };
}
