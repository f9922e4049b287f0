import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { startApiTestApp, type ApiTestApp } from '../helpers/api-test-app.js';

let api: ApiTestApp;
let id: string;
let cornerLabels: string[];
beforeAll(async () => {
  api = await startApiTestApp();
  const created = await api.http.post('/v1/designs').send({ spec: EXAMPLE_SPECS.packagingAux });
  id = created.body.id;
  cornerLabels = created.body.design.corners.map((corner: { label: string }) => corner.label);
});
afterAll(async () => {
  await api.close();
});

describe('GET /v1/designs/{id}/netlist', () => {
  it('GET /v1/designs/{id}/netlist answers text/plain SPICE ending in .end', async () => {
    const response = await api.http.get(`/v1/designs/${id}/netlist`);
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toMatch(/^text\/plain/);
    // ref: common practice (a SPICE deck's last line is .end)
    expect(response.text.trimEnd()).toMatch(/\n\.end$/i);
    // Computed results carry the caution; in a deck it is a comment the simulator skips.
    expect(response.text).toMatch(/^\*.*CAUTION/m);
    expect(response.text).toMatch(/lethal voltages/);
  });

  it('GET /v1/designs/{id}/netlist?corner= gives a different deck for a different corner', async () => {
    const [first, last] = [cornerLabels[0], cornerLabels.at(-1)] as [string, string];
    const a = await api.http.get(`/v1/designs/${id}/netlist`).query({ corner: first, revision: 1 });
    const b = await api.http.get(`/v1/designs/${id}/netlist`).query({ corner: last, revision: 1 });
    expect(a.status).toBe(200);
    expect(b.status).toBe(200);
    expect(a.text).not.toBe(b.text);
  });

  it('GET /v1/designs/{id}/netlist with an unknown corner answers 400 listing the valid corners', async () => {
    const response = await api.http
      .get(`/v1/designs/${id}/netlist`)
      .query({ corner: 'hottest-day' });
    expect(response.status).toBe(400);
    expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(response.body.validCorners).toEqual(cornerLabels);
    expect(response.body.errors).toEqual([{ path: ['corner'], message: 'unknown corner' }]);
    expect(response.body.detail).toContain(cornerLabels.join(', '));
  });

  it('GET /v1/designs/{id}/netlist?revision= of a revision not made yet answers 404', async () => {
    const response = await api.http.get(`/v1/designs/${id}/netlist`).query({ revision: 7 });
    expect(response.status).toBe(404);
  });
});
