import { describe, expect, it } from 'vitest';
import {
  SweepRequestSchema,
  evaluateSweepPoint,
  runChunkToEnd,
  sweepComputation,
  sweepPointRange,
  sweepPoints,
} from '../../../solvers/index.js';
import { INVENTED_FLYBACK_SPEC } from '../../helpers/sweep-requests.js';

// Invented scenario: the packaging-machine flyback over 3 frequencies x 2 inputs x 2 loads.
const REQUEST = SweepRequestSchema.parse({
  spec: INVENTED_FLYBACK_SPEC,
  grid: {
    switchingFrequenciesHz: [80e3, 100e3, 120e3],
    inputVoltagesV: [40, 60],
    loadFractions: [0.5, 1],
  },
  chunkPointCount: 5,
});

describe('sweepComputation', () => {
  it('sweepPointRange(request, start, count) is the same slice of sweepPoints(request)', () => {
    const all = sweepPoints(REQUEST);
    for (const [start, count] of [
      [0, 12],
      [3, 4],
      [11, 1],
      [5, 0],
    ] as const) {
      expect(sweepPointRange(REQUEST, start, count)).toEqual(all.slice(start, start + count));
    }
    expect(() => sweepPointRange(REQUEST, 10, 3)).toThrow(RangeError);
  });

  it('plan(request) cuts the 12 grid points into chunks of chunkPointCount (100 by default)', () => {
    expect(sweepComputation.plan(REQUEST)).toEqual({
      total: 12,
      chunks: [
        { index: 0, start: 0, count: 5 },
        { index: 1, start: 5, count: 5 },
        { index: 2, start: 10, count: 2 },
      ],
    });
    const { chunkPointCount: _omitted, ...withoutChunkSize } = REQUEST;
    expect(sweepComputation.plan(withoutChunkSize).chunks).toHaveLength(1);
  });

  it('size(request) is plan(request).total, the product of the axis lengths', () => {
    expect(sweepComputation.size?.(REQUEST)).toBe(sweepComputation.plan(REQUEST).total);
    // A grid of 10^9 points (1000 values an axis), sized without its chunks.
    const axis = (from: number, to: number) =>
      Array.from({ length: 1000 }, (_, i) => from + ((to - from) * i) / 999);
    const largest = SweepRequestSchema.parse({
      spec: INVENTED_FLYBACK_SPEC,
      grid: {
        switchingFrequenciesHz: axis(50e3, 250e3),
        inputVoltagesV: axis(36, 72),
        loadFractions: axis(0.1, 1),
      },
      chunkPointCount: 1,
    });
    expect(sweepComputation.size?.(largest)).toBe(1e9);
  });

  it('runChunk yields 1, 2, … count and returns each point evaluated with a fresh cache', () => {
    const chunk = { index: 1, start: 5, count: 5 };
    const steps = sweepComputation.runChunk(REQUEST, chunk);
    const yielded: number[] = [];
    let step = steps.next();
    while (!step.done) {
      yielded.push(step.value);
      step = steps.next();
    }
    expect(yielded).toEqual([1, 2, 3, 4, 5]);
    const expected = sweepPointRange(REQUEST, 5, 5).map((point) =>
      evaluateSweepPoint(REQUEST, point),
    );
    expect(step.value).toEqual(expected);
  });

  it('reduce of the chunks in order equals evaluating every point with one shared cache', () => {
    const plan = sweepComputation.plan(REQUEST);
    const outputs = plan.chunks.map((chunk) =>
      runChunkToEnd(sweepComputation.runChunk(REQUEST, chunk)),
    );
    const cache = new Map();
    const rows = sweepPoints(REQUEST).map((point) => evaluateSweepPoint(REQUEST, point, cache));
    expect(sweepComputation.reduce(REQUEST, outputs)).toEqual({ pointCount: 12, rows });
    expect(() => sweepComputation.reduce(REQUEST, outputs.slice(1))).toThrow(RangeError);
  });

  it('csvTable(output) has one row per grid point, one cell per column, in row order', () => {
    const plan = sweepComputation.plan(REQUEST);
    const output = sweepComputation.reduce(
      REQUEST,
      plan.chunks.map((chunk) => runChunkToEnd(sweepComputation.runChunk(REQUEST, chunk))),
    );
    const table = sweepComputation.csvTable?.(output);
    expect(table?.columns.slice(0, 4)).toEqual([
      'switchingFrequencyHz',
      'inputVoltageV',
      'loadFraction',
      'feasible',
    ]);
    expect(table?.rows).toHaveLength(12);
    for (const [index, row] of (table?.rows ?? []).entries()) {
      const source = output.rows[index];
      expect(row).toHaveLength(table?.columns.length ?? 0);
      expect(row.slice(0, 4)).toEqual([
        source?.switchingFrequencyHz,
        source?.inputVoltageV,
        source?.loadFraction,
        source?.feasible,
      ]);
      expect(row[table?.columns.indexOf('efficiency') ?? -1]).toBe(source?.efficiency ?? null);
    }
  });
});
