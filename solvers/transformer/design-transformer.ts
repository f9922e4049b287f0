import { coreGeometry } from '../magnetics/core-geometry.js';
import { MU_0_H_PER_M } from '../magnetics/gapped-inductance.js';
import { saturationFluxDensity } from '../magnetics/saturation-flux-density.js';
import { failure, success, type Issue, type Result } from '../result.js';
import { peak } from '../waveform/peak.js';
import { minimum } from '../waveform/minimum.js';
import { rms } from '../waveform/rms.js';
import type { Waveform } from '../waveform/waveform.js';
import { evaluateTransformer, type TransformerEvaluation } from './evaluate-transformer.js';
import type { TransformerBuild } from './transformer-build.js';
import type { TransformerDuty } from './transformer-duty.js';
import { TRANSFORMER_EVALUATION_DEFAULTS } from './transformer-evaluation-options.js';
import { transformerFitIssues } from './transformer-fit-issues.js';
import { transformerIssues } from './transformer-issues.js';
import type { TransformerRequest } from './transformer-request.js';
import { ringNeedsCutGapIssue, shapesForGap } from './shapes-for-gap.js';
import { ampereTurnShares } from './transformer-stack.js';
import { foilBuild } from './foil-build.js';
import { transformerTurns, turnsFromPrimary } from './transformer-turns.js';
import { windingWireChoice } from './winding-wire-choice.js';
import { wireDimensions, type WindingWire } from './winding-wire.js';

/** The chosen transformer, its evaluation at every corner, and how many builds were tried. */
export interface TransformerChoice {
  build: TransformerBuild;
  evaluation: TransformerEvaluation;
  /** Builds evaluated in full on the way. */
  evaluatedCount: number;
}

const TURNS_CAP = 2000;

/**
 * Designs the transformer for `duty`: over the request's shapes from the smallest effective
 * volume up (rings left out when the gap sets the inductance: a ring takes no cut gap), and its
 * materials, the fewest secondary turns that keep the peak flux density under the limit at the
 * hottest allowed core (ambient + temperatureRiseMaxK), and a few more turns beyond
 * (turnsOptionCount), each wound with the wire the current density and skin depth call for (on
 * an ungapped core, also a foil build where foilBuild offers one); the first shape with a build
 * inside every limit wins, with the least worst-corner loss among its builds (a foil build only
 * when it loses less, fully evaluated, than the best without foil). Candidates are screened at
 * three corners (largest primary current, flux swing and flux peak) and the best checked at
 * every corner (a request that names one build skips the screen). Issues of the last shape's
 * best build when none fits.
 */
export function designTransformer(
  duty: TransformerDuty,
  request: TransformerRequest,
): Result<TransformerChoice> {
  const settings = { ...TRANSFORMER_EVALUATION_DEFAULTS, ...request.evaluation };
  if (request.wires !== undefined && request.wires.length !== duty.windings.length) {
    return failure([
      {
        code: 'non_physical_value',
        path: ['magnetics', 'wires'],
        constraint: 'one wire per transformer winding (wires.length = windingCount)',
        quantity: 'wireCount',
        required: request.wires.length,
        limit: duty.windings.length,
      },
    ]);
  }
  if (request.shapes.length > 0 && shapesForGap(request.shapes, duty.gapRole).length === 0) {
    return failure([ringNeedsCutGapIssue(['magnetics', 'coreShape'])]);
  }
  const frequencyHz = 1 / (duty.magnetizingCurrentsA[0]?.periodS ?? 1);
  const isFoilOffered = request.wires === undefined && duty.gapRole === 'ungapped';
  const wires =
    request.wires ??
    duty.windings.map((winding) =>
      windingWireChoice(
        Math.max(...winding.currentsA.map((current) => rms(current)), 1e-6),
        frequencyHz,
        request.wireChoice,
      ),
    );
  const fluxPeakA = Math.max(
    ...duty.magnetizingCurrentsA.map((current) => Math.max(peak(current), -minimum(current))),
  );
  const hotC = duty.ambientTemperatureC + settings.temperatureRiseMaxK;
  // Sorted by volume read once per shape (the comparator looked both geometries up per call).
  const shapes = shapesForGap(request.shapes, duty.gapRole)
    .map((shape) => ({ shape, volumeM3: coreGeometry(shape).effectiveVolumeM3 }))
    .sort((a, b) => a.volumeM3 - b.volumeM3)
    .map((entry) => entry.shape);
  // The screen is cheap and errs high: losses once at the rise limit, 16 harmonics and the
  // Parseval tail (which overstates the rest) instead of up to 64.
  const screenSettings = {
    ...settings,
    thermalModel: 'at-limit' as const,
    harmonicCount: 16,
    harmonicCountMax: 16,
  };
  const allCorners = duty.cornerLabels.map((_, index) => index);
  // A request that names one build (one shape, one material, the primary turns and every wire)
  // is judged on its full evaluation alone, as a fixed output inductor is: the screen errs high
  // (losses at the rise limit, a Parseval tail over the 16th harmonic) and could refuse a build
  // inside every limit, where there is nothing else to choose from.
  const isOneBuild =
    shapes.length === 1 &&
    request.materials.length === 1 &&
    request.primaryTurns !== undefined &&
    request.wires !== undefined;
  // Only a search screens; one build is not screened (above), so its corners are not picked.
  const screening = isOneBuild ? [] : screeningCorners(duty);
  let evaluatedCount = 0;
  let lastIssues: Issue[] = [];
  for (const shape of shapes) {
    const geometry = coreGeometry(shape);
    const screened: Array<{ build: TransformerBuild; lossW: number; isFoil: boolean }> = [];
    let shapeIssues: Issue[] | undefined;
    const keepIssues = (issues: Issue[]) => {
      if (issues.length === 0) return;
      if (shapeIssues === undefined || issues.length < shapeIssues.length) shapeIssues = issues;
    };
    const windowVerdicts = new Map<string, Issue[]>();
    // One turns array and one ampere-turn shares array per turn set on this shape, whatever the
    // material: the window stack is kept by the turns array (evaluateTransformer's stackOf), so
    // materials that try the same turns lay it once instead of once each.
    const turnSets = new Map<string, { turns: number[]; shares: number[] }>();
    const foilBuilds = new Map<string, TransformerBuild | undefined>();
    const breadthM = geometry.windowBreadthM - 2 * settings.endMarginM;
    /**
     * Checks one build's window (no losses), then screens its losses at the screening corners;
     * a build inside every limit joins `screened`. An ungapped core's window does not depend on
     * the material: one verdict per `key` (its turns and wires).
     */
    const consider = (build: TransformerBuild, key: string, isFoil: boolean) => {
      const known = duty.gapRole === 'ungapped' ? windowVerdicts.get(key) : undefined;
      if (known !== undefined && known.length > 0) return;
      let sized: TransformerBuild = build;
      if (known === undefined) {
        const frame = evaluateTransformer(duty, build, settings, []);
        const windowIssues =
          frame === undefined
            ? transformerFitIssues(duty, build, settings)
            : transformerIssues(frame, settings);
        if (duty.gapRole === 'ungapped') windowVerdicts.set(key, windowIssues);
        if (frame === undefined || windowIssues.length > 0) {
          keepIssues(windowIssues);
          return;
        }
        sized = { ...build, gapLengthM: frame.gapLengthM };
      }
      if (isOneBuild) {
        screened.push({ build: sized, lossW: 0, isFoil });
        return;
      }
      const screen = evaluateTransformer(duty, sized, screenSettings, screening);
      evaluatedCount += 1;
      if (screen === undefined) return;
      const issues = transformerIssues(screen, settings);
      if (issues.length > 0) keepIssues(issues);
      else screened.push({ build: sized, lossW: worstLossW(screen), isFoil });
    };
    for (const material of request.materials) {
      const limitT = settings.fluxDensityUtilizationMax * saturationFluxDensity(material, hotC);
      // B = Lm·im/(Np·Amin) ≤ limit gives the fewest primary turns; a gap cut for Lm also needs
      // the ungapped core to exceed Lm: Np² > Lm·le/(μ0·μi·Ae), with 5 % to spare.
      const fluxTurns =
        (duty.magnetizingInductanceH * fluxPeakA) / (limitT * geometry.minimumAreaM2);
      const inductanceTurns =
        duty.gapRole === 'set-inductance'
          ? Math.sqrt(
              (1.05 * duty.magnetizingInductanceH * geometry.effectiveLengthM) /
                (MU_0_H_PER_M * material.initialPermeability * geometry.effectiveAreaM2),
            )
          : 0;
      const primaryMin = Math.max(fluxTurns, inductanceTurns);
      for (const options of turnsOptions(duty, primaryMin, request)) {
        const key = options.join(',');
        let turnSet = turnSets.get(key);
        if (turnSet === undefined) {
          turnSet = { turns: options, shares: ampereTurnShares(duty, options) };
          turnSets.set(key, turnSet);
        }
        const build: TransformerBuild = {
          shape,
          material,
          turns: turnSet.turns,
          wires,
          arrangement: request.arrangement,
          gapLengthM: 0,
          ampereTurnShares: turnSet.shares,
        };
        consider(build, key, false);
        // Foil is offered beside litz on ungapped cores when the engine chooses the wires (see
        // foilBuild); on a gapped core the gap's fringing field, which the one-dimensional
        // Dowell model leaves out, crosses a wide foil broadside (common practice: no foil
        // next to a gap), and a ring is not wound with foil (common practice). Its thickness
        // does not depend on the material: one per turn set.
        if (isFoilOffered && shape.family !== 'ring') {
          if (!foilBuilds.has(key)) {
            foilBuilds.set(
              key,
              foilBuild(
                duty,
                build,
                breadthM,
                settings.sectionInsulationM,
                geometry.meanTurnLengthM,
                request.foilChoice,
              ),
            );
          }
          const foil = foilBuilds.get(key);
          if (foil !== undefined) consider({ ...foil, material }, `foil:${key}`, true);
        }
      }
    }
    screened.sort((a, b) => a.lossW - b.lossW);
    // The first build inside every limit at every corner wins; a foil build only when it also
    // loses less, fully evaluated, than the first such build without foil (the screen's
    // at-limit losses rank the two kinds only roughly).
    let foilWinner: TransformerChoice | undefined;
    for (const candidate of screened) {
      if (foilWinner !== undefined && candidate.isFoil) continue;
      const evaluation = evaluateTransformer(duty, candidate.build, settings, allCorners);
      evaluatedCount += 1;
      if (evaluation === undefined) continue;
      const issues = transformerIssues(evaluation, settings);
      if (issues.length > 0) {
        keepIssues(issues);
        continue;
      }
      const choice = { build: candidate.build, evaluation, evaluatedCount };
      if (candidate.isFoil) {
        foilWinner = choice;
        continue;
      }
      if (foilWinner === undefined || worstLossW(evaluation) <= worstLossW(foilWinner.evaluation)) {
        return success(choice);
      }
      break;
    }
    if (foilWinner !== undefined) return success({ ...foilWinner, evaluatedCount });
    if (shapeIssues !== undefined) lastIssues = shapeIssues;
  }
  if (lastIssues.length === 0) {
    const breadthMaxM = Math.max(
      ...request.shapes.map(
        (shape) => coreGeometry(shape).windowBreadthM - 2 * settings.endMarginM,
      ),
    );
    lastIssues = [
      {
        code: 'window_fill_limit',
        path: ['magnetics'],
        constraint: 'one turn of every winding fits the breadth of some core window',
        quantity: 'windingPitchM',
        required: widestPitchM(wires, breadthMaxM),
        limit: breadthMaxM,
      },
    ];
  }
  return failure(lastIssues);
}

/** The largest length one turn of any winding takes along a layer of breadth `breadthM`, m. */
function widestPitchM(wires: readonly WindingWire[], breadthM: number): number {
  return Math.max(...wires.map((wire) => wireDimensions(wire, breadthM).pitchM));
}

function worstLossW(evaluation: TransformerEvaluation): number {
  return evaluation.corners.reduce((most, corner) => Math.max(most, corner.totalLossW), 0);
}

/**
 * The corners a candidate is screened at: the largest primary RMS current (copper), the largest
 * flux swing (core loss) and the largest flux peak (saturation).
 */
function screeningCorners(duty: TransformerDuty): number[] {
  const primary = duty.windings[0];
  // Each corner's score once (the loop compared against the best's score evaluated again).
  const pick = (score: (index: number) => number) => {
    let best = 0;
    let bestScore = score(0);
    for (let i = 1; i < duty.cornerLabels.length; i++) {
      const value = score(i);
      if (value > bestScore) {
        best = i;
        bestScore = value;
      }
    }
    return best;
  };
  const current = (i: number) => duty.magnetizingCurrentsA[i] as Waveform;
  const indices = [
    pick((i) => rms(primary?.currentsA[i] ?? current(i))),
    pick((i) => peak(current(i)) - minimum(current(i))),
    pick((i) => Math.max(peak(current(i)), -minimum(current(i)))),
  ];
  return [...new Set(indices)];
}

/**
 * The turn sets tried at one core: fixed primary turns, or the fewest that keep B in bounds and a
 * few more (set by the regulated output's winding, or by the only winding of an inductor).
 */
function turnsOptions(
  duty: TransformerDuty,
  primaryMin: number,
  request: TransformerRequest,
): number[][] {
  const ideal = duty.windings.map((winding) => winding.turnsPerPrimaryTurn);
  if (request.primaryTurns !== undefined) return [turnsFromPrimary(ideal, request.primaryTurns)];
  const count = request.turnsOptionCount ?? 3;
  // One winding (an inductor): its own fewest whole turns, and a few more.
  if (ideal.length === 1) {
    const fewest = Math.max(1, Math.ceil(primaryMin - 1e-9));
    return Array.from({ length: Math.min(count, TURNS_CAP - fewest + 1) }, (_, i) => [fewest + i]);
  }
  // The regulated output's (first) winding sets the whole-turns ratio that matters most.
  const found = duty.windings.findIndex(
    (winding) => winding.role.kind === 'output' && winding.role.outputIndex === 0,
  );
  const index = found > 0 ? found : 1;
  const share = ideal[index] as number;
  let regulated = Math.max(1, Math.ceil(primaryMin * share - 1e-9));
  // Rounding Np = Ns1/share can land below the minimum: step up until it does not.
  while (transformerTurns(ideal, regulated, index)[0]! < primaryMin && regulated < TURNS_CAP)
    regulated += 1;
  const options: number[][] = [];
  for (let i = 0; i < count && regulated + i <= TURNS_CAP; i++) {
    options.push(transformerTurns(ideal, regulated + i, index));
  }
  return options;
}
