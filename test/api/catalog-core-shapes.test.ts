import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CoreShapeListSchema } from '../../api/schemas/core-shape-list-schema.js';
import { CORE_SHAPE_CATALOG, coreGeometry } from '../../solvers/index.js';
import { startApiTestApp, type ApiTestApp } from '../helpers/api-test-app.js';
import { expectClose } from '../helpers/expect-close.js';
import { expectFiniteJson } from '../helpers/expect-finite-json.js';

let api: ApiTestApp;
beforeAll(async () => {
  api = await startApiTestApp();
});
afterAll(async () => {
  await api.close();
});

describe('GET /v1/catalog/core-shapes', () => {
  it('GET /v1/catalog/core-shapes lists every catalog shape with the nominal-dimensions note', async () => {
    const response = await api.http.get('/v1/catalog/core-shapes');
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toMatch(/^application\/json/);
    expectFiniteJson(response.text);
    const body = CoreShapeListSchema.parse(response.body);
    expect(body.items.map((item) => item.designation)).toEqual(
      CORE_SHAPE_CATALOG.map((shape) => shape.designation),
    );
    expect(body.note).toMatch(/nominal/);
    expect(body.note).toMatch(/supplier’s drawing/);
  });

  it('GET /v1/catalog/core-shapes gives each shape the geometry coreGeometry() computes from its dimensions', async () => {
    const response = await api.http.get('/v1/catalog/core-shapes');
    const body = CoreShapeListSchema.parse(response.body);
    for (const designation of ['ETD 34', 'E 25/13/7', 'R 25/15/10', 'PQ 26/20', 'EQ 30/8/20']) {
      const shape = CORE_SHAPE_CATALOG.find((item) => item.designation === designation);
      const entry = body.items.find((item) => item.designation === designation);
      if (!shape || !entry) throw new Error(`${designation} missing`);
      const { geometry, ...dimensions } = entry;
      expect(dimensions).toEqual(shape);
      const expected = coreGeometry(shape);
      expect(Object.keys(geometry).sort()).toEqual(Object.keys(expected).sort());
      for (const [name, value] of Object.entries(expected)) {
        // ref: consistency check against the engine's coreGeometry (the API must pass its
        // numbers through unchanged; a JSON round trip of a double is exact, 1e-12 is slack)
        expectClose(geometry[name as keyof typeof geometry], value, { rel: 1e-12 });
      }
    }
  });

  it('GET /v1/catalog/core-shapes?family=etd lists the ETD shapes only', async () => {
    const response = await api.http.get('/v1/catalog/core-shapes').query({ family: 'etd' });
    expect(response.status).toBe(200);
    const body = CoreShapeListSchema.parse(response.body);
    const etd = CORE_SHAPE_CATALOG.filter((shape) => shape.family === 'etd');
    expect(etd.length).toBeGreaterThan(0);
    expect(body.items.map((item) => item.designation)).toEqual(etd.map((s) => s.designation));
  });

  it('GET /v1/catalog/core-shapes?family=pq lists the PQ shapes with their slot width and geometry', async () => {
    const response = await api.http.get('/v1/catalog/core-shapes').query({ family: 'pq' });
    expect(response.status).toBe(200);
    const body = CoreShapeListSchema.parse(response.body);
    const pq = CORE_SHAPE_CATALOG.filter((shape) => shape.family === 'pq');
    expect(pq.length).toBeGreaterThanOrEqual(3);
    expect(body.items.map((item) => item.designation)).toEqual(pq.map((s) => s.designation));
    for (const item of body.items) {
      expect(item.family).toBe('pq');
      if (item.family === 'pq') expect(item.slotWidthM).toBeGreaterThan(0);
      // ref: IEC 60205, Ve = le·Ae
      expectClose(
        item.geometry.effectiveVolumeM3,
        item.geometry.effectiveLengthM * item.geometry.effectiveAreaM2,
        { rel: 1e-12 },
      );
    }
  });

  it('GET /v1/catalog/core-shapes?family=rm answers 400 naming the parameter and the valid families', async () => {
    const response = await api.http.get('/v1/catalog/core-shapes').query({ family: 'rm' });
    expect(response.status).toBe(400);
    expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(response.body).toMatchInlineSnapshot(`
      {
        "detail": "1 invalid field(s): family",
        "errors": [
          {
            "message": "Invalid option: expected one of "e"|"efd"|"etd"|"eq"|"pq"|"ring"",
            "path": [
              "family",
            ],
          },
        ],
        "instance": "/v1/catalog/core-shapes",
        "status": 400,
        "title": "Request parameter is invalid",
        "type": "tag:isolated-converter-design,2026:problem:invalid-parameter",
      }
    `);
  });
});
