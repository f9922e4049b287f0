import { describe, expect, it } from 'vitest';
import { RECONNECT_MAX_DELAY_MS, reconnectDelayMs } from '../../workers/runners/redis-reconnect.js';

describe('reconnectDelayMs', () => {
  it('doubles from 50 ms, is capped at RECONNECT_MAX_DELAY_MS and never gives up', () => {
    expect([1, 2, 3, 4, 5].map(reconnectDelayMs)).toEqual([50, 100, 200, 400, 800]);
    expect(reconnectDelayMs(6)).toBe(RECONNECT_MAX_DELAY_MS);
    // ioredis stops reconnecting when the strategy returns a non-number; this one never does.
    for (const times of [7, 100, 10_000, Number.MAX_SAFE_INTEGER]) {
      expect(reconnectDelayMs(times)).toBe(RECONNECT_MAX_DELAY_MS);
    }
  });
});
