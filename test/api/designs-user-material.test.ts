import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { USER_MATERIAL_DEFAULTS } from '../../api/catalog/user-material-class.js';
import { DesignViewSchema } from '../../api/schemas/design-view-schema.js';
import { igseCoreLoss } from '../../solvers/magnetics/igse-core-loss.js';
import { inputHash, type MaterialClass } from '../../solvers/index.js';
import { startApiTestApp, type ApiTestApp } from '../helpers/api-test-app.js';
import { expectClose } from '../helpers/expect-close.js';
import { expectFiniteJson } from '../helpers/expect-finite-json.js';
import { telecomSpec } from '../helpers/flyback-specs.js';
import { waitForFinish } from '../helpers/wait-for-job.js';
import { forwardTelecomSpec } from '../helpers/forward-specs.js';

let api: ApiTestApp;
beforeAll(async () => {
  api = await startApiTestApp();
});
afterAll(async () => {
  await api.close();
});

/**
 * INVENTED material, no product's data: its loss points are generated from Pv = k·f^α·B^β with
 * these coefficients on a 3 × 3 grid (50–200 kHz, 50–200 mT), so the fit has a known answer.
 */
const GENERATING = { k: 4, alpha: 1.35, beta: 2.55 };
const INVENTED_MATERIAL = {
  name: 'Invented test ferrite (not a product)',
  lossPoints: [50e3, 100e3, 200e3].flatMap((frequencyHz) =>
    [0.05, 0.1, 0.2].map((peakFluxDensityT) => ({
      frequencyHz,
      peakFluxDensityT,
      lossDensityWPerM3:
        GENERATING.k * frequencyHz ** GENERATING.alpha * peakFluxDensityT ** GENERATING.beta,
    })),
  ),
  saturationFluxDensityT: 0.36,
  initialPermeability: 2000,
};

let materialId = '';
let fitted = { k: NaN, alpha: NaN, beta: NaN };

beforeAll(async () => {
  const response = await api.http.post('/v1/catalog/materials').send(INVENTED_MATERIAL);
  expect(response.status).toBe(201);
  materialId = response.body.id as string;
  fitted = response.body.steinmetz as typeof fitted;
});

// With the waveforms: the iGSE check below reads the magnetizing current.
const postDesign = (spec: unknown) =>
  api.http
    .post('/v1/designs')
    .query({ include: 'waveforms' })
    .send({ spec } as object);

type DesignView = ReturnType<typeof DesignViewSchema.parse>;

/** Ve·Pv(iGSE) of the flux B = Lm·im/(Np·Ae) at every corner, W, with the flat factor ct = 1. */
function igseCoreLossesW(view: DesignView, coefficients: typeof fitted): number[] {
  const { design } = view;
  const transformer = design.transformer;
  if (transformer === undefined) throw new Error('expected a designed transformer');
  const primaryTurns = transformer.windings[0]?.turns ?? NaN;
  const scale =
    design.choices.magnetizingInductanceH / (primaryTurns * transformer.core.effectiveAreaM2);
  return design.corners.map((corner) => {
    const im = corner.waveforms?.magnetizingCurrentA;
    if (im === undefined) throw new Error('expected waveforms (include=waveforms)');
    const flux = { ...im, values: im.values.map((value) => value * scale) };
    return igseCoreLoss(flux, coefficients) * transformer.core.effectiveVolumeM3;
  });
}

describe('POST /v1/catalog/materials, then POST /v1/designs with the material', () => {
  // ref: consistency check — points generated exactly from Pv = k·f^α·B^β lie on a plane in
  // log space, so least squares there returns the generating coefficients (to round-off).
  it('POST /v1/catalog/materials fits the generating coefficients back', () => {
    expectClose(fitted.k, GENERATING.k, { rel: 1e-6 });
    expectClose(fitted.alpha, GENERATING.alpha, { rel: 1e-9 });
    expectClose(fitted.beta, GENERATING.beta, { rel: 1e-9 });
  });

  for (const [topology, makeSpec] of [
    ['flyback', telecomSpec],
    ['two-switch-forward', forwardTelecomSpec],
  ] as const) {
    // ref: Venkatachalam, Sullivan, Abdallah, Tacca, IEEE COMPEL 2002 (iGSE), with the fitted
    // coefficients and a flat temperature factor (the user-material default): the design's
    // core loss is Ve·Pv of the corner's flux (consistency check).
    it(`POST /v1/designs (${topology}, user materialId) designs with the fitted material`, async () => {
      const spec = makeSpec({ magnetics: { materialId } });
      const response = await postDesign(spec);
      expect(response.status).toBe(201);
      expectFiniteJson(response.text);
      const view = DesignViewSchema.parse(response.body);
      expect(view.design.topology).toBe(topology);
      const transformer = view.design.transformer;
      expect(transformer?.materialId).toBe(materialId);
      const expected = igseCoreLossesW(view, fitted);
      transformer?.corners.forEach((corner, index) => {
        expectClose(corner.coreLossW, expected[index] ?? NaN, { rel: 1e-9 });
      });
      // The hot corner's loss is not scaled: the factor is flat.
      const hottest = [...(transformer?.corners ?? [])].sort(
        (a, b) => b.temperatureC - a.temperatureC,
      )[0];
      expect(hottest?.temperatureC).toBeGreaterThan(spec.ambientTemperatureC);
    });
  }

  // ref: common practice — a result names the inputs it was computed from: the echoed spec
  // carries the material's numbers, and the defaults the user material lacked.
  it('POST /v1/designs (user materialId) echoes the material inline, defaults stated', async () => {
    const response = await postDesign(telecomSpec({ magnetics: { materialId } }));
    expect(response.status).toBe(201);
    const view = DesignViewSchema.parse(response.body);
    const expected: MaterialClass = {
      id: materialId,
      steinmetz: fitted,
      lossTemperatureFactor: { ct2: 0, ct1: 0, ct0: 1 },
      saturation: {
        lowTemperatureC: 25,
        lowFluxDensityT: 0.36,
        highTemperatureC: 100,
        highFluxDensityT: 0.36,
      },
      initialPermeability: 2000,
      initialPermeabilityTolerance: USER_MATERIAL_DEFAULTS.initialPermeabilityTolerance,
      frequencyMinHz: 50e3,
      frequencyMaxHz: 200e3,
    };
    expect(view.spec.magnetics.materialId).toBe(materialId);
    expect(view.spec.magnetics.material).toEqual(expected);
    expect(view.meta.inputHash).toBe(await inputHash(view.spec));
    const note = view.design.modelNotes.find((text) => text.includes(INVENTED_MATERIAL.name));
    expect(note).toMatch(/flat \(1\)/);
    expect(note).toMatch(/0\.36 T at 25 °C and 100 °C \(as posted/);
    expect(note).toMatch(/within ±0\.25 \(the service default\)/);
    const stored = await api.http.get(`/v1/designs/${view.id}`);
    expect(stored.body.spec.magnetics.material).toEqual(expected);
  });

  // ref: common practice — reproducibility: the echoed spec alone gives the same numbers and
  // the same input hash, whether or not the material is still stored.
  it('POST /v1/designs (the echoed spec) reproduces the design and its hash', async () => {
    const first = DesignViewSchema.parse(
      (await postDesign(forwardTelecomSpec({ magnetics: { materialId } }))).body,
    );
    const again = await postDesign(first.spec);
    expect(again.status).toBe(201);
    const second = DesignViewSchema.parse(again.body);
    expect(second.meta.inputHash).toBe(first.meta.inputHash);
    expect(second.design.transformer).toEqual(first.design.transformer);
  });

  // ref: common practice — a revision resolves the material as a new design does.
  it('POST /v1/designs/{id}/revisions (user materialId) puts the material inline', async () => {
    const created = await postDesign(telecomSpec());
    const response = await api.http
      .post(`/v1/designs/${created.body.id}/revisions`)
      .send({ spec: telecomSpec({ magnetics: { materialId } }) });
    expect(response.status).toBe(201);
    expect(response.body.revision).toBe(2);
    expect(response.body.spec.magnetics.material.id).toBe(materialId);
    expect(response.body.design.transformer.materialId).toBe(materialId);
  });

  // ref: common practice — a comparison designs every candidate with the same material.
  it('POST /v1/comparisons (user materialId) ranks designs made with the material', async () => {
    const { topology: _topology, ...spec } = telecomSpec({ magnetics: { materialId } });
    const response = await api.http
      .post('/v1/comparisons')
      .send({ spec, topologies: ['flyback', 'two-switch-forward'] });
    expect(response.status).toBe(200);
    expect(response.body.ranked.length).toBeGreaterThan(0);
    for (const entry of response.body.ranked) {
      expect(entry.spec.magnetics.material.id).toBe(materialId);
      expect(entry.design.transformer.materialId).toBe(materialId);
    }
  });
});

describe('POST /v1/jobs with a user material', () => {
  // ref: common practice — a sweep row solves the corner of the design made with the material.
  it('POST /v1/jobs (sweep, user materialId) runs every point with the material', async () => {
    const spec = telecomSpec({ magnetics: { materialId } });
    const grid = { switchingFrequenciesHz: [100e3], loadFractions: [1] };
    const response = await api.http.post('/v1/jobs').send({ kind: 'sweep', input: { spec, grid } });
    expect(response.status).toBe(202);
    const record = await waitForFinish(api.jobs, response.body.id as string);
    expect(record.state).toBe('completed');
    const { output } = record.result as { output: { rows: { feasible: boolean }[] } };
    expect(output.rows.length).toBeGreaterThan(0);
    expect(output.rows.every((row) => row.feasible)).toBe(true);
  });

  it('POST /v1/jobs (sweep, unknown materialId) answers 422 at spec.magnetics.materialId', async () => {
    const spec = telecomSpec({ magnetics: { materialId: 'no-such-material' } });
    const grid = { switchingFrequenciesHz: [100e3], loadFractions: [1] };
    const response = await api.http.post('/v1/jobs').send({ kind: 'sweep', input: { spec, grid } });
    expect(response.status).toBe(422);
    expect(response.body.issues[0].path).toEqual(['spec', 'magnetics', 'materialId']);
  });
});

describe('POST /v1/designs with a materialId that names nothing', () => {
  it('POST /v1/designs (unknown materialId) answers 422 naming magnetics.materialId', async () => {
    const response = await postDesign(
      telecomSpec({ magnetics: { materialId: 'no-such-material' } }),
    );
    expect(response.status).toBe(422);
    expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(response.body).toMatchInlineSnapshot(`
      {
        "detail": "no material has the id that magnetics.materialId names (materialMatchCount 0, 1 needed) (materialId names a built-in class or a stored user material (GET /v1/catalog/materials))",
        "instance": "/v1/designs",
        "issues": [
          {
            "code": "unknown_material",
            "constraint": "materialId names a built-in class or a stored user material (GET /v1/catalog/materials)",
            "limit": 0,
            "path": [
              "magnetics",
              "materialId",
            ],
            "quantity": "materialMatchCount",
            "required": 1,
          },
        ],
        "status": 422,
        "title": "Material is not in the catalog",
        "type": "tag:isolated-converter-design,2026:problem:unknown-material",
      }
    `);
  });

  it('POST /v1/comparisons (unknown materialId) answers 422 before designing', async () => {
    const { topology: _topology, ...spec } = telecomSpec({
      magnetics: { materialId: 'no-such-material' },
    });
    const response = await api.http.post('/v1/comparisons').send({ spec });
    expect(response.status).toBe(422);
    expect(response.body.issues[0].path).toEqual(['magnetics', 'materialId']);
  });

  it('POST /v1/designs (materialId differing from the inline material) answers 400', async () => {
    const spec = telecomSpec({ magnetics: { materialId: 'mnzn-power-low-frequency' } });
    const response = await postDesign({
      ...spec,
      magnetics: {
        ...spec.magnetics,
        material: { ...USER_MATERIAL_DEFAULTS_MATERIAL, id: 'another-id' },
      },
    });
    expect(response.status).toBe(400);
    expect(response.body.errors).toEqual([
      {
        path: ['spec', 'magnetics', 'material', 'id'],
        message: "must equal materialId 'mnzn-power-low-frequency' when both are given",
      },
    ]);
  });
});

/** An invented inline material for the 400 case (numbers only need to be well-formed). */
const USER_MATERIAL_DEFAULTS_MATERIAL: MaterialClass = {
  id: 'invented-inline',
  steinmetz: GENERATING,
  lossTemperatureFactor: { ct2: 0, ct1: 0, ct0: 1 },
  saturation: {
    lowTemperatureC: 25,
    lowFluxDensityT: 0.3,
    highTemperatureC: 100,
    highFluxDensityT: 0.3,
  },
  initialPermeability: 1000,
  initialPermeabilityTolerance: 0.25,
  frequencyMinHz: 50e3,
  frequencyMaxHz: 200e3,
};
