import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll } from 'vitest';
import { createMemoryIdempotencyStore } from '../../../api/idempotency/memory-idempotency-store.js';
import { createRedisIdempotencyStore } from '../../../api/idempotency/redis-idempotency-store.js';
import { idempotencyStoreContract } from '../../contracts/idempotency-store-contract.js';
import { startRedisServer, type TestRedisServer } from '../../helpers/redis-server.js';

let redis: TestRedisServer;
beforeAll(async () => {
  redis = await startRedisServer();
});
afterAll(async () => {
  await redis.stop();
});

idempotencyStoreContract('createMemoryIdempotencyStore()', async () =>
  createMemoryIdempotencyStore(),
);
idempotencyStoreContract('createRedisIdempotencyStore()', async () =>
  createRedisIdempotencyStore({ redisUrl: redis.url, keyPrefix: `test-${randomUUID()}` }),
);
