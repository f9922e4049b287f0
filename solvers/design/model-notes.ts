import type { Spec } from '../spec/spec-schema.js';
import { FLYBACK_MODEL_NOTES } from '../topologies/flyback/flyback-model-notes.js';

/** Each topology's statement of what its model includes and leaves out, by topology id. */
export const MODEL_NOTES: Readonly<Record<Spec['topology'], readonly string[]>> = {
  flyback: FLYBACK_MODEL_NOTES,
};
