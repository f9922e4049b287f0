import type { Spec } from '../spec/spec-schema.js';
import { ACTIVE_CLAMP_FORWARD_MODEL_NOTES } from '../topologies/active-clamp-forward/active-clamp-forward-model-notes.js';
import { doubleEndedModelNotes } from '../topologies/double-ended/double-ended-model-notes.js';
import { FLYBACK_MODEL_NOTES } from '../topologies/flyback/flyback-model-notes.js';
import {
  RESET_WINDING_FORWARD_MODEL_NOTES,
  TWO_SWITCH_FORWARD_MODEL_NOTES,
} from '../topologies/two-switch-forward/two-switch-forward-model-notes.js';

/** Each topology's statement of what its model includes and leaves out, by topology id. */
export const MODEL_NOTES: Readonly<Record<Spec['topology'], readonly string[]>> = {
  flyback: FLYBACK_MODEL_NOTES,
  'two-switch-forward': TWO_SWITCH_FORWARD_MODEL_NOTES,
  'forward-reset-winding': RESET_WINDING_FORWARD_MODEL_NOTES,
  'active-clamp-forward': ACTIVE_CLAMP_FORWARD_MODEL_NOTES,
  'push-pull': doubleEndedModelNotes('push-pull'),
  'half-bridge': doubleEndedModelNotes('half-bridge'),
  'full-bridge': doubleEndedModelNotes('full-bridge'),
};
