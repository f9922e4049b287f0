import { randomUUID } from 'node:crypto';
import { Redis } from 'ioredis';
import { afterAll, afterEach, describe, expect, it, vi } from 'vitest';
import { keyHash } from '../../api/auth/api-key.js';
import { createKey } from '../../api/auth/create-key.js';
import { createRedisRequestCounter, rateCounterKey } from '../../api/auth/rate-limit.js';
import { createRedisKeyStore } from '../../api/auth/redis-key-store.js';
import { startApiTestApp } from '../helpers/api-test-app.js';
import { useTestRedis } from '../helpers/use-test-redis.js';

// The Redis request counter behind RATE_LIMIT_PER_MINUTE with several API processes: one count
// per key and window, shared by every process, gone two windows after its last request.

const redis = useTestRedis();
const clients: Redis[] = [];
const client = () => {
  const opened = new Redis(redis.url, { maxRetriesPerRequest: 1 });
  clients.push(opened);
  return opened;
};
afterAll(() => {
  for (const opened of clients) opened.disconnect();
});

describe('createRedisRequestCounter', () => {
  it('increment() counts per key and window, across API processes', async () => {
    const first = createRedisRequestCounter(client(), 'count-test');
    const second = createRedisRequestCounter(client(), 'count-test');
    expect(await first.increment('key-a', 60_000, 60_000)).toBe(1);
    expect(await second.increment('key-a', 60_000, 60_000)).toBe(2);
    expect(await first.increment('key-a', 60_000, 60_000)).toBe(3);
    // Another key, or the next window, starts again from 1.
    expect(await second.increment('key-b', 60_000, 60_000)).toBe(1);
    expect(await first.increment('key-a', 120_000, 60_000)).toBe(1);
  });

  it('increment() leaves the counter to expire two windows after its last request', async () => {
    const reader = client();
    const counter = createRedisRequestCounter(client(), 'expiry-test');
    await counter.increment('key', 0, 30_000);
    const ttlMs = await reader.pttl(rateCounterKey('expiry-test', 'key', 0));
    expect(ttlMs).toBeGreaterThan(55_000);
    expect(ttlMs).toBeLessThanOrEqual(60_000);
  });

  it('increment() still counts after Redis has forgotten its scripts', async () => {
    const reader = client();
    const counter = createRedisRequestCounter(client(), 'flush-test');
    expect(await counter.increment('key', 0, 60_000)).toBe(1);
    await reader.script('FLUSH');
    expect(await counter.increment('key', 0, 60_000)).toBe(2);
  });
});

// With the Redis key store, authenticate finds the key and counts the request in one script
// (findCounting), in the same counters; it must count exactly the requests that pass
// authentication, as the separate count after it did.
describe('createRedisKeyStore().findCounting', () => {
  const stores: ReturnType<typeof createRedisKeyStore>[] = [];
  const keyStore = (keyPrefix: string) => {
    const store = createRedisKeyStore({ redisUrl: redis.url, keyPrefix });
    stores.push(store);
    return store;
  };
  afterAll(async () => {
    await Promise.all(stores.map((store) => store.close()));
  });
  const window = { windowStartMs: 120_000, windowMs: 60_000 };

  it('finds the key and counts its request in the counter increment() keeps', async () => {
    const prefix = `find-count-${randomUUID()}`;
    const keys = keyStore(prefix);
    const counter = createRedisRequestCounter(client(), prefix);
    const { record, token } = await createKey(keys, { tenant: 't', role: 'design', label: 'x' });
    const request = { tokenHash: keyHash(token), roles: ['design', 'admin'] as const, ...window };
    expect(await keys.findCounting?.(record.id, request)).toEqual({ record, count: 1 });
    expect(await counter.increment(record.id, window.windowStartMs, window.windowMs)).toBe(2);
    expect((await keys.findCounting?.(record.id, request))?.count).toBe(3);
    // Expiring two windows after the last request, as increment() leaves it.
    const ttlMs = await client().pttl(rateCounterKey(prefix, record.id, window.windowStartMs));
    expect(ttlMs).toBeGreaterThan(115_000);
    expect(ttlMs).toBeLessThanOrEqual(120_000);
  });

  it('counts no wrong secret, revoked key, role short of the operation or unknown id', async () => {
    const prefix = `find-count-${randomUUID()}`;
    const keys = keyStore(prefix);
    const counter = createRedisRequestCounter(client(), prefix);
    const reader = keys.findCounting?.bind(keys);
    const { record, token } = await createKey(keys, { tenant: 't', role: 'read', label: 'x' });
    const valid = { tokenHash: keyHash(token), roles: ['read', 'design', 'admin'] as const };
    const cases = [
      { ...valid, tokenHash: keyHash(`${token}x`) },
      { ...valid, roles: ['design', 'admin'] as const },
    ];
    for (const request of cases) {
      expect(await reader?.(record.id, { ...request, ...window })).toEqual({
        record,
        count: undefined,
      });
    }
    expect(await reader?.('0123456789abcdef', { ...valid, ...window })).toEqual({
      record: undefined,
      count: undefined,
    });
    await keys.revoke('t', record.id, new Date(0).toISOString());
    const revoked = await reader?.(record.id, { ...valid, ...window });
    expect(revoked?.record?.revokedAt).toBe(new Date(0).toISOString());
    expect(revoked?.count).toBeUndefined();
    // Nothing was counted: the window's first counted request is the first.
    expect(await counter.increment(record.id, window.windowStartMs, window.windowMs)).toBe(1);
  });

  it('still counts after Redis has forgotten its scripts', async () => {
    const keys = keyStore(`find-count-${randomUUID()}`);
    const { record, token } = await createKey(keys, { tenant: 't', role: 'admin', label: 'x' });
    const request = { tokenHash: keyHash(token), roles: ['admin'] as const, ...window };
    expect((await keys.findCounting?.(record.id, request))?.count).toBe(1);
    await client().script('FLUSH');
    expect((await keys.findCounting?.(record.id, request))?.count).toBe(2);
  });
});

describe('the rate limit with the Redis key store', () => {
  afterEach(() => {
    vi.useRealTimers();
  });

  it('counts only requests that authenticate: 401 and 403 take nothing from the limit', async () => {
    // In the middle of a clock minute, so that no window boundary falls between the requests.
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2026-12-02T12:00:30Z'));
    const prefix = `limit-${randomUUID()}`;
    const keys = createRedisKeyStore({ redisUrl: redis.url, keyPrefix: prefix });
    const limited = await startApiTestApp({ keys, config: { rateLimitPerMinute: 3 } });
    try {
      const reader = await limited.as('test-tenant', 'read');
      const wrong = `${limited.token.slice(0, -1)}${limited.token.endsWith('A') ? 'B' : 'A'}`;
      const statuses: number[] = [];
      for (let i = 0; i < 2; i += 1) {
        statuses.push(
          (await limited.anonymous.get('/v1/catalog/wires').set('authorization', `Bearer ${wrong}`))
            .status,
        );
        statuses.push((await reader.delete('/v1/jobs/none')).status);
      }
      for (let i = 0; i < 4; i += 1) {
        statuses.push((await reader.get('/v1/catalog/wires')).status);
      }
      expect(statuses).toEqual([401, 403, 401, 403, 200, 200, 200, 429]);
      // Counted in Redis as the key was found (the app's own request counter is in memory).
      const readKey = (await keys.list('test-tenant')).find((key) => key.role === 'read');
      const windowStartMs = Date.parse('2026-12-02T12:00:00Z');
      expect(await client().get(rateCounterKey(prefix, readKey?.id ?? '', windowStartMs))).toBe(
        '4',
      );
      // Another key of the same tenant has its own count.
      expect((await limited.http.get('/v1/catalog/wires')).status).toBe(200);
    } finally {
      await limited.close();
      await keys.close();
    }
  });
});
