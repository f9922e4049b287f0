import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll } from 'vitest';
import { createMemoryKeyStore } from '../../../api/auth/memory-key-store.js';
import { createRedisKeyStore } from '../../../api/auth/redis-key-store.js';
import { keyStoreContract } from '../../contracts/key-store-contract.js';
import { startRedisServer, type TestRedisServer } from '../../helpers/redis-server.js';

let redis: TestRedisServer;
beforeAll(async () => {
  redis = await startRedisServer();
});
afterAll(async () => {
  await redis.stop();
});

keyStoreContract('createMemoryKeyStore()', async () => createMemoryKeyStore());
keyStoreContract('createRedisKeyStore()', async () =>
  createRedisKeyStore({ redisUrl: redis.url, keyPrefix: `test-${randomUUID()}` }),
);
