/**
 * Result<T>: what every solver entry point returns. A well-formed spec that is physically
 * infeasible is data (issues), never an exception; exceptions are for programmer errors only.
 */
export type Result<T> = { ok: true; value: T } | { ok: false; issues: Issue[] };

/** Stable snake_case codes; clients may switch on them. */
export const ISSUE_CODES = [
  'duty_cycle_limit',
  'switch_voltage_rating',
  'rectifier_voltage_rating',
  'power_not_deliverable',
  'steady_state_not_found',
  'dcm_power_limit',
  'load_below_minimum_power',
  'clamp_voltage_too_low',
  'reset_incomplete',
  'non_physical_value',
  'job_size_limit',
  'window_fill_limit',
  'flux_density_limit',
  'temperature_rise_limit',
  'hot_spot_limit',
  'unknown_material',
] as const;
export type IssueCode = (typeof ISSUE_CODES)[number];

/**
 * One violated constraint, as data: which quantity (named with its unit suffix), the value the
 * design would need, the limit it meets, and where (field path, operating corner).
 */
export interface Issue {
  code: IssueCode;
  /** Path of the spec field the issue is about, as zod reports paths. */
  path: (string | number)[];
  /** The constraint in symbols, for example 'dutyCycle <= dutyCycleMax'. */
  constraint: string;
  /** The quantity, named as in the JSON with its unit suffix, for example 'switchPeakVoltageV'. */
  quantity: string;
  /** The value the spec would need. */
  required: number;
  /** The limit it is held against. */
  limit: number;
  /** Label of the operating corner where it happens, when it belongs to one. */
  corner?: string;
}

/** Wraps a value as a successful Result. */
export function success<T>(value: T): Result<T> {
  return { ok: true, value };
}

/** Wraps issues as a failed Result. */
export function failure<T>(issues: Issue[]): Result<T> {
  return { ok: false, issues };
}
