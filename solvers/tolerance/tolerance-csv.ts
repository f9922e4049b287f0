import type { CsvTable } from '../jobs/chunked-computation.js';
import type { InfeasibleToleranceResult, ToleranceResult } from './tolerance-result-schema.js';

/**
 * The CSV columns of a feasible tolerance run: one row per limit, after one row for the overall
 * yield. A limit's values (limit, nominal, distribution, worst case) are in its quantity's unit,
 * named in `unit` ('1' for a dimensionless ratio); the yield columns are fractions and counts.
 */
export const TOLERANCE_CSV_COLUMNS = [
  'limit',
  'quantity',
  'unit',
  'sense',
  'limitValue',
  'nominalValue',
  'yieldFraction',
  'yieldInterval95Low',
  'yieldInterval95High',
  'passCount',
  'count',
  'failCount',
  'mean',
  'standardDeviation',
  'min',
  'max',
  'p1',
  'p99',
  'worstCaseValue',
  'worstCaseViolates',
  'worstCaseAgreesWithMonteCarlo',
  'strongestDriver',
  'seed',
  'sampleCount',
] as const;

/** An infeasible run has no samples: one row saying why. */
export const INFEASIBLE_TOLERANCE_CSV_COLUMNS = [
  'feasible',
  'seed',
  'sampleCount',
  'issueCodes',
] as const;

/** Unit symbols of the suffixes a checked quantity may end in (solvers/units.ts). */
const UNIT_SYMBOLS: Record<string, string> = {
  V: 'V',
  A: 'A',
  W: 'W',
  K: 'K',
  Hz: 'Hz',
  T: 'T',
  C: '°C',
};

/** The unit of a quantity named with its suffix; '1' for a dimensionless one. */
export function quantityUnit(quantity: string): string {
  const suffix = /[a-z0-9](V|A|W|K|Hz|T|C)$/.exec(quantity)?.[1];
  return suffix === undefined ? '1' : (UNIT_SYMBOLS[suffix] ?? '1');
}

function feasibleTable(result: ToleranceResult): CsvTable {
  const { overall } = result.yield;
  const common = [result.seed, result.sampleCount];
  const rows: CsvTable['rows'] = [
    [
      'overall',
      null,
      null,
      null,
      null,
      null,
      overall.fraction,
      overall.interval95[0],
      overall.interval95[1],
      overall.passCount,
      overall.count,
      overall.count - overall.passCount,
      ...Array<null>(10).fill(null),
      ...common,
    ],
  ];
  for (const limit of result.limits) {
    const figure = result.yield.perLimit.find((entry) => entry.limit === limit.id);
    const spread = result.distributions.find((entry) => entry.limit === limit.id);
    const worst = result.worstCase.perLimit.find((entry) => entry.limit === limit.id);
    const drivers = result.sensitivity.perLimit.find((entry) => entry.limit === limit.id);
    if (figure === undefined || spread === undefined || worst === undefined) {
      throw new Error(`tolerance CSV: the result lacks a figure of limit ${limit.id}`);
    }
    rows.push([
      limit.id,
      limit.quantity,
      quantityUnit(limit.quantity),
      limit.sense,
      limit.limit,
      limit.nominalValue,
      figure.fraction,
      figure.interval95[0],
      figure.interval95[1],
      figure.passCount,
      figure.count,
      figure.failCount,
      spread.mean ?? null,
      spread.standardDeviation ?? null,
      spread.min?.value ?? null,
      spread.max?.value ?? null,
      spread.p1 ?? null,
      spread.p99 ?? null,
      worst.worstValue ?? null,
      worst.violates,
      worst.agreesWithMonteCarlo,
      drivers?.ranking[0]?.parameter ?? null,
      ...common,
    ]);
  }
  return { columns: [...TOLERANCE_CSV_COLUMNS], rows };
}

/**
 * A tolerance result as one table. Feasible: a row 'overall' (the yield over every limit),
 * then one row per limit with its yield and 95 % interval, the Monte Carlo distribution of its
 * quantity, the worst case and the strongest driver (the first of its sensitivity ranking).
 * Infeasible (no samples run): one row with the seed and the engine's issue codes joined by ';'.
 * The parameters, failing samples and full rankings stay in the JSON.
 */
export function toleranceCsvTable(result: ToleranceResult | InfeasibleToleranceResult): CsvTable {
  if (result.feasible) return feasibleTable(result);
  return {
    columns: [...INFEASIBLE_TOLERANCE_CSV_COLUMNS],
    rows: [
      [false, result.seed, result.sampleCount, result.issues.map((issue) => issue.code).join(';')],
    ],
  };
}
