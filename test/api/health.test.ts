import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { createMemoryDesignStore } from '../../api/stores/memory-design-store.js';
import { startApiTestApp, type ApiTestApp } from '../helpers/api-test-app.js';

let api: ApiTestApp;
beforeAll(async () => {
  api = await startApiTestApp();
});
afterAll(async () => {
  await api.close();
});

describe('health', () => {
  it('GET /healthz answers 200 while the process runs', async () => {
    const response = await api.http.get('/healthz');
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toMatch(/^application\/json/);
    expect(response.body).toEqual({ status: 'ok' });
  });

  it('GET /readyz answers 200 when the design store and the job backend are ready', async () => {
    const response = await api.http.get('/readyz');
    expect(response.status).toBe(200);
    expect(response.body).toEqual({
      status: 'ready',
      checks: { designStore: 'up', jobBackend: 'up' },
    });
  });

  it('GET /readyz answers 503 with Retry-After naming the store when the store is closed', async () => {
    const designs = createMemoryDesignStore();
    const degraded = await startApiTestApp({ designs });
    try {
      await designs.close();
      const response = await degraded.http.get('/readyz');
      expect(response.status).toBe(503);
      expect(response.headers['retry-after']).toBe(String(degraded.config.retryAfterS));
      expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
      expect(response.body).toMatchInlineSnapshot(`
        {
          "checks": {
            "designStore": "down",
            "jobBackend": "up",
          },
          "detail": "not ready: designStore down",
          "instance": "/readyz",
          "status": 503,
          "title": "Backend unavailable",
          "type": "tag:isolated-converter-design,2026:problem:backend-unavailable",
        }
      `);
      const live = await degraded.http.get('/healthz');
      expect(live.status).toBe(200);
    } finally {
      await degraded.close();
    }
  });

  it('GET /readyz and POST /v1/jobs answer 503 with Retry-After once the job runner is closed', async () => {
    const degraded = await startApiTestApp();
    try {
      await degraded.jobs.close();
      const response = await degraded.http.get('/readyz');
      expect(response.status).toBe(503);
      expect(response.body.checks).toEqual({ designStore: 'up', jobBackend: 'down' });
      const submit = await degraded.http
        .post('/v1/jobs')
        .send({ kind: 'sweep', input: { spec: EXAMPLE_SPECS.packagingAux } });
      expect(submit.status).toBe(503);
      expect(submit.headers['retry-after']).toMatch(/^\d+$/);
      expect(submit.headers['content-type']).toMatch(/^application\/problem\+json/);
    } finally {
      await degraded.close();
    }
  });
});
