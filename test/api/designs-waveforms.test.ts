import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { withoutWaveforms } from '../../api/designs/waveforms.js';
import { EXAMPLE_COMPARISONS } from '../../api/openapi/example-comparisons.js';
import { EXAMPLE_MATERIALS } from '../../api/openapi/example-materials.js';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { DesignViewSchema } from '../../api/schemas/design-view-schema.js';
import { ProblemSchema } from '../../api/schemas/problem-schema.js';
import type { DesignContent } from '../../api/stores/design-store.js';
import {
  DesignSchema,
  SOLVER_VERSION,
  SpecSchema,
  designConverter,
  designNetlist,
  resultMeta,
  type Design,
} from '../../solvers/index.js';
import { TEST_TENANT, startApiTestApp, type ApiTestApp } from '../helpers/api-test-app.js';

// The API contract of issue 6's opt-in waveforms (the lead's decision): design views leave each
// corner's waveforms out unless include=waveforms; a stored revision keeps none, and a read that
// asks recomputes them from the stored spec under the same solver version (DESIGN.md: same input
// and solver version, same numbers), checked byte for byte against the stored design. These
// check the service's own contract, not engine numbers.

let api: ApiTestApp;
beforeAll(async () => {
  api = await startApiTestApp();
});
afterAll(async () => {
  await api.close();
});

const spec = EXAMPLE_SPECS.packagingAux;
type Corner = { waveforms?: unknown };
const corners = (body: { design: { corners: Corner[] } }) => body.design.corners;

/** The engine's own design of `input` (with waveforms), and its spec as the API resolves it. */
function engineContent(input: unknown): {
  spec: ReturnType<typeof SpecSchema.parse>;
  design: Design;
} {
  const parsed = SpecSchema.parse(input);
  const converted = designConverter(parsed);
  if (!converted.ok) throw new Error(JSON.stringify(converted.issues));
  return { spec: parsed, design: converted.value };
}

function expectProblem(
  response: { status: number; headers: Record<string, string>; body: unknown },
  status: number,
) {
  expect(response.status).toBe(status);
  expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
  return ProblemSchema.parse(response.body);
}

describe('POST /v1/designs and its revisions: waveforms only with include=waveforms', () => {
  it('POST /v1/designs leaves every corner’s waveforms out by default and says so in the schema', async () => {
    const response = await api.http.post('/v1/designs').send({ spec });
    expect(response.status).toBe(201);
    const view = DesignViewSchema.parse(response.body);
    expect(view.design.corners.length).toBeGreaterThan(0);
    for (const corner of view.design.corners) expect(corner).not.toHaveProperty('waveforms');
    expect(response.text).not.toContain('"waveforms"');
    // The engine's schema requires them: the default answer is not a whole engine design.
    expect(DesignSchema.safeParse(view.design).success).toBe(false);
  });

  it('POST /v1/designs?include=waveforms answers the engine’s whole design; without them it is the default answer', async () => {
    const included = await api.http
      .post('/v1/designs')
      .query({ include: 'waveforms' })
      .send({ spec });
    expect(included.status).toBe(201);
    const view = DesignViewSchema.parse(included.body);
    for (const corner of corners(view)) expect(corner.waveforms).toBeDefined();
    // The whole design, as the engine computes it for the same spec (same input, same numbers).
    const engine = engineContent(spec).design;
    expect(DesignSchema.safeParse(view.design).success).toBe(true);
    expect(JSON.stringify(view.design)).toBe(JSON.stringify(engine));
    // What the default answer of the same design would be: the same with the waveforms cut out.
    const plain = await api.http.get(`/v1/designs/${view.id}`);
    expect(plain.status).toBe(200);
    expect(plain.text).toBe(
      JSON.stringify({ ...included.body, design: withoutWaveforms(included.body.design) }),
    );
    expect(included.text.length).toBeGreaterThan(2 * plain.text.length);
  });

  it('GET with include=waveforms is the POST include answer byte for byte (latest and by revision)', async () => {
    const posted = await api.http
      .post('/v1/designs')
      .query({ include: 'waveforms' })
      .send({ spec });
    expect(posted.status).toBe(201);
    const id = posted.body.id as string;
    const latest = await api.http.get(`/v1/designs/${id}`).query({ include: 'waveforms' });
    const first = await api.http
      .get(`/v1/designs/${id}/revisions/1`)
      .query({ include: 'waveforms' });
    expect(latest.status).toBe(200);
    expect(first.status).toBe(200);
    expect(latest.text).toBe(posted.text);
    expect(first.text).toBe(posted.text);
  });

  it('POST /v1/designs/{id}/revisions: default without waveforms, include=waveforms with them, both stored alike', async () => {
    const created = await api.http.post('/v1/designs').send({ spec });
    const id = created.body.id as string;
    const plain = await api.http.post(`/v1/designs/${id}/revisions`).send({ spec });
    const included = await api.http
      .post(`/v1/designs/${id}/revisions`)
      .query({ include: 'waveforms' })
      .send({ spec });
    expect([plain.status, included.status]).toEqual([201, 201]);
    expect(plain.text).not.toContain('"waveforms"');
    for (const corner of corners(included.body)) expect(corner.waveforms).toBeDefined();
    const readThree = await api.http.get(`/v1/designs/${id}/revisions/3`);
    expect(readThree.text).toBe(
      JSON.stringify({ ...included.body, design: withoutWaveforms(included.body.design) }),
    );
    const readThreeIncluded = await api.http
      .get(`/v1/designs/${id}/revisions/3`)
      .query({ include: 'waveforms' });
    expect(readThreeIncluded.text).toBe(included.text);
  });

  it('a design made from a user material gets its waveforms back, the material’s note carried over', async () => {
    const material = await api.http
      .post('/v1/catalog/materials')
      .send(EXAMPLE_MATERIALS.labFerrite);
    expect(material.status).toBe(201);
    const withMaterial = {
      ...spec,
      magnetics: { materialId: material.body.id as string },
    };
    const posted = await api.http
      .post('/v1/designs')
      .query({ include: 'waveforms' })
      .send({ spec: withMaterial });
    expect(posted.status).toBe(201);
    expect(posted.body.design.modelNotes.at(-1)).toMatch(/filled in from the user material/);
    const read = await api.http
      .get(`/v1/designs/${String(posted.body.id)}`)
      .query({ include: 'waveforms' });
    expect(read.status).toBe(200);
    expect(read.text).toBe(posted.text);
  });
});

describe('stored revisions the running solver cannot reproduce', () => {
  /** Stores `content` as a new design of the test tenant, through the store itself. */
  async function stored(content: DesignContent): Promise<string> {
    return (await api.designs.create(TEST_TENANT, content)).id;
  }

  it('a revision of another solver version: default 200, include=waveforms 409 naming both versions and the way out', async () => {
    const { spec: parsed, design } = engineContent(spec);
    const meta = { ...(await resultMeta(parsed)), solverVersion: '0.0.1-older' };
    const id = await stored({ spec: parsed, design: withoutWaveforms(design), meta });
    const plain = await api.http.get(`/v1/designs/${id}`);
    expect(plain.status).toBe(200);
    expect(plain.body.meta.solverVersion).toBe('0.0.1-older');
    for (const path of [`/v1/designs/${id}`, `/v1/designs/${id}/revisions/1`]) {
      const response = await api.http.get(path).query({ include: 'waveforms' });
      const problem = expectProblem(response, 409);
      expect(problem.type).toMatch(/waveforms-not-reproducible$/);
      expect(problem.detail).toContain('0.0.1-older');
      expect(problem.detail).toContain(SOLVER_VERSION);
      expect(problem.detail).toContain(`/v1/designs/${id}/revisions?include=waveforms`);
      expect(response.body.storedSolverVersion).toBe('0.0.1-older');
      expect(response.body.runningSolverVersion).toBe(SOLVER_VERSION);
    }
    // The netlist needs what the waveforms need.
    expectProblem(await api.http.get(`/v1/designs/${id}/netlist`), 409);
    // The way out the problem names: the spec posted again as a new revision, with waveforms.
    const again = await api.http
      .post(`/v1/designs/${id}/revisions`)
      .query({ include: 'waveforms' })
      .send({ spec: plain.body.spec });
    expect(again.status).toBe(201);
    expect(again.body.meta.solverVersion).toBe(SOLVER_VERSION);
    for (const corner of corners(again.body)) expect(corner.waveforms).toBeDefined();
  });

  it('a revision of this solver version whose stored design differs from the recomputed one: 409, not waveforms of other numbers', async () => {
    const { spec: parsed, design } = engineContent(spec);
    const stripped = withoutWaveforms(design);
    const [first, ...rest] = stripped.corners;
    if (first === undefined) throw new Error('no corner');
    // One number off in its last bit: the check is byte for byte.
    const altered = {
      ...stripped,
      corners: [{ ...first, dutyCycle: first.dutyCycle * (1 + Number.EPSILON) }, ...rest],
    } as typeof stripped;
    expect(altered.corners[0]?.dutyCycle).not.toBe(first.dutyCycle);
    const id = await stored({ spec: parsed, design: altered, meta: await resultMeta(parsed) });
    const problem = expectProblem(
      await api.http.get(`/v1/designs/${id}`).query({ include: 'waveforms' }),
      409,
    );
    expect(problem.detail).toMatch(/did not reproduce the stored design byte for byte/);
    expect(problem.detail).toContain('include=waveforms');
  });

  it('a revision stored with its waveforms (before they became opt-in): cut out by default, its own with include', async () => {
    const { spec: parsed, design } = engineContent(spec);
    const meta = { ...(await resultMeta(parsed)), solverVersion: '0.0.1-older' };
    const id = await stored({ spec: parsed, design, meta });
    const plain = await api.http.get(`/v1/designs/${id}`);
    expect(plain.status).toBe(200);
    expect(plain.text).not.toContain('"waveforms"');
    const included = await api.http.get(`/v1/designs/${id}`).query({ include: 'waveforms' });
    expect(included.status).toBe(200);
    expect(JSON.stringify(included.body.design)).toBe(JSON.stringify(design));
    expect(plain.text).toBe(
      JSON.stringify({ ...included.body, design: withoutWaveforms(included.body.design) }),
    );
  });
});

describe('the netlist of a revision stored without waveforms', () => {
  for (const [name, example] of [
    ['active-clamp forward', EXAMPLE_SPECS.fanShelf],
    ['push-pull', EXAMPLE_SPECS.cabDisplay],
  ] as const) {
    it(`GET /v1/designs/{id}/netlist (${name}, whose deck starts from waveform values) is the engine's deck of the whole design`, async () => {
      const created = await api.http.post('/v1/designs').send({ spec: example });
      expect(created.status).toBe(201);
      const { spec: parsed, design } = engineContent(example);
      const label = design.corners.at(-1)?.label ?? '';
      const response = await api.http
        .get(`/v1/designs/${String(created.body.id)}/netlist`)
        .query({ corner: label });
      expect(response.status).toBe(200);
      expect(response.text).toBe(designNetlist(parsed, design, { cornerLabel: label }));
    });
  }
});

describe('include with Idempotency-Key', () => {
  it('a retry with another include is 409 (the query is part of the request), never the other shape', async () => {
    const first = await api.http
      .post('/v1/designs')
      .set('idempotency-key', 'waveforms-key-1')
      .send({ spec });
    expect(first.status).toBe(201);
    const other = await api.http
      .post('/v1/designs')
      .query({ include: 'waveforms' })
      .set('idempotency-key', 'waveforms-key-1')
      .send({ spec });
    expect(expectProblem(other, 409).type).toMatch(/idempotency-key-reused$/);
    const same = await api.http
      .post('/v1/designs')
      .set('idempotency-key', 'waveforms-key-1')
      .send({ spec });
    expect(same.status).toBe(201);
    expect(same.headers['idempotency-replayed']).toBe('true');
    expect(same.text).toBe(first.text);
  });

  it('a retry of an include=waveforms request replays the answer with its waveforms', async () => {
    const send = () =>
      api.http
        .post('/v1/designs')
        .query({ include: 'waveforms' })
        .set('idempotency-key', 'waveforms-key-2')
        .send({ spec });
    const first = await send();
    const retry = await send();
    expect([first.status, retry.status]).toEqual([201, 201]);
    expect(retry.headers['idempotency-replayed']).toBe('true');
    expect(retry.text).toBe(first.text);
    for (const corner of corners(retry.body)) expect(corner.waveforms).toBeDefined();
    const plain = await api.http
      .post('/v1/designs')
      .set('idempotency-key', 'waveforms-key-2')
      .send({ spec });
    expect(plain.status).toBe(409);
  });
});

describe('POST /v1/comparisons and include', () => {
  it('ranked designs come without waveforms by default and with them on include=waveforms', async () => {
    const request = EXAMPLE_COMPARISONS.sensorRackForwards;
    const plain = await api.http.post('/v1/comparisons').send(request);
    const included = await api.http
      .post('/v1/comparisons')
      .query({ include: 'waveforms' })
      .send(request);
    expect([plain.status, included.status]).toEqual([200, 200]);
    expect(plain.body.ranked.length).toBeGreaterThan(0);
    expect(plain.text).not.toContain('"waveforms"');
    for (const entry of included.body.ranked as { design: Design }[]) {
      expect(DesignSchema.safeParse(entry.design).success).toBe(true);
    }
    const { meta: _a, ...plainRest } = plain.body;
    const { meta: _b, ...includedRest } = included.body;
    expect(plainRest).toEqual({
      ...includedRest,
      ranked: (included.body.ranked as { design: Design }[]).map((entry) => ({
        ...entry,
        design: withoutWaveforms(entry.design),
      })),
    });
  });
});

describe('a bad include value', () => {
  it('is 400 problem+json with the path include, on every operation that takes it', async () => {
    const created = await api.http.post('/v1/designs').send({ spec });
    const id = created.body.id as string;
    const requests = [
      api.http.post('/v1/designs').query({ include: 'everything' }).send({ spec }),
      api.http.post(`/v1/designs/${id}/revisions`).query({ include: 'everything' }).send({ spec }),
      api.http.get(`/v1/designs/${id}`).query({ include: 'everything' }),
      api.http.get(`/v1/designs/${id}/revisions/1`).query({ include: 'everything' }),
      api.http
        .post('/v1/comparisons')
        .query({ include: 'everything' })
        .send(EXAMPLE_COMPARISONS.sensorRackForwards),
    ];
    for (const response of await Promise.all(requests)) {
      const problem = expectProblem(response, 400);
      expect(problem.type).toMatch(/invalid-parameter$/);
      expect(response.body.errors).toEqual([
        { path: ['include'], message: expect.stringContaining("'everything'") as unknown },
      ]);
    }
    // Nothing was stored by the refused POSTs: the design still has one revision.
    const revisions = await api.http.get(`/v1/designs/${id}/revisions`);
    expect(revisions.body.items).toHaveLength(1);
  });

  it('names each bad entry of a list by its index; an empty value is bad too', async () => {
    const list = await api.http.get('/v1/designs/x').query('include=waveforms,sizes&include=');
    expectProblem(list, 400);
    expect((list.body.errors as { path: unknown[] }[]).map((error) => error.path)).toEqual([
      ['include', 1],
      ['include', 2],
    ]);
  });
});
