import type { CoreGeometry } from '../magnetics/core-geometry.js';
import type { CoreShape } from '../magnetics/core-shape.js';
import { dowellFactor } from '../magnetics/dowell-factor.js';
import { equivalentFoilLayer } from '../magnetics/equivalent-foil-layer.js';
import { lossTemperatureFactor } from '../magnetics/loss-temperature-factor.js';
import type { MaterialClass } from '../magnetics/material-class.js';
import { saturationFluxDensity } from '../magnetics/saturation-flux-density.js';
import { skinDepth } from '../magnetics/skin-depth.js';
import { surfaceRiseK } from '../magnetics/temperature-rise.js';
import { copperResistance } from '../materials/copper-resistance.js';
import { layoutPortion } from '../transformer/layout-portion.js';
import {
  evaluateTransformer,
  type TransformerEvaluation,
} from '../transformer/evaluate-transformer.js';
import type { WindingArrangement } from '../transformer/transformer-build.js';
import type { TransformerEvaluationOptions } from '../transformer/transformer-evaluation-options.js';
import { ampereTurnShares, transformerStack } from '../transformer/transformer-stack.js';
import { wireDimensions, type WindingWire } from '../transformer/winding-wire.js';
import {
  BOUND_HARMONIC_COUNT,
  BOUND_TAIL_HARMONIC_COUNT,
  SECOND_SOLVE_HARMONIC_COUNT,
  acSquareBoundA2,
  minimumLossTemperatureFactor,
  unitCoreLossDensity,
} from './candidate-bounds.js';
import type { AnyCorner } from '../design/design-schema.js';
import { cornersWithMagnetics } from '../design/magnetics-pass.js';
import type { SecondSolve } from './evaluate-candidate.js';
import { currentSpectrum, tailWeight } from '../magnetics/winding-ac-resistance.js';
import type { TransformerDuty } from '../transformer/transformer-duty.js';
import { unitCoreLossOf, type SolvedPass } from './first-pass.js';
import type { FrequencySpace } from './search-space.js';

/** Relative slack on the cheap checks, so round-off never prunes a candidate at a limit. */
export const ROUND_OFF = 1e-12;

/** What the window check gives a build that fits. */
export interface WindowVerdict {
  /** Leakage inductance from the winding geometry, referred to the primary, H. */
  leakageH: number;
  /**
   * Each winding's Dowell factor at harmonics 1…{@link BOUND_HARMONIC_COUNT} + 1 of the switching
   * frequency ([winding][n − 1]) and the hottest allowed copper: a lower bound of its factor at
   * that harmonic at every allowed temperature, and the last one at every higher harmonic.
   */
  harmonicFactors: number[][];
  /**
   * Each winding's equivalent foil: its thickness and porosity, and at the hottest allowed copper
   * Dowell's penetration ratio at the fundamental and the layer count (its factor at order n is
   * dowellFactor(Δ1·√n, layers)).
   */
  foils: WindowFoil[];
  /** The switching frequency, Hz, and the hottest allowed copper, °C, the factors are taken at. */
  frequencyHz: number;
  hotC: number;
  /**
   * Each winding's row of the block's {@link FactorCache} for its foil: by slot 3·j (3·j + 1 for
   * the long count; 3·j + 2 the tail's, `foilTailFactorsAt`), its factors at orders 1…{@link BOUND_HARMONIC_COUNT} + 1 (or
   * {@link SECOND_SOLVE_HARMONIC_COUNT} + 1) at the copper temperature
   * hotC − j·{@link FACTOR_GRID_STEP_K} (grid index j, {@link factorGridIndex}), filled on demand
   * and shared by every build whose winding has that foil. Read straight from here, not through a
   * table per window (an array per window and grid index was 16 of the 244 MB the whole-catalog
   * flyback search allocated).
   */
  foilTables: FactorRow[];
}

/**
 * Dowell's factors of a winding's foil by its thickness, porosity and layer count, then by grid
 * index (3·j, 3·j + 1 for the long count, 3·j + 2 for the tail's): one frequency and hottest allowed copper only
 * (one block's). Builds that share a winding's layout share its factors.
 */
export type FactorCache = Map<number, Map<number, Map<number, FactorRow>>>;

/** One foil's factors by slot (see {@link FactorCache}). */
export type FactorRow = (number[] | undefined)[];

/** The row of `cache` for `foil`, made empty when missing. */
function factorRowOf(cache: FactorCache, foil: WindowFoil): FactorRow {
  let byPorosity = cache.get(foil.thicknessM);
  if (byPorosity === undefined) {
    byPorosity = new Map();
    cache.set(foil.thicknessM, byPorosity);
  }
  let byLayers = byPorosity.get(foil.porosity);
  if (byLayers === undefined) {
    byLayers = new Map();
    byPorosity.set(foil.porosity, byLayers);
  }
  let row = byLayers.get(foil.layerCount);
  if (row === undefined) {
    row = [];
    byLayers.set(foil.layerCount, row);
  }
  return row;
}

/** Each order's factor of `foil` at grid index `j`, kept in its row (`row`). */
function foilFactorsAt(
  row: FactorRow,
  foil: WindowFoil,
  frequencyHz: number,
  hotC: number,
  j: number,
  isLong: boolean,
): number[] {
  const slot = 3 * j + (isLong ? 1 : 0);
  let factors = row[slot];
  if (factors === undefined) {
    const count = (isLong ? SECOND_SOLVE_HARMONIC_COUNT : BOUND_HARMONIC_COUNT) + 1;
    const depthM = skinDepth(frequencyHz, { temperatureC: hotC - j * FACTOR_GRID_STEP_K });
    const delta1 = (foil.thicknessM / depthM) * Math.sqrt(foil.porosity);
    factors = dowellFactors(delta1, foil.layerCount, count);
    row[slot] = factors;
  }
  return factors;
}

/**
 * The factors the copper bound's tail reads of `foil` at grid index `j`, kept in its row:
 * orders {@link BOUND_HARMONIC_COUNT} + 1…2·({@link BOUND_HARMONIC_COUNT} + 1) (index n − 33) and
 * then 2·({@link BOUND_TAIL_HARMONIC_COUNT} + 1) (the evaluation's tail slopes after 32 and 64
 * orders).
 */
function foilTailFactorsAt(
  row: FactorRow,
  foil: WindowFoil,
  frequencyHz: number,
  hotC: number,
  j: number,
): number[] {
  const slot = 3 * j + 2;
  let factors = row[slot];
  if (factors === undefined) {
    const depthM = skinDepth(frequencyHz, { temperatureC: hotC - j * FACTOR_GRID_STEP_K });
    const delta1 = (foil.thicknessM / depthM) * Math.sqrt(foil.porosity);
    factors = [];
    for (let n = BOUND_HARMONIC_COUNT + 1; n <= 2 * (BOUND_HARMONIC_COUNT + 1); n++) {
      factors.push(dowellFactor(delta1 * Math.sqrt(n), foil.layerCount));
    }
    factors.push(
      dowellFactor(delta1 * Math.sqrt(2 * (BOUND_TAIL_HARMONIC_COUNT + 1)), foil.layerCount),
    );
    row[slot] = factors;
  }
  return factors;
}

/** A winding's equivalent foil as the window check found it. */
export interface WindowFoil {
  penetrationRatio: number;
  layerCount: number;
  thicknessM: number;
  porosity: number;
}

/**
 * The window checks of the design (fill and stack height; every winding within the breadth):
 * undefined for a build that fails them.
 */
export function windowFits(
  shape: CoreShape,
  pass: SolvedPass,
  geometry: CoreGeometry,
  breadthM: number,
  turns: readonly number[],
  digits: readonly number[],
  f: FrequencySpace,
  arrangement: number,
  settings: Required<TransformerEvaluationOptions>,
  factorCache: FactorCache = new Map(),
  shares: readonly number[] = ampereTurnShares(pass.duty, turns),
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
      ampereTurnShares: shares,
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
  const foils = stack.layouts.map((layout, k) => {
    const foil = equivalentFoilLayer(
      layoutPortion(layout, stack.equivalentLayerCounts[k] ?? 0.5, breadthM),
    );
    const delta1 = (foil.thicknessM / depthM) * Math.sqrt(foil.porosity);
    return {
      penetrationRatio: delta1,
      layerCount: foil.layerCount,
      thicknessM: foil.thicknessM,
      porosity: foil.porosity,
    };
  });
  const foilTables = foils.map((foil) => factorRowOf(factorCache, foil));
  const harmonicFactors = foils.map((foil, k) =>
    foilFactorsAt(foilTables[k]!, foil, f.frequencyHz, hotC, 0, false),
  );
  return {
    leakageH: stack.leakageInductanceH,
    harmonicFactors,
    foils,
    frequencyHz: f.frequencyHz,
    hotC,
    foilTables,
  };
}

/**
 * Spacing of the copper temperatures at which the copper-loss bounds take Dowell's factors, K.
 * Dowell's factor grows with Δ ∝ 1/δ(T) and the skin depth δ grows with the copper's
 * resistivity, so the factor falls as the copper warms: the factors at a grid temperature at or
 * above T are at most the evaluation's at T. The bounds on an interval [a, b] of core (and
 * copper: one lumped temperature) temperatures take them at the grid temperature at or above b.
 */
export const FACTOR_GRID_STEP_K = 2;

/**
 * The grid index j whose temperature hotC − j·{@link FACTOR_GRID_STEP_K} is the least grid
 * temperature at or above `temperatureC` (0 at or above hotC).
 */
export function factorGridIndex(hotC: number, temperatureC: number): number {
  if (!(temperatureC < hotC)) return 0;
  // Less a hair, so that round-off never puts the grid temperature under temperatureC.
  return Math.max(0, Math.floor((hotC - temperatureC) / FACTOR_GRID_STEP_K - 1e-9));
}

/**
 * A corner's copper-loss bound at 20 °C (Ω·A², the loss Rdc(20 °C) would give) with Dowell's
 * factors taken at grid index j: at copper temperatures at or under gridHotC − j·
 * {@link FACTOR_GRID_STEP_K} it is at most the evaluation's copper loss scaled to 20 °C by the DC
 * resistance.
 */
export interface CopperAt20 {
  /** The copper temperature of grid index 0, °C. */
  readonly gridHotC: number;
  at20CW(j: number): number;
}

/**
 * Winding k's Dowell factors at orders 1…count of `window` at grid index `j` (count:
 * {@link BOUND_HARMONIC_COUNT} + 1, or {@link SECOND_SOLVE_HARMONIC_COUNT} + 1 when `isLong`),
 * computed once per foil and index: the penetration ratio as the evaluation takes it
 * (thickness over the skin depth at that copper temperature, times √porosity).
 */
export function windowFactorsAt(
  window: WindowVerdict,
  k: number,
  j: number,
  isLong: boolean,
): number[] {
  return foilFactorsAt(
    window.foilTables[k]!,
    window.foils[k]!,
    window.frequencyHz,
    window.hotC,
    j,
    isLong,
  );
}

/**
 * A corner's copper-loss bound at 20 °C as a function of the grid temperature Dowell's factors
 * are taken at: Σ over windings of Rdc,20·(I_dc² + Σ Fr(n)·I_n² + Fr(H + 1)·rest)
 * (`acSquareBoundA2`), with the factors of grid index j (a larger j, a cooler grid temperature,
 * has larger factors): times Rdc's temperature scaling it is at most the evaluation's copper
 * loss at every copper temperature at or under the grid's. One object is filled
 * and reused per corner ({@link CopperBound.reset}); each index is summed once.
 */
export class CopperBound implements CopperAt20 {
  windingCount = 0;
  window: WindowVerdict | undefined = undefined;
  isLong = false;
  readonly resistancesAt20COhm: number[] = [];
  readonly dcSquaresA2: number[] = [];
  readonly squaresA2: (readonly number[])[] = [];
  readonly unsummedA2: number[] = [];
  /**
   * The evaluation's harmonic settings the tail's extra relies on, with the grid index at or
   * below the ambient; undefined: no extra (the orders above H at the (H + 1)th order's factor).
   */
  tail: CopperTail | undefined = undefined;
  /** Each winding's orders 1…64 (A², index n − 1); undefined: no 64-order case extra. */
  readonly tailSquaresA2: (readonly number[] | undefined)[] = [];
  /** What orders 1…64 leave of each winding's AC mean square, A². */
  readonly unsummedTailA2: number[] = [];
  /**
   * The sums by grid index, NaN where not summed yet: a typed array reset in place, where a
   * sparse array emptied and regrown per corner was the largest garbage of the flyback's leaves.
   */
  private memo = new Float64Array(64).fill(NaN);
  /** Indices below this may hold a sum of the current corner. */
  private memoEnd = 0;

  /** Forgets the sums of the last corner; fill the fields, then call this. */
  reset(window: WindowVerdict, windingCount: number, isLong: boolean): void {
    this.window = window;
    this.windingCount = windingCount;
    this.isLong = isLong;
    this.memo.fill(NaN, 0, this.memoEnd);
    this.memoEnd = 0;
  }

  get gridHotC(): number {
    return this.window!.hotC;
  }

  /** The bound with the factors of grid index `j`, W at 20 °C. */
  at20CW(j: number): number {
    if (j < this.memoEnd) {
      const known = this.memo[j]!;
      if (!Number.isNaN(known)) return known;
    }
    const window = this.window!;
    const harmonicCount = this.isLong ? SECOND_SOLVE_HARMONIC_COUNT : BOUND_HARMONIC_COUNT;
    let sumW = 0;
    for (let k = 0; k < this.windingCount; k++) {
      const acA2 = acSquareBoundA2(
        windowFactorsAt(window, k, j, this.isLong),
        this.squaresA2[k]!,
        this.unsummedA2[k]!,
        harmonicCount,
      );
      const extraA2 = this.tail === undefined ? 0 : this.tailExtraA2(k, j, harmonicCount);
      sumW += this.resistancesAt20COhm[k]! * (this.dcSquaresA2[k]! + acA2 + extraA2);
    }
    if (j >= this.memo.length) {
      const grown = new Float64Array(2 * (j + 1)).fill(NaN);
      grown.set(this.memo.subarray(0, this.memoEnd));
      this.memo = grown;
    }
    this.memo[j] = sumW;
    this.memoEnd = Math.max(this.memoEnd, j + 1);
    return sumW;
  }

  /**
   * What the evaluation's tail adds over the 33rd order's factor times the rest, A² (≥ 0): at
   * every copper temperature T from the ambient up to the grid temperature of index j. The
   * evaluation (`writeWindingLoss`) sums its first 32 orders, then doubles to 64 while its tail
   * is over the tolerance times dc² + its weighted sum + the tail; its tail is
   * w·Fr(N + 1)·rest with w = `tailWeight`(Fr(N + 1), Fr(2(N + 1))), 1 ≤ w ≤ 2, non-decreasing in
   * the ratio. Dowell's factors at grid index j are at most the evaluation's at T, those at the
   * grid index at or below the ambient at least (the factor falls as the copper warms, rises with
   * the order). So the ratio Fr(66)/Fr(33) at T is at least F66(j)/F33(cool): stopping at 32,
   * the evaluation's tail is at least that weight times F33(j)·rest; going on to 64, it sums
   * orders 33…64 at Fr(n) ≥ F(n, j) and weighs the rest at least at F65(j) times the weight of
   * F130(j)/F65(cool) (1 where it may go past 64). Where the tolerance test is proven to stop
   * (its tail at most 2·F33(cool)·rest) or go on (at least the weight at 32 times F33(j)·rest),
   * that case's extra; else the lesser of the two. A relative slack of 1e-9 covers the round-off
   * between these sums and the evaluation's (the two spectra, the rests by Parseval).
   */
  private tailExtraA2(k: number, j: number, harmonicCount: number): number {
    const tail = this.tail!;
    const restA2 = this.unsummedA2[k]!;
    if (
      tail.firstCount !== BOUND_HARMONIC_COUNT ||
      harmonicCount !== BOUND_HARMONIC_COUNT ||
      !(restA2 > 0)
    ) {
      return 0;
    }
    const window = this.window!;
    const factors = windowFactorsAt(window, k, j, this.isLong);
    const coolFactors = windowFactorsAt(window, k, tail.coolIndex, this.isLong);
    const tailFactors = windowTailFactorsAt(window, k, j);
    const squaresA2 = this.squaresA2[k]!;
    const dcA2 = this.dcSquaresA2[k]!;
    let leastA2 = dcA2;
    let mostA2 = dcA2;
    for (let n = 0; n < BOUND_HARMONIC_COUNT; n++) {
      leastA2 += factors[n]! * squaresA2[n]!;
      mostA2 += coolFactors[n]! * squaresA2[n]!;
    }
    const nextFactor = factors[BOUND_HARMONIC_COUNT]!;
    const coolNextFactor = coolFactors[BOUND_HARMONIC_COUNT]!;
    const tolerance = tail.tolerance;
    const weightAt32 = tailWeight(coolNextFactor, tailFactors[BOUND_HARMONIC_COUNT + 1]!);
    const extraAt32A2 = (1 - TAIL_SLACK) * (weightAt32 - 1) * nextFactor * restA2;
    // It cannot go on where its most is 32; where its most lies between 32 and 64 it may stop
    // short of 64 (no 64-order extra then: `extraAt64A2` stays 0 below).
    const stops =
      tail.maxCount <= BOUND_HARMONIC_COUNT ||
      2 * coolNextFactor * restA2 * (1 - tolerance) * (1 + TAIL_SLACK) <=
        tolerance * leastA2 * (1 - TAIL_SLACK);
    if (stops) return extraAt32A2;
    const longA2 = this.tailSquaresA2[k];
    let extraAt64A2 = 0;
    if (longA2 !== undefined && tail.maxCount >= BOUND_TAIL_HARMONIC_COUNT) {
      let sumA2 = 0;
      for (let i = 0; i < BOUND_TAIL_HARMONIC_COUNT - BOUND_HARMONIC_COUNT; i++) {
        sumA2 += (tailFactors[i]! - nextFactor) * longA2[BOUND_HARMONIC_COUNT + i]!;
      }
      const at65 = tailFactors[BOUND_TAIL_HARMONIC_COUNT - BOUND_HARMONIC_COUNT]!;
      const weightAt64 =
        tail.maxCount === BOUND_TAIL_HARMONIC_COUNT
          ? tailWeight(
              windowTailFactorsAt(window, k, tail.coolIndex)[
                BOUND_TAIL_HARMONIC_COUNT - BOUND_HARMONIC_COUNT
              ]!,
              tailFactors[tailFactors.length - 1]!,
            )
          : 1;
      sumA2 += (weightAt64 * at65 - nextFactor) * this.unsummedTailA2[k]!;
      extraAt64A2 = Math.max(0, sumA2 - TAIL_SLACK * nextFactor * (mostA2 + restA2));
    }
    const goesOn =
      weightAt32 * nextFactor * restA2 * (1 - tolerance) * (1 - TAIL_SLACK) >
      tolerance * mostA2 * (1 + TAIL_SLACK);
    return goesOn ? extraAt64A2 : Math.min(extraAt32A2, extraAt64A2);
  }
}

/** The evaluation's harmonic settings the copper bound's tail relies on (`CopperBound.tail`). */
export interface CopperTail {
  /** Its first harmonic count (`harmonicCount`); the extra needs {@link BOUND_HARMONIC_COUNT}. */
  firstCount: number;
  /** Its most (`harmonicCountMax`). */
  maxCount: number;
  /** Its tail tolerance (`harmonicTailTolerance`). */
  tolerance: number;
  /** The grid index whose temperature is at or below the ambient. */
  coolIndex: number;
}

/** The tail's settings of `settings` at `ambientC`, grid hottest `hotC`. */
export function copperTailOf(
  settings: Required<TransformerEvaluationOptions>,
  ambientC: number,
  hotC: number,
): CopperTail {
  return {
    firstCount: settings.harmonicCount,
    maxCount: settings.harmonicCountMax,
    tolerance: settings.harmonicTailTolerance,
    // At or below the ambient (rounded towards the cooler index).
    coolIndex: Math.max(0, Math.ceil((hotC - ambientC) / FACTOR_GRID_STEP_K + 1e-9)),
  };
}

/** Relative slack of the copper tail's extra (see `CopperBound`). */
const TAIL_SLACK = 1e-9;

/** Winding k's tail factors of `window` at grid index `j` (see `foilTailFactorsAt`). */
function windowTailFactorsAt(window: WindowVerdict, k: number, j: number): number[] {
  return foilTailFactorsAt(
    window.foilTables[k]!,
    window.foils[k]!,
    window.frequencyHz,
    window.hotC,
    j,
  );
}

/** A leaf's bounds (see {@link leafBounds}). */
export interface LeafBound {
  lossW: number;
  riseK: number;
  /** The corner where the loss bound is largest (0 without a bound pass). */
  lossCorner: number;
  /** The corner where the rise bound is largest (0 without a bound pass). */
  riseCorner: number;
}

/**
 * The loss and temperature bounds of the leaves under one (material, turns, gap) node. Taken on
 * `boundPass` (see `boundPassFor`: the converter with the candidate's Lm and whole-turns ratios),
 * at each corner: the transformer loss the evaluation can only exceed, the core loss by the iGSE
 * times the least temperature factor over the temperatures the core can still have (the
 * evaluation multiplies the same iGSE loss by the factor at the core's temperature), and the
 * copper loss Rdc(T)·(Idc² + Σ Fr(n)·In² + …) with Dowell's factors at the hottest allowed
 * copper (`acSquareBoundA2`); the core temperature's proven lower bound ({@link settleFromBelow})
 * and the loss that rise takes. The converter's other losses are the bound pass's, the
 * leakage-energy loss (a clamp's ½·Llk·I²·fs and the like) scaled by the build's leakage over
 * the pass's (linear in the leakage at the same currents; none on the push-pull's bound pass,
 * solved without leakage: `boundPassFor`). All this is a lower bound on the
 * bound pass; the request's margin lowers it further to cover what the second converter solve
 * (the build's own resistances and leakage fixed in) moves the currents and the other losses
 * by: that part is not proven (measured, and checked against exhaustive searches in the tests).
 * Saturation: a corner whose peak flux density on the first pass (which the design checks) is
 * over the limit at every temperature from that pass's proven core temperature up is saturated
 * (the design rejects it, whatever the margin). `boundPass` undefined: no loss or rise bound.
 */
export function leafBounds(
  pass: SolvedPass,
  boundPass: SolvedPass | undefined,
  material: MaterialClass,
  geometry: CoreGeometry,
  turns: readonly number[],
  f: FrequencySpace,
  settings: Required<TransformerEvaluationOptions>,
  margin: number,
): LeafBounds {
  return new NodeLeafBounds(pass, boundPass, material, geometry, turns, f, settings, margin);
}

/**
 * A copper bound that is one sum at every grid index: a node's or group's, whose factors are
 * taken at the hottest allowed copper. One object per node's bounds, refilled per corner.
 */
class FixedCopper implements CopperAt20 {
  gridHotC = 0;
  sumAt20W = 0;

  at20CW(): number {
    return this.sumAt20W;
  }
}

/**
 * {@link leafBounds} of one node: a class with methods, not closures made per node (under tsx,
 * the service's and the bench's runtime, esbuild's keepNames wraps every named closure in an
 * Object.defineProperty call, a node's eleven of them and a node bound's per corner about 2 %
 * of the warmed whole-catalog flyback search). The same arithmetic in the same order.
 */
class NodeLeafBounds implements LeafBounds {
  private readonly ambientC: number;
  private readonly hotC: number;
  private readonly passCoreW: number[];
  private readonly boundCoreW: number[];
  private readonly cornerCount: number;
  private readonly resistances: number[][];
  private readonly copper = new CopperBound();
  private readonly fixedCopper = new FixedCopper();
  private readonly fluxScale: number;
  private readonly mayBeSaturated: boolean[];
  private readonly fixedLeakageH: number | undefined;
  private readonly settled: SettledCorner = { temperatureC: 0, transformerW: 0 };
  private readonly context: SettleContext;

  constructor(
    private readonly pass: SolvedPass,
    private readonly boundPass: SolvedPass | undefined,
    private readonly material: MaterialClass,
    geometry: CoreGeometry,
    turns: readonly number[],
    f: FrequencySpace,
    private readonly settings: Required<TransformerEvaluationOptions>,
    private readonly margin: number,
  ) {
    const ambientC = pass.duty.ambientTemperatureC;
    const hotC = ambientC + settings.temperatureRiseMaxK;
    this.ambientC = ambientC;
    this.hotC = hotC;
    const coreScale =
      (turns[0]! * geometry.effectiveAreaM2) ** -material.steinmetz.beta *
      geometry.effectiveVolumeM3;
    // Core loss at a temperature factor of 1 at each corner, W.
    this.passCoreW = coreLossesAt(pass, material, coreScale);
    this.boundCoreW = boundPass === undefined ? [] : coreLossesAt(boundPass, material, coreScale);
    this.cornerCount = this.passCoreW.length;
    // Resistance at 20 °C of each winding's options, Ω.
    const resistances: number[][] = [];
    for (let k = 0; k < f.wireOptions.length; k++) {
      const options = f.wireOptions[k]!;
      const row: number[] = [];
      for (const wire of options) {
        row.push(
          turns[k]! *
            geometry.meanTurnLengthM *
            // A foil without a width spans the breadth, as the layout lays it.
            wireDimensions(wire, geometry.windowBreadthM - 2 * settings.endMarginM)
              .resistancePerLengthAt20COhmPerM,
        );
      }
      resistances.push(row);
    }
    this.resistances = resistances;
    // B = Lm·im/(Np·Amin): the peak flux density per weber of linkage.
    this.fluxScale = 1 / (turns[0]! * geometry.minimumAreaM2);
    // A corner whose peak is under the utilization times the saturation at the hottest allowed
    // core is under it at every allowed temperature (the check below can only pass): its proven
    // temperature need not be found.
    const hotLimitT = settings.fluxDensityUtilizationMax * saturationFluxDensity(material, hotC);
    this.mayBeSaturated = [];
    for (const linkageWb of pass.cornerFluxLinkagesWb) {
      this.mayBeSaturated.push(linkageWb * this.fluxScale > hotLimitT * (1 + ROUND_OFF));
    }
    // The second solve takes a leakage the spec fixes, else the winding geometry's.
    this.fixedLeakageH = f.spec.transformer.leakageInductanceH;
    this.context = {
      material,
      ambientC,
      hotC,
      surfaceAreaM2: geometry.surfaceAreaM2,
      toleranceK: settings.thermalToleranceK,
    };
    this.fixedCopper.gridHotC = hotC;
  }

  // Rdc·(I_dc² + Σ Fr(n)·I_n² + Fr(H + 1)·rest) at 20 °C, summed over the windings: every order
  // at its own least factor (at a grid temperature, see CopperBound), the orders above H at the
  // least of them (the evaluation's tail weighs them higher still). Without the tail's extra
  // (`CopperBound.tail`, taken by `secondSolveBounds` only): on the bound pass it would lean on
  // the margin (a pass at 1 nH or no leakage has sharper edges, so more of its AC in high
  // orders, than the build's second solve: with the extra, a small push-pull search's margined
  // leaf rise bound came out 0.06 % over an accepted build's rise); on the first pass, where it
  // is proven, it put out only 31 more of the whole-catalog forward's leaves (27 on rise, 4 on
  // saturation) for a 64-order spectrum of every pass, so it was left out (not timed apart).
  private copperAt(
    p: SolvedPass,
    c: number,
    digits: readonly number[],
    w: WindowVerdict,
  ): CopperBound {
    const copper = this.copper;
    const resistances = this.resistances;
    for (let k = 0; k < digits.length; k++) {
      copper.resistancesAt20COhm[k] = resistances[k]![digits[k]!]!;
      copper.dcSquaresA2[k] = p.currentDcSquaredA2[k]![c]!;
      copper.squaresA2[k] = p.harmonicSquaresA2[k]![c]!;
      copper.unsummedA2[k] = p.unsummedAcSquaresA2[k]![c]!;
    }
    copper.reset(w, digits.length, false);
    return copper;
  }

  saturated(digits: readonly number[], window: WindowVerdict): boolean {
    const { pass, material, settings, hotC, ambientC } = this;
    for (let c = 0; c < this.cornerCount; c++) {
      if (!this.mayBeSaturated[c]) continue;
      // The design checks saturation on the first pass, at the core temperature that pass
      // gives: at least this (proven on that pass, so the margin does not enter), so the
      // saturation at most the largest between here and the hottest allowed (linear in
      // temperature, so at an end). Its loss bound is not needed.
      const provenC = settleFromBelow(
        this.context,
        this.passCoreW[c]!,
        this.copperAt(pass, c, digits, window),
        1,
        this.settled,
        false,
      ).temperatureC;
      if (provenC < hotC) {
        // Less twice the fixed point's tolerance: the evaluation settles that close to it.
        const coolestC = Math.max(ambientC, provenC - 2 * settings.thermalToleranceK);
        const limitT =
          settings.fluxDensityUtilizationMax *
          Math.max(
            saturationFluxDensity(material, coolestC),
            saturationFluxDensity(material, hotC),
          );
        if (pass.cornerFluxLinkagesWb[c]! * this.fluxScale > limitT * (1 + ROUND_OFF)) return true;
      }
    }
    return false;
  }

  // One corner's terms of a leaf's bounds: the loss before the margin and the rise, less twice
  // the fixed point's tolerance (the evaluation settles that close to it). Each corner's terms
  // are its own (the copper term is refilled per corner), whatever other corners were taken.
  private cornerTerms(
    digits: readonly number[],
    window: WindowVerdict,
    c: number,
    terms: LeafTerms,
  ): void {
    const { boundPass, cornerCount } = this;
    if (boundPass === undefined) {
      // No bounds without a bound pass (zero, as a leaf's).
      terms[c] = 0;
      terms[cornerCount + c] = 0;
      return;
    }
    // The loss and rise bounds, on the pass closest to the second solve, with the margin.
    const { temperatureC, transformerW } = settleFromBelow(
      this.context,
      this.boundCoreW[c]!,
      this.copperAt(boundPass, c, digits, window),
      this.margin,
      this.settled,
    );
    terms[cornerCount + c] = temperatureC - this.ambientC - 2 * this.settings.thermalToleranceK;
    const leakageRatio =
      boundPass.leakageInductanceH > 0
        ? (this.fixedLeakageH ?? window.leakageH) / boundPass.leakageInductanceH
        : 0;
    const leakageW = boundPass.leakageLossW[c]! * leakageRatio;
    terms[c] = boundPass.restLossW[c]! + leakageW + transformerW;
  }

  // The largest over every corner, corner by corner in order (ties to the first), as before
  // the terms were kept: the same numbers and corners to the bit.
  private folded(terms: LeafTerms): LeafBound {
    const cornerCount = this.cornerCount;
    let worstW = 0;
    let worstRiseK = 0;
    let lossCorner = 0;
    let riseCorner = 0;
    if (this.boundPass !== undefined) {
      for (let c = 0; c < cornerCount; c++) {
        const nextRiseK = Math.max(worstRiseK, terms[cornerCount + c]!);
        if (nextRiseK !== worstRiseK) riseCorner = c;
        worstRiseK = nextRiseK;
        const nextW = Math.max(worstW, terms[c]!);
        if (nextW !== worstW) lossCorner = c;
        worstW = nextW;
      }
    }
    return { lossW: this.margin * worstW, riseK: worstRiseK, lossCorner, riseCorner };
  }

  // NaN where a corner is not taken yet (a plain array: typed arrays cost more to make).
  private newTerms(): LeafTerms {
    return new Array<number>(2 * this.cornerCount).fill(NaN);
  }

  leaf(digits: readonly number[], window: WindowVerdict): LeafBound {
    const terms = this.newTerms();
    for (let c = 0; c < this.cornerCount; c++) this.cornerTerms(digits, window, c, terms);
    return this.folded(terms);
  }

  partial(
    digits: readonly number[],
    window: WindowVerdict,
    corners: readonly number[],
  ): PartialLeafBound {
    const terms = this.newTerms();
    const cornerCount = this.cornerCount;
    let worstW = 0;
    let worstRiseK = 0;
    for (const c of corners) {
      if (c >= cornerCount || !Number.isNaN(terms[c])) continue;
      this.cornerTerms(digits, window, c, terms);
      worstW = Math.max(worstW, terms[c]!);
      worstRiseK = Math.max(worstRiseK, terms[cornerCount + c]!);
    }
    return { lossW: this.margin * worstW, riseK: worstRiseK, terms };
  }

  complete(digits: readonly number[], window: WindowVerdict, part: PartialLeafBound): LeafBound {
    const { terms } = part;
    for (let c = 0; c < this.cornerCount; c++) {
      if (Number.isNaN(terms[c])) this.cornerTerms(digits, window, c, terms);
    }
    return this.folded(terms);
  }

  // A node's bound: each winding's least resistance over its leaves' wires and, order by order,
  // the least of its leaves' factors at the hottest allowed copper; a lower copper loss than any
  // one leaf's at every temperature, so settleFromBelow's argument holds for it as it does for
  // each leaf.
  node(leaves: readonly NodeLeaf[]): LeafBound {
    const { boundPass, resistances, settings, ambientC } = this;
    if (boundPass === undefined || leaves.length === 0) {
      return { lossW: 0, riseK: 0, lossCorner: 0, riseCorner: 0 };
    }
    const windingCount = resistances.length;
    const leastResistances: number[] = new Array<number>(windingCount).fill(Infinity);
    const leastFactors: number[][] = [];
    let leastLeakageH = Infinity;
    for (const { wireDigits, window } of leaves) {
      leastLeakageH = Math.min(leastLeakageH, window.leakageH);
      for (let k = 0; k < windingCount; k++) {
        leastResistances[k] = Math.min(leastResistances[k]!, resistances[k]![wireDigits[k]!]!);
        const factors = window.harmonicFactors[k]!;
        const least = leastFactors[k];
        if (least === undefined) {
          leastFactors[k] = [...factors];
          continue;
        }
        for (let n = 0; n < least.length; n++) least[n] = Math.min(least[n]!, factors[n]!);
      }
    }
    const leakageRatio =
      boundPass.leakageInductanceH > 0
        ? (this.fixedLeakageH ?? leastLeakageH) / boundPass.leakageInductanceH
        : 0;
    const nodeCopper = this.fixedCopper;
    let worstW = 0;
    let worstRiseK = 0;
    let lossCorner = 0;
    let riseCorner = 0;
    // Every corner of the bound pass (a pass at some corners only, `boundPassFor`'s `only`: its
    // own, the largest over them at most the largest over all).
    for (let c = 0; c < this.boundCoreW.length; c++) {
      let sumAt20W = 0;
      for (let k = 0; k < windingCount; k++) {
        const acA2 = acSquareBoundA2(
          leastFactors[k]!,
          boundPass.harmonicSquaresA2[k]![c]!,
          boundPass.unsummedAcSquaresA2[k]![c]!,
          BOUND_HARMONIC_COUNT,
        );
        sumAt20W += leastResistances[k]! * (boundPass.currentDcSquaredA2[k]![c]! + acA2);
      }
      nodeCopper.sumAt20W = sumAt20W;
      const { temperatureC, transformerW } = settleFromBelow(
        this.context,
        this.boundCoreW[c]!,
        nodeCopper,
        this.margin,
        this.settled,
      );
      const nextRiseK = Math.max(
        worstRiseK,
        temperatureC - ambientC - 2 * settings.thermalToleranceK,
      );
      if (nextRiseK !== worstRiseK) riseCorner = c;
      worstRiseK = nextRiseK;
      const leakageW = boundPass.leakageLossW[c]! * leakageRatio;
      const nextW = Math.max(worstW, boundPass.restLossW[c]! + leakageW + transformerW);
      if (nextW !== worstW) lossCorner = c;
      worstW = nextW;
    }
    return { lossW: this.margin * worstW, riseK: worstRiseK, lossCorner, riseCorner };
  }

  // The rise the first-pass design meets at its hottest corner, from below: the design
  // evaluates the build on the first pass at every corner and rejects it where one corner
  // settles over the rise limit, so the bound is taken there with no margin, as the saturation
  // check above takes its temperature (its loss bound not needed).
  firstPassRiseK(digits: readonly number[], window: WindowVerdict): number {
    let worstRiseK = 0;
    for (let c = 0; c < this.cornerCount; c++) {
      const { temperatureC } = settleFromBelow(
        this.context,
        this.passCoreW[c]!,
        this.copperAt(this.pass, c, digits, window),
        1,
        this.settled,
        false,
      );
      worstRiseK = Math.max(
        worstRiseK,
        temperatureC - this.ambientC - 2 * this.settings.thermalToleranceK,
      );
    }
    return worstRiseK;
  }

  // Whether firstPassRiseK(digits, window) > limitK, without settling every corner. For finite
  // losses (else settleFromBelow throws), each corner's term T − ambient − 2·tolerance is at most
  // its ceiling: settleFromBelow either stops under the hottest allowed core (T < hot) or ends
  // at max(hot, ambient + rise(loss at hot)), so T ≤ max(hot, ambient + rise(loss at hot)) and,
  // the subtractions rounding monotonically, the term is at most that less ambient and twice the
  // tolerance. A corner whose ceiling is not over the limit is not over it (its settling is
  // skipped); the largest over the corners (from 0) is over the limit exactly when one corner's
  // term is, so the first such corner answers. The same verdict as the comparison, to the bit.
  isFirstPassOver(digits: readonly number[], window: WindowVerdict, limitK: number): boolean {
    const { context, hotC, ambientC, material } = this;
    const toleranceK = 2 * this.settings.thermalToleranceK;
    for (let c = 0; c < this.cornerCount; c++) {
      const copper = this.copperAt(this.pass, c, digits, window);
      const atHotW =
        this.passCoreW[c]! * lossTemperatureFactor(material, hotC) +
        copperResistance(copper.at20CW(factorGridIndex(copper.gridHotC, hotC)), hotC);
      if (atHotW >= 0 && Number.isFinite(atHotW)) {
        const ceilingC = Math.max(hotC, ambientC + surfaceRiseK(atHotW, context.surfaceAreaM2));
        if (!(ceilingC - ambientC - toleranceK > limitK)) continue;
      }
      const { temperatureC } = settleFromBelow(
        context,
        this.passCoreW[c]!,
        copper,
        1,
        this.settled,
        false,
      );
      if (temperatureC - ambientC - toleranceK > limitK) return true;
    }
    return false;
  }
}

/** Each corner's core loss on `p` at a temperature factor of 1, W. */
function coreLossesAt(p: SolvedPass, material: MaterialClass, coreScale: number): number[] {
  return unitCoreLossOf(p, material).map((density) => density * coreScale);
}

/** What {@link leafBounds} gives for one (material, turns, gap) node. */
export interface LeafBounds {
  /**
   * Whether a leaf is saturated: a corner whose peak flux density on the first pass (which the
   * design checks) is over the limit at every temperature from that pass's proven core
   * temperature up (the design rejects it, whatever the margin).
   */
  saturated: (digits: readonly number[], window: WindowVerdict) => boolean;
  /** The bounds of one leaf (its wires' digits and its window verdict). */
  leaf: (digits: readonly number[], window: WindowVerdict) => LeafBound;
  /**
   * A leaf's bounds at `corners` only: the largest of its per-corner terms there, at most the
   * largest over every corner ({@link leaf}'s), so a test this puts out, the leaf's own bound
   * puts out too. The terms are kept for {@link complete}.
   */
  partial: (
    digits: readonly number[],
    window: WindowVerdict,
    corners: readonly number[],
  ) => PartialLeafBound;
  /** The leaf's bounds from a partial one: the other corners taken; {@link leaf}'s to the bit. */
  complete: (digits: readonly number[], window: WindowVerdict, part: PartialLeafBound) => LeafBound;
  /**
   * Loss and rise bounds under every one of `leaves` (leaves of this node that fit the
   * window): taken as a leaf's, with each winding's least resistance over their wires and its
   * least Dowell factor over them order by order (both at most any one leaf's, so the copper
   * loss at most any leaf's at every temperature), the least leakage, and without the
   * saturation check. Zero without a bound pass.
   */
  node: (leaves: readonly NodeLeaf[]) => LeafBound;
  /**
   * A proven lower bound of the largest core temperature rise over the corners of the leaf's
   * first-pass design (the build evaluated on the first pass, which the design checks against
   * the rise limit), K: {@link settleFromBelow} on the first pass's own currents, no margin,
   * less twice the evaluation's thermal tolerance.
   */
  firstPassRiseK: (digits: readonly number[], window: WindowVerdict) => number;
  /** Whether {@link firstPassRiseK} is over `limitK` (the same verdict, with fewer corners settled). */
  isFirstPassOver: (digits: readonly number[], window: WindowVerdict, limitK: number) => boolean;
}

/**
 * A leaf's per-corner bound terms: at c the loss before the margin, W, at cornerCount + c the
 * rise, K; NaN where the corner is not taken yet.
 */
export type LeafTerms = number[];

/** A leaf's bounds over some corners (margin applied), with the terms taken so far. */
export interface PartialLeafBound {
  lossW: number;
  riseK: number;
  terms: LeafTerms;
}

/** A leaf as a node's bound reads it: its wires' digits and its window verdict. */
export interface NodeLeaf {
  wireDigits: readonly number[];
  window: WindowVerdict;
}

/**
 * The loss and rise bounds of a candidate once its transformer has been evaluated on its bound
 * pass (see `boundPassFor`; for a gapped core that is its first pass, where the first-pass
 * design has evaluated it already), tighter than {@link leafBounds}: at each corner the
 * transformer loss is the build's own on that pass (what `leafBounds` bounds from below) instead
 * of its bound, the rest as there (the pass's other losses, the leakage-energy loss scaled by
 * the build's leakage), and the rise the one McLyman's relation gives that loss, less twice the
 * thermal tolerance. So it is what the evaluation finds on the bound pass itself, and the
 * request's margin lowers it, as it lowers `leafBounds`, to cover what the second converter
 * solve moves (the same unproven, measured step). Undefined when the evaluation does not hold
 * one corner per corner of the pass. With `cornerIndices`, the evaluation holds those corners
 * of the pass only (`evaluation.corners[i]` is corner cornerIndices[i], as `evaluateTransformer`
 * gives them: each corner evaluated on its own, the very numbers of the whole evaluation): the
 * largest over them, at most the largest over every corner, so never above the bound taken on
 * the whole evaluation.
 */
export function boundPassBuildBounds(
  pass: SolvedPass,
  evaluation: TransformerEvaluation,
  fixedLeakageH: number | undefined,
  surfaceAreaM2: number,
  settings: Required<TransformerEvaluationOptions>,
  margin: number,
  cornerIndices?: readonly number[],
): { lossW: number; riseK: number } | undefined {
  const corners = evaluation.corners;
  if (corners.length !== (cornerIndices ?? pass.restLossW).length) return undefined;
  const leakageRatio =
    pass.leakageInductanceH > 0
      ? (fixedLeakageH ?? evaluation.stack.leakageInductanceH) / pass.leakageInductanceH
      : 0;
  let worstW = 0;
  let worstRiseK = 0;
  for (let i = 0; i < corners.length; i++) {
    const c = cornerIndices === undefined ? i : cornerIndices[i]!;
    const transformerW = corners[i]!.totalLossW;
    worstW = Math.max(
      worstW,
      pass.restLossW[c]! + pass.leakageLossW[c]! * leakageRatio + transformerW,
    );
    const riseK = surfaceRiseK(margin * transformerW, surfaceAreaM2);
    worstRiseK = Math.max(worstRiseK, riseK - 2 * settings.thermalToleranceK);
  }
  return { lossW: margin * worstW, riseK: worstRiseK };
}

/**
 * What a node's candidates need to have their transformer evaluated on the bound pass before
 * the first-pass design ({@link evaluateOnBoundPass}): the bound pass's duty with the first
 * pass's gap role (an ungapped core's bound pass carries the Lm its core gives, and no gap is
 * cut), the node's turns and the ampere-turn shares the design fixes on the first pass.
 */
export interface BoundPassBuild {
  duty: TransformerDuty;
  turns: readonly number[];
  shares: readonly number[];
}

/** {@link BoundPassBuild} of a (material, turns, gap) node with first pass `pass`. */
export function boundPassBuildOf(
  pass: SolvedPass,
  boundPass: SolvedPass,
  turns: readonly number[],
): BoundPassBuild {
  return {
    duty: boundPass === pass ? pass.duty : { ...boundPass.duty, gapRole: pass.duty.gapRole },
    turns,
    // The design lays the stack with the shares on the first pass's duty (windowFits too).
    shares: ampereTurnShares(pass.duty, turns),
  };
}

/**
 * The build the first-pass design makes of these wires (a build named whole: the node's turns,
 * the first pass's shares; a gap cut for Lm where the duty sets it), evaluated on the bound pass
 * at `cornerIndices` only (the design's settings: the space's, which hold every one the losses
 * read). What `boundPassBuildBounds` takes, before the design.
 */
export function evaluateOnBoundPass(
  onBoundPass: BoundPassBuild,
  shape: CoreShape,
  material: MaterialClass,
  wires: readonly WindingWire[],
  arrangement: WindingArrangement,
  settings: Required<TransformerEvaluationOptions>,
  cornerIndices: readonly number[],
): TransformerEvaluation | undefined {
  return evaluateTransformer(
    onBoundPass.duty,
    {
      shape,
      material,
      turns: onBoundPass.turns,
      wires,
      arrangement,
      gapLengthM: 0,
      ampereTurnShares: onBoundPass.shares,
    },
    settings,
    cornerIndices,
  );
}

/** What {@link settleFromBelow} reads besides the corner's losses. */
export interface SettleContext {
  material: MaterialClass;
  ambientC: number;
  hotC: number;
  surfaceAreaM2: number;
  /** The evaluation's thermal fixed-point tolerance, K. */
  toleranceK: number;
}

/** A corner's temperature bound and the transformer loss bound at it. */
export interface SettledCorner {
  temperatureC: number;
  transformerW: number;
}

/**
 * A proven lower bound of one corner's settled core temperature, by excluding intervals: the
 * evaluation settles at a fixed point T* = ambient + rise(P(T*)) of its loss P (McLyman's
 * relation, increasing in the loss), and P(T) ≥ P_lb(T) = core·factor(T) + Rdc(T)·(…) for every
 * allowed T. Over an interval [a, b], if L = ambient + rise(share × least P_lb over [a, b]) is
 * above a, no fixed point lies in [a, min(L, b)) (there T < L ≤ ambient + rise(P(T))); so a
 * moves up to min(L, b). Each step takes b = ambient + rise(share × P_lb(a)) (the most the next
 * step could reach), which narrows [a, b] as it converges, so the least temperature factor over
 * it nears the factor at the fixed point (a factor taken over [a, hottest allowed], as a plain
 * iteration from below would, is far lower for a material whose least loss lies in that range).
 * Stops once a step gains under {@link SETTLE_STEP_K}, after {@link SETTLE_STEP_MAX} steps, or
 * past the hottest allowed core. Written into `out` (returned), with the least loss over
 * [bound, hottest allowed] (what an accepted build at that corner loses at least); with
 * `withLoss` false that loss is not taken (NaN), for the callers that read the temperature only
 * (it costs a McLyman power of its own).
 */
export function settleFromBelow(
  context: SettleContext,
  coreW: number,
  copper: CopperAt20,
  share: number,
  out: SettledCorner,
  withLoss = true,
): SettledCorner {
  const { material, ambientC, hotC, surfaceAreaM2 } = context;
  const gridHotC = copper.gridHotC;
  let temperatureC = ambientC;
  for (let step = 0; step < SETTLE_STEP_MAX; step++) {
    // The loss at a (Dowell's factors at the grid temperature at or above a) only chooses b.
    const pointW =
      coreW * lossTemperatureFactor(material, temperatureC) +
      copperResistance(copper.at20CW(factorGridIndex(gridHotC, temperatureC)), temperatureC);
    const reachC = Math.min(hotC, ambientC + surfaceRiseK(share * pointW, surfaceAreaM2));
    if (!(reachC > temperatureC)) break;
    // The least loss over [a, b]: the core at its least factor there, the copper at Rdc(a) with
    // Dowell's factors at the grid temperature at or above b (each at most the evaluation's
    // anywhere in [a, b], as the factor falls as the copper warms).
    const leastW =
      coreW * minimumLossTemperatureFactor(material, temperatureC, reachC) +
      copperResistance(copper.at20CW(factorGridIndex(gridHotC, reachC)), temperatureC);
    const nextC = Math.min(reachC, ambientC + surfaceRiseK(share * leastW, surfaceAreaM2));
    if (!(nextC > temperatureC)) break;
    const gainK = nextC - temperatureC;
    temperatureC = nextC;
    // Past the hottest allowed core: no accepted build has this loss (its rise is reported).
    if (nextC >= hotC || gainK < SETTLE_STEP_K) break;
  }
  if (temperatureC >= hotC) {
    // The bound may stop at the hottest allowed; beyond it, one plain step shows how far over.
    const atHotW =
      coreW * lossTemperatureFactor(material, hotC) +
      copperResistance(copper.at20CW(factorGridIndex(gridHotC, hotC)), hotC);
    temperatureC = Math.max(hotC, ambientC + surfaceRiseK(share * atHotW, surfaceAreaM2));
  }
  out.temperatureC = temperatureC;
  if (!withLoss) {
    out.transformerW = NaN;
    return out;
  }
  // At its settled temperature T* the loss is the one that rises the core to T*, and T* is at
  // least the bound (less twice the fixed point's tolerance, as the evaluation settles that
  // close): so the loss is at least the one that gives that rise, whatever the loss model.
  const provenRiseK = Math.min(temperatureC, hotC) - ambientC - 2 * context.toleranceK;
  // An accepted build may settle anywhere up to the hottest allowed: Dowell's factors there.
  out.transformerW = Math.max(
    coreW * minimumLossTemperatureFactor(material, Math.min(temperatureC, hotC), hotC) +
      copperResistance(copper.at20CW(factorGridIndex(gridHotC, hotC)), temperatureC),
    provenRiseK > 0 ? surfaceLossForRiseW(provenRiseK, surfaceAreaM2) : 0,
  );
  return out;
}

/**
 * The loss that McLyman's surface-dissipation relation (the evaluation's, `temperatureRise`)
 * turns into a rise of `riseK` on a surface of `surfaceAreaM2`, W: its inverse,
 * P = At·(ΔT/450)^(1/0.826) with At in cm². The tests check it inverts `temperatureRise`.
 */
export function surfaceLossForRiseW(riseK: number, surfaceAreaM2: number): number {
  // ref: C. W. T. McLyman, Transformer and Inductor Design Handbook, 4th ed., ch. 6 (from memory).
  return surfaceAreaM2 * 1e4 * (riseK / 450) ** (1 / 0.826);
}

/** Gain below which the temperature bound stops stepping, K. */
const SETTLE_STEP_K = 0.02;
/** Most steps of the temperature bound at one corner. */
const SETTLE_STEP_MAX = 12;

/**
 * Proven lower bounds of a candidate's final worst-corner converter loss and temperature rise,
 * taken on its second converter solve (`solveSecond`: the transformer and output inductors fixed
 * in), before the transformer is evaluated there. The final corners are these corners with the
 * wound cores' losses put in (`cornersWithMagnetics`): each transformer winding's copper line
 * takes its evaluated loss and the core line is added; everything else is this solve's. So per
 * corner: the output inductors evaluated exactly (`inductorCorners`: these corners with only the
 * inductors' losses in), less the transformer windings' assumed copper lines, plus the
 * transformer loss from below as `leafBounds` takes it (iGSE at the least temperature factor
 * still possible, Dowell's factors at the hottest allowed copper, the proven core temperature of
 * {@link settleFromBelow}), here on the very currents and magnetizing current the evaluation
 * will see. No margin: nothing moves after this solve, so unlike the leaf bounds (taken on a
 * pass the second solve moves) this bound needs no measured allowance.
 * Since 2026-12-05 the copper takes the tail's extra (`CopperBound.tail`: the evaluation's own
 * tail weight and 64-order sums where they are proven), on a 64-order spectrum of each current
 * (the evaluation's, whose first 32 orders the bound sums as before).
 */
export function secondSolveBounds(
  duty: TransformerDuty,
  inductorCorners: readonly AnyCorner[],
  material: MaterialClass,
  geometry: CoreGeometry,
  turns: readonly number[],
  wires: readonly WindingWire[],
  window: WindowVerdict,
  settings: Required<TransformerEvaluationOptions>,
): { lossW: number; riseK: number } {
  const ambientC = duty.ambientTemperatureC;
  const context: SettleContext = {
    material,
    ambientC,
    hotC: ambientC + settings.temperatureRiseMaxK,
    surfaceAreaM2: geometry.surfaceAreaM2,
    toleranceK: settings.thermalToleranceK,
  };
  const coreScale =
    (turns[0]! * geometry.effectiveAreaM2) ** -material.steinmetz.beta * geometry.effectiveVolumeM3;
  const breadthM = geometry.windowBreadthM - 2 * settings.endMarginM;
  const resistancesAt20COhm = wires.map(
    (wire, k) =>
      turns[k]! *
      geometry.meanTurnLengthM *
      wireDimensions(wire, breadthM).resistancePerLengthAt20COhmPerM,
  );
  const windingNames = new Set(duty.windings.map((winding) => winding.name));
  const copper = new CopperBound();
  copper.tail = copperTailOf(settings, ambientC, window.hotC);
  const settled: SettledCorner = { temperatureC: 0, transformerW: 0 };
  let worstW = 0;
  let worstRiseK = 0;
  for (let c = 0; c < inductorCorners.length; c++) {
    const corner = inductorCorners[c]!;
    let restW = corner.lossTotalW;
    for (const line of corner.losses) {
      if (line.mechanism === 'copper' && windingNames.has(line.component)) restW -= line.powerW;
    }
    for (let k = 0; k < duty.windings.length; k++) {
      // One spectrum of 64 orders, as the evaluation takes it (`harmonicCountMax`): its first 32
      // for the bound's sum, orders 33…64 for the tail's extra.
      const spectrum = currentSpectrum(duty.windings[k]!.currentsA[c]!, BOUND_TAIL_HARMONIC_COUNT);
      const squaresA2 = spectrum.harmonicSquaresA2;
      let summedA2 = 0;
      for (let n = 0; n < SECOND_SOLVE_HARMONIC_COUNT; n++) summedA2 += squaresA2[n]!;
      let longSummedA2 = summedA2;
      for (let n = SECOND_SOLVE_HARMONIC_COUNT; n < squaresA2.length; n++) {
        longSummedA2 += squaresA2[n]!;
      }
      copper.resistancesAt20COhm[k] = resistancesAt20COhm[k]!;
      copper.dcSquaresA2[k] = spectrum.dcA * spectrum.dcA;
      copper.squaresA2[k] = squaresA2;
      copper.unsummedA2[k] = Math.max(0, spectrum.acSquareA2 - summedA2);
      copper.tailSquaresA2[k] = squaresA2;
      copper.unsummedTailA2[k] = Math.max(0, spectrum.acSquareA2 - longSummedA2);
    }
    copper.reset(window, duty.windings.length, true);
    const coreW =
      unitCoreLossDensity(duty.magnetizingCurrentsA[c]!, duty.magnetizingInductanceH, material) *
      coreScale;
    const { temperatureC, transformerW } = settleFromBelow(context, coreW, copper, 1, settled);
    worstRiseK = Math.max(worstRiseK, temperatureC - ambientC - 2 * settings.thermalToleranceK);
    worstW = Math.max(worstW, restW + transformerW);
  }
  return { lossW: worstW, riseK: worstRiseK };
}

/**
 * {@link secondSolveBounds} of a candidate's second solve: the transformer's duty on it, and its
 * corners with the output inductors evaluated and their losses put in (as `cornersWithMagnetics`
 * puts them in the final corners).
 */
export function boundsOnSecondSolve(
  f: FrequencySpace,
  second: SecondSolve,
  material: MaterialClass,
  geometry: CoreGeometry,
  wires: readonly WindingWire[],
  window: WindowVerdict,
  settings: Required<TransformerEvaluationOptions>,
): { lossW: number; riseK: number } {
  const { magnetics, solved } = second;
  const inductorCorners =
    magnetics.inductors.length === 0
      ? solved.corners
      : cornersWithMagnetics(
          f.topology,
          { spec: magnetics.spec, inductors: magnetics.inductors },
          solved.choices,
          solved.corners,
        ).corners;
  const dutyOf = f.topology.transformerDuty;
  if (dutyOf === undefined) throw new Error('boundsOnSecondSolve: topology has no duty');
  const duty = dutyOf(magnetics.spec, solved.choices, solved.corners);
  return secondSolveBounds(
    duty,
    inductorCorners,
    material,
    geometry,
    magnetics.transformer.build.turns,
    wires,
    window,
    settings,
  );
}

/** Dowell's factor at orders 1…`count` of a foil of fundamental penetration ratio `delta1`. */
function dowellFactors(delta1: number, layerCount: number, count: number): number[] {
  const factors: number[] = [];
  for (let n = 1; n <= count; n++) {
    factors.push(dowellFactor(delta1 * Math.sqrt(n), layerCount));
  }
  return factors;
}
