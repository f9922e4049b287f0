/**
 * Ids the documented examples use. Ids are random, so a stored resource cannot have a fixed id:
 * these stand for "an id the service returned" (each example says which), and the example
 * replay test substitutes the real one. UNKNOWN_ID is literal: nothing ever has it.
 */
export const EXAMPLE_IDS = {
  /** Stands for an id POST /v1/designs returned. */
  design: '5a0c2d1e-0000-4000-8000-00000000d351',
  /** Stands for the id of a job that is still queued or running. */
  unfinishedJob: '5a0c2d1e-0000-4000-8000-000000000a0b',
  /** Stands for the id of a job that has completed. */
  finishedJob: '5a0c2d1e-0000-4000-8000-00000000f1ed',
  /** Stands for the id of an API key POST /v1/admin/keys returned. */
  apiKey: '5a0c2d1e0000a11e',
  /** No API key has this id. */
  unknownApiKey: '0000000000000000',
  /** No resource has this id. */
  unknown: '00000000-0000-4000-8000-000000000000',
} as const;
