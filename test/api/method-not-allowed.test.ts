import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApiTestApp, type ApiTestApp } from '../helpers/api-test-app.js';

let api: ApiTestApp;
beforeAll(async () => {
  api = await startApiTestApp();
});
afterAll(async () => {
  await api.close();
});

// ref: RFC 9110 §15.5.6 — 405 for a method the target resource does not support, with an Allow
// header listing the ones it does.
describe('a documented path asked with the wrong method', () => {
  it('PUT /v1/designs answers 405 problem+json with Allow: POST', async () => {
    const response = await api.http.put('/v1/designs').send({});
    expect(response.status).toBe(405);
    expect(response.headers['content-type']).toContain('application/problem+json');
    expect(response.headers.allow).toBe('POST');
    expect(response.body).toMatchObject({ status: 405, title: 'Method Not Allowed' });
  });

  it('PATCH /v1/jobs/{id} answers 405 with the methods a job offers', async () => {
    const response = await api.http.patch('/v1/jobs/some-id').send({});
    expect(response.status).toBe(405);
    expect(response.headers.allow).toBe('GET, DELETE');
  });

  it('an undocumented path still answers 404', async () => {
    const response = await api.http.put('/v1/nothing-here');
    expect(response.status).toBe(404);
    expect(response.headers.allow).toBeUndefined();
  });
});
