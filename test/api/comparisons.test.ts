import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CAUTION } from '../../api/caution.js';
import { issuesDetail } from '../../api/issue-messages.js';
import { EXAMPLE_COMPARISONS } from '../../api/openapi/example-comparisons.js';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { ComparisonViewSchema } from '../../api/schemas/comparison-view-schema.js';
import { ProblemSchema } from '../../api/schemas/problem-schema.js';
import { SCHEMA_VERSION, SOLVER_VERSION, TOPOLOGY_IDS, type Issue } from '../../solvers/index.js';
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

const compare = (body: unknown) => api.http.post('/v1/comparisons').send(body as object);

describe('POST /v1/comparisons', () => {
  it('POST /v1/comparisons answers 200 with every topology, ranked by nominal efficiency, meta and the caution', async () => {
    const response = await compare(EXAMPLE_COMPARISONS.sensorRack);
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toMatch(/^application\/json/);
    expect(response.headers.location).toBeUndefined();
    expectFiniteJson(response.text);
    const body = ComparisonViewSchema.parse(response.body);
    expect(body.rankBy).toBe('efficiency-nominal');
    expect(body.order).toBe('higher-first');
    expect(body.topologies).toEqual([...TOPOLOGY_IDS]);
    expect(body.ranked.length + body.rejected.length).toBe(TOPOLOGY_IDS.length);
    expect(body.ranked.map((entry) => entry.rank)).toEqual(body.ranked.map((_, i) => i + 1));
    for (const entry of body.ranked) {
      expect(entry.spec.topology).toBe(entry.topology);
      expect(entry.design.topology).toBe(entry.topology);
      expectClose(entry.figure, entry.design.summary.efficiencyNominal, { rel: 0 });
    }
    const figures = body.ranked.map((entry) => entry.figure);
    expect(figures).toEqual(figures.toSorted((a, b) => b - a));
    expect(body.caution).toBe(CAUTION);
    expect(body.meta.solverVersion).toBe(SOLVER_VERSION);
    expect(body.meta.schemaVersion).toBe(SCHEMA_VERSION);
    expect(body.meta.inputHash).toMatch(/^[0-9a-f]{64}$/);
  });

  it('POST /v1/comparisons lists each rejected topology with the issues and the detail a 422 gives it', async () => {
    const response = await compare(EXAMPLE_COMPARISONS.conveyorHoldUp);
    expect(response.status).toBe(200);
    const body = ComparisonViewSchema.parse(response.body);
    expect(body.rankBy).toBe('loss-largest');
    expect(body.order).toBe('lower-first');
    const rejected = body.rejected.map((entry) => entry.topology);
    // ref: common practice: on a 420 V bus the flyback's and the reset-winding forward's single
    // switch sees more than the 0.9 × 500 V derated rating; a two-switch forward's sees 420 V
    expect(rejected).toEqual(expect.arrayContaining(['flyback', 'forward-reset-winding']));
    expect(body.ranked.map((entry) => entry.topology)).toContain('two-switch-forward');
    for (const entry of body.rejected) {
      expect(entry.issues.map((issue) => issue.code)).toContain('switch_voltage_rating');
      expect(entry.detail).toBe(issuesDetail(entry.issues as Issue[]));
      // The same spec sent to /v1/designs is refused with the same issues and words.
      const alone = await api.http.post('/v1/designs').send({ spec: entry.spec });
      expect(alone.status).toBe(422);
      const problem = ProblemSchema.parse(alone.body);
      expect(problem.detail).toBe(entry.detail);
      expect(problem.issues).toEqual(entry.issues);
    }
  });

  it('POST /v1/comparisons with holdUp gives every ranked design its bulk capacitor', async () => {
    const response = await compare(EXAMPLE_COMPARISONS.conveyorHoldUp);
    const body = ComparisonViewSchema.parse(response.body);
    expect(body.ranked.length).toBeGreaterThan(0);
    for (const entry of body.ranked) {
      const block = entry.design.holdUp;
      if (!block) throw new Error(`no holdUp block for ${entry.topology}`);
      // ref: spec contract, the defaults are inputVoltageNominalV and inputVoltageMinV
      expect([block.startVoltageV, block.endVoltageV, block.timeS]).toEqual([400, 330, 0.02]);
      // ref: common practice, ½·C·(V1² − V2²) = P·t (stored energy of a capacitor, ½·C·V²)
      expectClose(0.5 * block.bulkCapacitanceF * (400 ** 2 - 330 ** 2), block.inputPowerW * 0.02, {
        rel: 1e-12,
      });
    }
  });

  it('POST /v1/comparisons with topologies designs only those, in registry order', async () => {
    const response = await compare(EXAMPLE_COMPARISONS.sensorRackForwards);
    expect(response.status).toBe(200);
    const body = ComparisonViewSchema.parse(response.body);
    const asked = ['two-switch-forward', 'forward-reset-winding'];
    expect(body.topologies).toEqual(TOPOLOGY_IDS.filter((id) => asked.includes(id)));
    const seen = [...body.ranked, ...body.rejected].map((entry) => entry.topology);
    expect(seen.toSorted()).toEqual(asked.toSorted());
    expect(body.rankBy).toBe('switch-voltage-utilization');
    for (const entry of body.ranked) {
      // ref: common practice, voltage utilization = peak blocking voltage / rated voltage (200 V)
      expectClose(entry.figure, entry.design.summary.switchVoltagePeakV / 200, { rel: 1e-12 });
    }
  });

  it('POST /v1/comparisons hashes what it evaluated: the ignored topology and the list order do not count', async () => {
    const { spec } = EXAMPLE_COMPARISONS.sensorRack;
    const [plain, withTopology, listed, reordered, otherFigure] = await Promise.all([
      compare({ spec }),
      compare({ spec: { ...spec, topology: 'flyback' } }),
      compare({ spec, topologies: [...TOPOLOGY_IDS] }),
      compare({ spec, topologies: [...TOPOLOGY_IDS].reverse(), rankBy: 'efficiency-nominal' }),
      compare({ spec, rankBy: 'efficiency-lowest' }),
    ]);
    const hash = plain.body.meta.inputHash;
    expect(withTopology.body.meta.inputHash).toBe(hash);
    expect(listed.body.meta.inputHash).toBe(hash);
    expect(reordered.body.meta.inputHash).toBe(hash);
    expect(reordered.body.ranked).toEqual(plain.body.ranked);
    expect(otherFigure.body.meta.inputHash).not.toBe(hash);
  });

  it("POST /v1/designs with a ranked entry's spec keeps that design, the same numbers and hash", async () => {
    const comparison = ComparisonViewSchema.parse(
      (await compare(EXAMPLE_COMPARISONS.sensorRack)).body,
    );
    const best = comparison.ranked[0];
    if (!best) throw new Error('no feasible topology');
    const kept = await api.http.post('/v1/designs').send({ spec: best.spec });
    expect(kept.status).toBe(201);
    expect(kept.body.design).toEqual(best.design);
    expect(kept.body.spec).toEqual(best.spec);
    const again = await api.http
      .post('/v1/designs')
      .send({ spec: { ...EXAMPLE_SPECS.sensorRack, topology: best.topology } });
    expect(again.body.meta.inputHash).toBe(kept.body.meta.inputHash);
  });

  it('POST /v1/comparisons with bad fields answers 400 with the path of each', async () => {
    const response = await compare(EXAMPLE_COMPARISONS.badFields);
    expect(response.status).toBe(400);
    expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
    const body = ProblemSchema.parse(response.body);
    expect(body.errors?.map((error) => error.path)).toEqual([
      ['spec', 'holdUp', 'endVoltageV'],
      ['topologies', 0],
      ['rankBy'],
    ]);
    expect(body.errors?.[0]?.message).toMatchInlineSnapshot(
      `"end voltage 44 V must be below start voltage 40 V (defaults: start inputVoltageNominalV, end inputVoltageMinV)"`,
    );
  });

  it('POST /v1/comparisons with a missing field, an empty list or an unknown key answers 400 with their paths', async () => {
    const { switchingFrequencyHz: _dropped, ...spec } = EXAMPLE_COMPARISONS.sensorRack.spec;
    const response = await compare({ spec, topologies: [], extra: 1 });
    expect(response.status).toBe(400);
    const body = ProblemSchema.parse(response.body);
    expect(body.errors?.map((error) => error.path)).toEqual([
      ['spec', 'switchingFrequencyHz'],
      ['topologies'],
      ['extra'],
    ]);
  });

  it('GET /v1/comparisons answers 405 with Allow: POST', async () => {
    const response = await api.http.get('/v1/comparisons');
    expect(response.status).toBe(405);
    expect(response.headers.allow).toBe('POST');
  });
});
