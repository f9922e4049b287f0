import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CAUTION } from '../../api/caution.js';
import { JobViewSchema, type JobView } from '../../api/schemas/job-view-schema.js';
import { wireLabel } from '../../solvers/core-search/core-search-csv.js';
import {
  CoreSearchResultSchema,
  ToleranceJobResultSchema,
  type CoreSearchCandidate,
} from '../../solvers/index.js';
import { startApiTestApp, type ApiTestApp } from '../helpers/api-test-app.js';
import { telecomSpec } from '../helpers/flyback-specs.js';
import { forwardTelecomSpec } from '../helpers/forward-specs.js';

// GET /v1/jobs/{id}/result as CSV for the core search and the tolerance run, over HTTP on the
// embedded backend. Every spec is an invented scenario of the test helpers, not any product.

let api: ApiTestApp;
beforeAll(async () => {
  api = await startApiTestApp();
});
afterAll(async () => {
  await api.close();
});

async function completedJob(kind: string, input: unknown): Promise<JobView> {
  const submitted = await api.http.post('/v1/jobs').send({ kind, input });
  expect(submitted.status, submitted.text).toBe(202);
  for (;;) {
    const view = JobViewSchema.parse(
      (await api.http.get(submitted.headers.location as string)).body,
    );
    if (['completed', 'failed', 'cancelled'].includes(view.state)) {
      expect(view.state, view.failureReason).toBe('completed');
      return view;
    }
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
}

/**
 * The lines of a CSV answer, each split into its fields. None of these tables holds a comma, a
 * quote or a line break inside a field, so a plain split is RFC 4180's reading of them
 * (ref: RFC 4180 §2: CRLF-ended records, a header record, comma-separated fields).
 */
async function csvOf(view: JobView): Promise<{ header: string[]; rows: string[][] }> {
  const response = await api.http.get(`${view.links.self}/result`).set('accept', 'text/csv');
  expect(response.status).toBe(200);
  expect(response.headers['content-type']).toMatch(/^text\/csv/);
  expect(response.headers['result-input-hash']).toBe(view.result?.meta.inputHash);
  expect(response.headers['result-solver-version']).toBe(view.result?.meta.solverVersion);
  expect(response.headers.caution).toBe(CAUTION);
  expect(response.text).not.toMatch(/"/);
  const lines = response.text.split('\r\n');
  expect(lines.at(-1)).toBe('');
  const [header = '', ...rows] = lines.slice(0, -1);
  return { header: header.split(','), rows: rows.map((line) => line.split(',')) };
}

/** A cell as the CSV writes a number: JavaScript's shortest round-trip form, empty for none. */
const cell = (value: number | string | boolean | undefined) =>
  value === undefined ? '' : String(value);

describe('GET /v1/jobs/{id}/result as CSV', () => {
  it('a core search: one line per returned candidate, the top N in rank order, then the other Pareto members', async () => {
    const view = await completedJob('core-search', {
      spec: telecomSpec(),
      space: {
        coreShapes: ['ETD 29', 'ETD 34'],
        materialIds: ['mnzn-power-low-frequency', 'mnzn-power-high-frequency'],
        primaryTurns: { min: 10, max: 12 },
        gaps: { kind: 'inductance-steps', stepCount: 2, factorMin: 0.8, factorMax: 1.25 },
        wireCurrentDensityFactors: [0.7, 1.4],
      },
      topN: 3,
    });
    const output = CoreSearchResultSchema.parse(view.result?.output);
    // The documented schema holds the whole result: nothing stripped, nothing missing.
    expect(output).toEqual(view.result?.output);
    const { header, rows } = await csvOf(view);
    expect(header).toEqual([
      'topRank',
      'onParetoFront',
      'index',
      'frequencyHz',
      'coreShape',
      'materialId',
      'arrangement',
      'windingNames',
      'turns',
      'wires',
      'gapLengthM',
      'magnetizingInductanceH',
      'leakageInductanceH',
      'lossWorstCornerW',
      'lossNominalW',
      'transformerLossWorstCornerW',
      'efficiencyNominal',
      'temperatureRiseK',
      'fluxDensityUtilization',
      'windowFill',
      'coreVolumeM3',
    ]);
    const onFront = new Set(output.paretoFront.map((candidate) => candidate.index));
    const topIndexes = new Set(output.top.map((candidate) => candidate.index));
    const expected: [CoreSearchCandidate, string][] = [
      ...output.top.map((candidate, rank): [CoreSearchCandidate, string] => [
        candidate,
        String(rank + 1),
      ]),
      ...output.paretoFront
        .filter((candidate) => !topIndexes.has(candidate.index))
        .map((candidate): [CoreSearchCandidate, string] => [candidate, '']),
    ];
    expect(output.top).toHaveLength(3);
    expect(expected.length).toBeGreaterThan(output.top.length);
    expect(rows).toHaveLength(expected.length);
    for (const [row, [candidate, rank]] of rows.map((r, i) => [r, expected[i]!] as const)) {
      expect(row).toEqual([
        rank,
        String(onFront.has(candidate.index)),
        cell(candidate.index),
        cell(candidate.frequencyHz),
        candidate.coreShape,
        candidate.materialId,
        candidate.arrangement,
        candidate.windingNames.join(';'),
        candidate.turns.join(';'),
        candidate.wires.map(wireLabel).join(';'),
        cell(candidate.gapLengthM),
        cell(candidate.magnetizingInductanceH),
        cell(candidate.leakageInductanceH),
        cell(candidate.lossWorstCornerW),
        cell(candidate.lossNominalW),
        cell(candidate.transformerLossWorstCornerW),
        cell(candidate.efficiencyNominal),
        cell(candidate.temperatureRiseK),
        cell(candidate.fluxDensityUtilization),
        cell(candidate.windowFill),
        cell(candidate.coreVolumeM3),
      ]);
    }
    // The numbers read back are the JSON's to the last bit.
    expect(Number(rows[0]?.[13])).toBe(output.top[0]?.lossWorstCornerW);
  });

  it('a tolerance run: a line overall, then one line per limit with yield, distribution, worst case and driver', async () => {
    const view = await completedJob('tolerance', {
      spec: telecomSpec(),
      sampleCount: 300,
      seed: 11,
    });
    const output = ToleranceJobResultSchema.parse(view.result?.output);
    if (!output.feasible) throw new Error('the invented flyback should be feasible');
    const { header, rows } = await csvOf(view);
    expect(header).toEqual([
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
    ]);
    expect(rows).toHaveLength(1 + output.limits.length);
    // The designed transformer's rise is among the limits: a quantity with a unit (K).
    expect(output.limits.map((limit) => limit.id)).toContain('temperatureRise');
    const column = (row: string[] | undefined, name: string) => row?.[header.indexOf(name)];
    const overall = rows[0];
    expect(column(overall, 'limit')).toBe('overall');
    expect(column(overall, 'yieldFraction')).toBe(cell(output.yield.overall.fraction));
    expect(column(overall, 'passCount')).toBe(cell(output.yield.overall.passCount));
    expect(column(overall, 'count')).toBe('300');
    expect(column(overall, 'seed')).toBe('11');
    for (const [l, limit] of output.limits.entries()) {
      const row = rows[l + 1];
      const figure = output.yield.perLimit[l];
      const spread = output.distributions[l];
      const worst = output.worstCase.perLimit[l];
      expect(column(row, 'limit')).toBe(limit.id);
      expect(column(row, 'quantity')).toBe(limit.quantity);
      // The unit its suffix names (solvers/units.ts); a ratio is dimensionless.
      expect(column(row, 'unit')).toBe(limit.quantity.endsWith('RiseK') ? 'K' : '1');
      expect(column(row, 'limitValue')).toBe(cell(limit.limit));
      expect(column(row, 'nominalValue')).toBe(cell(limit.nominalValue));
      expect(column(row, 'yieldFraction')).toBe(cell(figure?.fraction));
      expect(column(row, 'failCount')).toBe(cell(figure?.failCount));
      expect(column(row, 'mean')).toBe(cell(spread?.mean));
      expect(column(row, 'p99')).toBe(cell(spread?.p99));
      expect(column(row, 'worstCaseValue')).toBe(cell(worst?.worstValue));
      expect(column(row, 'worstCaseViolates')).toBe(cell(worst?.violates));
      expect(column(row, 'strongestDriver')).toBe(
        cell(output.sensitivity.perLimit[l]?.ranking[0]?.parameter),
      );
    }
    // ref: RFC 4180 §2, each record has the same number of fields as the header.
    for (const row of rows) expect(row).toHaveLength(header.length);
  });

  it('an infeasible tolerance run: one line with the seed and the issue codes', async () => {
    // A 10–12 V input the forward cannot reach 12 V from (invented, as in the engine's tests).
    const view = await completedJob('tolerance', {
      spec: forwardTelecomSpec({ inputVoltageMinV: 10, inputVoltageNominalV: 12 }),
      sampleCount: 10,
      seed: 5,
    });
    const output = ToleranceJobResultSchema.parse(view.result?.output);
    if (output.feasible) throw new Error('expected an infeasible nominal design');
    const { header, rows } = await csvOf(view);
    expect(header).toEqual(['feasible', 'seed', 'sampleCount', 'issueCodes']);
    expect(rows).toEqual([
      ['false', '5', '10', output.issues.map((issue) => issue.code).join(';')],
    ]);
  });
});
