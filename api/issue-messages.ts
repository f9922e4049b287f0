import type { Issue, IssueCode } from '../solvers/index.js';

/**
 * Unit symbols by the suffix a quantity's name ends in (STYLE.md, units.ts); longest first so
 * `M2` wins over `M`. A name without a suffix (dutyCycle, pointCount) is dimensionless.
 */
const UNIT_SYMBOLS: [suffix: string, symbol: string][] = [
  ['Ohm', 'Ω'],
  ['Hz', 'Hz'],
  ['M2', 'm²'],
  ['M3', 'm³'],
  ['Ms', 'ms'],
  ['V', 'V'],
  ['A', 'A'],
  ['W', 'W'],
  ['J', 'J'],
  ['H', 'H'],
  ['F', 'F'],
  ['T', 'T'],
  ['M', 'm'],
  ['K', 'K'],
  ['S', 's'],
];

function unitOf(quantity: string): string {
  if (quantity.endsWith('C')) return /Temperature/.test(quantity) ? ' °C' : ' C';
  const found = UNIT_SYMBOLS.find(([suffix]) => quantity.endsWith(suffix));
  return found ? ` ${found[1]}` : '';
}

/** Four significant figures, no trailing zeros: 0.7123 → "0.7123", 48.00001 → "48". */
function formatNumber(value: number): string {
  return String(Number(value.toPrecision(4)));
}

type Parts = { quantity: string; required: string; limit: string; at: string; field: string };

const MESSAGES: Record<IssueCode, (p: Parts) => string> = {
  duty_cycle_limit: (p) => `${p.quantity} ${p.required} needed${p.at} exceeds the limit ${p.limit}`,
  switch_voltage_rating: (p) =>
    `${p.quantity} ${p.required}${p.at} exceeds the derated switch rating ${p.limit}`,
  rectifier_voltage_rating: (p) =>
    `${p.quantity} ${p.required}${p.at} exceeds the derated rectifier rating ${p.limit}`,
  // A power against the power the converter can deliver (the flyback's); an output voltage
  // against the voltage it reaches (the forwards' and the double-ended family's).
  power_not_deliverable: (p) =>
    p.quantity === 'outputVoltageV'
      ? `${p.quantity} ${p.required} needed${p.at} is above the ${p.limit} the converter reaches`
      : `${p.quantity} ${p.required} needed${p.at} exceeds the ${p.limit} the converter can deliver`,
  steady_state_not_found: (p) =>
    `no steady state found${p.at}, though ${p.quantity} ${p.required} would do without losses (limit ${p.limit}): the engine's model does not hold there`,
  dcm_power_limit: (p) =>
    `${p.quantity} ${p.required} needed${p.at} exceeds the ${p.limit} deliverable in discontinuous conduction`,
  load_below_minimum_power: (p) =>
    `${p.quantity} ${p.required}${p.at} is below the ${p.limit} the converter delivers at its shortest pulse (even there the output would rise until the clamp takes the surplus; a controller would skip pulses)`,
  clamp_voltage_too_low: (p) =>
    `${p.quantity} ${p.required}${p.at} is below the lowest workable ${p.limit}`,
  reset_incomplete: (p) =>
    `${p.quantity} ${p.required}${p.at} leaves no time for the core to reset (limit ${p.limit})`,
  non_physical_value: (p) =>
    `${p.quantity} ${p.required}${p.at} is outside its physical range (limit ${p.limit})`,
  job_size_limit: (p) => `${p.quantity} ${p.required} requested exceeds the limit ${p.limit}`,
  window_fill_limit: (p) =>
    `${p.quantity} ${p.required}${p.at} does not fit the core's window (limit ${p.limit})`,
  flux_density_limit: (p) =>
    `${p.quantity} ${p.required}${p.at} exceeds the ${p.limit} allowed below saturation`,
  temperature_rise_limit: (p) =>
    `${p.quantity} ${p.required}${p.at} exceeds the allowed rise ${p.limit}`,
  hot_spot_limit: (p) =>
    `${p.quantity} ${p.required}${p.at} exceeds the winding hot-spot limit ${p.limit}`,
  unknown_material: (p) =>
    `no material has the id that ${p.field} names (${p.quantity} ${p.limit}, ${p.required} needed)`,
};

/**
 * One sentence for an engine issue, built only from its data (quantity, required, limit, corner,
 * constraint), for example "dutyCycle 0.71 needed at min-input/100pct-load exceeds the limit
 * 0.65 (dutyCycle <= dutyCycleMax)". The one place issue prose is written.
 */
export function issueMessage(issue: Issue): string {
  const unit = unitOf(issue.quantity);
  const sentence = MESSAGES[issue.code]({
    quantity: issue.quantity,
    required: `${formatNumber(issue.required)}${unit}`,
    limit: `${formatNumber(issue.limit)}${unit}`,
    at: issue.corner === undefined ? '' : ` at ${issue.corner}`,
    // The field the issue is about, as the spec spells it: magnetics.outputInductors.0.materialId.
    field: issue.path.join('.'),
  });
  return `${sentence} (${issue.constraint})`;
}

/** The detail of a 422: every issue's sentence, joined with "; ". */
export function issuesDetail(issues: readonly Issue[]): string {
  return issues.map(issueMessage).join('; ');
}
