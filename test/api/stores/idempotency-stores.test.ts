import { randomUUID } from 'node:crypto';
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
