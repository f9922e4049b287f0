import { describe, expect, it } from 'vitest';
import { compareTopologies } from '../../../solvers/design/compare-topologies.js';
import { designConverter } from '../../../solvers/design/design-converter.js';
import { RANKING_FIGURE_IDS, RANKING_FIGURES } from '../../../solvers/design/ranking-figures.js';
import { TOPOLOGY_IDS } from '../../../solvers/spec/spec-schema.js';
import { expectClose } from '../../helpers/expect-close.js';
import { telecomSpec } from '../../helpers/flyback-specs.js';
import { forwardBusSpec } from '../../helpers/forward-specs.js';

describe('compareTopologies', () => {
  const telecom = telecomSpec();

  it('compareTopologies(spec) designs every registered topology, each either ranked or rejected', () => {
    const comparison = compareTopologies(telecom);
    // ref: spec contract, the default candidates are the registry
    expect(comparison.topologies).toEqual([...TOPOLOGY_IDS]);
    expect(comparison.rankBy).toBe('efficiency-nominal');
    expect(comparison.order).toBe('higher-first');
    const seen = [...comparison.ranked, ...comparison.rejected].map((entry) => entry.topology);
    expect(seen.toSorted()).toEqual([...TOPOLOGY_IDS].toSorted());
    expect(comparison.ranked.map((entry) => entry.rank)).toEqual(
      comparison.ranked.map((_, index) => index + 1),
    );
  });

  for (const rankBy of RANKING_FIGURE_IDS) {
    it(`compareTopologies(spec, { rankBy: '${rankBy}' }) ranks best first by that figure`, () => {
      const comparison = compareTopologies(telecom, { rankBy });
      const figure = RANKING_FIGURES[rankBy];
      expect(comparison.ranked.length).toBeGreaterThanOrEqual(2);
      for (const entry of comparison.ranked) {
        // Consistency check, no outside reference: each entry is the design that
        // designConverter gives for the spec with that topology, and carries its figure.
        const alone = designConverter({ ...telecom, topology: entry.topology });
        expect(alone).toEqual({ ok: true, value: entry.design });
        expect(entry.spec).toEqual({ ...telecom, topology: entry.topology });
        expectClose(entry.figure, figure.value(entry.design, entry.spec), { rel: 0 });
      }
      const values = comparison.ranked.map((entry) => entry.figure);
      // ref: common practice, efficiency is better higher, loss and stress lower
      const sorted = values.toSorted((a, b) => (figure.order === 'higher-first' ? b - a : a - b));
      expect(values).toEqual(sorted);
      expect(figure.order).toBe(rankBy.startsWith('efficiency') ? 'higher-first' : 'lower-first');
    });
  }

  it("compareTopologies(spec, { rankBy: 'switch-voltage-utilization' }) divides the peak by the switch rating", () => {
    const comparison = compareTopologies(telecom, { rankBy: 'switch-voltage-utilization' });
    for (const entry of comparison.ranked) {
      // ref: common practice, voltage utilization = peak blocking voltage / rated voltage
      expectClose(entry.figure, entry.design.summary.switchVoltagePeakV / 200, { rel: 1e-12 });
    }
  });

  it('compareTopologies(400 V bus) rejects the single-switch topologies whose switch sees more than 450 V, with their issues', () => {
    const comparison = compareTopologies(forwardBusSpec());
    const rejected = (topology: string) =>
      comparison.rejected.find((entry) => entry.topology === topology);
    const largestRequired = (topology: string) =>
      Math.max(
        ...(rejected(topology)?.issues ?? [])
          .filter((issue) => issue.code === 'switch_voltage_rating')
          .map((issue) => issue.required),
      );
    // ref: Mohan, Undeland, Robbins, 3rd ed., §10-4-1 (from memory): the switch of a forward with
    // a reset winding blocks Vin·(1 + Np/Nr); Nr/Np = 1, 420 V and the 0.8 V reset-diode drop
    expectClose(largestRequired('forward-reset-winding'), 2 * 420 + 0.8, { rel: 1e-9 });
    // ref: common practice, a flyback switch blocks the input plus the reflected output voltage,
    // more than the 0.9 × 500 V derated rating on a 420 V bus
    expect(largestRequired('flyback')).toBeGreaterThan(450);
    expect(rejected('flyback')?.spec.topology).toBe('flyback');
    // ref: common practice (issue 3): each switch of a two-switch forward blocks only the input
    // voltage, so a 400 V bus takes a switch rated about 500 V
    const twoSwitch = comparison.ranked.find((entry) => entry.topology === 'two-switch-forward');
    expect(twoSwitch).toBeDefined();
    expectClose(twoSwitch?.design.summary.switchVoltagePeakV ?? NaN, 420 + 0.8, { rel: 1e-9 });
  });

  it('compareTopologies(spec, { topologies }) designs only those, whatever their order or repeats', () => {
    const some = compareTopologies(telecom, {
      topologies: ['forward-reset-winding', 'flyback', 'flyback'],
    });
    // ref: spec contract, candidates in registry order, each once
    expect(some.topologies).toEqual(
      TOPOLOGY_IDS.filter((id) => id === 'flyback' || id === 'forward-reset-winding'),
    );
    const reversed = compareTopologies(telecom, {
      topologies: ['flyback', 'forward-reset-winding'],
    });
    expect(reversed).toEqual(some);
    expect(compareTopologies(telecom, { topologies: ['flyback'] }).ranked).toHaveLength(1);
  });

  it('compareTopologies(spec, { topologies: [] }) throws RangeError', () => {
    // ref: common practice, an empty candidate list is a programmer error
    expect(() => compareTopologies(telecom, { topologies: [] })).toThrow(RangeError);
  });
});
