import { ObjectMemo } from '../object-memo.js';
import { copperResistance } from '../materials/copper-resistance.js';
import { layoutPortion } from './layout-portion.js';
import { coreGeometry, type CoreGeometry } from '../magnetics/core-geometry.js';
import { gapLengthForInductance } from '../magnetics/gap-length-for-inductance.js';
import type { GappedCore } from '../magnetics/gapped-core.js';
import { gappedInductance } from '../magnetics/gapped-inductance.js';
import { igseCoreLoss } from '../magnetics/igse-core-loss.js';
import { lossTemperatureFactor } from '../magnetics/loss-temperature-factor.js';
import { saturationFluxDensity } from '../magnetics/saturation-flux-density.js';
import { surfaceRiseK } from '../magnetics/temperature-rise.js';
import { windingHotSpotRisePerWatt } from '../magnetics/winding-hot-spot.js';
import { windingLossSlope } from '../magnetics/winding-loss-slope.js';
import {
  writeWindingLoss,
  type WindingAcResistanceOptions,
  type WindingLoss,
} from '../magnetics/winding-ac-resistance.js';
import type { WindingPortion } from '../magnetics/winding-portion.js';
import { peak } from '../waveform/peak.js';
import { minimum } from '../waveform/minimum.js';
import { rampJumps } from '../waveform/ramp-jumps.js';
import { scaleWaveform } from '../waveform/scale-waveform.js';
import { steepestSlope } from '../waveform/steepest-slope.js';
import { dutySpectra, spectrumAt, type DutySpectra } from './duty-spectra.js';
import type { TransformerBuild } from './transformer-build.js';
import type { TransformerDuty, WindingDuty } from './transformer-duty.js';
import {
  TRANSFORMER_EVALUATION_DEFAULTS,
  type TransformerEvaluationOptions,
} from './transformer-evaluation-options.js';
import { transformerStack, type TransformerStack } from './transformer-stack.js';

/** A stack laid, with every input it read besides the turns it is kept under. */
interface StackEntry {
  windings: TransformerDuty['windings'];
  wires: TransformerBuild['wires'];
  arrangement: TransformerBuild['arrangement'];
  ampereTurnShares: TransformerBuild['ampereTurnShares'];
  breadthM: number;
  sectionInsulationM: number;
  meanTurnLengthM: number;
  stack: TransformerStack | undefined;
}

/**
 * The last stack laid for each turns array: a search evaluates one build for its window, then
 * (copied with its gap) for the screen and at every corner, and the design evaluates it again
 * on the corners solved with it; the copies share the turns array. Stacks are plain data
 * nothing mutates.
 */
const STACKS = new ObjectMemo<TransformerBuild['turns'], StackEntry>();

/**
 * True when `duty` lays the same stack as the windings `known` was laid for: the same windings,
 * or, when the build carries its ampere-turn shares, windings of the same roles (all that
 * transformerStack then reads of the duty), as the corners solved again with the build give.
 */
function isSameStackDuty(
  known: TransformerDuty['windings'],
  duty: TransformerDuty,
  build: TransformerBuild,
): boolean {
  if (known === duty.windings) return true;
  if (build.ampereTurnShares === undefined || known.length !== duty.windings.length) return false;
  return known.every((winding, k) => winding.role.kind === duty.windings[k]?.role.kind);
}

/** transformerStack of the build in its shape's window, laid once for the same inputs. */
function stackOf(
  duty: TransformerDuty,
  build: TransformerBuild,
  breadthM: number,
  sectionInsulationM: number,
  meanTurnLengthM: number,
): TransformerStack | undefined {
  const known = STACKS.get(build.turns);
  if (
    known !== undefined &&
    isSameStackDuty(known.windings, duty, build) &&
    known.wires === build.wires &&
    known.arrangement === build.arrangement &&
    known.ampereTurnShares === build.ampereTurnShares &&
    known.breadthM === breadthM &&
    known.sectionInsulationM === sectionInsulationM &&
    known.meanTurnLengthM === meanTurnLengthM
  ) {
    return known.stack;
  }
  const stack = transformerStack(duty, build, breadthM, sectionInsulationM, meanTurnLengthM);
  STACKS.set(build.turns, {
    windings: duty.windings,
    wires: build.wires,
    arrangement: build.arrangement,
    ampereTurnShares: build.ampereTurnShares,
    breadthM,
    sectionInsulationM,
    meanTurnLengthM,
    stack,
  });
  return stack;
}

/** A gap solved for one core and inductance (NaN: no gap gives it). */
interface GapEntry {
  turns: number;
  effectiveLengthM: number;
  effectiveAreaM2: number;
  relativePermeability: number;
  windowHeightM: number;
  fringing: GappedCore['fringing'];
  inductanceH: number;
  gapM: number;
}

/**
 * The last gaps solved, newest last: a search cuts the gap of one build for its window check,
 * again for its screen and at every corner, and the design once more on the corners solved with
 * it (a designed flyback: 17 root searches, 9 of them distinct). A pure function of the numbers
 * compared, so a hit returns the very number the search would.
 */
const GAPS: GapEntry[] = [];
const GAP_MEMO_SIZE = 16;

/** gapLengthForInductance's gap for `core` and `inductanceH`, m; undefined when none gives it. */
function gapFor(core: GappedCore, inductanceH: number): number | undefined {
  for (let i = GAPS.length - 1; i >= 0; i--) {
    const entry = GAPS[i] as GapEntry;
    if (
      entry.inductanceH === inductanceH &&
      entry.turns === core.turns &&
      entry.effectiveLengthM === core.effectiveLengthM &&
      entry.effectiveAreaM2 === core.effectiveAreaM2 &&
      entry.relativePermeability === core.relativePermeability &&
      entry.windowHeightM === core.windowHeightM &&
      entry.fringing === core.fringing
    ) {
      return Number.isNaN(entry.gapM) ? undefined : entry.gapM;
    }
  }
  const gap = gapLengthForInductance(core, inductanceH);
  const gapM = gap.ok ? gap.value : NaN;
  if (GAPS.length >= GAP_MEMO_SIZE) GAPS.shift();
  GAPS.push({
    turns: core.turns,
    effectiveLengthM: core.effectiveLengthM,
    effectiveAreaM2: core.effectiveAreaM2,
    relativePermeability: core.relativePermeability,
    windowHeightM: core.windowHeightM,
    fringing: core.fringing,
    inductanceH,
    gapM,
  });
  return gap.ok ? gap.value : undefined;
}

/** Temperature rise at which the loss–temperature iteration is declared a runaway, K. */
const RUNAWAY_RISE_K = 300;

/** The hot spot's conduction rise, K, capped like a runaway (never an infinity). */
function hotSpotRise(copperLossW: number, hotSpotKPerW: number): number {
  const riseK = copperLossW * hotSpotKPerW;
  return riseK <= RUNAWAY_RISE_K ? riseK : RUNAWAY_RISE_K;
}

/** One winding's copper loss at one corner, at the corner's winding temperature. */
export interface WindingCornerLoss {
  /** DC resistance at the winding temperature, Ω. */
  resistanceOhm: number;
  /** Rdc·I_dc², W. */
  dcLossW: number;
  /** Loss of the harmonics by Dowell's factor, tail included, W. */
  acLossW: number;
}

/** The transformer at one corner, after the loss and temperature fixed point. */
export interface TransformerCorner {
  label: string;
  /** Largest |B| at the smallest section of the path, T. */
  peakFluxDensityT: number;
  /** Peak-to-peak flux density in the effective section, T. */
  fluxDensitySwingT: number;
  /** Saturation flux density at the core temperature, T. */
  saturationFluxDensityT: number;
  /** peakFluxDensityT over saturationFluxDensityT. */
  fluxDensityUtilization: number;
  coreLossW: number;
  windings: WindingCornerLoss[];
  copperLossW: number;
  totalLossW: number;
  /** Rise of the wound core above the ambient, K. */
  temperatureRiseK: number;
  /** Core and winding temperature (one lumped temperature), °C. */
  temperatureC: number;
  /** Conduction rise of the winding's hottest point over temperatureC, K. */
  hotSpotRiseK: number;
  /** Estimated winding hot-spot temperature, temperatureC + hotSpotRiseK, °C. */
  hotSpotTemperatureC: number;
  /** False when the loss–temperature iteration did not settle (thermal runaway). */
  isThermallyStable: boolean;
}

/** A build evaluated against a duty: geometry, fit, inductances and every corner. */
export interface TransformerEvaluation {
  geometry: CoreGeometry;
  stack: TransformerStack;
  /** Winding breadth available along the leg, m. */
  breadthM: number;
  /** Outside area of every turn over the window area. */
  windowFill: number;
  /** Stack height over the window width. */
  windowHeightFill: number;
  gapLengthM: number;
  /** Magnetizing inductance the build gives, referred to the primary, H. */
  magnetizingInductanceH: number;
  /** DC resistance of each winding at 20 °C, Ω. */
  resistancesAt20COhm: number[];
  corners: TransformerCorner[];
}

/**
 * Evaluates `build` against `duty`: lays the windings, cuts the gap (for a duty whose core sets
 * Lm), and at each corner finds the flux density from the magnetizing current,
 * B = Lm·im/(Np·A), the core loss by the iGSE times the material's temperature factor, the
 * copper loss by Dowell harmonic by harmonic, and the temperature rise from the total loss
 * (McLyman's surface relation), iterated until loss and temperature agree, and the winding's
 * hot spot above that (windingHotSpotRisePerWatt times the copper loss). Only the corners
 * `cornerIndices` are evaluated (all by default). Undefined when a winding does not fit the
 * window's breadth or the gap cannot give the inductance.
 */
export function evaluateTransformer(
  duty: TransformerDuty,
  build: TransformerBuild,
  options: TransformerEvaluationOptions = {},
  cornerIndices: readonly number[] = duty.cornerLabels.map((_, index) => index),
): TransformerEvaluation | undefined {
  const settings = { ...TRANSFORMER_EVALUATION_DEFAULTS, ...options };
  const geometry = coreGeometry(build.shape);
  const breadthM = geometry.windowBreadthM - 2 * settings.endMarginM;
  const stack = stackOf(
    duty,
    build,
    breadthM,
    settings.sectionInsulationM,
    geometry.meanTurnLengthM,
  );
  if (stack === undefined) return undefined;
  const primaryTurns = build.turns[0] as number;
  const core: GappedCore = {
    turns: primaryTurns,
    effectiveLengthM: geometry.effectiveLengthM,
    effectiveAreaM2: geometry.effectiveAreaM2,
    relativePermeability: build.material.initialPermeability,
    windowHeightM: geometry.windowBreadthM,
    fringing: 'mclyman',
  };
  let gapLengthM = build.gapLengthM;
  if (duty.gapRole === 'set-inductance') {
    const gapM = gapFor(core, duty.magnetizingInductanceH);
    if (gapM === undefined) return undefined;
    gapLengthM = gapM;
  }
  const magnetizingInductanceH = gappedInductance(core, gapLengthM);
  const resistancesAt20COhm = stack.layouts.map(
    (layout) =>
      layout.turns * geometry.meanTurnLengthM * layout.dimensions.resistancePerLengthAt20COhmPerM,
  );
  const portions = stack.layouts.map((layout, k) =>
    layoutPortion(layout, stack.equivalentLayerCounts[k] ?? 0.5, breadthM),
  );
  const hotSpotKPerW = windingHotSpotRisePerWatt({
    buildM: stack.stackHeightM,
    breadthM,
    meanTurnLengthM: geometry.meanTurnLengthM,
    conductivityWPerMK: settings.windingThermalConductivityWPerMK,
  });
  const spectra = dutySpectra(duty);
  // A winding whose current is another's half a period on, wound as that one (the same portion
  // and resistance), loses what that one loses at every temperature: its loss is copied.
  const lossTwins = duty.windings.map((winding, k) => {
    const j = winding.halfPeriodShiftOf;
    return j !== undefined &&
      j < k &&
      resistancesAt20COhm[j] === resistancesAt20COhm[k] &&
      isSamePortion(portions[j], portions[k])
      ? j
      : -1;
  });
  const corners = cornerIndices.map((index) =>
    transformerCorner({
      duty,
      build,
      geometry,
      portions,
      lossTwins,
      resistancesAt20COhm,
      index,
      settings,
      spectra,
      hotSpotKPerW,
    }),
  );
  return {
    geometry,
    stack,
    breadthM,
    windowFill: stack.outsideAreaM2 / geometry.windowAreaM2,
    windowHeightFill: stack.stackHeightM / geometry.windowWidthM,
    gapLengthM,
    magnetizingInductanceH,
    resistancesAt20COhm,
    corners,
  };
}

/** What every loss evaluation of one corner reads. */
interface CornerContext {
  duty: TransformerDuty;
  build: TransformerBuild;
  geometry: CoreGeometry;
  portions: readonly WindingPortion[];
  /** Per winding, the earlier winding whose loss it copies, else −1. */
  lossTwins: readonly number[];
  resistancesAt20COhm: readonly number[];
  index: number;
  settings: Required<TransformerEvaluationOptions>;
  spectra: DutySpectra;
  /** Hot-spot rise over the surface temperature per watt of copper loss, K/W. */
  hotSpotKPerW: number;
}

/**
 * Scratch of {@link copperAt}: each winding's resistance (Ω), DC and AC loss (W) at the last
 * temperature evaluated, three numbers per winding; with the loss and options objects it
 * reuses. A design evaluates copper hundreds of times and keeps only each corner's last.
 */
let COPPER = new Float64Array(3 * 8);
const LOSS: WindingLoss = {
  dcLossW: NaN,
  acLossW: NaN,
  tailLossW: NaN,
  totalLossW: NaN,
  effectiveResistanceOhm: NaN,
  harmonicsUsed: 0,
};
/** Each winding's loss slope in temperature where {@link copperAt} took them, W/K. */
let WINDING_SLOPES = new Float64Array(8);
/** Scratch for the slope of the first exact evaluation of a corner, W/K. */
const TANGENT = { wPerK: NaN };
const LOSS_OPTIONS: Required<WindingAcResistanceOptions> = {
  temperatureC: NaN,
  harmonicCount: 0,
  maxHarmonicCount: 0,
  tailTolerance: NaN,
};

/**
 * Exact copper loss of every winding at one corner (Dowell per harmonic) at one temperature,
 * into {@link COPPER}; returns Σ (DC + AC) loss, W, summed as (Σ + DC) + AC winding by winding.
 * With `slope`, also the loss's slope in temperature there (windingLossSlope), W/K, into
 * slope.wPerK.
 */
function copperAt(context: CornerContext, temperatureC: number, slope?: { wPerK: number }): number {
  const { duty, portions, lossTwins, resistancesAt20COhm, index, settings, spectra } = context;
  const windingCount = duty.windings.length;
  if (COPPER.length < 3 * windingCount) COPPER = new Float64Array(3 * windingCount);
  if (WINDING_SLOPES.length < windingCount) WINDING_SLOPES = new Float64Array(windingCount);
  LOSS_OPTIONS.temperatureC = temperatureC;
  LOSS_OPTIONS.harmonicCount = settings.harmonicCount;
  LOSS_OPTIONS.maxHarmonicCount = settings.harmonicCountMax;
  LOSS_OPTIONS.tailTolerance = settings.harmonicTailTolerance;
  let copperW = 0;
  let slopeWPerK = 0;
  for (let k = 0; k < windingCount; k++) {
    const twin = lossTwins[k] ?? -1;
    if (twin >= 0) {
      COPPER[3 * k] = COPPER[3 * twin] as number;
      COPPER[3 * k + 1] = COPPER[3 * twin + 1] as number;
      COPPER[3 * k + 2] = COPPER[3 * twin + 2] as number;
      copperW = copperW + (COPPER[3 * k + 1] as number) + (COPPER[3 * k + 2] as number);
      slopeWPerK += WINDING_SLOPES[twin] as number;
      WINDING_SLOPES[k] = WINDING_SLOPES[twin] as number;
      continue;
    }
    // A winding whose current is another's half a period on takes that one's spectrum.
    const source = (duty.windings[k] as WindingDuty).halfPeriodShiftOf ?? k;
    const current = duty.windings[source]?.currentsA[index];
    const portion = portions[k];
    if (current === undefined || portion === undefined) {
      throw new RangeError(`evaluateTransformer: winding ${k} lacks corner ${index}`);
    }
    const resistanceOhm = copperResistance(resistancesAt20COhm[k] ?? 0, temperatureC);
    const spectrum = spectrumAt(spectra, current, source, index, settings.harmonicCountMax);
    writeWindingLoss(LOSS, spectrum, portion, resistanceOhm, LOSS_OPTIONS);
    if (slope !== undefined) {
      WINDING_SLOPES[k] = windingLossSlope(spectrum, portion, resistanceOhm, temperatureC, LOSS);
      slopeWPerK += WINDING_SLOPES[k] as number;
    }
    COPPER[3 * k] = resistanceOhm;
    COPPER[3 * k + 1] = LOSS.dcLossW;
    COPPER[3 * k + 2] = LOSS.acLossW;
    copperW = copperW + LOSS.dcLossW + LOSS.acLossW;
  }
  if (slope !== undefined) slope.wPerK = slopeWPerK;
  return copperW;
}

/** The windings' losses of the last {@link copperAt}, and their total as Σ (DC + AC), W. */
function copperLosses(windingCount: number): {
  windings: WindingCornerLoss[];
  copperLossW: number;
} {
  const windings: WindingCornerLoss[] = [];
  let copperLossW = 0;
  for (let k = 0; k < windingCount; k++) {
    const dcLossW = COPPER[3 * k + 1] as number;
    const acLossW = COPPER[3 * k + 2] as number;
    windings.push({ resistanceOhm: COPPER[3 * k] as number, dcLossW, acLossW });
    copperLossW += dcLossW + acLossW;
  }
  return { windings, copperLossW };
}

function transformerCorner(context: CornerContext): TransformerCorner {
  const { duty, build, geometry, settings, index, hotSpotKPerW } = context;
  const label = duty.cornerLabels[index] ?? `corner-${index}`;
  const magnetizingA = duty.magnetizingCurrentsA[index];
  if (magnetizingA === undefined) throw new RangeError(`evaluateTransformer: no corner ${index}`);
  const primaryTurns = build.turns[0] as number;
  // Flux linkage Lm·im is what the converter's volt-seconds fixed; B = Lm·im/(Np·A).
  const fluxPerAmpere = duty.magnetizingInductanceH / primaryTurns;
  // Flux cannot jump. A converter model that steps its magnetizing current (an excess returned
  // "at once" through clamping diodes) really ramps it at the clamped winding voltage, which is
  // the steepest slope the waveform shows elsewhere: the step becomes that ramp.
  const stepped = scaleWaveform(magnetizingA, fluxPerAmpere / geometry.effectiveAreaM2);
  const flux = rampJumps(stepped, Math.max(steepestSlope(stepped), 1e-30));
  const fluxPeakA = Math.max(peak(magnetizingA), -minimum(magnetizingA));
  const peakFluxDensityT = (fluxPerAmpere * fluxPeakA) / geometry.minimumAreaM2;
  const fluxDensitySwingT = peak(flux) - minimum(flux);
  const coreLossAtMinimumW =
    igseCoreLoss(flux, build.material.steinmetz) * geometry.effectiveVolumeM3;
  // The core loss at a temperature is the iGSE's times the material's temperature factor.
  const material = build.material;
  // Fixed point of loss and temperature. Between exact copper evaluations the copper loss
  // follows a cheap model (below); an exact evaluation at the temperature it settles on restarts
  // the model, until the temperature an exact evaluation's own losses cause lies within the
  // tolerance of it (two or three exact evaluations a corner, where two exact passes had to
  // agree before: three or four).
  if (settings.thermalModel === 'at-limit') {
    // A screen: losses once, at the hottest temperature allowed; the rise they would cause.
    const limitC = duty.ambientTemperatureC + settings.temperatureRiseMaxK;
    copperAt(context, limitC);
    const { windings, copperLossW } = copperLosses(duty.windings.length);
    const coreLossW = coreLossAtMinimumW * lossTemperatureFactor(material, limitC);
    const totalLossW = coreLossW + copperLossW;
    const riseK = Number.isFinite(totalLossW)
      ? Math.min(RUNAWAY_RISE_K, surfaceRiseK(totalLossW, geometry.surfaceAreaM2))
      : RUNAWAY_RISE_K;
    const saturationAtLimitT = saturationFluxDensity(material, limitC);
    return {
      label,
      peakFluxDensityT,
      fluxDensitySwingT,
      saturationFluxDensityT: saturationAtLimitT,
      fluxDensityUtilization: peakFluxDensityT / Math.max(saturationAtLimitT, 1e-9),
      windings,
      coreLossW,
      copperLossW,
      totalLossW,
      temperatureRiseK: riseK,
      temperatureC: duty.ambientTemperatureC + riseK,
      hotSpotRiseK: hotSpotRise(copperLossW, hotSpotKPerW),
      hotSpotTemperatureC:
        duty.ambientTemperatureC + riseK + hotSpotRise(copperLossW, hotSpotKPerW),
      isThermallyStable: true,
    };
  }
  // Start half-way up the allowed rise: most designs settle near there.
  const ambientC = duty.ambientTemperatureC;
  const ceilingC = ambientC + RUNAWAY_RISE_K;
  let temperatureC = ambientC + settings.temperatureRiseMaxK / 2;
  let copperW = copperAt(context, temperatureC, TANGENT);
  const tangentWPerK = TANGENT.wPerK;
  // The exact evaluation before the last (NaN until there is one): the secant through the two
  // gives the copper loss's slope in temperature, Dowell's factors included.
  let previousC = NaN;
  let previousCopperW = NaN;
  let isThermallyStable = false;
  let passes = 0;
  for (let round = 0; round < 5; round++) {
    // Between exact evaluations the copper loss follows a model through the last one: the secant
    // through the last two, else (after the first) the tangent there, else the DC resistance's
    // scaling (Dowell's factors held). The first pass starts at the last exact evaluation, where
    // the model is exact: if the temperature its losses cause lies within the tolerance, that
    // evaluation is the answer. The tangent takes Dowell's factors' fall with temperature into
    // account, which the DC scaling left to a third exact evaluation at most corners.
    const hasSecant = Math.abs(temperatureC - previousC) > 1e-6 && Number.isFinite(previousCopperW);
    const hasTangent = !hasSecant && round === 0 && Number.isFinite(tangentWPerK);
    const slopeWPerK = hasSecant
      ? (copperW - previousCopperW) / (temperatureC - previousC)
      : hasTangent
        ? tangentWPerK
        : 0;
    const referenceResistance = copperResistance(1, temperatureC);
    let settledC = temperatureC;
    let isSettled = false;
    let isRunaway = false;
    for (; passes < settings.thermalIterationMax; passes++) {
      const modelW =
        hasSecant || hasTangent
          ? copperW + slopeWPerK * (settledC - temperatureC)
          : (copperW * copperResistance(1, settledC)) / referenceResistance;
      const totalLossW = coreLossAtMinimumW * lossTemperatureFactor(material, settledC) + modelW;
      const nextC = Number.isFinite(totalLossW)
        ? ambientC + surfaceRiseK(totalLossW, geometry.surfaceAreaM2)
        : Infinity;
      // Loss that outruns the cooling: report the runaway at a ceiling, never an infinity.
      if (!(nextC <= ceilingC)) {
        isRunaway = true;
        break;
      }
      if (Math.abs(nextC - settledC) <= settings.thermalToleranceK) {
        isSettled = true;
        break;
      }
      settledC = nextC;
    }
    if (isRunaway) {
      temperatureC = ceilingC;
      copperAt(context, temperatureC);
      break;
    }
    // The settling ran out of passes: the last exact evaluation stands, not stable.
    if (!isSettled) break;
    // Settled on the first pass: the last exact evaluation's own losses hold its temperature.
    if (settledC === temperatureC) {
      isThermallyStable = true;
      break;
    }
    previousC = temperatureC;
    previousCopperW = copperW;
    temperatureC = settledC;
    copperW = copperAt(context, temperatureC);
  }
  const coreLossW = coreLossAtMinimumW * lossTemperatureFactor(material, temperatureC);
  const { windings, copperLossW } = copperLosses(duty.windings.length);
  const saturationFluxDensityT = saturationFluxDensity(material, temperatureC);
  return {
    label,
    peakFluxDensityT,
    fluxDensitySwingT,
    saturationFluxDensityT,
    // A material extrapolated past its Curie point has no saturation left: a huge utilization.
    fluxDensityUtilization: peakFluxDensityT / Math.max(saturationFluxDensityT, 1e-9),
    windings,
    coreLossW,
    copperLossW,
    totalLossW: coreLossW + copperLossW,
    temperatureRiseK: temperatureC - duty.ambientTemperatureC,
    temperatureC,
    // The winding's interior runs hotter than the lumped (surface) temperature by the
    // conduction rise across its build at the settled copper loss.
    hotSpotRiseK: hotSpotRise(copperLossW, hotSpotKPerW),
    hotSpotTemperatureC: temperatureC + hotSpotRise(copperLossW, hotSpotKPerW),
    isThermallyStable,
  };
}

/** True when two portions are wound alike: the same layers, turns a layer, breadth, conductor. */
function isSamePortion(a: WindingPortion | undefined, b: WindingPortion | undefined): boolean {
  if (a === undefined || b === undefined) return false;
  if (
    a.layerCount !== b.layerCount ||
    a.turnsPerLayer !== b.turnsPerLayer ||
    a.breadthM !== b.breadthM
  ) {
    return false;
  }
  const x = a.conductor;
  const y = b.conductor;
  switch (x.kind) {
    case 'round':
      return y.kind === 'round' && x.bareDiameterM === y.bareDiameterM;
    case 'litz':
      return (
        y.kind === 'litz' &&
        x.strandBareDiameterM === y.strandBareDiameterM &&
        x.strandCount === y.strandCount
      );
    case 'foil':
      return y.kind === 'foil' && x.thicknessM === y.thicknessM && x.widthM === y.widthM;
  }
}
