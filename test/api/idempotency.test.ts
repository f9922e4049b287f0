import { Hono } from 'hono';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { toProblem } from '../../api/errors/to-problem.js';
import { idempotency } from '../../api/idempotency/idempotency.js';
import { createMemoryIdempotencyStore } from '../../api/idempotency/memory-idempotency-store.js';
import { problem } from '../../api/problem.js';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { ProblemSchema } from '../../api/schemas/problem-schema.js';
import { startApiTestApp, type ApiTestApp } from '../helpers/api-test-app.js';

// The behaviour checked here follows the IETF draft "The Idempotency-Key HTTP Header Field"
// (draft-ietf-httpapi-idempotency-key-header), except that a reused key answers 409 (issue 6).

let api: ApiTestApp;
beforeAll(async () => {
  api = await startApiTestApp();
});
afterAll(async () => {
  await api.close();
});

const spec = EXAMPLE_SPECS.packagingAux;

describe('Idempotency-Key on POST', () => {
  it('a retried design creation returns the first response and creates nothing new', async () => {
    const first = await api.http
      .post('/v1/designs')
      .set('idempotency-key', 'create-design-1')
      .send({ spec });
    expect(first.status).toBe(201);
    expect(first.headers['content-type']).toBe('application/json; charset=utf-8');
    expect(first.headers['x-request-id']).toBeDefined();
    const retry = await api.http
      .post('/v1/designs')
      .set('idempotency-key', 'create-design-1')
      .send({ spec });
    expect(retry.status).toBe(201);
    expect(retry.headers['idempotency-replayed']).toBe('true');
    expect(retry.headers.location).toBe(first.headers.location);
    expect(retry.text).toBe(first.text);
    // Only one revision exists under that id, and no second design appeared.
    const revisions = await api.http.get(`/v1/designs/${String(first.body.id)}/revisions`);
    expect(revisions.body.items).toHaveLength(1);
    const without = await api.http.post('/v1/designs').send({ spec });
    expect(without.body.id).not.toBe(first.body.id);
  });

  it('the same key with another body is 409 problem+json and executes nothing', async () => {
    await api.http.post('/v1/designs').set('idempotency-key', 'create-design-2').send({ spec });
    const other = await api.http
      .post('/v1/designs')
      .set('idempotency-key', 'create-design-2')
      .send({ spec: EXAMPLE_SPECS.logicSupply });
    expect(other.status).toBe(409);
    expect(other.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(ProblemSchema.parse(other.body).type).toMatch(/idempotency-key-reused$/);
  });

  it('the same key on another path is 409 too (the key names one request)', async () => {
    await api.http.post('/v1/designs').set('idempotency-key', 'create-design-3').send({ spec });
    const job = await api.http
      .post('/v1/jobs')
      .set('idempotency-key', 'create-design-3')
      .send({ kind: 'sweep', input: { spec } });
    expect(job.status).toBe(409);
  });

  it('a retried job submission returns the same job id', async () => {
    const body = { kind: 'sweep', input: { spec, grid: { loadFractions: [0.5, 1] } } };
    const first = await api.http.post('/v1/jobs').set('idempotency-key', 'job-1').send(body);
    expect(first.status).toBe(202);
    const retry = await api.http.post('/v1/jobs').set('idempotency-key', 'job-1').send(body);
    expect(retry.status).toBe(202);
    expect(retry.body.id).toBe(first.body.id);
    expect(retry.headers['idempotency-replayed']).toBe('true');
  });

  it('a 4xx answer is kept and replayed as well (the same request stays invalid)', async () => {
    const bad = { spec: { ...spec, switchingFrequencyHz: -1 } };
    const first = await api.http.post('/v1/designs').set('idempotency-key', 'bad-1').send(bad);
    expect(first.status).toBe(400);
    const retry = await api.http.post('/v1/designs').set('idempotency-key', 'bad-1').send(bad);
    expect(retry.status).toBe(400);
    expect(retry.headers['idempotency-replayed']).toBe('true');
  });

  it('of two concurrent sends with one key, one executes; the other waits its turn or replays', async () => {
    const send = () =>
      api.http.post('/v1/designs').set('idempotency-key', 'concurrent-1').send({ spec });
    const [a, b] = await Promise.all([send(), send()]);
    const executed = [a, b].filter((r) => r.status === 201 && !r.headers['idempotency-replayed']);
    expect(executed).toHaveLength(1);
    const other = a === executed[0] ? b : a;
    if (other.status === 409) {
      expect(ProblemSchema.parse(other.body).type).toMatch(/idempotency-in-progress$/);
      expect(other.headers['retry-after']).toBe('1');
    } else {
      expect(other.headers['idempotency-replayed']).toBe('true');
      expect(other.body.id).toBe(executed[0]?.body.id);
    }
  });

  it('an unacceptable key is 400 naming the header', async () => {
    const response = await api.http
      .post('/v1/designs')
      .set('idempotency-key', 'x'.repeat(256))
      .send({ spec });
    expect(response.status).toBe(400);
    expect(String(response.body.detail)).toMatch(/Idempotency-Key/);
  });
});

describe('idempotency middleware around a slow handler', () => {
  /** An app whose POST /v1/slow waits for `release` and counts its executions. */
  function slowApp() {
    let executions = 0;
    let open: () => void = () => {};
    const gate = new Promise<void>((resolve) => (open = resolve));
    const app = new Hono();
    app.use('*', idempotency({ store: createMemoryIdempotencyStore(), ttlMs: 60_000 }));
    app.post('/v1/slow', async (c) => {
      executions += 1;
      await gate;
      return c.json({ executions }, 201);
    });
    app.post('/v1/broken', () => {
      executions += 1;
      throw new Error('an engine bug');
    });
    app.onError((error, c) => {
      const found = toProblem(error, { retryAfterS: 5 });
      return problem(c, found.problemType, found.details);
    });
    return { app, release: () => open(), executions: () => executions };
  }
  const post = (app: Hono, path: string, key: string) =>
    app.fetch(
      new Request(`http://local${path}`, {
        method: 'POST',
        headers: { 'idempotency-key': key, 'content-type': 'application/json' },
        body: '{}',
      }),
    );

  it('a retry while the first still runs is 409 with Retry-After; after it, a replay', async () => {
    const { app, release, executions } = slowApp();
    const first = post(app, '/v1/slow', 'k');
    await new Promise((resolve) => setTimeout(resolve, 10));
    const during = await post(app, '/v1/slow', 'k');
    expect(during.status).toBe(409);
    expect(during.headers.get('retry-after')).toBe('1');
    expect(String(((await during.json()) as { type: string }).type)).toMatch(
      /idempotency-in-progress$/,
    );
    release();
    expect((await first).status).toBe(201);
    const after = await post(app, '/v1/slow', 'k');
    expect(after.status).toBe(201);
    expect(after.headers.get('idempotency-replayed')).toBe('true');
    expect(executions()).toBe(1);
  });

  it('a 5xx is not kept: the retry executes again', async () => {
    const { app, executions } = slowApp();
    expect((await post(app, '/v1/broken', 'b')).status).toBe(500);
    expect((await post(app, '/v1/broken', 'b')).status).toBe(500);
    expect(executions()).toBe(2);
  });
});
