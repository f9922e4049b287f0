import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { DesignViewSchema } from '../../api/schemas/design-view-schema.js';
import { ProblemSchema } from '../../api/schemas/problem-schema.js';
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

const spec = EXAMPLE_SPECS.fanShelf;

describe('POST /v1/designs (active-clamp forward)', () => {
  it('POST /v1/designs with an active-clamp forward spec answers 201 with its clamp at every corner', async () => {
    const response = await api.http.post('/v1/designs').send({ spec });
    expect(response.status).toBe(201);
    expect(response.headers['content-type']).toMatch(/^application\/json/);
    expectFiniteJson(response.text);
    const body = DesignViewSchema.parse(response.body);
    expect(body.design.topology).toBe('active-clamp-forward');
    if (body.design.topology !== 'active-clamp-forward') return;
    expect(body.design.corners).toHaveLength(9);
    const lowest = body.design.corners.find((c) => c.label === 'min-input/100pct-load');
    // ref: common practice, an active clamp allows the duty cycle above 0.5
    expect(lowest?.dutyCycle ?? NaN).toBeGreaterThan(0.5);
    // ref: spec contract, the turns ratio is chosen for the 0.6 target, then rounded to the whole
    // turns of the designed transformer, which moves the duty cycle by a few percent
    expectClose(lowest?.dutyCycle ?? NaN, 0.6, { rel: 0.1 });
    for (const corner of body.design.corners) {
      const d = corner.dutyCycle;
      // ref: Erickson & Maksimović, 2nd ed., §2.2 (from memory): volt-second balance on Lm,
      // Vc ≈ Vin·D/(1 − D); the drops and the dead time move it by a few percent
      expectClose(corner.activeClamp.capacitorVoltageV, (corner.inputVoltageV * d) / (1 - d), {
        rel: 0.1,
      });
    }
  });

  it('POST /v1/designs with a 100 V switch on 72 V answers 422 naming the switch rating and its numbers', async () => {
    const response = await api.http
      .post('/v1/designs')
      .send({ spec: { ...spec, primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 100 } } });
    expect(response.status).toBe(422);
    expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
    const body = ProblemSchema.parse(response.body);
    const issue = body.issues?.find(
      (i) => i.code === 'switch_voltage_rating' && i.corner === 'max-input/100pct-load',
    );
    expect(issue, JSON.stringify(body)).toBeDefined();
    // ref: common practice, the limit is switchVoltageDerating (0.9 by default) × the rating
    expectClose(issue?.limit ?? NaN, 90, { rel: 1e-12 });
    expect(issue?.required ?? NaN).toBeGreaterThan(90);
  });

  it('POST /v1/designs with a duty-cycle target above dutyCycleMax answers 422 with both numbers', async () => {
    const response = await api.http
      .post('/v1/designs')
      .send({ spec: { ...spec, targets: { dutyCycleTarget: 0.7 } } });
    expect(response.status).toBe(422);
    const body = ProblemSchema.parse(response.body);
    const issue = body.issues?.find((i) => i.code === 'duty_cycle_limit');
    // ref: common practice (the spec's default limits.dutyCycleMax 0.65 against the target)
    expectClose(issue?.required ?? NaN, 0.7, { rel: 0 });
    expectClose(issue?.limit ?? NaN, 0.65, { rel: 0 });
  });
});
