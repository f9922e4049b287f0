import { randomUUID } from 'node:crypto';
import { describe, expect, it, vi } from 'vitest';
import { evaluateSpec } from '../../../api/designs/evaluate-spec.js';
import { EXAMPLE_SPECS } from '../../../api/openapi/example-specs.js';
import { createMemoryMaterialStore } from '../../../api/stores/memory-material-store.js';
import { createRedisDesignStore } from '../../../api/stores/redis-design-store.js';
import { StoreUnavailableError } from '../../../api/stores/store-unavailable-error.js';
import { designStoreContract } from '../../contracts/design-store-contract.js';
import { TEST_TENANT, startApiTestApp } from '../../helpers/api-test-app.js';
import { freePort } from '../../helpers/redis-server.js';
import { useTestRedis } from '../../helpers/use-test-redis.js';
import { SpecSchema } from '../../../solvers/index.js';

const redis = useTestRedis();
const prefixes: string[] = [];

/** A store on the test Redis under a key prefix of its own, so tests never see each other. */
function freshStore() {
  const prefix = `test-${randomUUID()}`;
  prefixes.push(prefix);
  return createRedisDesignStore({ redisUrl: redis.url, keyPrefix: prefix });
}

designStoreContract('createRedisDesignStore()', async () => freshStore());

describe('createRedisDesignStore against a real Redis', () => {
  it('create() never overwrites an existing design: a repeated UUID is refused and another drawn', async () => {
    const store = freshStore();
    const prefix = prefixes.at(-1) as string;
    const evaluated = await evaluateSpec(SpecSchema.parse(EXAMPLE_SPECS.packagingAux), {
      materials: createMemoryMaterialStore(),
      tenant: TEST_TENANT,
    });
    if (!evaluated.ok) throw new Error('the example must be feasible');
    const existing = await store.create(TEST_TENANT, evaluated.value);
    const fresh = randomUUID();
    // The next two UUIDs drawn: the existing design's, then a fresh one.
    const draw = vi
      .spyOn(globalThis.crypto, 'randomUUID')
      .mockReturnValueOnce(existing.id as ReturnType<typeof randomUUID>)
      .mockReturnValueOnce(fresh as ReturnType<typeof randomUUID>);
    try {
      const created = await store.create(TEST_TENANT, evaluated.value);
      expect(created.id).toBe(fresh);
    } finally {
      draw.mockRestore();
    }
    expect(await store.listRevisions(TEST_TENANT, existing.id)).toHaveLength(1);
    expect(await store.listRevisions(TEST_TENANT, fresh)).toHaveLength(1);
    // create() stages the new lists under keys of their own; none outlives its transaction.
    expect(await redis.admin.keys(`${prefix}:*staged*`)).toEqual([]);
    expect((await redis.admin.keys(`${prefix}:*`)).sort()).toEqual(
      [existing.id, fresh]
        .flatMap((id) => [
          `${prefix}:tenant:${TEST_TENANT}:design:{${id}}:revisions`,
          `${prefix}:tenant:${TEST_TENANT}:design:{${id}}:summaries`,
        ])
        .sort(),
    );
    await store.close();
  });

  it('a revision written by one store instance is read by another on the same Redis', async () => {
    const writer = freshStore();
    const prefix = prefixes.at(-1) as string;
    const api = await startApiTestApp({ designs: writer });
    try {
      const created = await api.http.post('/v1/designs').send({ spec: EXAMPLE_SPECS.packagingAux });
      expect(created.status).toBe(201);
      const reader = createRedisDesignStore({ redisUrl: redis.url, keyPrefix: prefix });
      expect(await reader.latest(TEST_TENANT, created.body.id)).toEqual({
        id: created.body.id,
        revision: 1,
        spec: created.body.spec,
        design: created.body.design,
        meta: created.body.meta,
        contentJson: Buffer.from(
          JSON.stringify({
            spec: created.body.spec,
            design: created.body.design,
            meta: created.body.meta,
          }),
        ),
      });
      await reader.close();
    } finally {
      await api.close();
    }
  });

  it('every method rejects with StoreUnavailableError when Redis does not answer', async () => {
    const port = await freePort();
    const store = createRedisDesignStore({
      redisUrl: `redis://127.0.0.1:${port}`,
      commandTimeoutMs: 300,
    });
    const id = randomUUID();
    expect(await store.isReady()).toBe(false);
    await expect(store.latest(TEST_TENANT, id)).rejects.toBeInstanceOf(StoreUnavailableError);
    await expect(store.revision(TEST_TENANT, id, 1)).rejects.toBeInstanceOf(StoreUnavailableError);
    await expect(store.listRevisions(TEST_TENANT, id)).rejects.toBeInstanceOf(
      StoreUnavailableError,
    );
    await store.close();
  });

  it('the API answers 503 with Retry-After when the Redis store is down, and /readyz says so', async () => {
    const port = await freePort();
    const store = createRedisDesignStore({
      redisUrl: `redis://127.0.0.1:${port}`,
      commandTimeoutMs: 300,
    });
    const api = await startApiTestApp({ designs: store });
    try {
      const created = await api.http.post('/v1/designs').send({ spec: EXAMPLE_SPECS.packagingAux });
      expect(created.status).toBe(503);
      expect(created.headers['retry-after']).toBe(String(api.config.retryAfterS));
      expect(created.headers['content-type']).toMatch(/^application\/problem\+json/);
      const read = await api.http.get(`/v1/designs/${randomUUID()}`);
      expect(read.status).toBe(503);
      const ready = await api.http.get('/readyz');
      expect(ready.status).toBe(503);
      expect(ready.body.checks).toEqual({ designStore: 'down', jobBackend: 'up' });
    } finally {
      await api.close();
    }
  });
});
