import { designInductor, type InductorRequest } from '../inductor/design-inductor.js';
import { outputInductorDuties, type InductorDuty } from '../inductor/inductor-duty.js';
import { CORE_SHAPE_CATALOG } from '../magnetics/core-shape-catalog.js';
import { copperResistance } from '../materials/copper-resistance.js';
import { failure, success, type Issue, type Result } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';
import { windingTemperatureC } from '../spec/winding-temperature.js';
import { repetitionFrequencyHz } from '../waveform/repetition-frequency.js';
import type { TransformerEvaluation } from '../transformer/evaluate-transformer.js';
import type { TransformerBuild } from '../transformer/transformer-build.js';
import type { TransformerEvaluationOptions } from '../transformer/transformer-evaluation-options.js';
import type { SolvedSpec } from './transformer-pass.js';
import { specMaterials } from './transformer-request-from-spec.js';

/** A designed output inductor, to be fixed into the spec and evaluated on later corners. */
export interface FixedInductor {
  /** The duty it was designed for (the first solution's corners). */
  duty: InductorDuty;
  build: TransformerBuild;
  /** Its evaluation on that duty. */
  evaluation: TransformerEvaluation;
  settings: TransformerEvaluationOptions;
}

/**
 * Returns what an output inductor whose current ripples at `frequencyHz` (Hz) may be designed
 * from: every catalog shape (spec.magnetics.coreShape names the transformer's), the spec's
 * materials for that frequency, the spec's current density and limits.
 */
export function inductorRequestFromSpec(spec: Spec, frequencyHz: number): Result<InductorRequest> {
  const materials = specMaterials(spec, frequencyHz);
  if (!materials.ok) return materials;
  const { magnetics } = spec;
  return success({
    shapes: CORE_SHAPE_CATALOG,
    materials: materials.value,
    wireChoice: { currentDensityAPerM2: magnetics.currentDensityAPerM2 },
    evaluation: {
      windowFillMax: magnetics.windowFillMax,
      fluxDensityUtilizationMax: magnetics.fluxDensityUtilizationMax,
      temperatureRiseMaxK: magnetics.temperatureRiseMaxK,
    },
  });
}

/**
 * Designs every output inductor of a first solution (none for the flyback, or when the spec
 * assumes its magnetics); the issues of every inductor that cannot be built.
 */
export function designOutputInductors(spec: Spec, first: SolvedSpec): Result<FixedInductor[]> {
  if (spec.magnetics.mode !== 'design') return success([]);
  const fixed: FixedInductor[] = [];
  const issues: Issue[] = [];
  for (const duty of outputInductorDuties(spec.ambientTemperatureC, first)) {
    const frequencyHz = Math.max(
      ...duty.currentsA.map((current) => repetitionFrequencyHz(current)),
    );
    const request = inductorRequestFromSpec(spec, frequencyHz);
    if (!request.ok) return request;
    const chosen = designInductor(duty, request.value);
    if (!chosen.ok) issues.push(...chosen.issues);
    else fixed.push({ duty, ...chosen.value, settings: request.value.evaluation ?? {} });
  }
  return issues.length > 0 ? failure(issues) : success(fixed);
}

/**
 * Returns `spec` with the designed inductors fixed in: each output's inductance (the one its
 * gap was cut for) and its DC resistance at the inductor's hottest corner. The spec holds
 * resistances at 20 °C and the topology scales them to the winding temperature of the spec
 * (windingTemperatureC), so the 20 °C value written is the one that scales to the inductor's
 * own hot resistance there.
 */
export function specWithInductors(spec: Spec, inductors: readonly FixedInductor[]): Spec {
  if (inductors.length === 0) return spec;
  const perOhmAtWinding = copperResistance(1, windingTemperatureC(spec));
  const outputs = spec.outputs.map((output, k) => {
    const inductor = inductors.find((candidate) => candidate.duty.outputIndex === k);
    if (inductor === undefined) return output;
    const hottestC = Math.max(...inductor.evaluation.corners.map((c) => c.temperatureC));
    const at20COhm = inductor.evaluation.resistancesAt20COhm[0] ?? 0;
    return {
      ...output,
      inductanceH: inductor.duty.inductanceH,
      inductorResistanceOhm: copperResistance(at20COhm, hottestC) / perOhmAtWinding,
    };
  });
  return { ...spec, outputs };
}
