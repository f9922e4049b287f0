import {
  asInductorIssue,
  designInductor,
  type InductorRequest,
} from '../inductor/design-inductor.js';
import {
  inductorWindingDuty,
  outputInductorDuties,
  type InductorDuty,
} from '../inductor/inductor-duty.js';
import { coreGeometry } from '../magnetics/core-geometry.js';
import { CORE_SHAPE_CATALOG } from '../magnetics/core-shape-catalog.js';
import type { GappedCore } from '../magnetics/gapped-core.js';
import { gappedInductance } from '../magnetics/gapped-inductance.js';
import type { MaterialClass } from '../magnetics/material-class.js';
import { MATERIAL_CLASSES } from '../magnetics/material-classes.js';
import { copperResistance } from '../materials/copper-resistance.js';
import { failure, success, type Issue, type Result } from '../result.js';
import type { OutputInductorBuild } from '../spec/magnetics-spec-schema.js';
import type { Spec } from '../spec/spec-schema.js';
import { windingTemperatureC } from '../spec/winding-temperature.js';
import { repetitionFrequencyHz } from '../waveform/repetition-frequency.js';
import { rms } from '../waveform/rms.js';
import {
  evaluateTransformer,
  type TransformerEvaluation,
} from '../transformer/evaluate-transformer.js';
import type { TransformerBuild } from '../transformer/transformer-build.js';
import {
  TRANSFORMER_EVALUATION_DEFAULTS,
  type TransformerEvaluationOptions,
} from '../transformer/transformer-evaluation-options.js';
import { transformerFitIssues } from '../transformer/transformer-fit-issues.js';
import { transformerIssues } from '../transformer/transformer-issues.js';
import { ampereTurnShares } from '../transformer/transformer-stack.js';
import { windingWireChoice } from '../transformer/winding-wire-choice.js';
import type { SolvedSpec } from './transformer-pass.js';
import { specMaterials } from './transformer-request-from-spec.js';

/** A designed output inductor, to be fixed into the spec and evaluated on later corners. */
export interface FixedInductor {
  /**
   * The duty it was designed for (the first solution's corners); with a fixed gap, its
   * inductance is the one the gap gives, which the second solve takes.
   */
  duty: InductorDuty;
  build: TransformerBuild;
  /** Its evaluation on that duty. */
  evaluation: TransformerEvaluation;
  settings: TransformerEvaluationOptions;
  /** True when the spec fixes the gap: the build's gap sets L, none is cut for the duty. */
  isGapFixed: boolean;
}

/** The spec's fixed build of output `outputIndex`, with its place in magnetics.outputInductors. */
interface BuildEntry {
  entry: OutputInductorBuild;
  path: (string | number)[];
}

function buildEntryOf(spec: Spec, outputIndex: number): BuildEntry | undefined {
  const entries = spec.magnetics.outputInductors ?? [];
  const i = entries.findIndex((entry) => entry.outputIndex === outputIndex);
  const entry = entries[i];
  return entry === undefined ? undefined : { entry, path: ['magnetics', 'outputInductors', i] };
}

/** The material an entry names: magnetics.material when its id matches, else a built-in class. */
function entryMaterial(spec: Spec, { entry, path }: BuildEntry): Result<MaterialClass[]> {
  const { materialId } = entry;
  if (materialId === undefined) return success([]);
  const inline = spec.magnetics.material;
  if (inline !== undefined && inline.id === materialId) return success([inline]);
  const named = MATERIAL_CLASSES.filter((m) => m.id === materialId);
  if (named.length > 0) return success(named);
  return failure([
    {
      code: 'unknown_material',
      path: [...path, 'materialId'],
      constraint: "materialId names a built-in material class or magnetics.material's id",
      quantity: 'materialMatchCount',
      required: 1,
      limit: 0,
    },
  ]);
}

/**
 * Returns what an output inductor whose current ripples at `frequencyHz` (Hz) may be designed
 * from: every catalog shape (spec.magnetics.coreShape names the transformer's), the spec's
 * materials for that frequency, the spec's current density and limits; narrowed to what the
 * spec's build of that output fixes (`fixed`), with issues pointing at it.
 */
export function inductorRequestFromSpec(
  spec: Spec,
  frequencyHz: number,
  fixed?: BuildEntry,
): Result<InductorRequest> {
  const named = fixed === undefined ? success([]) : entryMaterial(spec, fixed);
  if (!named.ok) return named;
  const materials = named.value.length > 0 ? named : specMaterials(spec, frequencyHz);
  if (!materials.ok) return materials;
  const { magnetics } = spec;
  const entry = fixed?.entry;
  return success({
    shapes:
      entry?.coreShape === undefined
        ? CORE_SHAPE_CATALOG
        : CORE_SHAPE_CATALOG.filter((shape) => shape.designation === entry.coreShape),
    materials: materials.value,
    ...(entry?.turns === undefined ? {} : { turns: entry.turns }),
    ...(entry?.wire === undefined ? {} : { wire: entry.wire }),
    wireChoice: { currentDensityAPerM2: magnetics.currentDensityAPerM2 },
    evaluation: {
      windowFillMax: magnetics.windowFillMax,
      fluxDensityUtilizationMax: magnetics.fluxDensityUtilizationMax,
      temperatureRiseMaxK: magnetics.temperatureRiseMaxK,
    },
    ...(fixed === undefined ? {} : { issuePath: fixed.path }),
  });
}

/**
 * Designs every output inductor of a first solution (none for the flyback, or when the spec
 * assumes its magnetics); an inductor the spec fixes whole (core shape, material, turns) is only
 * evaluated, one it fixes in part is searched within what it fixes. The issues of every
 * inductor that cannot be built.
 */
export function designOutputInductors(spec: Spec, first: SolvedSpec): Result<FixedInductor[]> {
  if (spec.magnetics.mode !== 'design') return success([]);
  const fixed: FixedInductor[] = [];
  const issues: Issue[] = [];
  for (const duty of outputInductorDuties(spec.ambientTemperatureC, first)) {
    const entry = buildEntryOf(spec, duty.outputIndex);
    // The ripple's repetition frequency picks the materials and the wire; a build that names
    // both reads neither (the search, which a partial build falls back on, takes its own).
    let frequencyHz = 0;
    if (entry?.entry.materialId === undefined || entry.entry.wire === undefined) {
      for (const current of duty.currentsA) {
        frequencyHz = Math.max(frequencyHz, repetitionFrequencyHz(current));
      }
    }
    const request = inductorRequestFromSpec(spec, frequencyHz, entry);
    if (!request.ok) return request;
    const settings = request.value.evaluation ?? {};
    const chosen =
      entry === undefined
        ? designedInductor(duty, request.value)
        : fixedOrSearched(spec, duty, entry, request.value, frequencyHz);
    if (!chosen.ok) issues.push(...chosen.issues);
    else fixed.push({ ...chosen.value, settings });
  }
  return issues.length > 0 ? failure(issues) : success(fixed);
}

/**
 * The inductor of an output the spec has a build for: a ring is refused unless its gap is fixed
 * at 0 (a ring takes no cut gap); a build fixed whole is evaluated at every corner (no window
 * check or screen first: a fixed build is judged on its full evaluation), else searched within
 * what the entry fixes.
 */
function fixedOrSearched(
  spec: Spec,
  duty: InductorDuty,
  fixed: BuildEntry,
  request: InductorRequest,
  frequencyHz: number,
): Result<Omit<FixedInductor, 'settings'>> {
  const { entry, path } = fixed;
  const shape = request.shapes[0];
  // ref: common practice — a ring (toroid) cannot be cut; a distributed-gap material is used.
  if (shape?.family === 'ring' && entry.gapLengthM !== 0) {
    return failure([
      {
        code: 'non_physical_value',
        path: [...path, 'coreShape'],
        constraint: `${duty.name}: a ring core takes no cut gap (fix gapLengthM at 0, with a distributed-gap material)`,
        quantity: 'cutGapCount',
        required: 1,
        limit: 0,
      },
    ]);
  }
  const material = request.materials[0];
  if (
    shape === undefined ||
    material === undefined ||
    entry.turns === undefined ||
    (entry.materialId === undefined && request.materials.length > 1)
  ) {
    return designedInductor(duty, request);
  }
  const geometry = coreGeometry(shape);
  const settings = { ...TRANSFORMER_EVALUATION_DEFAULTS, ...request.evaluation };
  const isGapFixed = entry.gapLengthM !== undefined;
  let fixedDuty = duty;
  if (entry.gapLengthM !== undefined) {
    const gapped = fixedGapInductance(spec, duty, entry, path, geometry, material);
    if (!gapped.ok) return gapped;
    fixedDuty = { ...duty, inductanceH: gapped.value };
  }
  let wire = request.wire;
  if (wire === undefined) {
    let rmsA = 1e-6;
    for (const current of duty.currentsA) rmsA = Math.max(rmsA, rms(current));
    wire = windingWireChoice(rmsA, frequencyHz, request.wireChoice);
  }
  const windingDuty = inductorWindingDuty(fixedDuty, isGapFixed);
  const turns = [entry.turns];
  const build: TransformerBuild = {
    shape,
    material,
    turns,
    wires: [wire],
    arrangement: 'stacked',
    gapLengthM: entry.gapLengthM ?? 0,
    ampereTurnShares: ampereTurnShares(windingDuty, turns),
  };
  const evaluation = evaluateTransformer(windingDuty, build, settings);
  const issues =
    evaluation === undefined
      ? transformerFitIssues(windingDuty, build, settings)
      : transformerIssues(evaluation, settings);
  if (evaluation === undefined || issues.length > 0) {
    return failure(issues.map((issue) => asInductorIssue(fixedDuty, issue, path)));
  }
  return success({
    duty: fixedDuty,
    build: { ...build, gapLengthM: evaluation.gapLengthM },
    evaluation,
    isGapFixed,
  });
}

/** The inductor the catalog search finds for `duty` (its gap cut for the duty's inductance). */
function designedInductor(
  duty: InductorDuty,
  request: InductorRequest,
): Result<Omit<FixedInductor, 'settings'>> {
  const searched = designInductor(duty, request);
  return searched.ok ? success({ duty, ...searched.value, isGapFixed: false }) : searched;
}

/**
 * The inductance a fixed gap gives, H (McLyman's fringing factor, as the engine cuts gaps); a
 * gap beyond half the window height (where the fringing formula no longer holds), or an
 * outputs[k].inductanceH given too that differs from it by more than 1 %, is non_physical_value.
 */
function fixedGapInductance(
  spec: Spec,
  duty: InductorDuty,
  entry: OutputInductorBuild,
  path: (string | number)[],
  geometry: ReturnType<typeof coreGeometry>,
  material: MaterialClass,
): Result<number> {
  const gapLengthM = entry.gapLengthM ?? 0;
  const core: GappedCore = {
    turns: entry.turns ?? 1,
    effectiveLengthM: geometry.effectiveLengthM,
    effectiveAreaM2: geometry.effectiveAreaM2,
    relativePermeability: material.initialPermeability,
    windowHeightM: geometry.windowBreadthM,
    fringing: 'mclyman',
  };
  // As gapLengthForInductance: the fringing relation is meant for gaps well below G.
  const gapMaxM = 0.5 * core.windowHeightM;
  if (gapLengthM > gapMaxM) {
    return failure([
      {
        code: 'non_physical_value',
        path: [...path, 'gapLengthM'],
        constraint: `${duty.name}: gapLengthM <= 0.5 * windowHeightM`,
        quantity: 'gapLengthM',
        required: gapLengthM,
        limit: gapMaxM,
      },
    ]);
  }
  const inductanceH = gappedInductance(core, gapLengthM);
  const stated = spec.outputs[duty.outputIndex]?.inductanceH;
  if (stated !== undefined && Math.abs(inductanceH / stated - 1) > 0.01) {
    return failure([
      {
        code: 'non_physical_value',
        path: [...path, 'gapLengthM'],
        constraint: `${duty.name}: the fixed gap's inductance is within 1 % of outputs[${duty.outputIndex}].inductanceH`,
        quantity: 'inductanceH',
        required: inductanceH,
        limit: stated,
      },
    ]);
  }
  return success(inductanceH);
}

/**
 * Returns `spec` with the designed inductors fixed in: each output's inductance (the one its
 * gap was cut for, or the one a fixed gap gives) and its DC resistance at the inductor's hottest
 * corner. The spec holds resistances at 20 °C and the topology scales them to the winding
 * temperature of the spec (windingTemperatureC), so the 20 °C value written is the one that
 * scales to the inductor's own hot resistance there.
 */
export function specWithInductors(spec: Spec, inductors: readonly FixedInductor[]): Spec {
  if (inductors.length === 0) return spec;
  const perOhmAtWinding = copperResistance(1, windingTemperatureC(spec));
  const outputs = spec.outputs.map((output, k) => {
    const inductor = inductors.find((candidate) => candidate.duty.outputIndex === k);
    if (inductor === undefined) return output;
    const hottestC = Math.max(...inductor.evaluation.corners.map((c) => c.temperatureC));
    const at20COhm = inductor.evaluation.resistancesAt20COhm[0] ?? 0;
    // Object.assign, not a spread followed by new keys (a slow path in this V8; same result).
    return Object.assign({}, output, {
      inductanceH: inductor.duty.inductanceH,
      inductorResistanceOhm: copperResistance(at20COhm, hottestC) / perOhmAtWinding,
    });
  });
  return { ...spec, outputs };
}
