import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EXAMPLE_MATERIALS } from '../../api/openapi/example-materials.js';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { ProblemSchema } from '../../api/schemas/problem-schema.js';
import { startApiTestApp, type ApiTestApp } from '../helpers/api-test-app.js';

// Bearer tokens as RFC 6750 defines them (401 with WWW-Authenticate: Bearer when missing or
// invalid, 403 for a valid token without the rights); the roles and tenants are issue 6's.

let api: ApiTestApp;
beforeAll(async () => {
  api = await startApiTestApp();
});
afterAll(async () => {
  await api.close();
});

const spec = EXAMPLE_SPECS.packagingAux;

describe('authentication', () => {
  it('health, readiness and the OpenAPI document answer without a key', async () => {
    for (const path of ['/healthz', '/readyz', '/openapi.json']) {
      expect((await api.anonymous.get(path)).status).toBe(200);
    }
  });

  it('every other route without a key is 401 problem+json with WWW-Authenticate: Bearer', async () => {
    for (const [method, path] of [
      ['post', '/v1/designs'],
      ['get', '/v1/designs/x'],
      ['get', '/v1/catalog/core-shapes'],
      ['get', '/v1/jobs/x'],
      ['get', '/metrics'],
      ['get', '/v1/admin/keys'],
    ] as const) {
      const response = await api.anonymous[method](path);
      expect(response.status, `${method} ${path}`).toBe(401);
      expect(response.headers['www-authenticate']).toMatch(/^Bearer /);
      expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
      expect(ProblemSchema.parse(response.body).status).toBe(401);
    }
  });

  it('a malformed, unknown or wrong-secret key is 401, all alike', async () => {
    const wrongSecret = api.token.slice(0, -4) + (api.token.endsWith('AAAA') ? 'BBBB' : 'AAAA');
    const unknown = `icd_0123456789abcdef_${'A'.repeat(43)}`;
    for (const token of ['not-a-key', unknown, wrongSecret]) {
      const response = await api.anonymous
        .get('/v1/catalog/wires')
        .set('authorization', `Bearer ${token}`);
      expect(response.status, token).toBe(401);
      expect(response.body.detail).toBe('the API key is not valid (unknown, revoked or mistyped)');
    }
  });
});

describe('roles', () => {
  it("a 'read' key reads but may not create (403)", async () => {
    const reader = await api.as('test-tenant', 'read');
    expect((await reader.get('/v1/catalog/core-shapes')).status).toBe(200);
    const post = await reader.post('/v1/designs').send({ spec });
    expect(post.status).toBe(403);
    expect(post.body.detail).toMatch(/role 'read'.*needs 'design'/);
  });

  it("a 'design' key designs but may not manage keys (403)", async () => {
    const designer = await api.as('test-tenant', 'design');
    expect((await designer.post('/v1/designs').send({ spec })).status).toBe(201);
    expect((await designer.get('/v1/admin/keys')).status).toBe(403);
  });

  it('an admin creates a key (shown once), lists keys without secrets, and revokes one', async () => {
    const created = await api.http
      .post('/v1/admin/keys')
      .send({ role: 'read', label: 'dashboard' });
    expect(created.status).toBe(201);
    const token = String(created.body.key);
    expect(token).toMatch(/^icd_[0-9a-f]{16}_/);
    expect(created.body).toMatchObject({ tenant: 'test-tenant', role: 'read', label: 'dashboard' });
    const listed = await api.http.get('/v1/admin/keys');
    const entry = listed.body.items.find((item: { id: string }) => item.id === created.body.id);
    expect(entry).toBeDefined();
    expect(JSON.stringify(listed.body)).not.toContain(token.slice(-43));
    expect(entry).not.toHaveProperty('hash');
    const withKey = () =>
      api.anonymous.get('/v1/catalog/wires').set('authorization', `Bearer ${token}`);
    expect((await withKey()).status).toBe(200);
    expect((await api.http.delete(`/v1/admin/keys/${String(created.body.id)}`)).status).toBe(204);
    expect((await withKey()).status).toBe(401);
  });
});

describe('tenant isolation: another tenant’s id answers 404 exactly as an unknown one', () => {
  it('designs: read, revisions, one revision, netlist, and appending a revision', async () => {
    const other = await api.as('other-tenant', 'design');
    const created = await api.http.post('/v1/designs').send({ spec });
    const id = String(created.body.id);
    const unknown = '00000000-0000-4000-8000-000000000000';
    for (const path of ['', '/revisions', '/revisions/1', '/netlist']) {
      const theirs = await other.get(`/v1/designs/${id}${path}`);
      const none = await other.get(`/v1/designs/${unknown}${path}`);
      expect(theirs.status, path).toBe(404);
      expect(theirs.body.title).toBe(none.body.title);
      expect(theirs.body.detail).toBe(String(none.body.detail).replace(unknown, id));
    }
    const append = await other.post(`/v1/designs/${id}/revisions`).send({ spec });
    expect(append.status).toBe(404);
    expect((await api.http.get(`/v1/designs/${id}/revisions`)).body.items).toHaveLength(1);
  });

  it('user materials: read, listing, and designing with its id', async () => {
    const other = await api.as('other-tenant', 'design');
    const created = await api.http
      .post('/v1/catalog/materials')
      .send({ ...EXAMPLE_MATERIALS.labFerrite, name: 'isolation-ferrite' });
    expect(created.status).toBe(201);
    const id = String(created.body.id);
    expect((await other.get(`/v1/catalog/materials/${id}`)).status).toBe(404);
    const listed = await other.get('/v1/catalog/materials');
    expect(listed.body.items.map((item: { id: string }) => item.id)).not.toContain(id);
    const design = await other
      .post('/v1/designs')
      .send({ spec: { ...spec, magnetics: { materialId: id } } });
    expect(design.status).toBe(422);
    expect(design.body.type).toMatch(/unknown-material$/);
    // The same name is free in the other tenant.
    const same = await other
      .post('/v1/catalog/materials')
      .send({ ...EXAMPLE_MATERIALS.labFerrite, name: 'isolation-ferrite' });
    expect(same.status).toBe(201);
  });

  it('jobs: read, result, events and cancel', async () => {
    const other = await api.as('other-tenant', 'design');
    const submitted = await api.http
      .post('/v1/jobs')
      .send({ kind: 'sweep', input: { spec, grid: { loadFractions: [0.5, 1] } } });
    expect(submitted.status).toBe(202);
    const id = String(submitted.body.id);
    const unknown = '00000000-0000-4000-8000-000000000000';
    for (const path of ['', '/result', '/events']) {
      const theirs = await other.get(`/v1/jobs/${id}${path}`);
      const none = await other.get(`/v1/jobs/${unknown}${path}`);
      expect(theirs.status, path).toBe(404);
      expect(theirs.body.detail).toBe(String(none.body.detail).replace(unknown, id));
    }
    expect((await other.delete(`/v1/jobs/${id}`)).status).toBe(404);
    // The owner still sees it, uncancelled by the other tenant's attempt.
    const mine = await api.http.get(`/v1/jobs/${id}`);
    expect(mine.status).toBe(200);
    expect(mine.body.state).not.toBe('cancelled');
  });

  it('API keys: another tenant’s admin cannot revoke a key it does not own', async () => {
    const otherAdmin = await api.as('other-tenant', 'admin');
    const created = await api.http.post('/v1/admin/keys').send({ role: 'read', label: 'mine' });
    const revoke = await otherAdmin.delete(`/v1/admin/keys/${String(created.body.id)}`);
    expect(revoke.status).toBe(404);
    const listed = await otherAdmin.get('/v1/admin/keys');
    expect(listed.body.items.map((item: { id: string }) => item.id)).not.toContain(created.body.id);
  });

  it('idempotency keys are per tenant: the same key in two tenants creates two designs', async () => {
    const other = await api.as('other-tenant', 'design');
    const mine = await api.http
      .post('/v1/designs')
      .set('idempotency-key', 'shared-k')
      .send({ spec });
    const theirs = await other
      .post('/v1/designs')
      .set('idempotency-key', 'shared-k')
      .send({ spec });
    expect(mine.status).toBe(201);
    expect(theirs.status).toBe(201);
    expect(theirs.headers['idempotency-replayed']).toBeUndefined();
    expect(theirs.body.id).not.toBe(mine.body.id);
  });
});

describe('job quota per tenant', () => {
  it('past JOBS_PER_TENANT_MAX unfinished jobs a tenant gets 429 with Retry-After; another tenant does not', async () => {
    const limited = await startApiTestApp({ config: { jobsPerTenantMax: 1 } });
    try {
      // A sweep long enough to stay unfinished while the next submissions arrive.
      const long = {
        kind: 'sweep',
        input: {
          spec,
          grid: { inputVoltagesV: Array.from({ length: 400 }, (_, i) => 36 + i * 0.09) },
        },
      };
      const first = await limited.http.post('/v1/jobs').send(long);
      expect(first.status).toBe(202);
      const second = await limited.http.post('/v1/jobs').send(long);
      expect(second.status).toBe(429);
      expect(second.body.type).toMatch(/too-many-jobs$/);
      expect(second.body.detail).toMatch(/1 unfinished jobs; at most 1/);
      expect(Number(second.headers['retry-after'])).toBeGreaterThanOrEqual(1);
      const other = await limited.as('other-tenant', 'design');
      const theirs = await other.post('/v1/jobs').send(long);
      expect(theirs.status).toBe(202);
      // Once cancelled, the first no longer counts.
      await limited.http.delete(`/v1/jobs/${String(first.body.id)}`);
      for (let i = 0; i < 200; i += 1) {
        const job = await limited.http.get(`/v1/jobs/${String(first.body.id)}`);
        if (job.body.state === 'cancelled') break;
        await new Promise((resolve) => setTimeout(resolve, 20));
      }
      expect((await limited.http.post('/v1/jobs').send(long)).status).toBe(202);
    } finally {
      await limited.close();
    }
  });
});

describe('rate limit', () => {
  it('past RATE_LIMIT_PER_MINUTE a key gets 429 with Retry-After; another key does not', async () => {
    const limited = await startApiTestApp({ config: { rateLimitPerMinute: 3 } });
    try {
      const statuses: number[] = [];
      let last;
      for (let i = 0; i < 4; i += 1) {
        last = await limited.http.get('/v1/catalog/wires');
        statuses.push(last.status);
      }
      // A window boundary may fall between the calls; then the count restarts once.
      expect(statuses.filter((status) => status === 429).length).toBeLessThanOrEqual(1);
      if (statuses[3] === 429) {
        const seconds = Number(last?.headers['retry-after']);
        expect(seconds).toBeGreaterThanOrEqual(1);
        expect(seconds).toBeLessThanOrEqual(60);
        expect(last?.headers['content-type']).toMatch(/^application\/problem\+json/);
      }
      const other = await limited.as('test-tenant', 'read');
      expect((await other.get('/v1/catalog/wires')).status).toBe(200);
    } finally {
      await limited.close();
    }
  });
});
