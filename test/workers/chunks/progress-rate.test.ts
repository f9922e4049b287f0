import { describe, expect, it } from 'vitest';
import { progressWithRate } from '../../../workers/chunks/progress-rate.js';

describe('progressWithRate', () => {
  it('progressWithRate omits rate and ETA until something is done over a measurable time', () => {
    expect(progressWithRate(0, 100, { startedAtMs: 1000, lastProgressAtMs: 3000 }, true)).toEqual({
      done: 0,
      total: 100,
    });
    expect(progressWithRate(10, 100, {}, true)).toEqual({ done: 10, total: 100 });
    expect(progressWithRate(10, 100, { startedAtMs: 1000, lastProgressAtMs: 1000 }, true)).toEqual({
      done: 10,
      total: 100,
    });
  });

  it('progressWithRate gives done per second since the start and the remaining time at that rate', () => {
    // 40 items in 2 s: 20 items/s; 60 left: 3 s.
    expect(progressWithRate(40, 100, { startedAtMs: 1000, lastProgressAtMs: 3000 }, true)).toEqual({
      done: 40,
      total: 100,
      ratePerS: 20,
      etaS: 3,
    });
    // A finished job keeps its rate but has no ETA.
    expect(
      progressWithRate(100, 100, { startedAtMs: 1000, lastProgressAtMs: 6000 }, false),
    ).toEqual({ done: 100, total: 100, ratePerS: 20 });
  });
});
