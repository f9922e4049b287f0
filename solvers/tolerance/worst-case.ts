import type { LimitId, ToleranceLimit } from './tolerance-limits.js';
import { evaluateUnit, type ToleranceRun } from './tolerance-run.js';

/**
 * Worst-case analysis over the tolerance box (every varied parameter between its band ends):
 * - 'every-vertex' when 2^k vertices are few enough (k varied parameters up to the request's
 *   everyVertexParameterMax): each vertex is evaluated, and each limit's worst is the worst
 *   vertex.
 * - 'sensitivity-signed-vertex' above that (the extreme-value analysis with one-at-a-time
 *   signs): each parameter is moved alone to each band end, which gives the sign of its influence
 *   on every limit's quantity; for each limit the one vertex that pushes its quantity towards the
 *   limit (each parameter at the end that made it worse) is evaluated. Exact for quantities
 *   monotonic in each parameter without sign-changing interactions.
 * The one-at-a-time evaluations are made in both cases; their swings enter the sensitivity table.
 */

/** Which end of its band a parameter sits at. */
export type BandEnd = 'lower' | 'upper';

/** The quantity a vertex gives for each limit: a value, or undefined when the unit is unsolved. */
type VertexValues = (number | undefined)[];

/** One limit's worst case. */
export interface LimitWorstCase {
  limit: LimitId;
  /** The worst value of the checked quantity over the vertices that solve; absent if none does. */
  worstValue?: number;
  /** Whether some evaluated vertex violates the limit (an unsolved vertex violates regulation). */
  violates: boolean;
  /** The worst vertex: each varied parameter's band end. */
  vertex: Record<string, BandEnd>;
  /** Vertices evaluated for this limit that the engine could not solve. */
  unsolvedVertexCount: number;
}

/** The one-at-a-time swing of each limit's quantity: value at the upper end less the lower end. */
export interface OneAtATimeSwings {
  /** swings[l][j]: limit l, parameter j; undefined when an end is unsolved or j is not varied. */
  swings: (number | undefined)[][];
}

/** The worst-case table and the one-at-a-time swings. */
export interface WorstCaseAnalysis {
  method: 'every-vertex' | 'sensitivity-signed-vertex';
  /** Varied parameters (k). */
  variedParameterCount: number;
  /** Unit evaluations made: 2k one-at-a-time, plus the vertices. */
  evaluationCount: number;
  limits: LimitWorstCase[];
  oneAtATime: OneAtATimeSwings;
}

function valuesOf(run: ToleranceRun, values: readonly number[]): VertexValues {
  const outcome = evaluateUnit(run.frozen, run.parameters, values);
  return run.limits.map((limit) => (outcome.solved ? limit.read(outcome) : undefined));
}

/** Whether `a` is worse than `b` for the limit (further towards or past it). */
function isWorse(limit: ToleranceLimit, a: number, b: number): boolean {
  return limit.sense === 'at-most' ? a > b : a < b;
}

function violates(limit: ToleranceLimit, value: number | undefined): boolean {
  if (value === undefined) return limit.id === 'regulation';
  return limit.sense === 'at-most' ? value > limit.limit : value < limit.limit;
}

/** Runs the worst-case analysis of `run`. */
export function worstCaseAnalysis(run: ToleranceRun): WorstCaseAnalysis {
  const { parameters, limits } = run;
  const nominal = parameters.map((p) => p.nominal);
  const varied = parameters.flatMap((p, j) => (p.isVaried ? [j] : []));
  // Parameters that do not vary take their one value (a fixed value need not be the nominal).
  const base = parameters.map((p, j) => (p.isVaried ? (nominal[j] as number) : p.lower));
  let evaluationCount = 0;
  const evaluate = (values: readonly number[]) => {
    evaluationCount += 1;
    return valuesOf(run, values);
  };
  const endValue = (j: number, end: BandEnd) => {
    const p = parameters[j];
    if (p === undefined) throw new RangeError(`worstCaseAnalysis: no parameter ${j}`);
    return end === 'lower' ? p.lower : p.upper;
  };
  // One at a time: each varied parameter at each end, the others at their nominal.
  const oat = new Map<number, { lower: VertexValues; upper: VertexValues }>();
  for (const j of varied) {
    const at = (end: BandEnd) => {
      const values = [...base];
      values[j] = endValue(j, end);
      return evaluate(values);
    };
    oat.set(j, { lower: at('lower'), upper: at('upper') });
  }
  const swings = limits.map((_, l) =>
    parameters.map((_p, j) => {
      const ends = oat.get(j);
      const lower = ends?.lower[l];
      const upper = ends?.upper[l];
      return lower === undefined || upper === undefined ? undefined : upper - lower;
    }),
  );
  const vertexValues = (ends: readonly BandEnd[]) => {
    const values = [...base];
    varied.forEach((j, i) => {
      values[j] = endValue(j, ends[i] ?? 'lower');
    });
    return evaluate(values);
  };
  const vertexRecord = (ends: readonly BandEnd[]) =>
    Object.fromEntries(varied.map((j, i) => [parameters[j]?.id ?? String(j), ends[i] ?? 'lower']));
  const isEveryVertex = varied.length <= run.request.worstCase.everyVertexParameterMax;
  const worst: LimitWorstCase[] = [];
  if (isEveryVertex) {
    const tables = limits.map(() => ({
      worstValue: undefined as number | undefined,
      worstEnds: [] as BandEnd[],
      isViolated: false,
      unsolved: 0,
      unsolvedEnds: undefined as BandEnd[] | undefined,
    }));
    for (let mask = 0; mask < 2 ** varied.length; mask++) {
      const ends = varied.map((_, i): BandEnd => ((mask >> i) & 1 ? 'upper' : 'lower'));
      const values = vertexValues(ends);
      limits.forEach((limit, l) => {
        const table = tables[l];
        if (table === undefined) return;
        const value = values[l];
        if (value === undefined) {
          table.unsolved += 1;
          table.unsolvedEnds ??= ends;
        } else if (table.worstValue === undefined || isWorse(limit, value, table.worstValue)) {
          table.worstValue = value;
          table.worstEnds = ends;
        }
        if (violates(limit, value)) table.isViolated = true;
      });
    }
    limits.forEach((limit, l) => {
      const table = tables[l];
      if (table === undefined) return;
      const ends =
        limit.id === 'regulation' && table.unsolvedEnds !== undefined
          ? table.unsolvedEnds
          : table.worstEnds;
      worst.push({
        limit: limit.id,
        ...(table.worstValue === undefined ? {} : { worstValue: table.worstValue }),
        violates: table.isViolated,
        vertex: vertexRecord(ends),
        unsolvedVertexCount: table.unsolved,
      });
    });
  } else {
    limits.forEach((limit, l) => {
      // Each parameter at the end whose one-at-a-time value is worse (an unsolved end is worse).
      const ends = varied.map((j): BandEnd => {
        const atEnds = oat.get(j);
        const lower = atEnds?.lower[l];
        const upper = atEnds?.upper[l];
        if (upper === undefined && lower !== undefined) return 'upper';
        if (lower === undefined || upper === undefined) return 'lower';
        return isWorse(limit, upper, lower) ? 'upper' : 'lower';
      });
      const value = vertexValues(ends)[l];
      worst.push({
        limit: limit.id,
        ...(value === undefined ? {} : { worstValue: value }),
        violates: violates(limit, value),
        vertex: vertexRecord(ends),
        unsolvedVertexCount: value === undefined ? 1 : 0,
      });
    });
  }
  return {
    method: isEveryVertex ? 'every-vertex' : 'sensitivity-signed-vertex',
    variedParameterCount: varied.length,
    evaluationCount,
    limits: worst,
    oneAtATime: { swings },
  };
}
