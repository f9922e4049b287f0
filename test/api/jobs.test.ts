import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { JobViewSchema, type JobView } from '../../api/schemas/job-view-schema.js';
import { ProblemSchema } from '../../api/schemas/problem-schema.js';
import { CAUTION } from '../../api/caution.js';
import { startApiTestApp, type ApiTestApp } from '../helpers/api-test-app.js';
import { expectFiniteJson } from '../helpers/expect-finite-json.js';

let api: ApiTestApp;
beforeAll(async () => {
  api = await startApiTestApp({ config: { sweepPointLimit: 5000 } });
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
    const result = view.result;
    expect(result?.sweep.pointCount).toBe(3 * 2 * 2);
    expect(result?.sweep.rows).toHaveLength(12);
    expect(result?.meta.inputHash).toMatch(/^[0-9a-f]{64}$/);
    const points = result?.sweep.rows.map((row) => [
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
    const blocker = await api.http.post('/v1/jobs').send(longSweep(api.config.sweepPointLimit));
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
    const tooMany = longSweep(api.config.sweepPointLimit + 10);
    const response = await api.http.post('/v1/jobs').send(tooMany);
    expect(response.status).toBe(422);
    const body = ProblemSchema.parse(response.body);
    expect(body.issues).toEqual([
      {
        code: 'job_size_limit',
        path: ['grid'],
        constraint: 'pointCount <= sweepPointLimit',
        quantity: 'pointCount',
        required: api.config.sweepPointLimit + 10,
        limit: api.config.sweepPointLimit,
      },
    ]);
    expect(body.detail).toBe(
      `pointCount ${api.config.sweepPointLimit + 10} requested exceeds the limit ${api.config.sweepPointLimit} (pointCount <= sweepPointLimit)`,
    );
  });

  it('POST /v1/jobs with an unknown kind answers 400 naming the kind field', async () => {
    const response = await api.http.post('/v1/jobs').send({ kind: 'core-search', input: {} });
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

  it('GET and DELETE /v1/jobs/{id} of an unknown job answer 404', async () => {
    for (const method of ['get', 'delete'] as const) {
      const response = await api.http[method]('/v1/jobs/no-such-job');
      expect(response.status).toBe(404);
      expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
    }
  });
});
