import { Redis } from 'ioredis';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createRedisRequestCounter } from '../../api/auth/rate-limit.js';
import { startRedisServer, type TestRedisServer } from '../helpers/redis-server.js';

// The Redis request counter behind RATE_LIMIT_PER_MINUTE with several API processes: one count
// per key and window, shared by every process, gone two windows after its last request.

let redis: TestRedisServer;
const clients: Redis[] = [];
const client = () => {
  const opened = new Redis(redis.url, { maxRetriesPerRequest: 1 });
  clients.push(opened);
  return opened;
};
beforeAll(async () => {
  redis = await startRedisServer();
});
afterAll(async () => {
  for (const opened of clients) opened.disconnect();
  await redis.stop();
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
    const ttlMs = await reader.pttl('expiry-test:rate:key:0');
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
