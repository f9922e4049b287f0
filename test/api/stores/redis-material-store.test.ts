import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { EXAMPLE_MATERIALS } from '../../../api/openapi/example-materials.js';
import { createRedisMaterialStore } from '../../../api/stores/redis-material-store.js';
import { StoreUnavailableError } from '../../../api/stores/store-unavailable-error.js';
import { materialStoreContract } from '../../contracts/material-store-contract.js';
import { TEST_TENANT, startApiTestApp } from '../../helpers/api-test-app.js';
import { freePort } from '../../helpers/redis-server.js';
import { useTestRedis } from '../../helpers/use-test-redis.js';

const redis = useTestRedis();

/** A store on the test Redis under a key prefix of its own, so tests never see each other. */
function freshStore(prefix = `test-${randomUUID()}`) {
  return createRedisMaterialStore({ redisUrl: redis.url, keyPrefix: prefix });
}

materialStoreContract('createRedisMaterialStore()', async () => freshStore());

describe('createRedisMaterialStore against a real Redis', () => {
  it('a material posted through one store instance is read and listed by another', async () => {
    const prefix = `test-${randomUUID()}`;
    const api = await startApiTestApp({ materials: freshStore(prefix) });
    try {
      const created = await api.http
        .post('/v1/catalog/materials')
        .send(EXAMPLE_MATERIALS.labFerrite);
      expect(created.status).toBe(201);
      const reader = createRedisMaterialStore({ redisUrl: redis.url, keyPrefix: prefix });
      const record = await reader.get(TEST_TENANT, created.body.id);
      expect(record?.name).toBe(EXAMPLE_MATERIALS.labFerrite.name);
      expect(record?.fit.coefficients).toEqual(created.body.steinmetz);
      expect((await reader.list(TEST_TENANT)).map((item) => item.id)).toEqual([created.body.id]);
      await reader.close();
    } finally {
      await api.close();
    }
  });

  it('every method rejects with StoreUnavailableError when Redis does not answer, and the API answers 503', async () => {
    const port = await freePort();
    const store = createRedisMaterialStore({
      redisUrl: `redis://127.0.0.1:${port}`,
      commandTimeoutMs: 300,
    });
    expect(await store.isReady()).toBe(false);
    await expect(store.get(TEST_TENANT, randomUUID())).rejects.toBeInstanceOf(
      StoreUnavailableError,
    );
    await expect(store.list(TEST_TENANT)).rejects.toBeInstanceOf(StoreUnavailableError);
    const api = await startApiTestApp({ materials: store });
    try {
      const listed = await api.http.get('/v1/catalog/materials');
      expect(listed.status).toBe(503);
      expect(listed.headers['retry-after']).toBe(String(api.config.retryAfterS));
      expect(listed.headers['content-type']).toMatch(/^application\/problem\+json/);
      const created = await api.http
        .post('/v1/catalog/materials')
        .send(EXAMPLE_MATERIALS.labFerrite);
      expect(created.status).toBe(503);
    } finally {
      await api.close();
    }
  });
});
