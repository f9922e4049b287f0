import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { JobViewSchema, type JobView } from '../../api/schemas/job-view-schema.js';
import { ProblemSchema } from '../../api/schemas/problem-schema.js';
import { CAUTION } from '../../api/caution.js';
import { loadConfig } from '../../api/config.js';
import { JobResultViewSchema } from '../../api/schemas/job-result-schema.js';
import { SweepResultSchema, canonicalJson, sweepComputation } from '../../solvers/index.js';
import { startApiTestApp, type ApiTestApp } from '../helpers/api-test-app.js';
import { expectFiniteJson } from '../helpers/expect-finite-json.js';

let api: ApiTestApp;
beforeAll(async () => {
  api = await startApiTestApp({
    config: { jobSizeLimits: { ...loadConfig({}).jobSizeLimits, sweep: 5000 } },
  });
});
afterAll(async () => {
  await api.close();
});

const spec = EXAMPLE_SPECS.packagingAux;
const smallSweep = {
  kind: 'sweep',
  input: {
    spec,
    grid: {
      inputVoltagesV: [36, 48, 72],
      loadFractions: [0.5, 1],
      switchingFrequenciesHz: [150e3, 200e3],
    },
  },
};
/** A sweep of as many points as the limit allows, to keep the one in-process slot busy. */
const longSweep = (points: number) => ({
  kind: 'sweep',
  input: {
    spec,
    grid: {
      inputVoltagesV: Array.from(
        { length: points / 10 },
        (_, index) => 36 + (36 * index) / (points / 10),
      ),
      loadFractions: Array.from({ length: 10 }, (_, index) => 0.1 + index / 10),
    },
  },
});

const FINAL_STATES = new Set(['completed', 'failed', 'cancelled']);

async function pollUntilFinished(location: string): Promise<JobView> {
  for (;;) {
    const response = await api.http.get(location);
    expect(response.status).toBe(200);
    expectFiniteJson(response.text);
    const view = JobViewSchema.parse(response.body);
    if (FINAL_STATES.has(view.state)) return view;
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

describe('/v1/jobs', () => {
  it('POST /v1/jobs with a sweep answers 202 with Location and the queued job', async () => {
    const response = await api.http.post('/v1/jobs').send(smallSweep);
    expect(response.status).toBe(202);
    expect(response.headers['content-type']).toMatch(/^application\/json/);
    const view = JobViewSchema.parse(response.body);
    expect(response.headers.location).toBe(`/v1/jobs/${view.id}`);
    expect(view).toMatchObject({ kind: 'sweep', state: 'queued', caution: CAUTION });
    expect(view.links.self).toBe(response.headers.location);
  });

  it('a submitted sweep, polled until completed, has one row per grid point and meta', async () => {
    const submitted = await api.http.post('/v1/jobs').send(smallSweep);
    const view = await pollUntilFinished(submitted.headers.location as string);
    expect(view.state).toBe('completed');
    expect(view.progress).toMatchObject({ done: 12, total: 12, fraction: 1 });
    expect(view.startedAt).toBeDefined();
    expect(view.finishedAt).toBeDefined();
    const output = SweepResultSchema.parse(view.result?.output);
    expect(output.pointCount).toBe(3 * 2 * 2);
    expect(output.rows).toHaveLength(12);
    expect(view.result?.meta.inputHash).toMatch(/^[0-9a-f]{64}$/);
    expect(view.links.result).toBe(`${view.links.self}/result`);
    const points = output.rows.map((row) => [
      row.switchingFrequencyHz,
      row.inputVoltageV,
      row.loadFraction,
    ]);
    // One row per point, frequency outermost, then input voltage, then load (SweepResult's order).
    const expected = [150e3, 200e3].flatMap((f) =>
      [36, 48, 72].flatMap((v) => [0.5, 1].map((load) => [f, v, load])),
    );
    expect(points).toEqual(expected);
  });

  it('DELETE /v1/jobs/{id} on a queued job answers 200 with the cancelled job', async () => {
    const blocker = await api.http.post('/v1/jobs').send(longSweep(api.config.jobSizeLimits.sweep));
    const queued = await api.http.post('/v1/jobs').send(smallSweep);
    const response = await api.http.delete(queued.headers.location as string);
    expect(response.status).toBe(200);
    const view = JobViewSchema.parse(response.body);
    expect(view.state).toBe('cancelled');
    expect(view.result).toBeUndefined();
    const cancelledBlocker = await api.http.delete(blocker.headers.location as string);
    expect(cancelledBlocker.status).toBe(200);
    const finished = await pollUntilFinished(blocker.headers.location as string);
    expect(finished.state).toBe('cancelled');
  });

  it('DELETE /v1/jobs/{id} after completion answers 409', async () => {
    const submitted = await api.http.post('/v1/jobs').send(smallSweep);
    await pollUntilFinished(submitted.headers.location as string);
    const response = await api.http.delete(submitted.headers.location as string);
    expect(response.status).toBe(409);
    expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect({ ...response.body, detail: undefined, instance: undefined }).toMatchInlineSnapshot(`
      {
        "detail": undefined,
        "instance": undefined,
        "status": 409,
        "title": "Job has already finished",
        "type": "tag:isolated-converter-design,2026:problem:job-finished",
      }
    `);
  });

  it('POST /v1/jobs with more grid points than the limit answers 422 job_size_limit with the numbers', async () => {
    const limit = api.config.jobSizeLimits.sweep;
    const tooMany = longSweep(limit + 10);
    const response = await api.http.post('/v1/jobs').send(tooMany);
    expect(response.status).toBe(422);
    expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
    const body = ProblemSchema.parse(response.body);
    expect(body.issues).toEqual([
      {
        code: 'job_size_limit',
        path: [],
        constraint: 'jobSize <= jobSizeLimit',
        quantity: 'jobSize',
        required: limit + 10,
        limit,
      },
    ]);
    expect(body.detail).toBe(
      `jobSize ${limit + 10} requested exceeds the limit ${limit} (jobSize <= jobSizeLimit)`,
    );
  });

  it('POST /v1/jobs with a grid of 10^9 points answers 422 with its size, never cutting it into chunks', async () => {
    // 1000 values an axis in chunks of one point: a body of about 40 kB, 10^9 points. Cut into
    // chunks before the size check, it took the API process's memory (10^7 chunks: 10 s, 0.8
    // GB); the check must size the grid without them, so planning here is a failure.
    const axis = (from: number, to: number) =>
      Array.from({ length: 1000 }, (_, index) => from + ((to - from) * index) / 999);
    const planned = vi.spyOn(sweepComputation, 'plan').mockImplementation(() => {
      throw new Error('an oversized sweep was cut into chunks');
    });
    try {
      const response = await api.http.post('/v1/jobs').send({
        kind: 'sweep',
        input: {
          spec,
          grid: {
            inputVoltagesV: axis(36, 72),
            loadFractions: axis(0.1, 1),
            switchingFrequenciesHz: axis(50e3, 250e3),
          },
          chunkPointCount: 1,
        },
      });
      expect(response.status).toBe(422);
      const limit = api.config.jobSizeLimits.sweep;
      expect(ProblemSchema.parse(response.body).issues).toEqual([
        {
          code: 'job_size_limit',
          path: [],
          constraint: 'jobSize <= jobSizeLimit',
          quantity: 'jobSize',
          required: 1e9,
          limit,
        },
      ]);
      expect(planned).not.toHaveBeenCalled();
    } finally {
      planned.mockRestore();
    }
  });

  it('POST /v1/jobs with an unknown kind answers 400 naming the kind field', async () => {
    const response = await api.http.post('/v1/jobs').send({ kind: 'thermal-soak', input: {} });
    expect(response.status).toBe(400);
    expect(response.body.errors.map((error: { path: unknown }) => error.path)).toEqual([['kind']]);
  });

  it('POST /v1/jobs with a bad sweep input answers 400 with paths from the body root', async () => {
    const response = await api.http.post('/v1/jobs').send({
      kind: 'sweep',
      input: { spec, grid: { loadFractions: [0.5, 2] } },
    });
    expect(response.status).toBe(400);
    expect(response.body.errors.map((error: { path: unknown }) => error.path)).toEqual([
      ['input', 'grid', 'loadFractions', 1],
    ]);
  });

  it('GET /v1/jobs/{id}/result answers the result as JSON: { meta, output, caution }, as on the job', async () => {
    const submitted = await api.http.post('/v1/jobs').send(smallSweep);
    const view = await pollUntilFinished(submitted.headers.location as string);
    const response = await api.http.get(`${view.links.self}/result`);
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toMatch(/^application\/json/);
    const body = JobResultViewSchema.parse(response.body);
    expect(body.caution).toBe(CAUTION);
    expect(canonicalJson({ meta: body.meta, output: body.output })).toBe(
      canonicalJson(view.result),
    );
  });

  it('GET /v1/jobs/{id}/result as CSV (Accept or ?format=csv) has a header and one line per grid point', async () => {
    const submitted = await api.http.post('/v1/jobs').send(smallSweep);
    const view = await pollUntilFinished(submitted.headers.location as string);
    const rows = SweepResultSchema.parse(view.result?.output).rows;
    const byAccept = await api.http.get(`${view.links.self}/result`).set('accept', 'text/csv');
    const byQuery = await api.http
      .get(`${view.links.self}/result?format=csv`)
      .set('accept', 'application/json');
    for (const response of [byAccept, byQuery]) {
      expect(response.status).toBe(200);
      expect(response.headers['content-type']).toMatch(/^text\/csv/);
      expect(response.headers['result-input-hash']).toBe(view.result?.meta.inputHash);
      expect(response.headers.caution).toBe(CAUTION);
    }
    expect(byQuery.text).toBe(byAccept.text);
    const lines = byAccept.text.split('\r\n');
    expect(lines.at(-1)).toBe('');
    expect(lines[0]).toBe(
      'switchingFrequencyHz,inputVoltageV,loadFraction,feasible,conductionMode,dutyCycle,efficiency,lossTotalW,switchVoltagePeakV,switchCurrentPeakA,issueCodes',
    );
    expect(lines).toHaveLength(rows.length + 2);
    // Each line carries its row's numbers exactly (JavaScript's shortest round-trip form).
    for (const [index, row] of rows.entries()) {
      const cells = (lines[index + 1] ?? '').split(',');
      expect(cells.slice(0, 4)).toEqual([
        String(row.switchingFrequencyHz),
        String(row.inputVoltageV),
        String(row.loadFraction),
        String(row.feasible),
      ]);
      expect(cells[6]).toBe(row.efficiency === undefined ? '' : String(row.efficiency));
    }
  });

  it('GET /v1/jobs/{id}/result answers 409 before completion, 400 for an unknown format', async () => {
    const blocker = await api.http.post('/v1/jobs').send(longSweep(api.config.jobSizeLimits.sweep));
    const early = await api.http.get(`${blocker.headers.location as string}/result`);
    expect(early.status).toBe(409);
    expect(early.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(early.body.type).toBe('tag:isolated-converter-design,2026:problem:job-not-completed');
    await api.http.delete(blocker.headers.location as string);
    const finished = await pollUntilFinished(blocker.headers.location as string);
    expect(finished.state).toBe('cancelled');
    expect((await api.http.get(`${finished.links.self}/result`)).status).toBe(409);
    const badFormat = await api.http.get(`${finished.links.self}/result?format=xml`);
    expect(badFormat.status).toBe(400);
  });

  it('GET and DELETE /v1/jobs/{id} and GET its result of an unknown job answer 404', async () => {
    for (const method of ['get', 'delete'] as const) {
      const response = await api.http[method]('/v1/jobs/no-such-job');
      expect(response.status).toBe(404);
      expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
    }
    expect((await api.http.get('/v1/jobs/no-such-job/result')).status).toBe(404);
  });
});
