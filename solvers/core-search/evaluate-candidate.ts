import type { FixedTransformer } from '../design/transformer-pass.js';
import {
  designOutputInductors,
  specWithInductors,
  type FixedInductor,
} from '../design/inductor-pass.js';
import {
  cornersWithMagnetics,
  magneticsIssues,
  type FixedMagnetics,
} from '../design/magnetics-pass.js';
import type { Result } from '../result.js';
import { designHoldUp } from '../design/design-hold-up.js';
import { designSummary } from '../design/design-summary.js';
import { operatingCorners } from '../design/operating-corners.js';
import type { AnyCorner } from '../design/design-schema.js';
import { solveEveryCorner, type SolvedSpec } from '../design/transformer-pass.js';
import { specWithTransformer } from '../design/spec-with-transformer.js';
import { transformerRequestFromSpec } from '../design/transformer-request-from-spec.js';
import { coreGeometry } from '../magnetics/core-geometry.js';
import type { CoreShape } from '../magnetics/core-shape.js';
import type { MaterialClass } from '../magnetics/material-class.js';
import type { Issue } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';
import { designTransformer, type TransformerChoice } from '../transformer/design-transformer.js';
import type { WindingArrangement } from '../transformer/transformer-build.js';
import type { TransformerRequest } from '../transformer/transformer-request.js';
import type { TransformerEvaluationOptions } from '../transformer/transformer-evaluation-options.js';
import { transformerIssues } from '../transformer/transformer-issues.js';
import type { WindingWire } from '../transformer/winding-wire.js';
import type { CoreSearchCandidate, CoreSearchCounts } from './core-search-candidate.js';
import type { FirstPass } from './first-pass.js';
import type { FrequencySpace } from './search-space.js';

/** What a full evaluation gives: an accepted candidate, or the count its rejection falls in. */
export type CandidateVerdict =
  | { ok: true; candidate: CoreSearchCandidate }
  | { ok: false; reason: keyof CoreSearchCounts; issues: Issue[] };

/** A candidate to evaluate in full. */
export interface CandidateBuild {
  index: number;
  shape: CoreShape;
  material: MaterialClass;
  primaryTurns: number;
  wires: WindingWire[];
  arrangement: WindingArrangement;
}

/**
 * The spec that fixes `build` for `POST /v1/designs`: the first pass's spec (the request's at
 * this frequency, with Lm fixed for a gapped core, which fixes the gap) with the magnetics block
 * naming the shape, material, primary turns, wires and arrangement.
 */
export function candidateSpec(pass: Extract<FirstPass, { ok: true }>, build: CandidateBuild): Spec {
  const { magnetics } = pass.spec;
  const inline = magnetics.material?.id === build.material.id ? magnetics.material : undefined;
  const { material: _dropped, ...rest } = magnetics;
  // Object.assign, not spreads followed by new keys (the same keys in the same order): this V8
  // (Node 20) takes a slow path for the latter, as in specWithTransformer.
  return Object.assign({}, pass.spec, {
    magnetics: Object.assign(
      {},
      rest,
      {
        mode: 'design' as const,
        coreShape: build.shape.designation,
        materialId: build.material.id,
      },
      inline === undefined ? {} : { material: inline },
      { primaryTurns: build.primaryTurns, wires: build.wires, arrangement: build.arrangement },
    ),
  });
}

/**
 * The output inductors `designConverter` would design for `spec` on the first pass: they do not
 * depend on the transformer build, only on the first solution and the spec's material, so they
 * are designed once per first pass and material.
 */
const inductorCache = new WeakMap<object, Map<string, Result<FixedInductor[]>>>();
function outputInductorsFor(
  pass: Extract<FirstPass, { ok: true }>,
  spec: Spec,
): Result<FixedInductor[]> {
  let byMaterial = inductorCache.get(pass);
  if (byMaterial === undefined) {
    byMaterial = new Map();
    inductorCache.set(pass, byMaterial);
  }
  const key = spec.magnetics.material?.id ?? spec.magnetics.materialId ?? '';
  let inductors = byMaterial.get(key);
  if (inductors === undefined) {
    inductors = designOutputInductors(spec, pass.solved);
    byMaterial.set(key, inductors);
  }
  return inductors;
}

/** A candidate's transformer designed (checked) on the first pass: the first half of its evaluation. */
export interface FirstPassDesign {
  spec: Spec;
  requested: TransformerRequest;
  chosen: TransformerChoice;
}

/**
 * Evaluates `build` in full, by the path `designConverter` takes for a spec that fixes it: the
 * transformer designed (here: checked, every choice being fixed) on the first pass's duty, fixed
 * into the spec (whole turns, resistances, leakage, Lm), every corner solved again with it, the
 * transformer evaluated at every corner of that solution, and its limits checked there too.
 * The first pass is shared: it does not depend on anything the build fixes but Lm.
 */
export function evaluateCandidate(
  f: FrequencySpace,
  pass: Extract<FirstPass, { ok: true }>,
  build: CandidateBuild,
  settings: Required<TransformerEvaluationOptions>,
): CandidateVerdict {
  const designed = designOnFirstPass(pass, build);
  if (!designed.ok) return designed;
  return finishEvaluation(f, pass, build, designed.value, settings);
}

/**
 * The output inductors every candidate of `material` on first pass `pass` is evaluated with
 * (`outputInductorsFor`, which designs them once per first pass and material: the inductor
 * design reads the spec's material, not the transformer's build). The bound pass takes its
 * lower bound of their loss from them (`boundPassFor`, every topology with output inductors).
 */
export function outputInductorsOfMaterial(
  pass: Extract<FirstPass, { ok: true }>,
  material: MaterialClass,
): Result<FixedInductor[]> {
  const { magnetics } = pass.spec;
  const inline = magnetics.material?.id === material.id ? magnetics.material : undefined;
  const { material: _dropped, ...rest } = magnetics;
  const spec: Spec = Object.assign({}, pass.spec, {
    magnetics: Object.assign(
      {},
      rest,
      { mode: 'design' as const, materialId: material.id },
      inline === undefined ? {} : { material: inline },
    ),
  });
  return outputInductorsFor(pass, spec);
}

/**
 * The first half of {@link evaluateCandidate}: the transformer designed (checked) on the first
 * pass's duty, as `designConverter` does first. Its evaluation is the build's own on the first
 * pass, at every corner: a candidate's loss there, before the second solve moves it.
 */
export function designOnFirstPass(
  pass: Extract<FirstPass, { ok: true }>,
  build: CandidateBuild,
): { ok: true; value: FirstPassDesign } | Extract<CandidateVerdict, { ok: false }> {
  const spec = candidateSpec(pass, build);
  const requested = transformerRequestFromSpec(spec);
  if (!requested.ok) return { ok: false, reason: 'converterInfeasible', issues: requested.issues };
  const chosen = designTransformer(pass.duty, requested.value);
  if (!chosen.ok) return { ok: false, reason: reasonOf(chosen.issues), issues: chosen.issues };
  return { ok: true, value: { spec, requested: requested.value, chosen: chosen.value } };
}

/** A candidate's converter solved again with its transformer and output inductors fixed in. */
export interface SecondSolve {
  magnetics: FixedMagnetics & { transformer: FixedTransformer };
  solved: SolvedSpec;
}

/**
 * The second converter solve of {@link finishEvaluation}: the transformer `designed` on the first
 * pass and the output inductors fixed into the spec, every corner solved again. What the
 * magnetics are then evaluated on.
 */
export function solveSecond(
  f: FrequencySpace,
  pass: Extract<FirstPass, { ok: true }>,
  designed: FirstPassDesign,
): { ok: true; value: SecondSolve } | Extract<CandidateVerdict, { ok: false }> {
  const fixing = fixedMagneticsOf(pass, designed);
  if (!fixing.ok) return fixing;
  const { fixedSpec, fixed, inductors } = fixing;
  const second = solveEveryCorner(f.topology, fixedSpec);
  if (!second.ok) return { ok: false, reason: 'converterInfeasible', issues: second.issues };
  return {
    ok: true,
    value: {
      magnetics: { spec: fixedSpec, transformer: fixed, inductors },
      solved: second.value,
    },
  };
}

/** The spec {@link solveSecond} solves: the transformer and every output inductor fixed in. */
function fixedMagneticsOf(
  pass: Extract<FirstPass, { ok: true }>,
  designed: FirstPassDesign,
):
  | { ok: true; fixedSpec: Spec; fixed: FixedTransformer; inductors: FixedInductor[] }
  | Extract<CandidateVerdict, { ok: false }> {
  const { spec, requested, chosen } = designed;
  const inductors = outputInductorsFor(pass, spec);
  if (!inductors.ok) {
    return { ok: false, reason: reasonOf(inductors.issues), issues: inductors.issues };
  }
  // As fixMagnetics: the transformer fixed in, then every output inductor.
  const fixedSpec = specWithInductors(
    specWithTransformer(spec, pass.duty, chosen),
    inductors.value,
  );
  const fixed: FixedTransformer = {
    spec: fixedSpec,
    build: chosen.build,
    settings: requested.evaluation ?? {},
    gapRole: pass.duty.gapRole,
  };
  return { ok: true, fixedSpec, fixed, inductors: inductors.value };
}

/**
 * Part of {@link solveSecond}: the same fixed spec and choices, only the operating corners
 * `cornerIndices` (indices into every corner, in the order {@link solveSecond} has them) solved.
 * `solveEveryCorner` solves each corner on its own from the spec and the choices (nothing
 * carries from one corner to the next), so each corner here is the very corner the whole solve
 * gives (`second-solve-bounds.test.ts` checks this to the bit). Undefined when the
 * magnetics cannot be fixed, the choices fail or a corner does not solve: the whole solve then
 * decides (with every corner's issues). Where the choices or a corner failed, `failed.verdict`
 * (when given) is the failure the whole solve gives ({@link secondSolveFailure}).
 */
export function solveSecondAt(
  f: FrequencySpace,
  pass: Extract<FirstPass, { ok: true }>,
  designed: FirstPassDesign,
  cornerIndices: readonly number[],
  failed?: { verdict?: Extract<CandidateVerdict, { ok: false }> },
): PartialSecondSolve | undefined {
  const fixing = fixedMagneticsOf(pass, designed);
  if (!fixing.ok) return undefined;
  const { fixedSpec, fixed, inductors } = fixing;
  const chosen = f.topology.choose(fixedSpec);
  if (!chosen.ok) {
    if (failed !== undefined) {
      failed.verdict = { ok: false, reason: 'converterInfeasible', issues: chosen.issues };
    }
    return undefined;
  }
  const every = operatingCorners(fixedSpec);
  const corners: AnyCorner[] = [];
  for (const index of cornerIndices) {
    const corner = every[index];
    if (corner === undefined) return undefined;
    const solved = f.topology.solveCorner(fixedSpec, chosen.value, corner);
    if (!solved.ok) {
      if (failed !== undefined) {
        failed.verdict = { ok: false, reason: 'converterInfeasible', issues: solved.issues };
      }
      return undefined;
    }
    corners.push(solved.value);
  }
  return {
    magnetics: { spec: fixedSpec, transformer: fixed, inductors },
    solved: { choices: chosen.value, corners },
    cornerIndices,
    cornerCount: every.length,
  };
}

/**
 * The failure {@link solveSecond} gives when its spec is fixed and then its choices or one of
 * the corners `cornerIndices` (indices into every corner) fail: `solveEveryCorner` solves each
 * corner on its own from the spec and the choices, so such a corner fails there too, and the
 * whole solve fails with the same count (`converterInfeasible`); the issues are those found
 * here only (the search keeps the count). Undefined otherwise (the whole solve decides): a spec
 * that cannot be fixed gives its own count.
 */
export function secondSolveFailure(
  f: FrequencySpace,
  pass: Extract<FirstPass, { ok: true }>,
  designed: FirstPassDesign,
  cornerIndices: readonly number[],
): Extract<CandidateVerdict, { ok: false }> | undefined {
  const fixing = fixedMagneticsOf(pass, designed);
  if (!fixing.ok) return undefined;
  const chosen = f.topology.choose(fixing.fixedSpec);
  if (!chosen.ok) return { ok: false, reason: 'converterInfeasible', issues: chosen.issues };
  const every = operatingCorners(fixing.fixedSpec);
  for (const index of cornerIndices) {
    const corner = every[index];
    if (corner === undefined) continue;
    const solved = f.topology.solveCorner(fixing.fixedSpec, chosen.value, corner);
    if (!solved.ok) return { ok: false, reason: 'converterInfeasible', issues: solved.issues };
  }
  return undefined;
}

/**
 * More corners of a partial second solve: `cornerIndices` solved with its spec and choices, as
 * {@link solveSecondAt} solves them, in a partial of their own. Undefined when one does not solve.
 */
export function solveMoreAt(
  f: FrequencySpace,
  partial: PartialSecondSolve,
  cornerIndices: readonly number[],
): PartialSecondSolve | undefined {
  const { magnetics, solved } = partial;
  const every = operatingCorners(magnetics.spec);
  const corners: AnyCorner[] = [];
  for (const index of cornerIndices) {
    const corner = every[index];
    if (corner === undefined) return undefined;
    const more = f.topology.solveCorner(magnetics.spec, solved.choices, corner);
    if (!more.ok) return undefined;
    corners.push(more.value);
  }
  return {
    magnetics,
    solved: { choices: solved.choices, corners },
    cornerIndices,
    cornerCount: partial.cornerCount,
  };
}

/** The corners of two partials of the same second solve together (`a`'s first). */
export function mergePartials(a: PartialSecondSolve, b: PartialSecondSolve): PartialSecondSolve {
  return {
    magnetics: a.magnetics,
    solved: { choices: a.solved.choices, corners: [...a.solved.corners, ...b.solved.corners] },
    cornerIndices: [...a.cornerIndices, ...b.cornerIndices],
    cornerCount: a.cornerCount,
  };
}

/** {@link SecondSolve} at some of the corners only (`solved.corners[i]` is corner cornerIndices[i]). */
export interface PartialSecondSolve extends SecondSolve {
  cornerIndices: readonly number[];
  cornerCount: number;
}

/**
 * The whole second solve from a partial one: the corners it lacks solved as
 * {@link solveSecond} solves them, the ones it has taken as they are (the same numbers: each
 * corner is solved on its own). A corner that does not solve: the failure {@link solveSecond}
 * gives (`converterInfeasible`), with that corner's issues only.
 */
export function completeSecond(
  f: FrequencySpace,
  partial: PartialSecondSolve,
): { ok: true; value: SecondSolve } | Extract<CandidateVerdict, { ok: false }> {
  const { magnetics, solved, cornerIndices } = partial;
  const every = operatingCorners(magnetics.spec);
  const corners: AnyCorner[] = [];
  for (let index = 0; index < every.length; index++) {
    const i = cornerIndices.indexOf(index);
    if (i >= 0) {
      corners.push(solved.corners[i]!);
      continue;
    }
    const corner = f.topology.solveCorner(magnetics.spec, solved.choices, every[index]!);
    // The whole solve fails too (`solveEveryCorner` solves this very corner from the same spec
    // and choices), with the same count; the issues are this corner's only (the search keeps
    // the count; solving every corner again for theirs cost the half bridge's whole-catalog
    // search 3,472 second solves that failed).
    if (!corner.ok) return { ok: false, reason: 'converterInfeasible', issues: corner.issues };
    corners.push(corner.value);
  }
  return { ok: true, value: { magnetics, solved: { choices: solved.choices, corners } } };
}

/**
 * The second half of {@link evaluateCandidate}: the transformer `designed` on the first pass
 * fixed into the spec, every corner solved again ({@link solveSecond}; `solvedSecond` when already
 * solved), the magnetics evaluated there and checked.
 */
export function finishEvaluation(
  f: FrequencySpace,
  pass: Extract<FirstPass, { ok: true }>,
  build: CandidateBuild,
  designed: FirstPassDesign,
  settings: Required<TransformerEvaluationOptions>,
  solvedSecond?: SecondSolve,
): CandidateVerdict {
  const { spec, chosen } = designed;
  let secondSolve = solvedSecond;
  if (secondSolve === undefined) {
    const solved = solveSecond(f, pass, designed);
    if (!solved.ok) return solved;
    secondSolve = solved.value;
  }
  const { magnetics } = secondSolve;
  const fixedSpec = magnetics.spec;
  const { choices } = secondSolve.solved;
  const withLosses = cornersWithMagnetics(
    f.topology,
    magnetics,
    choices,
    secondSolve.solved.corners,
  );
  if (withLosses.transformer === undefined) {
    throw new Error('evaluateCandidate: the fixed transformer was not evaluated');
  }
  const evaluation = withLosses.transformer.evaluation;
  const issues = [
    ...transformerIssues(evaluation, settings),
    ...magneticsIssues(magnetics, withLosses),
  ];
  if (issues.length > 0) return { ok: false, reason: reasonOf(issues), issues };
  if (spec.holdUp !== undefined) {
    const holdUp = designHoldUp(
      fixedSpec,
      f.topology,
      choices,
      (corner) =>
        cornersWithMagnetics(f.topology, magnetics, choices, [corner]).corners[0] ?? corner,
      withLosses.corners,
    );
    if (!holdUp.ok) return { ok: false, reason: 'converterInfeasible', issues: holdUp.issues };
  }
  const corners = withLosses.corners;
  const summary = designSummary(corners, spec.inputVoltageNominalV, spec.outputs[0]?.voltageV ?? 0);
  // The nominal corner as the summary takes it: nominal input, largest load fraction.
  let nominal: (typeof corners)[number] | undefined;
  for (const corner of corners) {
    if (corner.inputVoltageV !== spec.inputVoltageNominalV) continue;
    if (nominal === undefined || corner.loadFraction > nominal.loadFraction) nominal = corner;
  }
  let transformerLossW = 0;
  let riseK = 0;
  let utilization = 0;
  for (const corner of evaluation.corners) {
    transformerLossW = Math.max(transformerLossW, corner.totalLossW);
    riseK = Math.max(riseK, corner.temperatureRiseK);
    utilization = Math.max(utilization, corner.fluxDensityUtilization);
  }
  return {
    ok: true,
    candidate: {
      index: build.index,
      frequencyHz: f.frequencyHz,
      coreShape: build.shape.designation,
      materialId: build.material.id,
      turns: [...chosen.build.turns],
      windingNames: pass.duty.windings.map((winding) => winding.name),
      wires: build.wires,
      arrangement: build.arrangement,
      gapLengthM: evaluation.gapLengthM,
      magnetizingInductanceH:
        fixedSpec.transformer.magnetizingInductanceH ?? evaluation.magnetizingInductanceH,
      leakageInductanceH: evaluation.stack.leakageInductanceH,
      lossWorstCornerW: summary.lossTotalMaxW,
      lossNominalW: nominal?.lossTotalW ?? summary.lossTotalMaxW,
      transformerLossWorstCornerW: transformerLossW,
      efficiencyNominal: summary.efficiencyNominal,
      temperatureRiseK: riseK,
      fluxDensityUtilization: utilization,
      windowFill: evaluation.windowFill,
      coreVolumeM3: coreGeometry(build.shape).effectiveVolumeM3,
      spec,
    },
  };
}

/** The count a rejection falls in: its first issue's constraint. */
export function reasonOf(issues: readonly Issue[]): keyof CoreSearchCounts {
  const codes = new Set(issues.map((issue) => issue.code));
  if (codes.has('window_fill_limit')) return 'windowFill';
  if (codes.has('flux_density_limit')) return 'saturationEvaluated';
  if (codes.has('temperature_rise_limit')) return 'temperatureRise';
  if (codes.has('non_physical_value')) return 'inductanceUnreachable';
  return 'converterInfeasible';
}
