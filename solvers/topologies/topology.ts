import type { Corner } from '../design/design-schema.js';
import type { Result } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';
import type { TransformerDuty } from '../transformer/transformer-duty.js';

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
  /**
   * What the transformer carries at the solved corners (winding currents and the magnetizing
   * current), for the magnetics design. Absent where the magnetics design does not reach the
   * topology yet: its designs then carry no transformer.
   */
  transformerDuty?(spec: Spec, choices: Choices, corners: readonly SolvedCorner[]): TransformerDuty;
}
