import { InlineMaterialSchema, MATERIAL_CLASSES } from '../../solvers/index.js';
import type { Issue, MagneticsSpec } from '../../solvers/index.js';
import { userMaterialClass, userMaterialNote } from '../catalog/user-material-class.js';
import { infeasibleProblem } from '../errors/infeasible-problem.js';
import { PROBLEM_TYPES } from '../errors/problem-types.js';
import { validationProblem } from '../errors/validation-problem.js';
import type { MaterialStore } from '../stores/material-store.js';

const BUILT_IN_IDS = new Set(MATERIAL_CLASSES.map((material) => material.id));

/** The issue of a materialId that names neither a built-in class nor a stored user material. */
const UNKNOWN_MATERIAL: Issue = {
  code: 'unknown_material',
  path: ['magnetics', 'materialId'],
  constraint:
    'materialId names a built-in class or a stored user material (GET /v1/catalog/materials)',
  quantity: 'materialMatchCount',
  required: 1,
  limit: 0,
};

/** Where the spec sits, for the paths of the problems. */
export interface SpecPlacement {
  /** Prefix of a 422 issue's path (issues are relative to what the engine evaluates). @defaultValue [] */
  issuePath?: (string | number)[];
  /** Path of the spec in the request body, for a 400's field paths. @defaultValue ['spec'] */
  bodyPath?: (string | number)[];
}

/** A spec with a user material put inline, and the model notes that say where it came from. */
export interface SpecWithMaterial<S> {
  spec: S;
  notes: string[];
}

/**
 * Puts the user material (of `tenant`) a spec's materialId names inline as magnetics.material, so the engine
 * stays pure and the spec that is evaluated, hashed and echoed carries the numbers used. A spec
 * with an inline material, a built-in id or no id is returned as it is.
 * @throws ProblemError 422 (unknown-material, issue at magnetics.materialId) for an id that names
 *   nothing; 400 when a stored fit cannot serve as a material (a non-positive exponent).
 */
export async function resolveSpecMaterial<S extends { magnetics: MagneticsSpec }>(
  spec: S,
  materials: MaterialStore,
  tenant: string,
  { issuePath = [], bodyPath = ['spec'] }: SpecPlacement = {},
): Promise<SpecWithMaterial<S>> {
  const { materialId, material } = spec.magnetics;
  if (material !== undefined || materialId === undefined || BUILT_IN_IDS.has(materialId)) {
    return { spec, notes: [] };
  }
  const record = await materials.get(tenant, materialId);
  if (record === undefined) {
    const issue = { ...UNKNOWN_MATERIAL, path: [...issuePath, ...UNKNOWN_MATERIAL.path] };
    throw infeasibleProblem([issue], { problemType: PROBLEM_TYPES.unknownMaterial });
  }
  const parsed = InlineMaterialSchema.safeParse(userMaterialClass(record));
  if (!parsed.success) {
    throw validationProblem(
      parsed.error.issues.map((issue) => ({
        ...issue,
        path: [...bodyPath, 'magnetics', 'material', ...issue.path],
      })),
    );
  }
  return {
    spec: { ...spec, magnetics: { ...spec.magnetics, material: parsed.data } },
    notes: [userMaterialNote(record)],
  };
}
