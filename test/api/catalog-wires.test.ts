import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { WireListSchema } from '../../api/schemas/wire-list-schema.js';
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

const INCH_M = 0.0254;

describe('GET /v1/catalog/wires', () => {
  it('GET /v1/catalog/wires lists AWG 0000 (−3) to 56, thickest first', async () => {
    const response = await api.http.get('/v1/catalog/wires');
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toMatch(/^application\/json/);
    expectFiniteJson(response.text);
    const { items, note } = WireListSchema.parse(response.body);
    expect(items.map((wire) => wire.awg)).toEqual(Array.from({ length: 60 }, (_, i) => i - 3));
    expect(note).toMatch(/ASTM B258/);
  });

  it('GET /v1/catalog/wires?awgMin=20&awgMax=30 lists exactly AWG 20…30 with ASTM B258 diameters', async () => {
    const response = await api.http.get('/v1/catalog/wires').query({ awgMin: 20, awgMax: 30 });
    expect(response.status).toBe(200);
    const { items } = WireListSchema.parse(response.body);
    expect(items.map((wire) => wire.awg)).toEqual(Array.from({ length: 11 }, (_, i) => 20 + i));
    const [awg20] = items;
    if (!awg20) throw new Error('AWG 20 missing');
    // ref: ASTM B258, AWG 20 nominal diameter 0.0320 in (from memory; the table rounds to 4 places)
    expectClose(awg20.bareDiameterM, 0.032 * INCH_M, { rel: 2e-3 });
    // ref: IEC 60028, annealed copper 1/58 Ω·mm²/m at 20 °C: R' = ρ/A for the listed area
    expectClose(awg20.resistancePerLengthOhmPerM, 1e-6 / 58 / awg20.copperAreaM2, { rel: 1e-9 });
    expect(awg20.temperatureC).toBe(20);
  });

  it('GET /v1/catalog/wires gives each gauge three enamel grades, each thicker than the last', async () => {
    const response = await api.http.get('/v1/catalog/wires').query({ awgMin: 10, awgMax: 40 });
    for (const wire of WireListSchema.parse(response.body).items) {
      expect(wire.insulations.map((insulation) => insulation.insulationGrade)).toEqual([1, 2, 3]);
      // ref: common practice (IEC 60317 grades 1, 2, 3 are successively thicker builds)
      const diameters = [wire.bareDiameterM, ...wire.insulations.map((i) => i.overallDiameterM)];
      for (let i = 1; i < diameters.length; i++) {
        expect(diameters[i]).toBeGreaterThan(diameters[i - 1] as number);
      }
    }
  });

  it('GET /v1/catalog/wires with bad bounds answers 400 naming each bad parameter', async () => {
    const reversed = await api.http.get('/v1/catalog/wires').query({ awgMin: 30, awgMax: 20 });
    expect(reversed.status).toBe(400);
    expect(reversed.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(reversed.body.errors).toEqual([
      { path: ['awgMax'], message: 'awgMax must not be below awgMin' },
    ]);
    const outside = await api.http.get('/v1/catalog/wires').query({ awgMin: -4, awgMax: 2.5 });
    expect(outside.status).toBe(400);
    expect(outside.body.errors.map((error: { path: string[] }) => error.path)).toEqual([
      ['awgMin'],
      ['awgMax'],
    ]);
  });
});
