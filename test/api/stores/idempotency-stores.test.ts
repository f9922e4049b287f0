import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { createMemoryIdempotencyStore } from '../../../api/idempotency/memory-idempotency-store.js';
import { createRedisIdempotencyStore } from '../../../api/idempotency/redis-idempotency-store.js';
import { idempotencyStoreContract } from '../../contracts/idempotency-store-contract.js';
import { useTestRedis } from '../../helpers/use-test-redis.js';

const redis = useTestRedis();

idempotencyStoreContract('createMemoryIdempotencyStore()', async () =>
  createMemoryIdempotencyStore(),
);
idempotencyStoreContract('createRedisIdempotencyStore()', async () =>
  createRedisIdempotencyStore({ redisUrl: redis.url, keyPrefix: `test-${randomUUID()}` }),
);

describe('createRedisIdempotencyStore against a real Redis', () => {
  it('replays a response an earlier version kept with its body as JSON text, byte for byte', async () => {
    const keyPrefix = `test-${randomUUID()}`;
    const store = createRedisIdempotencyStore({ redisUrl: redis.url, keyPrefix });
    const response = { status: 201, headers: { location: '/v1/designs/d-1' }, body: '{"µ":"Δ"}' };
    await redis.admin.set(
      `${keyPrefix}:idempotency:k`,
      JSON.stringify({ fingerprint: 'f', response }),
    );
    expect(await store.begin('k', 'f', 10_000)).toEqual({
      kind: 'replay',
      response: { ...response, body: new Uint8Array(Buffer.from(response.body, 'utf8')) },
    });
    await store.close();
  });
});
