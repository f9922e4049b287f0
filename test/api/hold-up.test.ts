import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { DesignViewSchema } from '../../api/schemas/design-view-schema.js';
import { ProblemSchema } from '../../api/schemas/problem-schema.js';
import { startApiTestApp, type ApiTestApp } from '../helpers/api-test-app.js';
import { expectClose } from '../helpers/expect-close.js';

let api: ApiTestApp;
beforeAll(async () => {
  api = await startApiTestApp();
});
afterAll(async () => {
  await api.close();
});

const spec = EXAMPLE_SPECS.conveyorControls;

describe('POST /v1/designs with holdUp', () => {
  it('POST /v1/designs with holdUp answers 201 with the hold-up block and echoes holdUp as sent', async () => {
    const response = await api.http
      .post('/v1/designs')
      .send({ spec: { ...spec, holdUp: { timeS: 0.02, endVoltageV: 340 } } });
    expect(response.status).toBe(201);
    const body = DesignViewSchema.parse(response.body);
    expect(body.spec.holdUp).toEqual({ timeS: 0.02, endVoltageV: 340 });
    const block = body.design.holdUp;
    if (!block) throw new Error('no holdUp block');
    expect(block.origins).toEqual({ startVoltageV: 'default', endVoltageV: 'spec' });
    // ref: common practice, ½·C·(V1² − V2²) = P·t (stored energy of a capacitor, ½·C·V²)
    expectClose(0.5 * block.bulkCapacitanceF * (400 ** 2 - 340 ** 2), block.energyJ, {
      rel: 1e-12,
    });
  });

  it('POST /v1/designs without holdUp has no hold-up block and hashes as before the field existed', async () => {
    const [plain, held] = await Promise.all([
      api.http.post('/v1/designs').send({ spec }),
      api.http.post('/v1/designs').send({ spec: { ...spec, holdUp: { timeS: 0.02 } } }),
    ]);
    expect('holdUp' in plain.body.spec).toBe(false);
    expect('holdUp' in plain.body.design).toBe(false);
    // Consistency check, no outside reference: the block is the only difference.
    const { holdUp: _block, ...rest } = held.body.design;
    expect(rest).toEqual(plain.body.design);
    expect(held.body.meta.inputHash).not.toBe(plain.body.meta.inputHash);
  });

  it('POST /v1/designs with a hold-up end below the minimum input answers 400 naming the field and the numbers', async () => {
    const response = await api.http
      .post('/v1/designs')
      .send({ spec: { ...spec, holdUp: { timeS: 0.02, endVoltageV: 250 } } });
    expect(response.status).toBe(400);
    const body = ProblemSchema.parse(response.body);
    expect(body.errors).toMatchInlineSnapshot(`
      [
        {
          "message": "end voltage 250 V must be at least inputVoltageMinV 330 V",
          "path": [
            "spec",
            "holdUp",
            "endVoltageV",
          ],
        },
      ]
    `);
  });
});
