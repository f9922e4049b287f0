import type { ChunkPlan } from '../jobs/chunked-computation.js';
import { layoutPortion } from '../transformer/layout-portion.js';
import { coreGeometry, type CoreGeometry } from '../magnetics/core-geometry.js';
import type { GappedCore } from '../magnetics/gapped-core.js';
import { gappedInductance } from '../magnetics/gapped-inductance.js';
import type { CoreShape } from '../magnetics/core-shape.js';
import type { MaterialClass } from '../magnetics/material-class.js';
import { dowellFactor } from '../magnetics/dowell-factor.js';
import { equivalentFoilLayer } from '../magnetics/equivalent-foil-layer.js';
import { skinDepth } from '../magnetics/skin-depth.js';
import { saturationFluxDensity } from '../magnetics/saturation-flux-density.js';
import { temperatureRise } from '../magnetics/temperature-rise.js';
import { copperResistance } from '../materials/copper-resistance.js';
import type { TransformerEvaluationOptions } from '../transformer/transformer-evaluation-options.js';
import { ampereTurnShares, transformerStack } from '../transformer/transformer-stack.js';
import { turnsFromPrimary } from '../transformer/transformer-turns.js';
import { windingLayout } from '../transformer/winding-layout.js';
import { wireDimensions } from '../transformer/winding-wire.js';
import {
  BOUND_HARMONIC_COUNT,
  acSquareBoundA2,
  minimumLossTemperatureFactor,
  saturationLimitT,
} from './candidate-bounds.js';
import {
  zeroCounts,
  type CoreSearchCandidate,
  type CoreSearchChunkOutput,
  type CoreSearchCounts,
} from './core-search-candidate.js';
import type { CoreSearchRequest } from './core-search-request-schema.js';
import { evaluateCandidate } from './evaluate-candidate.js';
import { firstPass, outputTurnsRatiosOf, unitCoreLossOf, type FirstPass } from './first-pass.js';
import { byLoss, dominates, paretoFront, topByLoss } from './pareto-front.js';
import { resolveSearchSpace, type CoreSearchSpace, type FrequencySpace } from './search-space.js';

type SolvedPass = Extract<FirstPass, { ok: true }>;

/** A candidate that passed the cheap checks, with its bounds, waiting for full evaluation. */
interface Survivor {
  index: number;
  pass: SolvedPass;
  material: MaterialClass;
  primaryTurns: number;
  wireDigits: number[];
  arrangement: number;
  /** Lower estimate of the worst-corner converter loss, W (margin applied). */
  lossBoundW: number;
  /** Lower estimate of the worst-corner temperature rise, K (margin applied). */
  riseBoundK: number;
}

/** Relative slack on the cheap checks, so round-off never prunes a candidate at a limit. */
const ROUND_OFF = 1e-12;

/**
 * Runs the candidates [start, start + count) of a core search: hierarchical cheap checks (a
 * subtree pruned is counted whole, its leaves never visited), then, one block (a shape at a
 * frequency) at a time, full evaluation in order of increasing loss bound until no remaining
 * candidate can enter the block's top N or its Pareto front. Yields the candidates accounted
 * for so far. The bound's scope is one block, so a plan of whole blocks gives the same counts
 * however the blocks are grouped into chunks.
 */
export function* runCoreSearchChunk(
  request: CoreSearchRequest,
  chunk: ChunkPlan,
  space: CoreSearchSpace = resolveSearchSpace(request),
): Generator<number, CoreSearchChunkOutput, void> {
  const counts = zeroCounts();
  let top: CoreSearchCandidate[] = [];
  let front: CoreSearchCandidate[] = [];
  const from = chunk.start;
  const to = chunk.start + chunk.count;
  if (from < 0 || to > space.total || chunk.count < 1) {
    throw new RangeError(`core-search: chunk [${from}, ${to}) outside [0, ${space.total})`);
  }
  for (const f of space.frequencies) {
    if (f.count === 0 || f.offset >= to || f.offset + f.count <= from) continue;
    const passes = passesOf(f);
    for (let s = 0; s < f.shapes.length; s++) {
      const blockStart = f.offset + s * f.blockSize;
      const lo = Math.max(from, blockStart);
      const hi = Math.min(to, blockStart + f.blockSize);
      if (lo >= hi) continue;
      const block = yield* runBlock(request, space, f, s, lo, hi, passes, counts);
      top = topByLoss([...top, ...block.top], request.topN);
      front = paretoFront([...front, ...block.front]);
    }
  }
  counts.enumerated = accounted(counts);
  if (counts.enumerated !== chunk.count) {
    throw new Error(
      `core-search: chunk ${chunk.index} accounted for ${counts.enumerated} of ${chunk.count} candidates`,
    );
  }
  return { counts, top, paretoFront: front };
}

function accounted(counts: CoreSearchCounts): number {
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

function* runBlock(
  request: CoreSearchRequest,
  space: CoreSearchSpace,
  f: FrequencySpace,
  s: number,
  lo: number,
  hi: number,
  passes: Map<string, FirstPass>,
  counts: CoreSearchCounts,
): Generator<number, { top: CoreSearchCandidate[]; front: CoreSearchCandidate[] }, void> {
  const { settings } = space;
  const shape = f.shapes[s]!;
  const geometry = coreGeometry(shape);
  const breadthM = geometry.windowBreadthM - 2 * settings.endMarginM;
  const windingCount = f.wireOptions.length;
  // Candidates below each digit: sizes[d] = product of the radices after digit d.
  const sizes = f.radices.map((_, d) => f.radices.slice(d + 1).reduce((p, r) => p * r, 1));
  const blockStart = f.offset + s * f.blockSize;
  const overlap = (a: number, b: number) => Math.max(0, Math.min(b, hi) - Math.max(a, lo));
  const startCount = accounted(counts);
  const survivors: Survivor[] = [];
  const windowVerdicts = new Map<string, WindowVerdict | undefined>();
  const areas = new Map<string, number>();
  const margin = 1 - request.lossBoundMargin;
  for (let m = 0; m < f.materials.length; m++) {
    const material = f.materials[m]!;
    for (let t = 0; t < f.turnsCount; t++) {
      const primaryTurns = f.turnsStart[s]! + t;
      for (let g = 0; g < f.gaps.length; g++) {
        const a = blockStart + ((m * f.turnsCount + t) * f.gaps.length + g) * sizes[2]!;
        const n = overlap(a, a + sizes[2]!);
        if (n === 0) continue;
        const ideal = passFor(f, passes, g, geometry, material, primaryTurns);
        if (!ideal.ok) {
          counts.converterInfeasible += n;
          continue;
        }
        // A gapped core's own whole turns fix its ratios in the first pass it is designed on (the
        // second pass keeps its Lm, so the first then sees nearly the final operating point). An
        // ungapped core's first pass keeps the ideal ratios: there the topology's own Lm, far
        // below the core's, could make a whole ratio infeasible that the real core can run.
        const ratios =
          ideal.duty.gapRole === 'set-inductance'
            ? outputTurnsRatiosOf(
                ideal,
                turnsFromPrimary(ideal.idealRatios, primaryTurns),
                f.spec.outputs.length,
              )
            : undefined;
        const pass = wholeTurnsPass(f, passes, ideal, ratios);
        if (!pass.ok) {
          counts.converterInfeasible += n;
          continue;
        }
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
        const boundsOf = leafBounds(pass, material, geometry, turns, f, settings, margin);
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
        const visit = (k: number, areaM2: number, start: number) => {
          if (k === windingCount) {
            for (let r = 0; r < f.arrangements.length; r++) {
              const index = start + r;
              if (index < lo || index >= hi) continue;
              const key = `${turnsKey}|${digits.join(',')}|${r}`;
              let verdict = windowVerdicts.get(key);
              if (!windowVerdicts.has(key)) {
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
                );
                windowVerdicts.set(key, verdict);
              }
              if (verdict === undefined) {
                counts.windowFill += 1;
                continue;
              }
              const bound = boundsOf(digits, verdict);
              if (bound.isSaturated) {
                counts.saturation += 1;
                continue;
              }
              if (bound.riseK > settings.temperatureRiseMaxK * (1 + ROUND_OFF)) {
                counts.temperatureRise += 1;
                continue;
              }
              survivors.push({
                index,
                pass,
                material,
                primaryTurns,
                wireDigits: [...digits],
                arrangement: r,
                lossBoundW: bound.lossW,
                riseBoundK: bound.riseK,
              });
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
      }
      yield accounted(counts) - startCount;
    }
  }
  // Best first: the candidates in order of their loss bound, each evaluated in full unless it
  // can enter neither the block's top N nor its Pareto front (all share the core volume here).
  survivors.sort((x, y) => x.lossBoundW - y.lossBoundW || x.index - y.index);
  let top: CoreSearchCandidate[] = [];
  let front: CoreSearchCandidate[] = [];
  for (const survivor of survivors) {
    const nth = top.length >= request.topN ? top[request.topN - 1] : undefined;
    if (
      nth !== undefined &&
      survivor.lossBoundW > nth.lossWorstCornerW &&
      front.some(
        (member) =>
          member.lossWorstCornerW < survivor.lossBoundW &&
          member.temperatureRiseK <= survivor.riseBoundK,
      )
    ) {
      counts.boundedOut += 1;
      continue;
    }
    const verdict = evaluateCandidate(
      f,
      survivor.pass,
      {
        index: survivor.index,
        shape,
        material: survivor.material,
        primaryTurns: survivor.primaryTurns,
        wires: survivor.wireDigits.map((w, k) => f.wireOptions[k]![w]!),
        arrangement: f.arrangements[survivor.arrangement]!,
      },
      settings,
    );
    counts.fullyEvaluated += 1;
    if (verdict.ok) {
      counts.accepted += 1;
      const candidate = verdict.candidate;
      if (nth === undefined || byLoss(candidate, nth) < 0) {
        top = [...top, candidate].sort(byLoss).slice(0, request.topN);
      }
      if (!front.some((member) => dominates(member, candidate))) {
        front = [...front.filter((member) => !dominates(candidate, member)), candidate];
      }
    } else {
      counts[verdict.reason] += 1;
    }
    yield accounted(counts) - startCount;
  }
  return { top, front };
}

/**
 * The first passes solved for one frequency's space, by magnetizing inductance (and whole-turns
 * ratios): shared by every block and chunk of the space in this process. A first pass is a pure
 * function of the space and its key, so sharing it changes no chunk's output.
 */
const PASSES = new WeakMap<FrequencySpace, Map<string, FirstPass>>();
function passesOf(f: FrequencySpace): Map<string, FirstPass> {
  let passes = PASSES.get(f);
  if (passes === undefined) {
    passes = new Map();
    PASSES.set(f, passes);
  }
  return passes;
}

/** The first pass for gap step `g` (solved once per distinct magnetizing inductance). */
function passFor(
  f: FrequencySpace,
  passes: Map<string, FirstPass>,
  g: number,
  geometry: CoreGeometry,
  material: MaterialClass,
  primaryTurns: number,
): FirstPass {
  const step = f.gaps[g]!;
  let inductanceH: number | undefined;
  if (step.kind === 'inductance') inductanceH = step.magnetizingInductanceH;
  if (step.kind === 'length') {
    inductanceH = gappedInductance(gappedCore(geometry, material, primaryTurns), step.gapLengthM);
  }
  const key = String(inductanceH);
  let pass = passes.get(key);
  if (pass === undefined) {
    pass = firstPass(f, inductanceH);
    passes.set(key, pass);
  }
  return pass;
}

/** The first pass with the ideal pass's Lm and the whole-turns ratios `ratios` (cached). */
function wholeTurnsPass(
  f: FrequencySpace,
  passes: Map<string, FirstPass>,
  ideal: SolvedPass,
  ratios: number[] | undefined,
): FirstPass {
  if (ratios === undefined) return ideal;
  const inductanceH = ideal.spec.transformer.magnetizingInductanceH;
  const key = `${String(inductanceH)}|${ratios.join(',')}`;
  let pass = passes.get(key);
  if (pass === undefined) {
    pass = firstPass(f, inductanceH, ratios);
    passes.set(key, pass);
  }
  return pass;
}

function gappedCore(geometry: CoreGeometry, material: MaterialClass, turns: number): GappedCore {
  return {
    turns,
    effectiveLengthM: geometry.effectiveLengthM,
    effectiveAreaM2: geometry.effectiveAreaM2,
    relativePermeability: material.initialPermeability,
    windowHeightM: geometry.windowBreadthM,
    fringing: 'mclyman',
  };
}

/**
 * Whether some gap up to half the window height gives `inductanceH` (the conditions of
 * gapLengthForInductance, which the design's evaluation uses to cut the gap).
 */
function isInductanceReachable(
  geometry: CoreGeometry,
  material: MaterialClass,
  turns: number,
  inductanceH: number,
): boolean {
  const core = gappedCore(geometry, material, turns);
  return (
    inductanceH < gappedInductance(core, 0) &&
    gappedInductance(core, 0.5 * geometry.windowBreadthM) <= inductanceH
  );
}

/** What the window check gives a build that fits. */
interface WindowVerdict {
  /** Leakage inductance from the winding geometry, referred to the primary, H. */
  leakageH: number;
  /**
   * Each winding's Dowell factor at harmonics 1…{@link BOUND_HARMONIC_COUNT} + 1 of the switching
   * frequency ([winding][n − 1]) and the hottest allowed copper: a lower bound of its factor at
   * that harmonic at every allowed temperature, and the last one at every higher harmonic.
   */
  harmonicFactors: number[][];
}

/**
 * The window checks of the design (fill and stack height; every winding within the breadth):
 * undefined for a build that fails them.
 */
function windowFits(
  shape: CoreShape,
  pass: SolvedPass,
  geometry: CoreGeometry,
  breadthM: number,
  turns: readonly number[],
  digits: readonly number[],
  f: FrequencySpace,
  arrangement: number,
  settings: Required<TransformerEvaluationOptions>,
): WindowVerdict | undefined {
  const stack = transformerStack(
    pass.duty,
    {
      shape,
      material: f.materials[0]!,
      turns,
      wires: digits.map((w, k) => f.wireOptions[k]![w]!),
      arrangement: f.arrangements[arrangement]!,
      gapLengthM: 0,
      ampereTurnShares: ampereTurnShares(pass.duty, turns),
    },
    breadthM,
    settings.sectionInsulationM,
    geometry.meanTurnLengthM,
  );
  if (stack === undefined) return undefined;
  const fits =
    stack.outsideAreaM2 / geometry.windowAreaM2 <= settings.windowFillMax &&
    stack.stackHeightM / geometry.windowWidthM <= 1;
  if (!fits) return undefined;
  // Dowell's factor grows with Δ ∝ √(n·f) / δ(T): at the hottest allowed copper (largest skin
  // depth) each harmonic has its least factor over the allowed temperatures, and the factor at
  // order n is at most that at any higher order.
  const hotC = pass.duty.ambientTemperatureC + settings.temperatureRiseMaxK;
  const depthM = skinDepth(f.frequencyHz, { temperatureC: hotC });
  const harmonicFactors = stack.layouts.map((layout, k) => {
    const foil = equivalentFoilLayer(
      layoutPortion(layout, stack.equivalentLayerCounts[k] ?? 0.5, breadthM),
    );
    const delta1 = (foil.thicknessM / depthM) * Math.sqrt(foil.porosity);
    const factors: number[] = [];
    for (let n = 1; n <= BOUND_HARMONIC_COUNT + 1; n++) {
      factors.push(dowellFactor(delta1 * Math.sqrt(n), foil.layerCount));
    }
    return factors;
  });
  return { leakageH: stack.leakageInductanceH, harmonicFactors };
}

/**
 * The loss and temperature bounds of the leaves under one (material, turns, gap) node, on the
 * first pass's duty. At each corner, the transformer loss the evaluation can only exceed: the
 * core loss by the iGSE times the smallest temperature factor over the temperatures the core
 * can still have (the evaluation multiplies the same iGSE loss by the factor at the core's
 * temperature), and the copper loss Rdc(T)·(Idc² + Fr1·Iac²), Fr1 Dowell's factor at the
 * fundamental and the hottest allowed copper: Dowell's factor grows with the penetration ratio
 * Δ ∝ √(n·f)/ρ(T)^½, so every harmonic n ≥ 1 at any allowed temperature has at least Fr1, and the
 * evaluation's Parseval tail errs high; Rdc grows with temperature. The temperature bound is a fixed-point iteration from below: with
 * T0 the ambient, T(k+1) = ambient + rise(least loss over [T(k), hottest allowed]) by McLyman's
 * relation (the evaluation's, monotonic in the loss); if T(k) is at most the settled temperature
 * T*, the least loss over [T(k), hot] is at most the loss at T*, so T(k+1) ≤ T*: every step
 * stays a lower bound of an accepted build's temperature, and the losses at it stay lower bounds.
 * A corner whose peak flux density is over the limit at every temperature from that bound up is
 * saturated (the design rejects it on this duty, whatever the margin).
 * The converter's other losses are the first pass's, the leakage-energy loss (a clamp's
 * ½·Llk·I²·fs and the like) scaled by the build's leakage over the assumed one (linear in the
 * leakage at the same currents). All this is a lower bound on the first pass; the request's
 * margin lowers it further to cover what the second converter solve (the transformer's own
 * resistances and leakage fixed in) moves the currents and the other losses by: that part is not
 * proven, it is checked against brute force in the tests.
 */
function leafBounds(
  pass: SolvedPass,
  material: MaterialClass,
  geometry: CoreGeometry,
  turns: readonly number[],
  f: FrequencySpace,
  settings: Required<TransformerEvaluationOptions>,
  margin: number,
): (
  digits: readonly number[],
  window: WindowVerdict,
) => { lossW: number; riseK: number; isSaturated: boolean } {
  const ambientC = pass.duty.ambientTemperatureC;
  const hotC = ambientC + settings.temperatureRiseMaxK;
  const unit = unitCoreLossOf(pass, material);
  const coreScale =
    (turns[0]! * geometry.effectiveAreaM2) ** -material.steinmetz.beta * geometry.effectiveVolumeM3;
  const cornerCount = unit.length;
  // Core loss at a temperature factor of 1, W.
  const coreW = unit.map((density) => density * coreScale);
  // Resistance at 20 °C of each winding's options, Ω.
  const resistances = f.wireOptions.map((options, k) =>
    options.map(
      (wire) =>
        turns[k]! *
        geometry.meanTurnLengthM *
        // A foil without a width spans the breadth, as the layout lays it.
        wireDimensions(wire, geometry.windowBreadthM - 2 * settings.endMarginM)
          .resistancePerLengthAt20COhmPerM,
    ),
  );
  const surfaceAreaM2 = geometry.surfaceAreaM2;
  // B = Lm·im/(Np·Amin): the peak flux density per weber of linkage.
  const fluxScale = 1 / (turns[0]! * geometry.minimumAreaM2);
  // A corner whose peak is under the utilization times the saturation at the hottest allowed
  // core is under it at every allowed temperature (the check below can only pass): its proven
  // temperature need not be found.
  const hotLimitT = settings.fluxDensityUtilizationMax * saturationFluxDensity(material, hotC);
  const mayBeSaturated = pass.cornerFluxLinkagesWb.map(
    (linkageWb) => linkageWb * fluxScale > hotLimitT * (1 + ROUND_OFF),
  );
  // The second solve takes a leakage the spec fixes, else the winding geometry's.
  const fixedLeakageH = f.spec.transformer.leakageInductanceH;
  const settled: SettledCorner = { temperatureC: 0, transformerW: 0 };
  const context: SettleContext = { material, ambientC, hotC, surfaceAreaM2 };
  return (digits, window) => {
    const leakageRatio =
      pass.leakageInductanceH > 0
        ? (fixedLeakageH ?? window.leakageH) / pass.leakageInductanceH
        : 0;
    let worstW = 0;
    let worstRiseK = 0;
    let isSaturated = false;
    for (let c = 0; c < cornerCount; c++) {
      let copperAt20CW = 0;
      for (let k = 0; k < digits.length; k++) {
        // Rdc·(I_dc² + Σ Fr(n)·I_n² + Fr(H + 1)·rest): every order at its own least factor, the
        // orders above H at the least of them (the evaluation's tail weighs them higher still).
        const acA2 = acSquareBoundA2(
          window.harmonicFactors[k]!,
          pass.harmonicSquaresA2[k]![c]!,
          pass.unsummedAcSquaresA2[k]![c]!,
        );
        copperAt20CW += resistances[k]![digits[k]!]! * (pass.currentDcSquaredA2[k]![c]! + acA2);
      }
      // From below: with the margin for the bounds, without it (a proof on this duty alone)
      // for the saturation check, so that check does not depend on the request's margin.
      settleFromBelow(context, coreW[c]!, copperAt20CW, margin, settled);
      const { temperatureC, transformerW } = settled;
      worstRiseK = Math.max(worstRiseK, temperatureC - ambientC);
      if (mayBeSaturated[c]) {
        // The corner's core is at least this hot: its saturation at most the largest between
        // here and the hottest allowed (linear in temperature, so at an end).
        const provenC =
          margin === 1
            ? temperatureC
            : settleFromBelow(context, coreW[c]!, copperAt20CW, 1, settled).temperatureC;
        if (provenC < hotC) {
          // Less twice the fixed point's tolerance: the evaluation settles that close to it.
          const coolestC = Math.max(ambientC, provenC - 2 * settings.thermalToleranceK);
          const limitT =
            settings.fluxDensityUtilizationMax *
            Math.max(
              saturationFluxDensity(material, coolestC),
              saturationFluxDensity(material, hotC),
            );
          isSaturated ||= pass.cornerFluxLinkagesWb[c]! * fluxScale > limitT * (1 + ROUND_OFF);
        }
      }
      const leakageW = pass.leakageLossW[c]! * leakageRatio;
      worstW = Math.max(worstW, pass.restLossW[c]! + leakageW + transformerW);
    }
    return { lossW: margin * worstW, riseK: worstRiseK, isSaturated };
  };
}

/** What {@link settleFromBelow} reads besides the corner's losses. */
interface SettleContext {
  material: MaterialClass;
  ambientC: number;
  hotC: number;
  surfaceAreaM2: number;
}

/** A corner's temperature bound and the transformer loss bound at it. */
interface SettledCorner {
  temperatureC: number;
  transformerW: number;
}

/**
 * The fixed-point iteration from below of {@link leafBounds} at one corner: from the ambient,
 * T(k+1) = ambient + rise(share × least loss over [T(k), hottest allowed]), at most four steps,
 * stopping once it no longer rises or passes the hottest allowed. Written into `out` (returned).
 */
function settleFromBelow(
  context: SettleContext,
  coreW: number,
  copperAt20CW: number,
  share: number,
  out: SettledCorner,
): SettledCorner {
  const { material, ambientC, hotC, surfaceAreaM2 } = context;
  let temperatureC = ambientC;
  let transformerW = 0;
  for (let step = 0; step < 4; step++) {
    transformerW =
      coreW * minimumLossTemperatureFactor(material, temperatureC, hotC) +
      copperResistance(copperAt20CW, temperatureC);
    const nextC =
      ambientC +
      temperatureRise({
        method: 'surface-dissipation',
        totalLossW: share * transformerW,
        surfaceAreaM2,
      });
    if (!(nextC > temperatureC)) break;
    // Past the hottest allowed core: no accepted build has this loss (its rise is reported).
    temperatureC = nextC;
    if (nextC >= hotC) break;
  }
  out.temperatureC = temperatureC;
  out.transformerW = transformerW;
  return out;
}
