import { describe, expect, it } from 'vitest';
import {
  drawnWaveform,
  drawPoint,
  piecewiseLinear,
  piecewiseLinearColumns,
  redrawnWaveform,
  reusableDrawing,
  startDrawing,
  type WaveformDrawing,
} from '../../../solvers/waveform/piecewise-linear.js';

// Invented scenario: one 100 kHz switching period.
const T = 1e-5;

describe('piecewiseLinear', () => {
  it('piecewiseLinear(T, points) keeps the points, a repeated time being a jump', () => {
    const w = piecewiseLinear(T, [
      [0, 0],
      [0.4 * T, 2],
      [0.4 * T, -1],
      [T, 0],
    ]);
    // ref: common practice (a piecewise-linear waveform is its breakpoint list)
    expect(w).toEqual({ periodS: T, timesS: [0, 0.4 * T, 0.4 * T, T], values: [0, 2, -1, 0] });
  });

  it('piecewiseLinear clamps a last time D·T + (1 − D)·T that rounds above T onto T', () => {
    const duty = 0.061;
    const rawEndS = duty * T + (1 - duty) * T;
    // ref: IEEE 754 binary64 rounding; this sum lands one ulp above T, so the clamp is exercised
    expect(rawEndS).toBeGreaterThan(T);
    const w = piecewiseLinear(T, [
      [0, 1],
      [duty * T, 3],
      [rawEndS, 1],
    ]);
    // Exactly T is the claim: every operation relies on the last time being the period itself.
    // ref: IEEE 754 binary64 rounding (a few ulps are not a real time step)
    expect(w.timesS[2]).toBe(T);
  });

  it('piecewiseLinear clamps times within 1e-12·T of 0, of T and of the previous time', () => {
    const w = piecewiseLinear(T, [
      [-1e-13 * T, 0],
      [0.5 * T, 4],
      [0.5 * T * (1 - 1e-15), -4],
      [T * (1 + 5e-13), 0],
    ]);
    // ref: IEEE 754 binary64 rounding (errors of ~1e-16 relative, far under the 1e-12 tolerance)
    expect(w.timesS).toEqual([0, 0.5 * T, 0.5 * T, T]);
  });

  it('piecewiseLinear keeps the first and last point of a run of three equal times', () => {
    const w = piecewiseLinear(T, [
      [0, 0],
      [0.5 * T, 1],
      [0.5 * T, 7],
      [0.5 * T, -1],
      [T, 0],
    ]);
    // ref: common practice (a zero-length phase is a single jump from the value before to after)
    expect(w).toEqual({ periodS: T, timesS: [0, 0.5 * T, 0.5 * T, T], values: [0, 1, -1, 0] });
  });

  const bad: Array<[string, number, Array<[number, number]>]> = [
    [
      'a zero period',
      0,
      [
        [0, 0],
        [0, 1],
      ],
    ],
    [
      'a negative period',
      -T,
      [
        [0, 0],
        [-T, 1],
      ],
    ],
    [
      'a NaN period',
      NaN,
      [
        [0, 0],
        [1, 1],
      ],
    ],
    [
      'an infinite period',
      Infinity,
      [
        [0, 0],
        [Infinity, 1],
      ],
    ],
    ['no points', T, []],
    ['a single point', T, [[0, 1]]],
    [
      'a NaN value',
      T,
      [
        [0, 0],
        [0.5 * T, NaN],
        [T, 0],
      ],
    ],
    [
      'an infinite value',
      T,
      [
        [0, 0],
        [0.5 * T, Infinity],
        [T, 0],
      ],
    ],
    [
      'a NaN time',
      T,
      [
        [0, 0],
        [NaN, 1],
        [T, 0],
      ],
    ],
    [
      'times out of order',
      T,
      [
        [0, 0],
        [0.6 * T, 1],
        [0.5 * T, 2],
        [T, 0],
      ],
    ],
    [
      'a first time not 0',
      T,
      [
        [0.1 * T, 0],
        [T, 0],
      ],
    ],
    [
      'a negative first time',
      T,
      [
        [-0.1 * T, 0],
        [T, 0],
      ],
    ],
    [
      'a last time short of the period',
      T,
      [
        [0, 0],
        [0.9 * T, 0],
      ],
    ],
    [
      'a time beyond the period by more than round-off',
      T,
      [
        [0, 0],
        [T * (1 + 1e-9), 1],
        [T, 0],
      ],
    ],
  ];
  for (const [what, periodS, points] of bad) {
    it(`piecewiseLinear throws RangeError for ${what}`, () => {
      // ref: common practice (ECMAScript RangeError for an argument outside its allowed range)
      expect(() => piecewiseLinear(periodS, points)).toThrow(RangeError);
    });
  }

  // The column form keeps the same breakpoints by the same rules (round-off clamps, jumps, runs
  // of three) and throws for the same bad input.
  const columns = (points: Array<[number, number]>) =>
    [points.map(([t]) => t), points.map(([, v]) => v)] as const;
  const good: Array<Array<[number, number]>> = [
    [
      [-1e-13 * T, 0],
      [0.5 * T, 4],
      [0.5 * T * (1 - 1e-15), -4],
      [T * (1 + 5e-13), 0],
    ],
    [
      [0, 0],
      [0.5 * T, 1],
      [0.5 * T, 7],
      [0.5 * T, -1],
      [T, 0],
    ],
  ];
  for (const points of good) {
    it(`piecewiseLinearColumns keeps the breakpoints of ${points.length} points as piecewiseLinear`, () => {
      const [times, values] = columns(points);
      // ref: IEEE 754 binary64 rounding and common practice, as the piecewiseLinear cases above
      expect(piecewiseLinearColumns(T, times, values)).toEqual(piecewiseLinear(T, points));
    });
  }
  for (const [what, periodS, points] of bad) {
    it(`piecewiseLinearColumns throws RangeError for ${what}`, () => {
      const [times, values] = columns(points);
      // ref: common practice (ECMAScript RangeError for an argument outside its allowed range)
      expect(() => piecewiseLinearColumns(periodS, times, values)).toThrow(RangeError);
    });
  }
  it('piecewiseLinearColumns throws RangeError for columns of unequal length', () => {
    // ref: common practice (ECMAScript RangeError for an argument outside its allowed range)
    expect(() => piecewiseLinearColumns(T, [0, T], [0])).toThrow(RangeError);
  });
});

describe('drawnWaveform', () => {
  /** The same points drawn as columns (into `reuse` when given). */
  function drawn(periodS: number, points: Array<[number, number]>, reuse?: WaveformDrawing) {
    const [first, ...rest] = points;
    const drawing = startDrawing(first?.[0] ?? NaN, first?.[1] ?? NaN, reuse);
    for (const [timeS, value] of rest) drawPoint(drawing, timeS, value);
    return drawnWaveform(periodS, drawing);
  }

  it('drawnWaveform keeps the points piecewiseLinear keeps: round-off clamped, spikes cut', () => {
    // ref: spec contract, one set of rules for every way a waveform is built
    const cases: Array<Array<[number, number]>> = [
      [
        [0, 1],
        [0.25, 2],
        [0.25, 3],
        [0.25, 4],
        [0.5 + 1e-14, 5],
        [0.5, 6],
        [1 - 1e-14, 7],
      ],
      [
        [1e-15, 0],
        [0.1, 0],
        [0.1, 1],
        [0.1, 2],
        [0.1, 3],
        [0.6, -1],
        [1, 0],
      ],
    ];
    for (const points of cases) {
      expect(drawn(1, points)).toEqual(piecewiseLinear(1, points));
    }
  });

  it('a reusable drawing drawn again gives each waveform piecewiseLinear gives, and leaves the last alone', () => {
    // ref: spec contract, one set of rules for every way a waveform is built; a drawing started
    // again must not change a waveform already drawn from it (common practice: no aliasing)
    const long: Array<[number, number]> = [
      [0, 1],
      [0.25, 2],
      [0.25, 3],
      [0.25, 4],
      [0.5, 5],
      [0.75, 6],
      [1, 7],
    ];
    const short: Array<[number, number]> = [
      [0, -1],
      [0.5, -2],
      [1, -3],
    ];
    const drawing = reusableDrawing();
    const first = drawn(1, long, drawing);
    const second = drawn(1, short, drawing);
    expect(first).toEqual(piecewiseLinear(1, long));
    expect(second).toEqual(piecewiseLinear(1, short));
    expect(drawn(1, long, drawing)).toEqual(piecewiseLinear(1, long));
    expect(second).toEqual(piecewiseLinear(1, short));
  });

  it('drawnWaveform refuses what piecewiseLinear refuses', () => {
    // ref: spec contract, the same RangeErrors as piecewiseLinear
    expect(() =>
      drawn(1, [
        [0, 1],
        [0.5, NaN],
        [1, 1],
      ]),
    ).toThrow(/not finite/);
    expect(() =>
      drawn(1, [
        [0, 1],
        [0.6, 1],
        [0.5, 1],
        [1, 1],
      ]),
    ).toThrow(/outside/);
    expect(() =>
      drawn(1, [
        [0, 1],
        [0.9, 1],
      ]),
    ).toThrow(/last time/);
    expect(() => drawn(1, [[0, 1]])).toThrow(/at least 2 points/);
  });
});

describe('redrawnWaveform', () => {
  /**
   * `source` redrawn between `fromS` and `toS` as the push-pull's clamp drawings do: its points
   * up to `fromS` as they are, then `middle`, then its points from `toS` on as they are.
   */
  function redraw(
    source: ReturnType<typeof piecewiseLinear>,
    fromS: number,
    middle: Array<[number, number]>,
    toS: number,
  ) {
    const drawing = reusableDrawing();
    const points: Array<[number, number]> = [];
    let i = 0;
    for (; i < source.timesS.length && (source.timesS[i] as number) <= fromS; i++) {
      points.push([source.timesS[i] as number, source.values[i] as number]);
    }
    const headCount = points.length;
    points.push(...middle);
    for (; i < source.timesS.length && (source.timesS[i] as number) < toS; i++);
    const tailAt = points.length;
    for (; i < source.timesS.length; i++) {
      points.push([source.timesS[i] as number, source.values[i] as number]);
    }
    drawing.count = 0;
    for (const [timeS, value] of points) drawPoint(drawing, timeS, value);
    return { points, waveform: () => redrawnWaveform(1, drawing, headCount, tailAt) };
  }

  it('redrawnWaveform keeps the points piecewiseLinear keeps, at the seams too', () => {
    // ref: spec contract, one set of rules for every way a waveform is built (the head and tail
    // are a waveform's own points, which those rules keep as they are)
    const source = piecewiseLinear(1, [
      [0, 0],
      [0.2, 1],
      [0.4, 1],
      [0.4, 2],
      [0.6, 3],
      [0.6 + 5e-13, 4],
      [0.8, 5],
      [1, 0],
    ]);
    const cases: Array<[number, Array<[number, number]>, number]> = [
      // A bump inside one segment.
      [0.3, [[0.35, 9]], 0.4],
      // A middle point within round-off of the tail's first time: clamped onto it, and the
      // tail's jump there then runs three points long (its middle one dropped).
      [0.2, [[0.4 - 1e-13, 7]], 0.4],
      // A middle ending on the tail's time, which makes the tail's first point a third at it.
      [0.1, [[0.4, 8]], 0.4],
      // A middle up to the last time.
      [0.85, [[0.9, 6]], 1],
    ];
    for (const [fromS, middle, toS] of cases) {
      const { points, waveform } = redraw(source, fromS, middle, toS);
      expect(waveform()).toEqual(piecewiseLinear(1, points));
    }
  });

  it('redrawnWaveform refuses what piecewiseLinear refuses in the stretch redrawn', () => {
    // ref: spec contract, the same RangeErrors as piecewiseLinear
    const source = piecewiseLinear(1, [
      [0, 0],
      [0.5, 1],
      [1, 0],
    ]);
    expect(redraw(source, 0.2, [[0.3, NaN]], 0.5).waveform).toThrow(/not finite/);
    expect(redraw(source, 0.2, [[0.6, 1]], 0.5).waveform).toThrow(/outside/);
  });
});
