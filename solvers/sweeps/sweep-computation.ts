import { evenChunks, type ChunkedComputation, type CsvTable } from '../jobs/chunked-computation.js';
import {
  evaluateSweepPoint,
  sweepPointCount,
  sweepPointRange,
  type SweepChoiceCache,
} from './parametric.js';
import {
  SweepRequestSchema,
  SweepResultSchema,
  type SweepRequest,
  type SweepResult,
  type SweepRow,
} from './sweep-request-schema.js';

const DEFAULTS = {
  /** Grid points per chunk when the request does not say: about 0.1–0.3 s of work on one core. */
  chunkPointCount: 100,
} as const;

/** The CSV columns of a sweep, in order: the point, then what was computed there. */
const CSV_COLUMNS = [
  'switchingFrequencyHz',
  'inputVoltageV',
  'loadFraction',
  'feasible',
  'conductionMode',
  'dutyCycle',
  'efficiency',
  'lossTotalW',
  'switchVoltagePeakV',
  'switchCurrentPeakA',
  'issueCodes',
] as const;

/** One CSV row of a sweep row; absent numbers are empty cells, issue codes joined by ';'. */
function csvRow(row: SweepRow): CsvTable['rows'][number] {
  return [
    row.switchingFrequencyHz,
    row.inputVoltageV,
    row.loadFraction,
    row.feasible,
    row.conductionMode ?? null,
    row.dutyCycle ?? null,
    row.efficiency ?? null,
    row.lossTotalW ?? null,
    row.switchVoltagePeakV ?? null,
    row.switchCurrentPeakA ?? null,
    row.issues === undefined ? null : row.issues.map((issue) => issue.code).join(';'),
  ];
}

/**
 * The parametric sweep as a chunked job: the items are the grid points in row order, a chunk is
 * a run of consecutive points (each chunk designs the transformer of its own frequencies afresh,
 * so no cache crosses chunks), and the result is the rows of every chunk in order.
 */
export const sweepComputation: ChunkedComputation<SweepRequest, SweepRow[], SweepResult> = {
  kind: 'sweep',
  requestSchema: SweepRequestSchema,
  outputSchema: SweepResultSchema,

  plan(request) {
    return evenChunks(
      sweepPointCount(request),
      request.chunkPointCount ?? DEFAULTS.chunkPointCount,
    );
  },

  size(request) {
    return sweepPointCount(request);
  },

  *runChunk(request, chunk) {
    const cache: SweepChoiceCache = new Map();
    const rows: SweepRow[] = [];
    for (const point of sweepPointRange(request, chunk.start, chunk.count)) {
      rows.push(evaluateSweepPoint(request, point, cache));
      yield rows.length;
    }
    return rows;
  },

  reduce(request, outputs) {
    const rows = outputs.flat();
    const pointCount = sweepPointCount(request);
    if (rows.length !== pointCount) {
      throw new RangeError(`sweep reduce: ${rows.length} rows for ${pointCount} grid points`);
    }
    return { pointCount, rows };
  },

  csvTable(output) {
    return { columns: [...CSV_COLUMNS], rows: output.rows.map(csvRow) };
  },
};
