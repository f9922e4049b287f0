import type { Context } from 'hono';
import { accepts } from 'hono/accepts';
import { jobComputation, type JobResult } from '../../solvers/index.js';
import type { JobRecord } from '../../workers/runners/job-runner.js';
import { CAUTION } from '../caution.js';
import { ProblemError } from '../errors/problem-error.js';
import { PROBLEM_TYPES } from '../errors/problem-types.js';
import { sendJson } from '../http/send-json.js';
import { csvText } from './csv-text.js';

/** The formats a result is exported in. */
export const RESULT_FORMATS = ['json', 'csv'] as const;
type ResultFormat = (typeof RESULT_FORMATS)[number];

const MEDIA_TYPES: Record<ResultFormat, string> = { json: 'application/json', csv: 'text/csv' };

/** `?format=` when given (400 for another value), else the Accept header's choice, else JSON. */
function resultFormat(c: Context): ResultFormat {
  const asked = c.req.query('format');
  if (asked !== undefined) {
    if ((RESULT_FORMATS as readonly string[]).includes(asked)) return asked as ResultFormat;
    throw new ProblemError(PROBLEM_TYPES.invalidParameter, {
      detail: `format must be one of ${RESULT_FORMATS.join(', ')}, not '${asked}'`,
      extensions: { errors: [{ path: ['format'], message: 'unknown format' }] },
    });
  }
  const chosen = accepts(c, {
    header: 'Accept',
    supports: Object.values(MEDIA_TYPES),
    default: MEDIA_TYPES.json,
  });
  return chosen === MEDIA_TYPES.csv ? 'csv' : 'json';
}

/**
 * Answers a job's result, as JSON (`{ meta, output, caution }`) or, where the kind offers a
 * table, as CSV with the provenance and the caution in response headers. 409 for a job that
 * has not completed; 406 for CSV of a kind without a table.
 */
export function sendJobResult(c: Context, record: JobRecord): Response {
  const format = resultFormat(c);
  if (record.state !== 'completed' || record.result === undefined) {
    throw new ProblemError(PROBLEM_TYPES.jobNotCompleted, {
      detail: `job ${record.id} is ${record.state}; only a completed job has a result`,
    });
  }
  const result = record.result as JobResult;
  if (format === 'json') return sendJson(c, 200, { ...result, caution: CAUTION });
  const table = jobComputation(record.kind)?.csvTable?.(result.output);
  if (table === undefined) {
    throw new ProblemError(PROBLEM_TYPES.notAcceptable, {
      detail: `a ${record.kind} job's result is offered as JSON only`,
    });
  }
  return c.body(csvText(table), 200, {
    'content-type': 'text/csv; charset=utf-8; header=present',
    'content-disposition': `attachment; filename="${record.kind}-${record.id}.csv"`,
    'result-solver-version': result.meta.solverVersion,
    'result-schema-version': result.meta.schemaVersion,
    'result-input-hash': result.meta.inputHash,
    caution: CAUTION,
  });
}
