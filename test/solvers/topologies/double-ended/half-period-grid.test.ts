import { describe, expect, it } from 'vitest';
import {
  gridHalfWaveform,
  gridHalfWaveformOfEnds,
  gridWaveform,
  gridWaveformOfEnds,
  gridWaveformPair,
  gridWaveformPairOfEnds,
  type HalfPeriodGrid,
} from '../../../../solvers/topologies/double-ended/half-period-grid.js';

// Invented scenario: one 100 kHz period; the grids below are laid out by hand (not solved).
const T = 1e-5;

/** A grid of four intervals; `edges` and `joined` as given. */
function grid(edges: number[], joined?: boolean[]): HalfPeriodGrid {
  const out: HalfPeriodGrid = {
    start: edges[1] as number,
    onEnd: edges[2] as number,
    edges,
    kinds: ['commutation', 'on', 'off', 'off'],
    idle: [[false, false, false, false]],
    inductorA: [[0, 1, 1, 2, 2, 1.5, 1.5, 0]],
  };
  if (joined !== undefined) out.joined = joined;
  return out;
}

// Per-end values (index 2j + end), one entry short (read as 0) and with a negative zero.
const HALF_0 = [0.5, 1.25, -2, 3.5, 4, -0, 7.75];
const HALF_1 = [-1, 2.5, 6, -3.25, 0.125, 9, 11];

describe('grid waveforms read off per-end columns', () => {
  const grids: Array<[string, HalfPeriodGrid]> = [
    ['every time kept', grid([0, 0.1, 0.4, 0.7, 1])],
    ['a joined start', grid([0, 0.1, 0.4, 0.7, 1], [false, false, false, true])],
    // A zero-width interval: a run of four equal times, of which the waveform keeps two.
    ['a run of equal times', grid([0, 0.1, 0.4, 0.4, 1])],
  ];
  for (const [what, g] of grids) {
    it(`gridWaveformOfEnds and gridWaveformPairOfEnds give the value functions' waveforms (${what})`, () => {
      // ref: spec contract, one set of rules for every way a grid waveform is built: the same
      // values at the same ends give the same waveform, to the bit (IEEE 754: 1·x is x, −1·x is −x)
      const at = (values: number[], j: number, end: 0 | 1) => values[2 * j + end] ?? 0;
      expect(gridWaveformOfEnds(g, T, HALF_0)).toEqual(
        gridWaveform(grid(g.edges, g.joined), T, (j, end) => at(HALF_0, j, end)),
      );
      expect(gridWaveformOfEnds(g, T, HALF_0, true)).toEqual(
        gridWaveform(grid(g.edges, g.joined), T, (j, end, half) =>
          half === 0 ? at(HALF_0, j, end) : -1 * at(HALF_0, j, end),
        ),
      );
      expect(gridHalfWaveformOfEnds(g, T, HALF_0)).toEqual(
        gridHalfWaveform(grid(g.edges, g.joined), T, (j, end) => at(HALF_0, j, end)),
      );
      expect(gridWaveformPairOfEnds(g, T, HALF_0, HALF_1)).toEqual(
        gridWaveformPair(grid(g.edges, g.joined), T, (j, end, half) =>
          at(half === 0 ? HALF_0 : HALF_1, j, end),
        ),
      );
    });
  }

  it('gridWaveformOfEnds refuses a non-finite value as piecewiseLinear does', () => {
    // ref: spec contract, the same RangeError as piecewiseLinear for a point that is not finite
    expect(() => gridWaveformOfEnds(grid([0, 0.1, 0.4, 0.7, 1]), T, [0, 1, NaN])).toThrow(
      /not finite/,
    );
    expect(() =>
      gridWaveformPairOfEnds(grid([0, 0.1, 0.4, 0.7, 1]), T, HALF_0, [1, Infinity]),
    ).toThrow(/not finite/);
  });
});
