import { describe, expect, it } from 'vitest';
import { designConverter } from '../../../solvers/design/design-converter.js';
import {
  SweepRequestSchema,
  evaluateSweepPoint,
  sweepPointCount,
  sweepPoints,
  type Corner,
  type SweepRow,
} from '../../../solvers/index.js';
import { topologyById } from '../../../solvers/topologies/index.js';
import { forwardTelecomSpec } from '../../helpers/forward-specs.js';
import { INVENTED_FLYBACK_SPEC } from '../../helpers/sweep-requests.js';

const REQUEST = SweepRequestSchema.parse({
  spec: INVENTED_FLYBACK_SPEC,
  grid: {
    switchingFrequenciesHz: [80e3, 120e3],
    inputVoltagesV: [40, 60],
    loadFractions: [0.5, 1],
  },
});

/** The row fields a sweep takes from a corner, read the way a reader of the design would. */
function rowOfCorner(corner: Corner, switchingFrequencyHz: number): SweepRow {
  return {
    inputVoltageV: corner.inputVoltageV,
    loadFraction: corner.loadFraction,
    switchingFrequencyHz,
    feasible: true,
    conductionMode: corner.conductionMode,
    dutyCycle: corner.dutyCycle,
    efficiency: corner.efficiency,
    lossTotalW: corner.lossTotalW,
    switchVoltagePeakV: Math.max(...corner.switches.map((device) => device.voltagePeakV)),
    switchCurrentPeakA: Math.max(...corner.switches.map((device) => device.currentPeakA)),
  };
}

describe('sweepPoints', () => {
  it('sweepPoints(request) orders the grid frequency first, then input voltage, then load', () => {
    const points = sweepPoints(REQUEST).map((point) => [
      point.switchingFrequencyHz,
      point.inputVoltageV,
      point.loadFraction,
    ]);
    expect(points).toEqual([
      [80e3, 40, 0.5],
      [80e3, 40, 1],
      [80e3, 60, 0.5],
      [80e3, 60, 1],
      [120e3, 40, 0.5],
      [120e3, 40, 1],
      [120e3, 60, 0.5],
      [120e3, 60, 1],
    ]);
    expect(sweepPointCount(REQUEST)).toBe(points.length);
  });

  it('sweepPoints(request) with no grid takes the spec frequency, min/nominal/max input and loads', () => {
    const request = SweepRequestSchema.parse({ spec: INVENTED_FLYBACK_SPEC });
    const { spec } = request;
    const expected = [
      spec.inputVoltageMinV,
      spec.inputVoltageNominalV,
      spec.inputVoltageMaxV,
    ].flatMap((inputVoltageV) =>
      spec.loadFractions.map((loadFraction) => ({
        switchingFrequencyHz: spec.switchingFrequencyHz,
        inputVoltageV,
        loadFraction,
      })),
    );
    expect(sweepPoints(request)).toEqual(expected);
    expect(sweepPointCount(request)).toBe(expected.length);
  });

  it('sweepPoints(request) counts a fixed input (min = nominal = max) once', () => {
    const request = SweepRequestSchema.parse({
      spec: { ...INVENTED_FLYBACK_SPEC, inputVoltageMinV: 48, inputVoltageMaxV: 48 },
      grid: { loadFractions: [1] },
    });
    expect(sweepPoints(request).map((point) => point.inputVoltageV)).toEqual([48]);
    expect(sweepPointCount(request)).toBe(1);
  });
});

describe('evaluateSweepPoint', () => {
  // Consistency check, not an outside reference: a sweep row must equal the matching corner of
  // designConverter run on the spec with that switching frequency (the design service's own
  // answer), number for number, since both make the same choices and solve the same corner.
  it('evaluateSweepPoint(request, point) equals the design corner at that frequency', () => {
    const request = SweepRequestSchema.parse({
      spec: INVENTED_FLYBACK_SPEC,
      grid: { switchingFrequenciesHz: [80e3, 150e3] },
    });
    const cache = new Map();
    const rows = sweepPoints(request).map((point) => evaluateSweepPoint(request, point, cache));
    for (const switchingFrequencyHz of [80e3, 150e3]) {
      const design = designConverter({ ...request.spec, switchingFrequencyHz });
      if (!design.ok) throw new Error(`invented spec infeasible: ${JSON.stringify(design.issues)}`);
      if (design.value.topology !== 'flyback') throw new Error('expected a flyback design');
      for (const corner of design.value.corners) {
        const row = rows.find(
          (candidate) =>
            candidate.switchingFrequencyHz === switchingFrequencyHz &&
            candidate.inputVoltageV === corner.inputVoltageV &&
            candidate.loadFraction === corner.loadFraction,
        );
        expect(row).toEqual(rowOfCorner(corner, switchingFrequencyHz));
      }
    }
    expect(cache.size).toBe(2);
  });

  // Consistency check, as above: with designed output inductors (a forward, magnetics 'design')
  // the row carries the inductor's resistance and losses exactly as the design's corner does.
  it('evaluateSweepPoint(forward with designed inductors) equals the design corner', () => {
    const spec = forwardTelecomSpec({ magnetics: { mode: 'design' } });
    const request = SweepRequestSchema.parse({ spec, grid: {} });
    const design = designConverter(request.spec);
    if (!design.ok) throw new Error(`invented spec infeasible: ${JSON.stringify(design.issues)}`);
    expect(design.value.outputInductors).toHaveLength(1);
    const cache = new Map();
    for (const corner of design.value.corners) {
      const row = evaluateSweepPoint(
        request,
        {
          switchingFrequencyHz: spec.switchingFrequencyHz,
          inputVoltageV: corner.inputVoltageV,
          loadFraction: corner.loadFraction,
        },
        cache,
      );
      expect(row.feasible).toBe(true);
      expect(row.efficiency).toBe(corner.efficiency);
      expect(row.lossTotalW).toBe(corner.lossTotalW);
      expect(row.dutyCycle).toBe(corner.dutyCycle);
    }
  });

  it('evaluateSweepPoint gives the same row with or without a choice cache', () => {
    const [point] = sweepPoints(REQUEST);
    if (point === undefined) throw new Error('empty grid');
    expect(evaluateSweepPoint(REQUEST, point, new Map())).toEqual(
      evaluateSweepPoint(REQUEST, point),
    );
  });

  it('evaluateSweepPoint below the design input is infeasible with the corner solver issues', () => {
    // ref: common practice — a flyback's duty cycle rises as its input falls, so an input far
    // below the one the turns ratio was chosen for needs more than dutyCycleMax.
    const request = SweepRequestSchema.parse({
      spec: INVENTED_FLYBACK_SPEC,
      grid: { inputVoltagesV: [12], loadFractions: [1] },
    });
    const [point] = sweepPoints(request);
    if (point === undefined) throw new Error('empty grid');
    const row = evaluateSweepPoint(request, point);
    expect(row.feasible).toBe(false);
    expect(row.dutyCycle).toBeUndefined();
    expect(row.issues?.map((issue) => issue.code)).toContain('duty_cycle_limit');
    const topology = topologyById('flyback');
    const choices = topology.choose(request.spec);
    if (!choices.ok) throw new Error('invented spec infeasible');
    const solved = topology.solveCorner(request.spec, choices.value, {
      label: 'low-input',
      inputVoltageV: 12,
      loadFraction: 1,
    });
    expect(solved.ok).toBe(false);
    if (!solved.ok) {
      expect(row.issues?.map((issue) => issue.code)).toEqual(solved.issues.map((i) => i.code));
    }
  });
});
