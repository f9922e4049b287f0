import { randomUUID } from 'node:crypto';
import { createMemoryKeyStore } from '../../../api/auth/memory-key-store.js';
import { createRedisKeyStore } from '../../../api/auth/redis-key-store.js';
import { keyStoreContract } from '../../contracts/key-store-contract.js';
import { useTestRedis } from '../../helpers/use-test-redis.js';

const redis = useTestRedis();

keyStoreContract('createMemoryKeyStore()', async () => createMemoryKeyStore());
keyStoreContract('createRedisKeyStore()', async () =>
  createRedisKeyStore({ redisUrl: redis.url, keyPrefix: `test-${randomUUID()}` }),
);
