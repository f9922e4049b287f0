import { SCHEMA_VERSION, SOLVER_VERSION, type Design } from '../../solvers/index.js';
import { ProblemError } from '../errors/problem-error.js';
import { PROBLEM_TYPES } from '../errors/problem-types.js';
import { designContentJson, type DesignRevisionRecord } from '../stores/design-store.js';
import type { MaterialStore } from '../stores/material-store.js';
import { evaluateSpec, type EvaluatedContent } from './evaluate-spec.js';
import { jsonHasWaveforms, withoutWaveforms } from './waveforms.js';

/** Where a stored revision's waveforms are recomputed: as evaluateSpec takes them. */
export interface Reevaluating {
  materials: MaterialStore;
  tenant: string;
  onEngineCpuS?: (seconds: number) => void;
}

/** How a client gets waveforms when a stored revision's cannot be recomputed. */
function howToGetWaveforms(id: string): string {
  return `To get waveforms, POST its spec again as a new revision with include=waveforms (POST /v1/designs/${id}/revisions?include=waveforms).`;
}

function notReproducible(record: DesignRevisionRecord, why: string): ProblemError {
  return new ProblemError(PROBLEM_TYPES.waveformsNotReproducible, {
    detail: `revision ${record.revision} of design ${record.id}: ${why}. ${howToGetWaveforms(record.id)}`,
    extensions: {
      storedSolverVersion: record.meta.solverVersion,
      runningSolverVersion: SOLVER_VERSION,
    },
  });
}

/**
 * The content of a stored revision with its corners' waveforms. A revision stored before
 * waveforms became opt-in holds them: its own content. Otherwise the stored spec is evaluated
 * again, which gives the same numbers when the solver (and schema) version is the stored one
 * (DESIGN.md: same input and solver version, same numbers), and that is checked: the recomputed
 * design without its waveforms must be the stored design byte for byte (the whole stored
 * content's JSON is compared). The model notes the API appended to the engine's when the design
 * was made (a user material's origin: its record may have changed since) are carried over from
 * the stored design; the engine's own notes are among the bytes compared.
 * @throws ProblemError 409 (waveforms-not-reproducible) naming both solver versions when the
 *   versions differ, or saying the stored design could not be reproduced; either says how to
 *   get waveforms (post the spec again as a new revision with include=waveforms).
 */
export async function contentWithWaveforms(
  record: DesignRevisionRecord,
  evaluating: Reevaluating,
): Promise<EvaluatedContent> {
  const { spec, design, meta } = record;
  if (jsonHasWaveforms(record.contentJson)) return { spec, design: design as Design, meta };
  if (meta.solverVersion !== SOLVER_VERSION || meta.schemaVersion !== SCHEMA_VERSION) {
    throw notReproducible(
      record,
      `it was computed by solver ${meta.solverVersion} (schema ${meta.schemaVersion}); this service runs solver ${SOLVER_VERSION} (schema ${SCHEMA_VERSION}), whose numbers may differ, so it does not recompute that revision's waveforms`,
    );
  }
  const notReproduced = () =>
    notReproducible(
      record,
      `solver ${SOLVER_VERSION} evaluated its stored spec again and did not reproduce the stored design byte for byte, so it has no waveforms that belong to the stored numbers`,
    );
  const evaluated = await evaluateSpec(spec, evaluating);
  if (!evaluated.ok) throw notReproduced();
  const engine = evaluated.value.design;
  const appended = design.modelNotes.slice(engine.modelNotes.length);
  const recomputed: Design =
    appended.length === 0 ? engine : { ...engine, modelNotes: [...engine.modelNotes, ...appended] };
  const check = designContentJson({ spec, design: withoutWaveforms(recomputed), meta });
  if (!check.equals(record.contentJson)) throw notReproduced();
  return { spec, design: recomputed, meta };
}
