import type { CoreGeometry } from '../magnetics/core-geometry.js';
import { dowellFactor } from '../magnetics/dowell-factor.js';
import { lossTemperatureFactor } from '../magnetics/loss-temperature-factor.js';
import type { MaterialClass } from '../magnetics/material-class.js';
import { saturationFluxDensity } from '../magnetics/saturation-flux-density.js';
import { skinDepth } from '../magnetics/skin-depth.js';
import { surfaceRiseK } from '../magnetics/temperature-rise.js';
import { windingHotSpotRisePerWatt } from '../magnetics/winding-hot-spot.js';
import { copperResistance } from '../materials/copper-resistance.js';
import { transformerRequestFromSpec } from '../design/transformer-request-from-spec.js';
import type { Spec } from '../spec/spec-schema.js';
import type { TransformerRequest } from '../transformer/transformer-request.js';
import {
  evaluateTransformer,
  type TransformerCorner,
} from '../transformer/evaluate-transformer.js';
import type { TransformerBuild } from '../transformer/transformer-build.js';
import {
  TRANSFORMER_EVALUATION_DEFAULTS,
  type TransformerEvaluationOptions,
} from '../transformer/transformer-evaluation-options.js';
import { transformerIssues } from '../transformer/transformer-issues.js';
import { shapesForGap } from '../transformer/shapes-for-gap.js';
import { ampereTurnShares } from '../transformer/transformer-stack.js';
import { turnsFromPrimary } from '../transformer/transformer-turns.js';
import { BOUND_HARMONIC_COUNT } from './candidate-bounds.js';
import {
  candidateSpec,
  designOnFirstPass,
  reasonOf,
  type CandidateBuild,
  type FirstPassDesign,
} from './evaluate-candidate.js';
import { unitCoreLossOf, type SolvedPass } from './first-pass.js';
import { FACTOR_GRID_STEP_K, windowFactorsAt, type WindowVerdict } from './leaf-bounds.js';

/**
 * Relative slack for round-off between these bounds' arithmetic and the evaluation's (other
 * summation orders, the spectra and the iGSE taken once per pass and scaled by (Np·Ae)^−β): those
 * differ by some 1e-15 of the value, so 1e-9 covers them a million times over.
 */
const HEAT_SLACK = 1e-9;

/** `x` raised by {@link HEAT_SLACK} of its size (and of 1: a temperature may be near 0 °C). */
function above(x: number): number {
  return x + HEAT_SLACK * (Math.abs(x) + 1);
}

/** Most steps of {@link CornerCeiling.isAtOrUnder}. */
const CEILING_STEP_MAX = 24;

/**
 * A proven upper bound of the temperature at which the transformer evaluation settles one corner
 * of a first pass, for a build it accepts there (stable, within the rise limit), by excluding
 * intervals from above (the mirror of `settleFromBelow`).
 *
 * The evaluation reports a stable corner only at a temperature T whose own losses, evaluated
 * exactly at T, give a temperature within its tolerance of T (the first pass of a round that
 * settles at once: ambient + rise(P(T)) within thermalToleranceK of T), so T ≤ ambient +
 * rise(P(T)) + tolerance, and T ≥ ambient − tolerance (a rise is never negative); the build is
 * accepted only within the rise limit, T ≤ hottest allowed. For T in [a, U] the loss is at most
 * P_ub = core iGSE × the largest temperature factor over [a, U] (the factor is a quadratic: the
 * largest at an end, or at the vertex of one that opens downwards) + Σ over windings
 * Rdc(U)·(I_dc² + Σ_{n ≤ 32} Fr_n(a)·I_n² + tail): Rdc grows with the temperature, Dowell's
 * factor falls as the copper warms (Δ ∝ 1/δ(T), the factor grows with Δ:
 * `candidate-bounds.test.ts`) and grows with the order; the evaluation sums orders 1…N exactly,
 * N from its first count (32) doubling while its tail estimate w·Fr_(N+1)·(AC mean square less
 * the orders summed) is over harmonicTailTolerance of the total, w ≤ 2; so the orders above 32
 * and the tail weigh at most 2·Fr_(Nmax+1)(a) times what the first 32 leave of the AC mean
 * square (Parseval), and at most 2·Fr_33(a) times it where the tolerance test stops the
 * evaluation at 32 at every temperature in range (its tail at most that, its total at least
 * I_dc² + Σ_{n ≤ 32} I_n², Fr ≥ 1). So a reported temperature in [a, U] is at most
 * G = ambient + rise(P_ub) + tolerance: U moves down to G, and where G < a none lies in [a, U]
 * (the corner is under a). Dowell's factors at `a` are taken at the grid temperature at or below
 * it (larger still). The slack {@link HEAT_SLACK} covers the round-off between this arithmetic
 * and the evaluation's.
 */
export class CornerCeiling {
  /** Current upper bound of the settled temperature, °C. */
  temperatureC: number;
  private readonly coreW: number;
  private readonly lowC: number;
  /** Copper sums at 20 °C by grid index (NaN: not summed yet). */
  private readonly copperAt20: Map<number, number> = new Map();

  constructor(
    private readonly pass: SolvedPass,
    private readonly c: number,
    private readonly material: MaterialClass,
    private readonly window: WindowVerdict,
    private readonly resistancesAt20COhm: readonly number[],
    private readonly settings: Required<TransformerEvaluationOptions>,
    coreW: number,
    private readonly surfaceAreaM2: number,
  ) {
    const ambientC = pass.duty.ambientTemperatureC;
    this.lowC = ambientC - settings.thermalToleranceK;
    this.temperatureC = above(ambientC + settings.temperatureRiseMaxK);
    this.coreW = coreW * (1 + HEAT_SLACK);
  }

  /**
   * Σ over windings of Rdc,20·(I_dc² + the AC bound) with Dowell's factors at the grid
   * temperature at or below `lowC` (at least the evaluation's at every copper temperature from
   * `lowC` up), W at 20 °C.
   */
  private copperAt20W(lowC: number): number {
    const { window, pass, c, settings } = this;
    const j = Math.ceil((window.hotC - Math.max(lowC, this.lowC)) / FACTOR_GRID_STEP_K + 1e-9);
    const known = this.copperAt20.get(j);
    if (known !== undefined) return known;
    const tailOrder = Math.max(settings.harmonicCountMax, BOUND_HARMONIC_COUNT) + 1;
    const tolerance = settings.harmonicTailTolerance;
    let copperAt20W = 0;
    for (let k = 0; k < pass.duty.windings.length; k++) {
      const factors = windowFactorsAt(window, k, j, false);
      const squaresA2 = pass.harmonicSquaresA2[k]![c]!;
      const restA2 = pass.unsummedAcSquaresA2[k]![c]!;
      const dcA2 = pass.currentDcSquaredA2[k]![c]!;
      let weightedA2 = 0;
      let summedA2 = 0;
      for (let n = 0; n < BOUND_HARMONIC_COUNT; n++) {
        weightedA2 += factors[n]! * squaresA2[n]!;
        summedA2 += squaresA2[n]!;
      }
      // Parseval's rest, with room for the round-off of the evaluation's spectrum's partial sums.
      const unsummedA2 = restA2 + HEAT_SLACK * (restA2 + summedA2);
      const tailAt33A2 = 2 * factors[BOUND_HARMONIC_COUNT]! * unsummedA2;
      // Where the evaluation's own tolerance test stops it at 32 orders at every temperature
      // (its first count must be these 32: a larger one sums orders above the 33rd's factor).
      const stopsAt32 =
        settings.harmonicCount === BOUND_HARMONIC_COUNT &&
        tailAt33A2 * (1 - tolerance) * (1 + HEAT_SLACK) <= tolerance * (dcA2 + summedA2);
      let tailA2 = tailAt33A2;
      if (!stopsAt32) {
        const foil = window.foils[k]!;
        const depthM = skinDepth(window.frequencyHz, {
          temperatureC: window.hotC - j * FACTOR_GRID_STEP_K,
        });
        const delta1 = (foil.thicknessM / depthM) * Math.sqrt(foil.porosity);
        tailA2 = 2 * dowellFactor(delta1 * Math.sqrt(tailOrder), foil.layerCount) * unsummedA2;
      }
      copperAt20W += this.resistancesAt20COhm[k]! * (dcA2 + weightedA2 + tailA2);
    }
    copperAt20W *= 1 + HEAT_SLACK;
    this.copperAt20.set(j, copperAt20W);
    return copperAt20W;
  }

  /** A bound of the copper loss at every temperature from the ambient up to `temperatureC`, W. */
  copperW(temperatureC: number): number {
    return copperResistance(this.copperAt20W(this.lowC), temperatureC);
  }

  /**
   * Whether the corner is proven to settle at or under `untilC` (−∞: only narrows the bound),
   * stepping the bound down over [max(ambient − tolerance, untilC), U] until it is out of that
   * interval, stops gaining or runs out of steps.
   */
  isAtOrUnder(untilC: number): boolean {
    if (this.temperatureC <= untilC) return true;
    const a = Math.max(this.lowC, untilC);
    const copperAt20W = this.copperAt20W(a);
    for (let step = 0; step < CEILING_STEP_MAX; step++) {
      const upperC = this.temperatureC;
      const lossW =
        this.coreW * maximumLossTemperatureFactor(this.material, a, upperC) +
        copperResistance(copperAt20W, upperC);
      const nextC = above(
        this.pass.duty.ambientTemperatureC +
          surfaceRiseK(lossW, this.surfaceAreaM2) +
          this.settings.thermalToleranceK,
      );
      if (nextC < a) return true;
      if (!(nextC < upperC)) return false;
      this.temperatureC = nextC;
      if (nextC <= untilC) return true;
      if (upperC - nextC < 0.005) return false;
    }
    return false;
  }
}

/**
 * The largest core-loss temperature factor between `lowC` and `highC` (°C): a quadratic
 * ct2·T² − ct1·T + ct0, largest at an end or, when it opens downwards, at its vertex.
 */
export function maximumLossTemperatureFactor(
  material: MaterialClass,
  lowC: number,
  highC: number,
): number {
  const { ct2, ct1 } = material.lossTemperatureFactor;
  let most = Math.max(
    lossTemperatureFactor(material, lowC),
    lossTemperatureFactor(material, highC),
  );
  if (ct2 < 0) {
    const vertexC = ct1 / (2 * ct2);
    if (vertexC > lowC && vertexC < highC) {
      most = Math.max(most, lossTemperatureFactor(material, vertexC));
    }
  }
  return most;
}

/**
 * The {@link CornerCeiling} of corner `c` of the first pass `pass` for a build of `material` on
 * `geometry` with `primaryTurns`, the window verdict `window` (its windings' foils) and DC
 * resistances `resistancesAt20COhm`; undefined where the evaluation's settings leave the
 * argument (a first count under the bound's 32 orders).
 */
export function cornerCeiling(
  pass: SolvedPass,
  c: number,
  material: MaterialClass,
  geometry: CoreGeometry,
  primaryTurns: number,
  window: WindowVerdict,
  resistancesAt20COhm: readonly number[],
  settings: Required<TransformerEvaluationOptions>,
): CornerCeiling | undefined {
  if (settings.harmonicCount < BOUND_HARMONIC_COUNT) return undefined;
  const coreScale =
    (primaryTurns * geometry.effectiveAreaM2) ** -material.steinmetz.beta *
    geometry.effectiveVolumeM3;
  return new CornerCeiling(
    pass,
    c,
    material,
    window,
    resistancesAt20COhm,
    settings,
    unitCoreLossOf(pass, material)[c]! * coreScale,
    geometry.surfaceAreaM2,
  );
}

/**
 * A first-pass design evaluated at some corners only (`chosen.evaluation.corners[i]` is corner
 * cornerIndices[i], ascending): every other corner proven no hotter than the hottest of them.
 */
export interface HottestDesign extends FirstPassDesign {
  cornerIndices: number[];
  /**
   * An evaluated corner breaks a limit, so the design fails (not probed: {@link completeDesign}
   * gives its failure); the corners stop there.
   */
  isRejected: boolean;
}

/** Every corner check of `transformerIssues` at one evaluated corner: true when none fails. */
function isCornerAccepted(
  corner: TransformerCorner,
  settings: Required<TransformerEvaluationOptions>,
): boolean {
  return (
    !(corner.fluxDensityUtilization > settings.fluxDensityUtilizationMax) &&
    corner.isThermallyStable &&
    !(corner.temperatureRiseK > settings.temperatureRiseMaxK) &&
    !(corner.hotSpotTemperatureC > settings.hotSpotTemperatureMaxC)
  );
}

/** Whether two arrays hold the same numbers. */
function isSame(a: readonly number[], b: readonly number[]): boolean {
  return a.length === b.length && a.every((x, i) => x === b[i]);
}

/** Whether two settings objects hold the same value for every option. */
function isSameSettings(
  a: Required<TransformerEvaluationOptions>,
  b: Required<TransformerEvaluationOptions>,
): boolean {
  for (const key of Object.keys(TRANSFORMER_EVALUATION_DEFAULTS) as Array<keyof typeof a>) {
    if (a[key] !== b[key]) return false;
  }
  return true;
}

/** Corners of the first pass a build was already evaluated at, with the settings used. */
export interface KnownCorners {
  cornerIndices: number[];
  /** `corners[i]` is corner cornerIndices[i]. */
  corners: TransformerCorner[];
  settings: Required<TransformerEvaluationOptions>;
}

/**
 * `transformerRequestFromSpec` of candidate specs of one first pass, shape and material, less
 * the fields the candidate's own build sets (null where it fails).
 */
const REQUESTS = new WeakMap<SolvedPass, Map<string, RequestTemplate | null>>();

/** A request without a candidate's own fields, with the evaluation settings it gives. */
interface RequestTemplate {
  request: TransformerRequest;
  settings: Required<TransformerEvaluationOptions>;
  /** The last settings object found the same as `settings` (by value). */
  sameAs: Required<TransformerEvaluationOptions> | undefined;
}

/**
 * `transformerRequestFromSpec(spec)` for `spec = candidateSpec(pass, candidate)`: the shapes,
 * materials, wire choice and limits it reads are those of the pass's spec, the shape and the
 * material (the same for every candidate of them: taken once), the arrangement, primary turns
 * and wires the candidate's. Undefined where it fails.
 */
function requestOf(
  pass: SolvedPass,
  spec: Spec,
  candidate: CandidateBuild,
): { request: TransformerRequest; template: RequestTemplate } | undefined {
  let byBuild = REQUESTS.get(pass);
  if (byBuild === undefined) {
    byBuild = new Map();
    REQUESTS.set(pass, byBuild);
  }
  const key = `${candidate.shape.designation}|${candidate.material.id}`;
  let template = byBuild.get(key);
  if (template === undefined) {
    const requested = transformerRequestFromSpec(spec);
    template = requested.ok
      ? {
          request: requested.value,
          settings: { ...TRANSFORMER_EVALUATION_DEFAULTS, ...requested.value.evaluation },
          sameAs: undefined,
        }
      : null;
    byBuild.set(key, template);
  }
  if (template === null) return undefined;
  const { magnetics } = spec;
  if (magnetics.primaryTurns === undefined || magnetics.wires === undefined) return undefined;
  return {
    request: Object.assign({}, template.request, {
      arrangement: magnetics.arrangement,
      primaryTurns: magnetics.primaryTurns,
      wires: magnetics.wires,
    }),
    template,
  };
}

/**
 * What the second solve needs of a candidate's first-pass design, without evaluating every
 * corner: the design `designOnFirstPass` makes of a build named whole (`designTransformer`'s
 * one-build path: its window checked on a frame, then evaluated at every corner), here evaluated
 * only at the corners that can be the hottest. The second solve reads of the design its build,
 * its DC resistances, leakage and Lm (the same whatever corners are evaluated) and the hottest
 * corner's temperature (`specWithTransformer`: the copper temperature it fixes); every other
 * corner's temperature is proven at or under the hottest evaluated one by its
 * {@link CornerCeiling}, and its flux density and hot spot inside their limits, for a build the
 * design accepts. So for such a build the spec fixed from this is the design's own to the bit,
 * and a second solve on it gives the very numbers the design's would. An evaluated corner that
 * breaks a limit (the design then fails): `isRejected`. A build this path does not cover, or
 * `evaluateTransformer` failing: undefined (the design decides). `known`: corners already evaluated with this duty,
 * build and settings (the bound-pass probe of a gapped core, whose bound pass is its first pass),
 * taken as they are. Not covered by the proof: a corner not evaluated here that the evaluation
 * would not settle (runaway, out of iterations), or would settle above the rise limit though
 * every temperature from the hottest evaluated corner up to the limit maps down; the design
 * rejects such a build, so a candidate the early probe puts out would count in `boundedOut`
 * instead (none on the benchmark's and the tests' searches; DEVELOPERS.md, "The probe before the
 * design").
 */
export function designAtHottestCorner(
  pass: SolvedPass,
  candidate: CandidateBuild,
  window: WindowVerdict,
  geometry: CoreGeometry,
  known: KnownCorners | undefined,
  nodeBuild?: { turns: readonly number[]; shares: readonly number[] },
): HottestDesign | undefined {
  const spec = candidateSpec(pass, candidate);
  const requested = requestOf(pass, spec, candidate);
  if (requested === undefined) return undefined;
  const { request, template } = requested;
  const duty = pass.duty;
  const { settings } = template;
  if (settings.thermalModel !== 'settled') return undefined;
  const shapes = shapesForGap(request.shapes, duty.gapRole);
  if (
    shapes.length !== 1 ||
    request.materials.length !== 1 ||
    request.primaryTurns === undefined ||
    request.wires === undefined ||
    request.wires.length !== duty.windings.length
  ) {
    return undefined;
  }
  // As designTransformer builds a request's one build: the turns from the primary's, the
  // ampere-turn shares on this duty, the gap the window frame cuts.
  const material = request.materials[0]!;
  let turns = turnsFromPrimary(
    duty.windings.map((winding) => winding.turnsPerPrimaryTurn),
    request.primaryTurns,
  );
  let shares = ampereTurnShares(duty, turns);
  // The node's own arrays where they hold the same numbers: the stack laid for the node's build
  // (kept by its turns array, `evaluateTransformer`) is then found, not laid again.
  if (
    nodeBuild !== undefined &&
    isSame(nodeBuild.turns, turns) &&
    isSame(nodeBuild.shares, shares)
  ) {
    turns = nodeBuild.turns as number[];
    shares = nodeBuild.shares as number[];
  }
  const build: TransformerBuild = {
    shape: shapes[0]!,
    material,
    turns,
    wires: request.wires,
    arrangement: request.arrangement,
    gapLengthM: 0,
    ampereTurnShares: shares,
  };
  const frame = evaluateTransformer(duty, build, settings, []);
  if (frame === undefined || transformerIssues(frame, settings).length > 0) return undefined;
  const sized: TransformerBuild = { ...build, gapLengthM: frame.gapLengthM };
  const cornerCount = duty.cornerLabels.length;
  const evaluated: (TransformerCorner | undefined)[] = new Array<TransformerCorner | undefined>(
    cornerCount,
  );
  let hottestC = -Infinity;
  // The corners evaluated so far, in index order, as a partial design.
  const partialOf = (isRejected: boolean): HottestDesign => {
    const corners: TransformerCorner[] = [];
    const cornerIndices: number[] = [];
    evaluated.forEach((corner, c) => {
      if (corner === undefined) return;
      corners.push(corner);
      cornerIndices.push(c);
    });
    return {
      spec,
      requested: request,
      chosen: { build: sized, evaluation: { ...frame, corners }, evaluatedCount: 1 },
      cornerIndices,
      isRejected,
    };
  };
  const take = (c: number, corner: TransformerCorner): boolean => {
    evaluated[c] = corner;
    hottestC = Math.max(hottestC, corner.temperatureC);
    return isCornerAccepted(corner, settings);
  };
  if (
    known !== undefined &&
    (template.sameAs === known.settings || isSameSettings(known.settings, settings))
  ) {
    template.sameAs = known.settings;
    for (let i = 0; i < known.cornerIndices.length; i++) {
      if (!take(known.cornerIndices[i]!, known.corners[i]!)) return partialOf(true);
    }
  }
  const primaryTurns = turns[0]!;
  const lowC = duty.ambientTemperatureC - settings.thermalToleranceK;
  const hotSpotKPerW = windingHotSpotRisePerWatt({
    buildM: frame.stack.stackHeightM,
    breadthM: frame.breadthM,
    meanTurnLengthM: geometry.meanTurnLengthM,
    conductivityWPerMK: settings.windingThermalConductivityWPerMK,
  });
  const ceilings: (CornerCeiling | undefined)[] = [];
  for (let c = 0; c < cornerCount; c++) {
    ceilings.push(
      evaluated[c] === undefined
        ? cornerCeiling(
            pass,
            c,
            material,
            geometry,
            primaryTurns,
            window,
            frame.resistancesAt20COhm,
            settings,
          )
        : undefined,
    );
  }
  // Is corner c (not evaluated) proven at or under the hottest evaluated corner, and inside the
  // flux density and hot-spot limits at every temperature up to its bound?
  const isProven = (c: number): boolean => {
    const ceiling = ceilings[c];
    if (ceiling === undefined) return false;
    if (!ceiling.isAtOrUnder(hottestC)) return false;
    // Its temperature lies in [ambient − tolerance, hottest evaluated].
    const upperC = hottestC;
    // The evaluation's (Lm/Np)·max|im|/Amin, from the pass's Lm·max|im| (round-off in the slack).
    const peakFluxDensityT =
      pass.cornerFluxLinkagesWb[c]! / (primaryTurns * geometry.minimumAreaM2);
    // The saturation model is linear in temperature (floored at 0): its least over [low, U] at an end.
    const leastSaturationT = Math.min(
      saturationFluxDensity(material, lowC),
      saturationFluxDensity(material, upperC),
    );
    if (
      !(
        (peakFluxDensityT / Math.max(leastSaturationT, 1e-9)) * (1 + HEAT_SLACK) <=
        settings.fluxDensityUtilizationMax
      )
    ) {
      return false;
    }
    const hotSpotRiseK = Math.min(300, ceiling.copperW(upperC) * hotSpotKPerW);
    return above(upperC + hotSpotRiseK) <= settings.hotSpotTemperatureMaxC;
  };
  const proven: boolean[] = new Array<boolean>(cornerCount).fill(false);
  for (;;) {
    // Corners not evaluated and not yet proven; the one with the highest ceiling is evaluated.
    let next = -1;
    let nextC = -Infinity;
    for (let c = 0; c < cornerCount; c++) {
      if (evaluated[c] !== undefined || proven[c]) continue;
      if (isProven(c)) {
        proven[c] = true;
        continue;
      }
      const upperC = ceilings[c]?.temperatureC ?? Infinity;
      if (next < 0 || upperC > nextC) {
        next = c;
        nextC = upperC;
      }
    }
    if (next < 0) break;
    const one = evaluateTransformer(duty, sized, settings, [next]);
    if (one === undefined) return undefined;
    if (!take(next, one.corners[0]!)) return partialOf(true);
  }
  return partialOf(false);
}

/**
 * The first-pass design itself from a {@link designAtHottestCorner} one: the corners it lacks
 * evaluated (each corner is evaluated on its own, so those it has are the very corners of an
 * evaluation at every corner), and every limit checked, as `designTransformer` finishes a build
 * named whole, and failed as it fails one (with the whole evaluation's issues) where a limit is
 * broken. Undefined where the evaluation does not hold (the design decides).
 */
export function completeDesign(
  pass: SolvedPass,
  partial: HottestDesign,
): ReturnType<typeof designOnFirstPass> | undefined {
  const { chosen, requested, cornerIndices } = partial;
  const duty = pass.duty;
  const settings = { ...TRANSFORMER_EVALUATION_DEFAULTS, ...requested.evaluation };
  const missing: number[] = [];
  for (let c = 0; c < duty.cornerLabels.length; c++) {
    if (!cornerIndices.includes(c)) missing.push(c);
  }
  let corners = chosen.evaluation.corners;
  if (missing.length > 0) {
    const more = evaluateTransformer(duty, chosen.build, settings, missing);
    if (more === undefined) return undefined;
    corners = [];
    for (let c = 0, i = 0, m = 0; c < duty.cornerLabels.length; c++) {
      if (cornerIndices[i] === c) corners.push(chosen.evaluation.corners[i++]!);
      else corners.push(more.corners[m++]!);
    }
  }
  const evaluation = { ...chosen.evaluation, corners };
  // As designTransformer fails a build named whole: with its evaluation's issues.
  const issues = transformerIssues(evaluation, settings);
  if (issues.length > 0) return { ok: false, reason: reasonOf(issues), issues };
  return {
    ok: true,
    value: {
      spec: partial.spec,
      requested,
      chosen: { build: chosen.build, evaluation, evaluatedCount: chosen.evaluatedCount },
    },
  };
}
