import type { Corner } from '../design/design-schema.js';
import type { Result } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';

/** One operating corner of a spec: an input voltage and a load fraction applied to every output. */
export interface OperatingCorner {
  label: string;
  inputVoltageV: number;
  loadFraction: number;
}

/**
 * What every topology implements: choose its free design variables from the spec's targets
 * (keeping whatever the spec fixes), then solve the periodic steady state at one corner.
 */
export interface Topology<Choices, SolvedCorner = Corner> {
  id: Spec['topology'];
  /** Chooses turns ratio, inductances and the like; issues when no choice can meet the spec. */
  choose(spec: Spec): Result<Choices>;
  /** Solves one corner with the given choices; issues name the violated limit with numbers. */
  solveCorner(spec: Spec, choices: Choices, corner: OperatingCorner): Result<SolvedCorner>;
}
