import type { ExampleObject, ParameterObject, PathsObject } from 'openapi3-ts/oas31';
import {
  CORE_SEARCH_CSV_COLUMNS,
  INFEASIBLE_TOLERANCE_CSV_COLUMNS,
  JOB_KINDS,
  TOLERANCE_CSV_COLUMNS,
  type JobKind,
} from '../../solvers/index.js';
import { EXAMPLE_IDS } from './example-ids.js';
import { EXAMPLE_SPECS } from './example-specs.js';
import { example } from './example.js';
import { jsonResponse, problemResponses } from './responses.js';

const jobId = (examples: Record<string, ExampleObject>): ParameterObject => ({
  name: 'id',
  in: 'path',
  required: true,
  description: 'The job id POST /v1/jobs returned.',
  schema: { type: 'string' },
  examples,
});

const unknownJob = example('an id no job has', EXAMPLE_IDS.unknown, 404);

/** A CSV header line (the columns hold no comma, quote or line break). */
const csvHeader = (columns: readonly string[]) => `${columns.join(',')}\r\n`;

/** An evenly spaced axis of `count` values from `from` to `to`. */
function axis(count: number, from: number, to: number): number[] {
  return Array.from({ length: count }, (_, index) =>
    Number((from + ((to - from) * index) / Math.max(1, count - 1)).toPrecision(6)),
  );
}

/** The /v1/jobs paths; the oversized example is sized from the configured sweep limit. */
export function jobPaths({
  jobSizeLimits,
}: {
  jobSizeLimits: Record<JobKind, number>;
}): PathsObject {
  const sweepPointLimit = jobSizeLimits.sweep;
  const limits = JOB_KINDS.map((kind) => `${kind} ${jobSizeLimits[kind]}`).join(', ');
  // Three equal axes whose product just exceeds the limit (each axis may hold up to 1000 values).
  const side = Math.ceil(Math.cbrt(sweepPointLimit + 1));
  const tooLarge = {
    spec: EXAMPLE_SPECS.packagingAux,
    grid: {
      inputVoltagesV: axis(side, 36, 72),
      loadFractions: axis(side, 0.05, 1),
      switchingFrequenciesHz: axis(side, 100e3, 300e3),
    },
  };
  return {
    '/v1/jobs': {
      post: {
        operationId: 'submitJob',
        tags: ['jobs'],
        summary: 'Submit a heavy job; poll its Location for progress and the result',
        description: `A job is discriminated on \`kind\`. Its size is the number of items its plan enumerates (a sweep's grid points); the largest size per kind here is: ${limits}. A larger job gets 422 with issue code job_size_limit, giving the size (required) and the limit. Every job is cut into chunks of consecutive items that any number of workers share; its result is the same however many workers ran it.`,
        requestBody: {
          required: true,
          content: {
            'application/json': {
              schema: { $ref: '#/components/schemas/JobRequest' },
              examples: {
                'small-sweep': example(
                  'invented: the packaging-machine supply swept over 3 input voltages × 2 loads × 2 frequencies',
                  {
                    kind: 'sweep',
                    input: {
                      spec: EXAMPLE_SPECS.packagingAux,
                      grid: {
                        inputVoltagesV: [36, 48, 72],
                        loadFractions: [0.5, 1],
                        switchingFrequenciesHz: [150e3, 200e3],
                      },
                    },
                  },
                  202,
                ),
                'spec-defaults-grid': example(
                  'invented: the logic supply at its own corners (every grid axis from the spec)',
                  { kind: 'sweep', input: { spec: EXAMPLE_SPECS.logicSupply } },
                  202,
                ),
                'small-core-search': example(
                  'invented: transformers for the packaging-machine supply searched over two core shapes, 4 primary turn counts, the default gap steps and materials, two wire sizes per winding; result: counts per constraint (each candidate under the first test that rejects it, bounds before design), top N, Pareto front (CSV: one line per returned candidate)',
                  {
                    kind: 'core-search',
                    input: {
                      spec: EXAMPLE_SPECS.packagingAux,
                      space: {
                        coreShapes: ['EFD 25/13/9', 'ETD 29'],
                        primaryTurnsCount: 4,
                        wireCurrentDensityFactors: [0.7, 1.4],
                        arrangements: ['interleaved'],
                      },
                      topN: 5,
                    },
                  },
                  202,
                ),
                'small-tolerance': example(
                  'invented: 200 units of the logic supply with the input drawn over its whole range and a ±10 % (1 sigma) on-resistance spread, every other spread at its stated default; result: yield, worst case and drivers per limit (CSV: one line per limit)',
                  {
                    kind: 'tolerance',
                    input: {
                      spec: EXAMPLE_SPECS.logicSupply,
                      sampleCount: 200,
                      seed: 7,
                      tolerances: {
                        inputVoltageV: { kind: 'uniform', scale: 'absolute', lower: 18, upper: 32 },
                        'primarySwitch.onResistanceOhm': {
                          kind: 'normal',
                          scale: 'relative',
                          sigma: 0.1,
                        },
                      },
                    },
                  },
                  202,
                ),
                'too-many-points': example(
                  `invented: a sweep of ${side ** 3} points, over the limit of ${sweepPointLimit}`,
                  { kind: 'sweep', input: tooLarge },
                  422,
                ),
                'unknown-kind': example(
                  'a job kind this version does not offer',
                  { kind: 'weather-forecast', input: {} },
                  400,
                ),
              },
            },
          },
        },
        responses: {
          '202': jsonResponse('Accepted: the job, queued.', 'Job', { isCreated: true }),
          ...problemResponses(400, 413, 415, 422, 503),
        },
      },
    },
    '/v1/jobs/{id}': {
      get: {
        operationId: 'getJob',
        tags: ['jobs'],
        summary:
          'State, progress (done, total, rate, ETA) and (once completed) the result of a job',
        parameters: [
          jobId({
            finished: example(
              `a completed job: the id POST /v1/jobs returned (${EXAMPLE_IDS.finishedJob} stands for it)`,
              EXAMPLE_IDS.finishedJob,
              200,
            ),
            unknown: unknownJob,
          }),
        ],
        responses: { '200': jsonResponse('The job.', 'Job'), ...problemResponses(404, 503) },
      },
      delete: {
        operationId: 'cancelJob',
        tags: ['jobs'],
        summary: 'Cancel a queued or running job',
        description:
          'A queued job is cancelled at once; a running one stops at its next check and turns cancelled. A finished job gets 409.',
        parameters: [
          jobId({
            unfinished: example(
              `a queued or running job (${EXAMPLE_IDS.unfinishedJob} stands for its id)`,
              EXAMPLE_IDS.unfinishedJob,
              200,
            ),
            finished: example(
              `a completed job (${EXAMPLE_IDS.finishedJob} stands for its id)`,
              EXAMPLE_IDS.finishedJob,
              409,
            ),
            unknown: unknownJob,
          }),
        ],
        responses: {
          '200': jsonResponse('The job, cancelled or being cancelled.', 'Job'),
          ...problemResponses(404, 409, 503),
        },
      },
    },
    '/v1/jobs/{id}/result': {
      get: {
        operationId: 'getJobResult',
        tags: ['jobs'],
        summary: 'The result of a completed job, as JSON or CSV',
        description:
          'JSON (the default): `{ meta, output, caution }`, the same result as GET /v1/jobs/{id} carries. CSV (`Accept: text/csv` or `?format=csv`, which wins over Accept): the result as one table, RFC 4180 with a header line, numbers in the unit their column name’s suffix says (a sweep: one line per grid point, issue codes joined by `;`; a core search: one line per returned candidate, the top N in rank order then the other Pareto members, per-winding lists joined by `;`; a tolerance run: a line `overall`, then one line per limit with its yield, distribution, worst case and strongest driver, values in the unit its `unit` column names; an infeasible tolerance run: one line with its issue codes), with the provenance in the `Result-Solver-Version`, `Result-Schema-Version` and `Result-Input-Hash` headers and the caution in `Caution`. 409 while the job has not completed (or when it failed or was cancelled); 406 for CSV of a kind that offers none.',
        parameters: [
          jobId({
            finished: example(
              `a completed job (${EXAMPLE_IDS.finishedJob} stands for its id)`,
              EXAMPLE_IDS.finishedJob,
              200,
            ),
            unfinished: example(
              `a queued job: no result yet (${EXAMPLE_IDS.unfinishedJob} stands for its id)`,
              EXAMPLE_IDS.unfinishedJob,
              409,
            ),
            unknown: unknownJob,
          }),
          {
            name: 'format',
            in: 'query',
            required: false,
            description: 'json or csv; when given it wins over the Accept header.',
            schema: { type: 'string', enum: ['json', 'csv'] },
            examples: { finished: example('JSON, named explicitly', 'json', 200) },
          },
        ],
        responses: {
          '200': {
            description: 'The result.',
            headers: {
              'Result-Solver-Version': {
                description: 'CSV only: the engine version that computed it.',
                schema: { type: 'string' },
              },
              'Result-Schema-Version': {
                description: 'CSV only: the version of the result shape.',
                schema: { type: 'string' },
              },
              'Result-Input-Hash': {
                description: 'CSV only: SHA-256 (hex) of the canonical parsed input.',
                schema: { type: 'string' },
              },
              Caution: { description: 'CSV only: read before use.', schema: { type: 'string' } },
            },
            content: {
              'application/json': { schema: { $ref: '#/components/schemas/JobResultView' } },
              'text/csv': {
                schema: { type: 'string' },
                examples: {
                  'core-search': {
                    summary:
                      'The header line of a core search (each line below it: one returned candidate)',
                    value: csvHeader(CORE_SEARCH_CSV_COLUMNS),
                  },
                  tolerance: {
                    summary:
                      'The header line of a tolerance run (each line below it: overall, then one limit)',
                    value: csvHeader(TOLERANCE_CSV_COLUMNS),
                  },
                  'tolerance-infeasible': {
                    summary:
                      'The header line of a tolerance run whose nominal design is infeasible',
                    value: csvHeader(INFEASIBLE_TOLERANCE_CSV_COLUMNS),
                  },
                },
              },
            },
          },
          ...problemResponses(400, 404, 406, 409, 503),
        },
      },
    },
    '/v1/jobs/{id}/events': {
      get: {
        operationId: 'streamJobEvents',
        tags: ['jobs'],
        summary: 'Progress of a job as server-sent events',
        description:
          'An `event: progress` whenever the state or progress changes (data: the job without its result), keep-alive comments while nothing changes, then one `event: end` with the final state, and the stream closes. Read the result with GET /v1/jobs/{id}.',
        parameters: [
          jobId({
            finished: example(
              `a completed job: the stream sends its last progress and end at once (${EXAMPLE_IDS.finishedJob} stands for its id)`,
              EXAMPLE_IDS.finishedJob,
              200,
            ),
            unknown: unknownJob,
          }),
        ],
        responses: {
          '200': {
            description: 'The event stream.',
            content: { 'text/event-stream': { schema: { type: 'string' } } },
          },
          ...problemResponses(404, 503),
        },
      },
    },
  };
}
