import { describe, expect, it } from 'vitest';
import { coreSearchPlan } from '../../../solvers/core-search/core-search-computation.js';
import { CoreSearchRequestSchema } from '../../../solvers/core-search/core-search-request-schema.js';
import {
  JOB_CHUNK_COUNT_MAX,
  evenChunks,
  type JobPlan,
} from '../../../solvers/jobs/chunked-computation.js';
import { sweepComputation } from '../../../solvers/sweeps/sweep-computation.js';
import { SweepRequestSchema } from '../../../solvers/sweeps/sweep-request-schema.js';
import { TOLERANCE_COMPUTATION } from '../../../solvers/tolerance/tolerance-computation.js';
import { ToleranceRequestSchema } from '../../../solvers/tolerance/tolerance-request-schema.js';
import { telecomSpec } from '../../helpers/flyback-specs.js';
import { INVENTED_FLYBACK_SPEC } from '../../helpers/sweep-requests.js';

// Every chunk is a queue entry added in the submitting request (a BullMQ child job): the plans
// must stay within JOB_CHUNK_COUNT_MAX chunks whatever chunk size the request asks for, and
// still cover every item once, in order.

/** Asserts the chunks are consecutive, cover 0 … total − 1 and number at most the cap. */
function expectCoveringWithinCap(plan: JobPlan): void {
  expect(plan.chunks.length).toBeLessThanOrEqual(JOB_CHUNK_COUNT_MAX);
  let next = 0;
  plan.chunks.forEach((chunk, index) => {
    expect(chunk.index).toBe(index);
    expect(chunk.start).toBe(next);
    expect(chunk.count).toBeGreaterThanOrEqual(1);
    next += chunk.count;
  });
  expect(next).toBe(plan.total);
}

const axis = (from: number, to: number, count: number) =>
  Array.from({ length: count }, (_, i) => from + ((to - from) * i) / (count - 1));

describe('the number of chunks a job is cut into', () => {
  it('keeps the asked chunk size while the plan stays within the cap', () => {
    expect(evenChunks(12, 5).chunks.map((chunk) => chunk.count)).toEqual([5, 5, 2]);
    const atCap = evenChunks(JOB_CHUNK_COUNT_MAX * 7, 7);
    expect(atCap.chunks).toHaveLength(JOB_CHUNK_COUNT_MAX);
    expect(atCap.chunks.every((chunk) => chunk.count === 7)).toBe(true);
  });

  it('takes larger chunks where the asked size would exceed the cap', () => {
    const plan = evenChunks(100_000, 1);
    expect(plan.chunks).toHaveLength(JOB_CHUNK_COUNT_MAX);
    expect(plan.chunks.every((chunk) => chunk.count === 100)).toBe(true);
    for (const total of [1_000_001, 123_457, 999_999])
      expectCoveringWithinCap(evenChunks(total, 1));
  });

  it('admits a sweep axis longer than 1000 values and cuts the grid within the cap', () => {
    // 1200 input voltages × 12 loads: 14,400 points, under the default size limit (100,000);
    // a per-axis bound of 1000 values refused it with 400 before its size was ever checked.
    const request = SweepRequestSchema.parse({
      spec: INVENTED_FLYBACK_SPEC,
      grid: { inputVoltagesV: axis(36, 72, 1200), loadFractions: axis(0.1, 1.2, 12) },
      chunkPointCount: 1,
    });
    expect(sweepComputation.size?.(request)).toBe(14_400);
    const plan = sweepComputation.plan(request);
    expectCoveringWithinCap(plan);
    expect(plan.chunks[0]?.count).toBe(15);
  });

  it('cuts the largest tolerance run within the cap', () => {
    const request = ToleranceRequestSchema.parse({ spec: telecomSpec(), sampleCount: 1_000_000 });
    expectCoveringWithinCap(TOLERANCE_COMPUTATION.plan(request));
  });

  it('plans the largest core search, every catalog shape at 16 frequencies, within the cap', () => {
    // One chunk per shape and frequency: a catalog that outgrew the cap would need the blocks
    // grouped (they may be: the counts do not depend on the grouping).
    const request = CoreSearchRequestSchema.parse({
      spec: { ...telecomSpec(), magnetics: { ...telecomSpec().magnetics, mode: 'design' } },
      space: { switchingFrequenciesHz: axis(50e3, 500e3, 16) },
    });
    expectCoveringWithinCap(coreSearchPlan(request));
  });
});
